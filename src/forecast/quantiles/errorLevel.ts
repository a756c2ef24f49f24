import { sortedQuantile } from './sortedQuantile.js';
import { medianBySelection } from './driverSpread.js';
import type { PoolOrder } from './poolOrder.js';
import { regularizedBeta } from '../../stats/regularizedBeta.js';

/** Lookbacks of the day-level error regression [days]: the day before, the week before, the four weeks before. */
export const ERROR_LEVEL_LOOKBACK_DAYS: readonly number[] = Object.freeze([1, 7, 28]);

/**
 * Size of the pretest [-]: the weights are used only when the F test of b = 0 rejects at this level
 * (1%, a conventional level; 5% cost a known-distribution setting 0.005: docs/forecast-quality.md, the
 * seventh wave, the demo's centre); otherwise the shift is 0.
 */
export const ERROR_LEVEL_TEST_SIZE = 0.01;

/**
 * The shift of a delivery day's centre that the level of the recent calibration errors predicts: an
 * intercept correction (Clements and Hendry 1996) whose weights are estimated from the calibration
 * errors themselves, by a heterogeneous autoregression of the errors' day level (Corsi 2009).
 *
 * Why: a point model refitted on a window of past days reads a persistent price level (a fuel or
 * day-level factor shared by all periods of a day) through yesterday's prices, whose own day noise
 * attenuates the coefficient; when the level moves away from the window's average the forecasts stay
 * between the two, and every period of a run of days errs the same way. The error pool of the
 * calibration days is centred on the whole window and cannot follow such a run; the recent errors can.
 *
 * With e(d, s) the calibration errors (on the error scale), m_s the median of slot s's errors over the
 * calibration days (what historical simulation already adds to the centre), and
 *   y(d) = median over the slots s of (e(d, s) - m_s),
 * the day level beyond the pool's centre, and x_k(t) the mean of y over the calibration days in
 * [t - k, t - 1] for the lookbacks k of ERROR_LEVEL_LOOKBACK_DAYS (a day, a week, four weeks, as the
 * daily, weekly and monthly components of Corsi's model), the weights b solve least squares without
 * an intercept over the calibration days whose longest lookback lies within the calibration days:
 *   y(d) = sum_k b_k x_k(d) + v(d),
 * and the delivery day's shift is sum_k b_k x_k(delivery day). Without an intercept a window whose
 * errors carry no run predicts a shift near 0 (b estimated near 0); the medians keep spike days from
 * setting the level. Nothing after the last calibration day is read (they all lie before the delivery day).
 *
 * References: M. P. Clements and D. F. Hendry (1996), Intercept corrections and structural change,
 * J. Appl. Econometrics 11(5), 475-494, doi:10.1002/(SICI)1099-1255(199609)11:5<475::AID-JAE409>3.0.CO;2-9;
 * F. Corsi (2009), A simple approximate long-memory model of realized volatility, J. Financ.
 * Econometrics 7(2), 174-196, doi:10.1093/jjfinec/nbp001.
 *
 * @param dayNumbers the calibration days' day numbers, ascending
 * @param errors errors[d][s] of those days on the error scale, S slots each
 * @param targetDay the delivery day's number, after every calibration day
 * @returns the shift on the error scale; 0 when fewer calibration days than the longest lookback have
 *   a whole lookback, when a lookback before the delivery day holds no calibration day, or when the
 *   normal equations are singular
 */
export function errorLevelShift(dayNumbers: ArrayLike<number>, errors: readonly ArrayLike<number>[], targetDay: number): number {
  return errorLevelShifts(dayNumbers, errors, targetDay).target;
}

/** The shifts of {@link errorLevelShift}: the delivery day's, and each calibration day's from its own lookbacks (0 without a whole lookback). */
export interface ErrorLevelShifts {
  readonly target: number;
  /** Per calibration day, sum_k b_k x_k(d) with the same weights b (0 for a day without every lookback, or when b is not estimated). */
  readonly days: Float64Array;
}

/**
 * {@link errorLevelShift}, and the shift the same weights give each calibration day from the days before
 * it, so that the pool can hold the errors of the shifted forecasts, e(d, s) - shift(d): the pool then
 * holds the errors of the forecasts the delivery day's quantiles are made like.
 *
 * @param order the slots' order at the last call for the same calibration window (speed only; day ids = dayNumbers)
 */
export function errorLevelShifts(dayNumbers: ArrayLike<number>, errors: readonly ArrayLike<number>[], targetDay: number, order?: PoolOrder): ErrorLevelShifts {
  const n = errors.length;
  const none = { target: 0, days: new Float64Array(n) };
  if (n === 0) return none;
  const S = (errors[0] as ArrayLike<number>).length;
  const lookbacks = ERROR_LEVEL_LOOKBACK_DAYS;
  const longest = Math.max(...lookbacks);
  // m_s, the slot's median error over the calibration days (definition 7; with a kept order the pools
  // are sorted from the last call's order, the same numbers at less CPU: poolOrder.ts).
  const column = new Float64Array(n);
  const slotMedian = new Float64Array(S);
  order?.begin(dayNumbers);
  for (let s = 0; s < S; s++) {
    if (order === undefined) {
      for (let d = 0; d < n; d++) column[d] = (errors[d] as ArrayLike<number>)[s] as number;
      slotMedian[s] = medianBySelection(column);
    } else {
      order.sortSlot(errors, s, column);
      slotMedian[s] = sortedQuantile(column, 0.5);
    }
  }
  // y(d), the day's median error beyond its slots' medians; prefix sums for the lookbacks' means.
  const prefix = new Float64Array(n + 1);
  const day = new Float64Array(S);
  for (let d = 0; d < n; d++) {
    const row = errors[d] as ArrayLike<number>;
    for (let s = 0; s < S; s++) day[s] = (row[s] as number) - (slotMedian[s] as number);
    prefix[d + 1] = (prefix[d] as number) + medianBySelection(day);
  }
  const first = dayNumbers[0] as number;
  /** x_k(t) for every lookback into `out`, false when a lookback holds no calibration day. */
  const features = (t: number, end: number, out: Float64Array): boolean => {
    for (let k = 0; k < lookbacks.length; k++) {
      let from = end;
      while (from > 0 && (dayNumbers[from - 1] as number) >= t - (lookbacks[k] as number)) from--;
      if (from === end) return false;
      out[k] = ((prefix[end] as number) - (prefix[from] as number)) / (end - from);
    }
    return true;
  };
  const p = lookbacks.length;
  const gram = new Float64Array(p * p);
  const rhs = new Float64Array(p);
  const x = new Float64Array(p);
  let rows = 0;
  let yy = 0;
  for (let d = 0; d < n; d++) {
    const t = dayNumbers[d] as number;
    if (t - longest < first || !features(t, d, x)) continue;
    const y = (prefix[d + 1] as number) - (prefix[d] as number);
    yy += y * y;
    for (let i = 0; i < p; i++) {
      rhs[i] = (rhs[i] as number) + (x[i] as number) * y;
      for (let j = 0; j < p; j++) gram[i * p + j] = (gram[i * p + j] as number) + (x[i] as number) * (x[j] as number);
    }
    rows++;
  }
  if (rows < longest || !features(targetDay, n, x)) return none;
  const b = solveSymmetric(gram, rhs, p);
  if (b === null) return none;
  if (!(fTestPValue(b, rhs, yy, rows) < ERROR_LEVEL_TEST_SIZE)) return none;
  const predict = (): number => {
    let shift = 0;
    for (let k = 0; k < p; k++) shift += (b[k] as number) * (x[k] as number);
    return shift;
  };
  const target = predict();
  const days = none.days;
  for (let d = 0; d < n; d++) if (features(dayNumbers[d] as number, d, x)) days[d] = predict();
  return { target, days };
}

/**
 * Solves G b = r for a symmetric positive definite p x p matrix G (row-major) by Cholesky, G = L L'
 * (Golub and Van Loan 2013, section 4.2); null when a pivot is not positive beyond rounding (relative
 * to the largest diagonal value), i.e. G singular.
 */
function solveSymmetric(g: Float64Array, r: Float64Array, p: number): Float64Array | null {
  const l = new Float64Array(p * p);
  let largest = 0;
  for (let i = 0; i < p; i++) largest = Math.max(largest, g[i * p + i] as number);
  if (!(largest > 0)) return null;
  for (let j = 0; j < p; j++) {
    let pivot = g[j * p + j] as number;
    for (let k = 0; k < j; k++) pivot -= (l[j * p + k] as number) ** 2;
    if (!(pivot > 1e-12 * largest)) return null;
    const root = Math.sqrt(pivot);
    l[j * p + j] = root;
    for (let i = j + 1; i < p; i++) {
      let v = g[i * p + j] as number;
      for (let k = 0; k < j; k++) v -= (l[i * p + k] as number) * (l[j * p + k] as number);
      l[i * p + j] = v / root;
    }
  }
  const z = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    let v = r[i] as number;
    for (let k = 0; k < i; k++) v -= (l[i * p + k] as number) * (z[k] as number);
    z[i] = v / (l[i * p + i] as number);
  }
  const b = new Float64Array(p);
  for (let i = p - 1; i >= 0; i--) {
    let v = z[i] as number;
    for (let k = i + 1; k < p; k++) v -= (l[k * p + i] as number) * (b[k] as number);
    b[i] = v / (l[i * p + i] as number);
  }
  return b;
}

/**
 * p-value of the F test of b = 0 in least squares without an intercept: with ESS = b'X'y and
 * RSS = y'y - ESS over n rows and p weights, F = (ESS / p) / (RSS / (n - p)) and
 * P(F(p, n - p) > F) = I_{(n - p) / (n - p + p F)}((n - p) / 2, p / 2) (Abramowitz and Stegun 1964,
 * 26.6.2 with 26.5.2). 1 when the residuals leave no degrees of freedom; 0 for an exact fit.
 */
export function fTestPValue(b: ArrayLike<number>, xty: ArrayLike<number>, yty: number, rows: number): number {
  const p = b.length;
  if (rows <= p) return 1;
  let ess = 0;
  for (let k = 0; k < p; k++) ess += (b[k] as number) * (xty[k] as number);
  const rss = Math.max(yty - ess, 0);
  if (rss === 0) return ess > 0 ? 0 : 1;
  const f = ess / p / (rss / (rows - p));
  if (!(f > 0)) return 1;
  return regularizedBeta((rows - p) / (rows - p + p * f), (rows - p) / 2, p / 2);
}
