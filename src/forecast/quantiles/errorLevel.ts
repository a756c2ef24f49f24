import { medianBySelection } from './driverSpread.js';
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
 * Calendar days before the fit's day whose calibration days are the rows of the weights' regression [days]:
 * a year, the default calibration window; a longer window's older days still give slot medians, levels and
 * lookbacks. (With the 728-day window's two years as rows the test rejected on runs that did not carry
 * over, and cost a known-distribution setting 0.006: docs/forecast-quality.md, "the eighth wave".)
 */
export const ERROR_LEVEL_FIT_DAYS = 364;

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
 * an intercept over the calibration days whose longest lookback lies within the calibration days and
 * that lie within ERROR_LEVEL_FIT_DAYS of the delivery day:
 *   y(d) = sum_k b_k x_k(d) + v(d),
 * and the delivery day's shift is sum_k b_k x_k(delivery day). Without an intercept a window whose
 * errors carry no run predicts a shift near 0 (b estimated near 0); the medians keep spike days from
 * setting the level. Nothing after the last calibration day is read (they all lie before the delivery day).
 * The Forecaster fits this on the driver regression's refit days only and carries the fit to the days
 * until the next ({@link fitErrorLevel}, {@link DayLevels}; forecaster.ts, errorLevelShiftsOf).
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
export function errorLevelShift(dayNumbers: ArrayLike<number>, errors: readonly ArrayLike<number>[], targetDay: number, dayMeans?: ArrayLike<number>): number {
  return errorLevelShifts(dayNumbers, errors, targetDay, dayMeans).target;
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
 */
export function errorLevelShifts(dayNumbers: ArrayLike<number>, errors: readonly ArrayLike<number>[], targetDay: number, dayMeans?: ArrayLike<number>): ErrorLevelShifts {
  const n = errors.length;
  const days = new Float64Array(n);
  const fit = fitErrorLevel(dayNumbers, errors, targetDay, dayMeans);
  const target = fit.weights === null ? null : fit.levels.shift(fit.weights, targetDay, fit.curvature);
  if (target === null) return { target: 0, days };
  for (let d = 0; d < n; d++) days[d] = fit.levels.shift(fit.weights as Float64Array, dayNumbers[d] as number, fit.curvature) ?? 0;
  return { target, days };
}

/**
 * The centring of the quadratic term of {@link fitErrorLevel} with day means: q(t) = (zbar(t - 1) - centre)^2
 * - meanSquare, with centre the mean of zbar(t - 1) over the regression's rows and meanSquare the mean of
 * (zbar(t - 1) - centre)^2 over them (so that q has mean 0 over the rows: without an intercept, an
 * uncentred square would act as one).
 */
export interface LevelCurvature {
  readonly centre: number;
  readonly meanSquare: number;
  /** The least and greatest zbar(t - 1) of the rows: a day's zbar(t - 1) is clamped into them (the square is not extrapolated). */
  readonly low: number;
  readonly high: number;
}

/**
 * What a fit of the day-level regression keeps: the slot medians m_s, the day levels y(d), the weights b (null:
 * not used), and with day means the centring of the quadratic term (null without day means).
 */
export interface ErrorLevelFit {
  readonly slotMedians: Float64Array;
  readonly levels: DayLevels;
  readonly weights: Float64Array | null;
  readonly curvature: LevelCurvature | null;
}

/**
 * The slot medians m_s, day levels y(d) and weights b of {@link errorLevelShift} over the calibration
 * days given (all before the day the fit is made for); weights null when fewer than the longest
 * lookback's days have a whole lookback, the normal equations are singular or the F test does not reject.
 *
 * With `dayMeans` (zbar(d), each calibration day's mean realised price on the error scale) a quadratic
 * term in the day before's price level follows the lookbacks:
 *   y(d) = sum_k b_k x_k(d) + b_q q(d) + v(d),   q(d) = (zbar(d - 1) - c)^2 - Q  (LevelCurvature).
 * The b_k are the ones above (the same rows, sums and F test: with b_q = 0 the shifts are those without
 * day means, bit for bit); b_q is fitted on what they leave, u(d) = y(d) - sum_k b_k x_k(d), as
 * b_q = sum q u / sum q^2, and used only where its own F test (1 and n - 1 degrees of freedom) rejects at
 * ERROR_LEVEL_TEST_SIZE. A day whose zbar(t - 1) lies beyond those of the rows takes the nearest of them
 * (a polynomial term is not extrapolated beyond the data it was fitted on). Why: the driver regression
 * reads the persistent day level linearly from the day before's mean price; where the level's effect on
 * the next day's prices is not linear on the error scale (a convex merit order seen through the asinh
 * scale), the errors' day level varies with the square of the day before's level though not with the
 * errors before it. A second-order term is the first test of such a neglected nonlinearity (the powers of
 * the regressors in Ramsey's 1969 specification test), and its F test keeps it out where the errors do not
 * carry it. (Fitted jointly with the b_k under one F test it moved them too, and cost the demo:
 * docs/forecast-quality.md, "the ninth wave: the level read through the merit order's slope".)
 *
 * Reference: J. B. Ramsey (1969), Tests for specification errors in classical linear least-squares regression
 * analysis, J. R. Stat. Soc. B 31(2), 350-371, doi:10.1111/j.2517-6161.1969.tb00796.x.
 */
export function fitErrorLevel(dayNumbers: ArrayLike<number>, errors: readonly ArrayLike<number>[], fitDay: number, dayMeans?: ArrayLike<number>): ErrorLevelFit {
  const n = errors.length;
  const S = n === 0 ? 0 : (errors[0] as ArrayLike<number>).length;
  const lookbacks = ERROR_LEVEL_LOOKBACK_DAYS;
  const longest = Math.max(...lookbacks);
  // m_s, the slot's median error over the calibration days.
  const column = new Float64Array(n);
  const slotMedians = new Float64Array(S);
  for (let s = 0; s < S; s++) {
    for (let d = 0; d < n; d++) column[d] = (errors[d] as ArrayLike<number>)[s] as number;
    slotMedians[s] = medianBySelection(column);
  }
  // y(d), the day's median error beyond its slots' medians.
  const levels = new DayLevels(n === 0 ? 0 : (dayNumbers[0] as number));
  const work = new Float64Array(S);
  for (let d = 0; d < n; d++) levels.append(dayNumbers[d] as number, dayLevel(errors[d] as ArrayLike<number>, slotMedians, work), dayMeans?.[d] as number);
  if (n === 0) return { slotMedians, levels, weights: null, curvature: null };
  const rows = regressionRows(dayNumbers, fitDay, levels, dayMeans !== undefined);
  if (rows.targets.length < longest) return { slotMedians, levels, weights: null, curvature: null };
  if (dayMeans !== undefined) return fitWithCurvature(rows, slotMedians, levels);
  const p = lookbacks.length;
  const { gram, rhs, yy } = normalEquations(rows, p);
  const b = solveSymmetric(gram, rhs, p);
  if (b === null || !(fTestPValue(b, rhs, yy, rows.targets.length) < ERROR_LEVEL_TEST_SIZE)) return { slotMedians, levels, weights: null, curvature: null };
  return { slotMedians, levels, weights: b, curvature: null };
}

/**
 * The rows of the day-level regression, ascending: each calibration day whose longest lookback lies within the
 * calibration days and that lies within ERROR_LEVEL_FIT_DAYS of the fit's day, with its lookbacks' means
 * x_k(d) (and, `withMeans`, a last entry left for q(d) and the day before's mean price zbar(d - 1)) and its level y(d).
 */
interface RegressionRows {
  readonly features: Float64Array[];
  readonly before: number[];
  readonly targets: number[];
}

function regressionRows(dayNumbers: ArrayLike<number>, fitDay: number, levels: DayLevels, withMeans: boolean): RegressionRows {
  const h = ERROR_LEVEL_LOOKBACK_DAYS.length;
  const longest = Math.max(...ERROR_LEVEL_LOOKBACK_DAYS);
  const first = dayNumbers[0] as number;
  const rows: RegressionRows = { features: [], before: [], targets: [] };
  for (let d = 0; d < dayNumbers.length; d++) {
    const t = dayNumbers[d] as number;
    const x = new Float64Array(withMeans ? h + 1 : h);
    if (t - longest < first || t < fitDay - ERROR_LEVEL_FIT_DAYS || !levels.features(t, x)) continue;
    const previous = withMeans ? levels.meanBefore(t) : Number.NaN;
    if (withMeans && !Number.isFinite(previous)) continue;
    rows.features.push(x);
    rows.before.push(previous);
    rows.targets.push(levels.level(t));
  }
  return rows;
}

/** X'X (p x p), X'y and y'y over the rows' first p features, summed in the rows' order. */
function normalEquations(rows: RegressionRows, p: number): { gram: Float64Array; rhs: Float64Array; yy: number } {
  const gram = new Float64Array(p * p);
  const rhs = new Float64Array(p);
  let yy = 0;
  for (let r = 0; r < rows.targets.length; r++) {
    const x = rows.features[r] as Float64Array;
    const y = rows.targets[r] as number;
    yy += y * y;
    for (let i = 0; i < p; i++) {
      rhs[i] = (rhs[i] as number) + (x[i] as number) * y;
      for (let j = 0; j < p; j++) gram[i * p + j] = (gram[i * p + j] as number) + (x[i] as number) * (x[j] as number);
    }
  }
  return { gram, rhs, yy };
}

/** {@link fitErrorLevel}'s regression with the quadratic term q(d) (the rows with the day before's mean price). */
function fitWithCurvature(rows: RegressionRows, slotMedians: Float64Array, levels: DayLevels): ErrorLevelFit {
  const h = ERROR_LEVEL_LOOKBACK_DAYS.length;
  const p = h + 1;
  const { features, before } = rows;
  const n = features.length;
  // The centring of q over the rows, then q(d) as the rows' last feature.
  let centre = 0;
  for (const v of before) centre += v;
  centre /= n;
  let meanSquare = 0;
  for (const v of before) meanSquare += (v - centre) ** 2;
  meanSquare /= n;
  const curvature = { centre, meanSquare, low: Math.min(...before), high: Math.max(...before) };
  for (let r = 0; r < n; r++) (features[r] as Float64Array)[h] = ((before[r] as number) - centre) ** 2 - meanSquare;
  const { gram, rhs, yy } = normalEquations(rows, p);
  // The lookbacks' weights as 'recent' fits them (the Gram's leading h x h block, its own F test), then the
  // quadratic term's weight on what they leave, with an F test of its own.
  const gh = new Float64Array(h * h);
  for (let i = 0; i < h; i++) for (let j = 0; j < h; j++) gh[i * h + j] = gram[i * p + j] as number;
  const rh = rhs.subarray(0, h);
  const har = solveSymmetric(gh, rh, h);
  const b = new Float64Array(p);
  if (har !== null && fTestPValue(har, rh, yy, n) < ERROR_LEVEL_TEST_SIZE) b.set(har);
  // u = y - sum_k b_k x_k: q'u = q'y - sum_k b_k q'x_k and u'u = y'y - 2 b'X'y + b'X'X b.
  let qu = rhs[h] as number;
  let uu = yy;
  for (let i = 0; i < h; i++) {
    qu -= (b[i] as number) * (gram[h * p + i] as number);
    uu -= 2 * (b[i] as number) * (rhs[i] as number);
    for (let j = 0; j < h; j++) uu += (b[i] as number) * (b[j] as number) * (gram[i * p + j] as number);
  }
  const qq = gram[h * p + h] as number;
  if (qq > 0) {
    const bq = qu / qq;
    if (fTestPValue([bq], [qu], uu, n) < ERROR_LEVEL_TEST_SIZE) b[h] = bq;
  }
  if (b.every((v) => v === 0)) return { slotMedians, levels, weights: null, curvature };
  return { slotMedians, levels, weights: b, curvature };
}

/** y = median over the slots s of (row[s] - slotMedians[s]); `work` holds S values. */
export function dayLevel(row: ArrayLike<number>, slotMedians: Float64Array, work: Float64Array): number {
  for (let s = 0; s < work.length; s++) work[s] = (row[s] as number) - (slotMedians[s] as number);
  return medianBySelection(work);
}

/**
 * The day levels y(d) of the calibration days by day number, appended in ascending order, with running
 * sums over the calendar days from the first (0 for a day without a level, which adds nothing), so that
 * each lookback's mean costs two subtractions.
 */
export class DayLevels {
  /** sums[i] = the sum of y over the days first .. first + i - 1; counts likewise the days with a level. */
  private sums = new Float64Array(65);
  private counts = new Int32Array(65);
  /** means[i] = zbar of day first + i (NaN: none given, or the day has no level). */
  private means = new Float64Array(65).fill(Number.NaN);
  /** Calendar days covered [-]: every day from `first` to first + span - 1 has been appended or has no level. */
  private span = 0;

  constructor(readonly first: number) {}

  /** The last day number whose level (or its absence) is known. */
  get through(): number {
    return this.first + this.span - 1;
  }

  /** Appends day `dayNumber`'s level y, and its mean price zbar if given (days between the last one and it have none). */
  append(dayNumber: number, y: number, mean = Number.NaN): void {
    this.coverThrough(dayNumber - 1);
    this.grow(this.span + 1);
    const i = this.span;
    this.sums[i + 1] = (this.sums[i] as number) + y;
    this.counts[i + 1] = (this.counts[i] as number) + 1;
    this.means[i] = mean;
    this.span++;
  }

  /** zbar of day t - 1 as appended, NaN when that day has no level or no mean. */
  meanBefore(t: number): number {
    const i = t - 1 - this.first;
    return i < 0 || i >= this.span ? Number.NaN : (this.means[i] as number);
  }

  /** States that the days up to `dayNumber` not appended have no level. */
  coverThrough(dayNumber: number): void {
    const upTo = dayNumber - this.first + 1;
    if (upTo <= this.span) return;
    this.grow(upTo);
    for (let i = this.span; i < upTo; i++) {
      this.sums[i + 1] = this.sums[i] as number;
      this.counts[i + 1] = this.counts[i] as number;
      this.means[i] = Number.NaN;
    }
    this.span = upTo;
  }

  /** y of an appended day, as the difference of the running sums (the rounding the lookbacks' means see). */
  level(dayNumber: number): number {
    const i = dayNumber - this.first;
    return (this.sums[i + 1] as number) - (this.sums[i] as number);
  }

  /**
   * x_k(t), the mean of y over the days with a level in [t - k, t - 1] (from `first` on), for the
   * lookbacks k into `out`; false when a lookback holds no such day. Days up to t - 1 must be covered.
   */
  features(t: number, out: Float64Array): boolean {
    const lookbacks = ERROR_LEVEL_LOOKBACK_DAYS;
    const end = t - this.first;
    if (end > this.span || end <= 0) return false;
    for (let k = 0; k < lookbacks.length; k++) {
      const from = Math.max(0, end - (lookbacks[k] as number));
      const count = (this.counts[end] as number) - (this.counts[from] as number);
      if (count === 0) return false;
      out[k] = ((this.sums[end] as number) - (this.sums[from] as number)) / count;
    }
    return true;
  }

  /**
   * sum_k b_k x_k(t), plus b_q q(t) with `curvature` (fitErrorLevel with day means), or null when a lookback
   * of t holds no day (or, with `curvature`, day t - 1 has no mean).
   */
  shift(b: Float64Array, t: number, curvature: LevelCurvature | null = null): number | null {
    const x = this.scratch;
    if (!this.features(t, x)) return null;
    const h = ERROR_LEVEL_LOOKBACK_DAYS.length;
    let shift = 0;
    for (let k = 0; k < h; k++) shift += (b[k] as number) * (x[k] as number);
    if (curvature === null) return shift;
    const previous = this.meanBefore(t);
    if (!Number.isFinite(previous)) return null;
    const clamped = Math.min(Math.max(previous, curvature.low), curvature.high);
    return shift + (b[h] as number) * ((clamped - curvature.centre) ** 2 - curvature.meanSquare);
  }

  private readonly scratch = new Float64Array(ERROR_LEVEL_LOOKBACK_DAYS.length);

  /** Room for `length` days. */
  private grow(length: number): void {
    if (this.sums.length > length) return;
    const size = Math.max(length, 2 * (this.sums.length - 1));
    const sums = new Float64Array(size + 1);
    const counts = new Int32Array(size + 1);
    const means = new Float64Array(size + 1).fill(Number.NaN);
    sums.set(this.sums);
    counts.set(this.counts);
    means.set(this.means);
    this.sums = sums;
    this.counts = counts;
    this.means = means;
  }
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
