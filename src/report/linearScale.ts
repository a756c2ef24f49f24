import { alignedTicks, niceTicks, ticksOnFixedEnds, type NiceTicks } from './niceTicks.js';
import { tickLabels } from './tickLabel.js';

/** A linear map from data values to pixels, with its ticks and their labels. */
export interface LinearScale {
  /** Data interval shown [data unit]: the outer nice ticks unless fixed by the caller. */
  readonly domain: readonly [number, number];
  /** Pixel interval it maps onto; range[0] is where domain[0] goes (for y axes the bottom). */
  readonly range: readonly [number, number];
  /** Tick values inside the domain. */
  readonly ticks: readonly number[];
  /** Tick labels, one per tick (see tickLabel). */
  readonly labels: readonly string[];
  /** Decimals of the tick step, for value labels that match the axis. */
  readonly decimals: number;
  /** Pixel position of a data value (values outside the domain map outside the range). */
  at(value: number): number;
}

export interface ScaleOptions {
  /** Fixed lower end of the domain; default: the nice tick at or below the data. */
  readonly min?: number;
  /** Fixed upper end of the domain; default: the nice tick at or above the data. */
  readonly max?: number;
  /** Stretch the domain to contain 0 (bars, amounts). Default false. */
  readonly includeZero?: boolean;
  /** Wished number of tick intervals, default 5. */
  readonly tickTarget?: number;
  /** Use exactly this many ticks, chosen to line up with another axis (secondary axes). */
  readonly alignToTickCount?: number;
}

export const SCALE_DEFAULTS = Object.freeze({ includeZero: false, tickTarget: 5 });

/**
 * Linear scale over the data extent, widened to nice ticks (1-2-5 ladder, see niceTicks). Fixed
 * `min`/`max` are kept exactly; when both are fixed, ticks that land on both ends are preferred
 * (ticksOnFixedEnds: [-5, 5] gives -5, 0, 5), else the nice ticks that fall inside them.
 *
 * @param values data values; null and non-finite values are ignored
 * @param range pixel positions of the domain's lower and upper end
 */
export function linearScale(values: readonly (number | null)[], range: readonly [number, number], options: ScaleOptions = {}): LinearScale {
  const o = { ...SCALE_DEFAULTS, ...options };
  const finite = values.filter((v): v is number => v !== null && Number.isFinite(v));
  if (o.min !== undefined) finite.push(o.min);
  if (o.max !== undefined) finite.push(o.max);
  if (o.includeZero) finite.push(0);
  const lo = finite.length > 0 ? Math.min(...finite) : 0;
  const hi = finite.length > 0 ? Math.max(...finite) : 1;
  const nice: NiceTicks = o.alignToTickCount !== undefined ? alignedTicks(lo, hi, o.alignToTickCount) : niceTicks(lo, hi, o.tickTarget);
  const d0 = o.min ?? nice.min;
  const d1 = o.max ?? nice.max;
  const span = d1 - d0 || 1;
  const ends = o.min !== undefined && o.max !== undefined && o.alignToTickCount === undefined ? ticksOnFixedEnds(d0, d1, nice.step, o.tickTarget) : null;
  const chosen = ends ?? nice;
  const ticks = chosen.values.filter((v) => v >= d0 - 1e-9 * span && v <= d1 + 1e-9 * span);
  const [r0, r1] = range;
  return {
    domain: [d0, d1],
    range,
    ticks,
    labels: tickLabels(ticks, chosen.step, chosen.decimals),
    decimals: chosen.decimals,
    at: (value: number) => r0 + ((value - d0) / span) * (r1 - r0),
  };
}
