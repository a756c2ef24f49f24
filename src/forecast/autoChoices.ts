import { entryMembers, type AutoEntry } from './forecastMethods.js';

/** The method `auto` records for a day it served the quantile average of several candidates. */
export const QUANTILE_AVERAGE = 'quantile-average';

/** A member of a quantile average `auto` chose: a method, its calibration window [calendar days] and its weight [-]. */
export interface AverageMember {
  readonly method: string;
  readonly calibrationDays: number;
  readonly weight: number;
}

/** What `auto` served for a day: one method and window, or (method QUANTILE_AVERAGE) the quantile average of `averageOf`. */
export interface ChosenCandidate {
  readonly method: string;
  /** Calibration window [calendar days]; 0 for a quantile average (each member keeps its own). */
  readonly calibrationDays: number;
  /** With method QUANTILE_AVERAGE: its members and their weights (summing to 1); absent otherwise. */
  readonly averageOf?: readonly AverageMember[];
}

/** What `auto` chose for one delivery day. */
export interface DayChoice extends ChosenCandidate {
  /** Delivery day, YYYY-MM-DD. */
  readonly day: string;
}

/** The record of an entry of `auto`'s candidates: a single one as it is, an average as QUANTILE_AVERAGE of its members at equal weights. */
export function chosenCandidate(entry: AutoEntry): ChosenCandidate {
  if (!('averageOf' in entry)) return { method: entry.method, calibrationDays: entry.calibrationDays };
  const members = entryMembers(entry);
  return { method: QUANTILE_AVERAGE, calibrationDays: 0, averageOf: members.map((m) => ({ method: m.method, calibrationDays: m.calibrationDays, weight: 1 / members.length })) };
}

/** How a summary names a choice: "driver-hs (364 calibration days)", or "quantile average of driver-fhs (364) and driver-fhs (728), weights 0.5, 0.5". */
export function choiceLabel(c: ChosenCandidate): string {
  if (c.averageOf === undefined) return `${c.method} (${c.calibrationDays} calibration days)`;
  const members = c.averageOf.map((m) => `${m.method} (${m.calibrationDays})`);
  return `quantile average of ${members.slice(0, -1).join(', ')} and ${members[members.length - 1]}, weights ${c.averageOf.map((m) => Number(m.weight.toFixed(4))).join(', ')}`;
}

/**
 * The record of `auto`'s choices that forecast.json and every summary of a --model run carry: the
 * choice of each day in day order, and how many days each (method, window, or average of members) was
 * chosen, most first (ties in the order first chosen). Null when no day was forecast by `auto`.
 */
export function chosenMethodsRecord(choices: readonly DayChoice[]): {
  readonly perDay: readonly DayChoice[];
  readonly counts: readonly (ChosenCandidate & { readonly days: number })[];
} | null {
  if (choices.length === 0) return null;
  const counts = new Map<string, ChosenCandidate & { days: number }>();
  for (const c of choices) {
    const key = JSON.stringify([c.method, c.calibrationDays, c.averageOf ?? null]);
    const entry = counts.get(key) ?? { ...choiceRecord(c), days: 0 };
    entry.days++;
    counts.set(key, entry);
  }
  const perDay = [...choices].sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0)).map((c) => ({ day: c.day, ...choiceRecord(c) }));
  return { perDay, counts: [...counts.values()].sort((a, b) => b.days - a.days) };
}

/** The method, window and (for an average) members of a choice, without anything else it carries (e.g. auto's validation figures). */
export function choiceRecord(c: ChosenCandidate): ChosenCandidate {
  return c.averageOf === undefined ? { method: c.method, calibrationDays: c.calibrationDays } : { method: c.method, calibrationDays: c.calibrationDays, averageOf: c.averageOf.map((m) => ({ method: m.method, calibrationDays: m.calibrationDays, weight: m.weight })) };
}
