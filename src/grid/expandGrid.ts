import { InputError } from '../errors/inputError.js';
import { axisValueText, type AxisValue, type GridAxis } from './gridAxis.js';

/** One setting of a grid: a value per axis name, e.g. `{ alpha: 0.02, policy: 'quantile' }`. */
export type Setting = Readonly<Record<string, AxisValue>>;

/**
 * The type of the settings of a grid with these axes: one field per axis, of the axis's value type,
 * e.g. `{ alpha: number; policy: 'quantile' | 'median' }`. A task module reads its setting's fields
 * as they are: they were checked when the axes were parsed, and a worker gets the settings by
 * structured clone, so nothing is read back from text or checked again.
 */
export type SettingOf<Axes extends readonly GridAxis[]> = { readonly [A in Axes[number] as A['name']]: A['values'][number] };

/** A setting with its place in the grid and its stable key. */
export interface GridPoint<S extends Setting = Setting> {
  /** Position in grid order, 0-based. */
  readonly index: number;
  /** `alpha=0.02|policy=quantile|unaccepted=follow-plan`: axis order, values as axisValueText. */
  readonly key: string;
  readonly setting: S;
}

export const GRID_DEFAULTS = Object.freeze({ maxSettings: 100_000 });

const AXIS_NAME = /^[a-z][a-z0-9_]*$/;

/**
 * The cartesian product of the axes in grid order: axes in the order given, the last one varying
 * fastest (as nested loops with the first axis outermost), values in the order each axis lists them.
 * The order depends only on the axes, so it is the same on every run and for any number of threads.
 * More than `maxSettings` settings is a problem naming every option.
 */
export function expandGrid<const Axes extends readonly GridAxis[]>(axes: Axes, options: { readonly maxSettings?: number } = {}): GridPoint<SettingOf<Axes>>[] {
  const { maxSettings } = { ...GRID_DEFAULTS, ...options };
  checkAxisNames(axes);
  const total = axes.reduce((product, axis) => product * axis.values.length, 1);
  if (total > maxSettings) {
    const counts = axes.map((axis) => `${axis.values.length} ${axis.option}`).join(' x ');
    throw new InputError([
      { file: 'command line', field: axes.map((axis) => axis.option).join(', '), message: `${counts} is ${total} settings, more than the ${maxSettings} one sweep may have`, fix: 'use larger steps or fewer values' },
    ]);
  }
  const points: GridPoint<SettingOf<Axes>>[] = [];
  for (let index = 0; index < total; index++) {
    const setting: Record<string, AxisValue> = {};
    let rest = index;
    for (let a = axes.length - 1; a >= 0; a--) {
      const axis = axes[a] as GridAxis;
      setting[axis.name] = axis.values[rest % axis.values.length] as AxisValue;
      rest = Math.floor(rest / axis.values.length);
    }
    const ordered = Object.fromEntries(axes.map((axis) => [axis.name, setting[axis.name] as AxisValue]));
    points.push({ index, key: settingKey(axes, ordered), setting: Object.freeze(ordered) as SettingOf<Axes> });
  }
  return points;
}

/** The stable key of a setting: `name=value` per axis in axis order, joined by `|`. */
export function settingKey(axes: readonly GridAxis[], setting: Setting): string {
  return axes.map((axis) => `${axis.name}=${axisValueText(setting[axis.name] as AxisValue)}`).join('|');
}

function checkAxisNames(axes: readonly GridAxis[]): void {
  const names = axes.map((axis) => axis.name);
  const bad = names.filter((name, i) => !AXIS_NAME.test(name) || names.indexOf(name) !== i);
  if (bad.length > 0) throw new Error(`sweep axis names must be distinct lower snake case words: ${bad.join(', ')}`);
}
