import { sortedQuantile } from '../quantiles/sortedQuantile.js';
import { leastSquaresQr } from '../linalg/leastSquaresQr.js';

/**
 * How the driver regression's day-level columns carry the day before's mean price m = meanZ(d-1) beyond
 * its linear term (driverRegression.ts, DriverSettings.levelKnots):
 * - 'hinge': a linear spline in m, the truncated power basis max(0, m - k_j) with knots k_j at the
 *   j/(K+1) quantiles (Hyndman and Fan 1996, definition 7) of the training days' m (Hastie, Tibshirani
 *   and Friedman 2009, section 5.2); the delivery day's m is used as it is (the spline extrapolates
 *   linearly beyond the training days' range);
 * - 'hinge-clamped': the same, with the delivery day's m clamped into the training days' range [min m,
 *   max m] in the hinges (not in the linear column): beyond the range the level follows the linear
 *   term's slope alone, the curvature not extrapolated;
 * - 'shared': one column instead of K, the curve f(m) = sum_j c_j max(0, m' - k_j) (m' = m clamped
 *   into the training range) with c_j from a least-squares regression of the day's mean price on
 *   [1, m, meanX(d-1), the day's mean residual load, the hinges, weekday dummies] over the training
 *   days: the curve's shape is estimated once from day means, and each slot's model only scales it
 *   (K coefficients per day, not per slot: fewer to estimate where the level's effect is linear);
 * - 'surprise': hinges in u = m - (alpha + beta meanX(d-1)), the day before's mean price less its
 *   least-squares fit on the day before's mean residual load over the training days: the part of the
 *   level its drivers do not explain, knots at the quantiles of the training days' u;
 * - 'natural-cubic': the restricted (natural) cubic spline of Harrell (2015, Regression Modeling
 *   Strategies, 2nd ed., Springer, section 2.4.5, eq. 2.25) in m with K >= 3 knots at the quantiles
 *   Harrell recommends for K = 3, 4, 5 (his table 2.3: 0.10 0.5 0.90; 0.05 0.35 0.65 0.95;
 *   0.05 0.275 0.5 0.725 0.95), K - 2 columns, each divided by (t_K - t_1)^2 as Harrell scales them;
 *   linear beyond the outer knots.
 *
 * References: T. Hastie, R. Tibshirani and J. Friedman (2009), The Elements of Statistical Learning,
 * 2nd ed., Springer, section 5.2; F. E. Harrell (2015), Regression Modeling Strategies, 2nd ed.,
 * Springer, section 2.4.5; R. J. Hyndman and Y. Fan (1996), Am. Stat. 50(4), 361-365.
 */
export type DayLevelBasis = 'hinge' | 'hinge-clamped' | 'surprise' | 'natural-cubic' | 'shared';

export const DAY_LEVEL_BASES: readonly DayLevelBasis[] = ['hinge', 'hinge-clamped', 'surprise', 'natural-cubic', 'shared'];

/** What the 'shared' basis's day-mean regression reads of each training day (the rows of meanZ). */
export interface DayMeans {
  /** The day's own mean price on the model's scale (clipped as meanZ is). */
  readonly meanZ: Float64Array;
  /** The day's own mean residual load. */
  readonly meanX: Float64Array;
  /** ISO weekday 1..7 (7, Sunday, the reference). */
  readonly weekdays: Int8Array;
}

/** A day-level spline fitted to the training days: its knots, range and (for 'surprise') the fit of m on meanX. */
export interface DayLevelSpline {
  readonly basis: DayLevelBasis;
  /** The knots, ascending. */
  readonly knots: Float64Array;
  /** Number of columns the spline adds beside m and meanX. */
  readonly columns: number;
  /** Range of the training days' m. */
  readonly low: number;
  readonly high: number;
  /** 'surprise': u = m - (alpha + beta meanX). */
  readonly alpha: number;
  readonly beta: number;
  /** 'shared': the hinges' weights c_j of the curve. */
  readonly weights: Float64Array;
}

/** Harrell's (2015, table 2.3) knot quantiles of a restricted cubic spline with K knots. */
const HARRELL_QUANTILES: Readonly<Record<number, readonly number[]>> = {
  3: [0.1, 0.5, 0.9],
  4: [0.05, 0.35, 0.65, 0.95],
  5: [0.05, 0.275, 0.5, 0.725, 0.95],
};

/** The knot levels of `knots` knots of `basis`: j/(K+1) for the hinges, Harrell's for the cubic spline. */
export function dayLevelKnotLevels(basis: DayLevelBasis, knots: number): readonly number[] {
  if (basis === 'natural-cubic') {
    const levels = HARRELL_QUANTILES[knots];
    if (levels === undefined) throw new RangeError(`a natural cubic spline takes 3, 4 or 5 knots, not ${knots}`);
    return levels;
  }
  return Array.from({ length: knots }, (_, j) => (j + 1) / (knots + 1));
}

/**
 * The spline of `knots` knots fitted to the training days' m (meanZ) and meanX (the same rows).
 *
 * @param knots K >= 1 (3..5 for 'natural-cubic')
 */
export function fitDayLevelSpline(basis: DayLevelBasis, knots: number, meanZ: Float64Array, meanX: Float64Array, dayMeans?: DayMeans): DayLevelSpline {
  const n = meanZ.length;
  let alpha = 0;
  let beta = 0;
  if (basis === 'surprise') {
    // Least squares of m on meanX: beta = S_xm / S_xx, alpha = mean m - beta mean x.
    let mx = 0;
    let mm = 0;
    for (let r = 0; r < n; r++) {
      mx += meanX[r] as number;
      mm += meanZ[r] as number;
    }
    mx /= n;
    mm /= n;
    let sxm = 0;
    let sxx = 0;
    for (let r = 0; r < n; r++) {
      const dx = (meanX[r] as number) - mx;
      sxm += dx * ((meanZ[r] as number) - mm);
      sxx += dx * dx;
    }
    beta = sxx > 0 ? sxm / sxx : 0;
    alpha = mm - beta * mx;
  }
  const argument = new Float64Array(n);
  for (let r = 0; r < n; r++) argument[r] = (meanZ[r] as number) - (basis === 'surprise' ? alpha + beta * (meanX[r] as number) : 0);
  const sorted = argument.sort();
  const levels = dayLevelKnotLevels(basis, knots);
  const knotValues = Float64Array.from(levels, (tau) => sortedQuantile(sorted, tau));
  let low = Infinity;
  let high = -Infinity;
  for (let r = 0; r < n; r++) {
    const m = meanZ[r] as number;
    if (m < low) low = m;
    if (m > high) high = m;
  }
  const weights = new Float64Array(knots);
  if (basis === 'shared' && dayMeans !== undefined) {
    // Rows: 1, m, meanX(d-1), the day's mean residual load, the K hinges, Monday..Saturday dummies.
    const cols = 4 + knots + 6;
    const data = new Float64Array(n * cols);
    for (let r = 0; r < n; r++) {
      const m = meanZ[r] as number;
      const at = r * cols;
      data[at] = 1;
      data[at + 1] = m;
      data[at + 2] = meanX[r] as number;
      data[at + 3] = dayMeans.meanX[r] as number;
      for (let j = 0; j < knots; j++) data[at + 4 + j] = Math.max(0, m - (knotValues[j] as number));
      const weekday = dayMeans.weekdays[r] as number;
      if (weekday <= 6) data[at + 4 + knots + weekday - 1] = 1;
    }
    const fit = leastSquaresQr({ rows: n, cols, data }, dayMeans.meanZ);
    for (let j = 0; j < knots; j++) weights[j] = fit.coefficients[4 + j] as number;
  }
  return { basis, knots: knotValues, columns: basis === 'natural-cubic' ? knots - 2 : basis === 'shared' ? 1 : knots, low, high, alpha, beta, weights };
}

/** The day's m as the spline's columns read it (not the linear column): clamped into the training range for 'hinge-clamped' and 'shared'. */
export function dayLevelArgument(spline: DayLevelSpline, meanZ: number): number {
  if (spline.basis !== 'hinge-clamped' && spline.basis !== 'shared') return meanZ;
  return meanZ < spline.low ? spline.low : meanZ > spline.high ? spline.high : meanZ;
}

/**
 * The spline's columns of a day with day-before mean price m (already through dayLevelArgument) and
 * mean residual load `meanX`, into out[at..at + columns - 1].
 */
export function dayLevelColumns(spline: DayLevelSpline, m: number, meanX: number, out: Float64Array, at: number): void {
  const t = spline.knots;
  const K = t.length;
  if (spline.basis === 'natural-cubic') {
    // Harrell (2015) eq. 2.25: (m - t_j)^3_+ - (m - t_{K-1})^3_+ (t_K - t_j)/(t_K - t_{K-1}) + (m - t_K)^3_+ (t_{K-1} - t_j)/(t_K - t_{K-1}).
    const tK = t[K - 1] as number;
    const tK1 = t[K - 2] as number;
    const norm = ((tK - (t[0] as number)) ** 2) || 1;
    const span = tK - tK1 || 1;
    const cube = (v: number): number => (v > 0 ? v * v * v : 0);
    for (let j = 0; j < K - 2; j++) {
      const tj = t[j] as number;
      out[at + j] = (cube(m - tj) - (cube(m - tK1) * (tK - tj)) / span + (cube(m - tK) * (tK1 - tj)) / span) / norm;
    }
    return;
  }
  if (spline.basis === 'shared') {
    let f = 0;
    for (let j = 0; j < K; j++) f += (spline.weights[j] as number) * Math.max(0, m - (t[j] as number));
    out[at] = f;
    return;
  }
  const u = spline.basis === 'surprise' ? m - (spline.alpha + spline.beta * meanX) : m;
  for (let j = 0; j < K; j++) {
    const v = u - (t[j] as number);
    out[at + j] = v > 0 ? v : 0;
  }
}
