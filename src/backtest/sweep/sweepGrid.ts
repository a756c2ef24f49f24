import { InputError } from '../../errors/inputError.js';
import { axisValueText, type AxisValue, type SweepAxis } from './sweepAxis.js';

/** One setting of a sweep: a value per axis name, e.g. `{ alpha: 0.02, policy: 'quantile' }`. */
export type Setting = Readonly<Record<string, AxisValue>>;

/** A setting with its place in the grid and its stable key. */
export interface GridPoint {
  /** Position in grid order, 0-based. */
  readonly index: number;
  /** `alpha=0.02|policy=quantile|unaccepted=follow-plan`: axis order, values as axisValueText. */
  readonly key: string;
  readonly setting: Setting;
}

export const GRID_DEFAULTS = Object.freeze({ maxSettings: 100_000 });

const AXIS_NAME = /^[a-z][a-z0-9_]*$/;

/**
 * The cartesian product of the axes in grid order: axes in the order given, the last one varying
 * fastest (as nested loops with the first axis outermost), values in the order each axis lists them.
 * The order depends only on the axes, so it is the same on every run and for any number of threads.
 * More than `maxSettings` settings is a problem naming every option.
 */
export function expandGrid(axes: readonly SweepAxis[], options: { readonly maxSettings?: number } = {}): GridPoint[] {
  const { maxSettings } = { ...GRID_DEFAULTS, ...options };
  checkAxisNames(axes);
  const total = axes.reduce((product, axis) => product * axis.values.length, 1);
  if (total > maxSettings) {
    const counts = axes.map((axis) => `${axis.values.length} ${axis.option}`).join(' x ');
    throw new InputError([
      { file: 'command line', field: axes.map((axis) => axis.option).join(', '), message: `${counts} is ${total} settings, more than the ${maxSettings} one sweep may have`, fix: 'use larger steps or fewer values' },
    ]);
  }
  const points: GridPoint[] = [];
  for (let index = 0; index < total; index++) {
    const setting: Record<string, AxisValue> = {};
    let rest = index;
    for (let a = axes.length - 1; a >= 0; a--) {
      const axis = axes[a] as SweepAxis;
      setting[axis.name] = axis.values[rest % axis.values.length] as AxisValue;
      rest = Math.floor(rest / axis.values.length);
    }
    const ordered = Object.fromEntries(axes.map((axis) => [axis.name, setting[axis.name] as AxisValue]));
    points.push({ index, key: settingKey(axes, ordered), setting: Object.freeze(ordered) });
  }
  return points;
}

/** The stable key of a setting: `name=value` per axis in axis order, joined by `|`. */
export function settingKey(axes: readonly SweepAxis[], setting: Setting): string {
  return axes.map((axis) => `${axis.name}=${axisValueText(setting[axis.name] as AxisValue)}`).join('|');
}

function checkAxisNames(axes: readonly SweepAxis[]): void {
  const names = axes.map((axis) => axis.name);
  const bad = names.filter((name, i) => !AXIS_NAME.test(name) || names.indexOf(name) !== i);
  if (bad.length > 0) throw new Error(`sweep axis names must be distinct lower snake case words: ${bad.join(', ')}`);
}
