import type { Setting } from './sweep/sweepGrid.js';

/**
 * Typed reads of a sweep setting's values inside a task module. A missing or mistyped value is a
 * fault of the command that built the grid, not bad input, so it throws a plain Error.
 */
export function settingNumber(setting: Setting, name: string): number {
  const value = setting[name];
  if (typeof value !== 'number') throw new Error(`setting ${JSON.stringify(setting)} has no number ${name}`);
  return value;
}

export function settingWord<T extends string>(setting: Setting, name: string, allowed: readonly T[]): T {
  const value = setting[name];
  if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
    throw new Error(`setting ${JSON.stringify(setting)} has no ${name} among ${allowed.join(', ')}`);
  }
  return value as T;
}
