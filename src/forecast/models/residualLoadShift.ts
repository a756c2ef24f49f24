import { farOutFences, type Fences } from './farOutFences.js';

/**
 * A slot's merit-order curve z = f(x) on the model's scale, piecewise linear in the residual load x [GW]
 * and increasing, for reading a price back as the residual load that would have set it (inverse
 * prediction, "statistical calibration": C. Osborne 1991, Statistical calibration: a review, Int. Stat.
 * Rev. 59(3), 309-336; P. J. Brown 1993, Measurement, Regression, and Calibration, Oxford, ch. 1-2).
 * Segment 0 runs left of knots[0], segment j from knots[j - 1] to knots[j], the last right of the last knot.
 */
export interface MonotoneCurve {
  /** Knots in ascending order [GW]. */
  readonly knots: Float64Array;
  /** f at each knot [model scale]. */
  readonly values: Float64Array;
  /** Slope of each of the knots + 1 segments [model scale / GW], all > 0. */
  readonly slopes: Float64Array;
}

/**
 * Share of the median segment slope below which a segment's slope is raised to it: a flat or falling
 * stretch of a fitted curve has no inverse (a price there maps to no one residual load).
 */
export const SLOPE_FLOOR_SHARE = 0.1;
/** Slope used when the median slope is not positive (a curve with no merit order to read) [model scale / GW]. */
const SMALLEST_SLOPE = 1e-6;

/**
 * The increasing piecewise-linear curve of a hinge basis f(x) = level + slope0 x + sum_j hinge[j] max(0, x - knots[j])
 * (knots ascending): segment slopes slope0 + hinge[0] + ... + hinge[j - 1], each floored at
 * SLOPE_FLOOR_SHARE times their median; the curve passes through f(knots[0]) = level + slope0 knots[0] and
 * follows the floored slopes from there (where no slope is floored, it is f exactly).
 */
export function monotoneHingeCurve(level: number, slope0: number, hingeSlopes: ArrayLike<number>, knots: ArrayLike<number>): MonotoneCurve {
  // Without knots, a knot at 0 with no change of slope anchors the line's level.
  if (knots.length === 0) return monotoneHingeCurve(level, slope0, [0], [0]);
  const J = knots.length;
  const slopes = new Float64Array(J + 1);
  let slope = slope0;
  slopes[0] = slope;
  for (let j = 0; j < J; j++) {
    slope += hingeSlopes[j] as number;
    slopes[j + 1] = slope;
  }
  const median = medianOfSorted(Float64Array.from(slopes).sort());
  const floor = Math.max(SLOPE_FLOOR_SHARE * median, SMALLEST_SLOPE);
  for (let j = 0; j <= J; j++) if ((slopes[j] as number) < floor) slopes[j] = floor;
  const values = new Float64Array(J);
  values[0] = level + slope0 * (knots[0] as number);
  for (let j = 1; j < J; j++) values[j] = (values[j - 1] as number) + (slopes[j] as number) * ((knots[j] as number) - (knots[j - 1] as number));
  return { knots: Float64Array.from(knots), values, slopes };
}

/** The residual load x with f(x) = z on a monotone curve [GW] (the curve is increasing, so x is unique). */
export function inverseOf(curve: MonotoneCurve, z: number): number {
  const { knots, values, slopes } = curve;
  const J = knots.length;
  if (z < (values[0] as number)) return (knots[0] as number) + (z - (values[0] as number)) / (slopes[0] as number);
  let j = 0;
  while (j + 1 < J && (values[j + 1] as number) <= z) j++;
  return (knots[j] as number) + (z - (values[j] as number)) / (slopes[j + 1] as number);
}

/**
 * A day's residual-load offset D [GW]: the median over its periods of f_s^{-1}(z(t)) - x(t), the residual load
 * the curve of the period's slot s needs for the day's (clipped) price z(t) less the residual load it had.
 * A supply shift moves every period's point along the curve by the same amount, so D reads it in GW.
 */
export function dayOffset(curves: readonly MonotoneCurve[], z: ArrayLike<number>, x: ArrayLike<number>, work: Float64Array): number {
  const S = curves.length;
  for (let s = 0; s < S; s++) work[s] = inverseOf(curves[s] as MonotoneCurve, z[s] as number) - (x[s] as number);
  return medianOfSorted(work.subarray(0, S).sort());
}

/** The median of values in ascending order (the mean of the middle two for an even count). */
function medianOfSorted(sorted: Float64Array): number {
  const n = sorted.length;
  return n % 2 === 1 ? (sorted[n >> 1] as number) : ((sorted[(n >> 1) - 1] as number) + (sorted[n >> 1] as number)) / 2;
}

/** The far-out fences of the training days' offsets, at which every offset is clipped (a day of spikes reads as a far shift). */
export function offsetFences(offsets: ArrayLike<number>): Fences {
  return farOutFences(offsets);
}

/** v clipped into [fences.low, fences.high]. */
export function clipToFences(v: number, fences: Fences): number {
  return v < fences.low ? fences.low : v > fences.high ? fences.high : v;
}
