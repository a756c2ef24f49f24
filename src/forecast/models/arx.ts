import { choleskyPrediction } from '../linalg/choleskyLeastSquares.js';
import type { LassoOptions } from '../linalg/lasso.js';
import { lassoBic } from '../linalg/lasso.js';
import { predictLinear } from '../linalg/linearModel.js';
import type { FitStopwatch } from '../fitStopwatch.js';
import { timedFits } from '../fitStopwatch.js';
import { ArxGramBuilder } from './arxGram.js';
import type { HistoryView } from './historyView.js';
import type { PointForecast } from './pointForecast.js';
import { averageMembers } from './pointForecast.js';
import type { RobustScale } from './robustAsinh.js';
import { fromAsinhScale, toAsinhScale } from './robustAsinh.js';

/** How the ARX coefficients are estimated. */
export type ArxEstimator = 'least-squares' | 'lasso';

/** Settings of the ARX point model. */
export interface ArxSettings {
  /** Calibration window lengths [calendar days before the delivery day]; one fit per window, averaged. */
  readonly windowsDays: readonly number[];
  readonly estimator: ArxEstimator;
  /** LASSO path settings (estimator 'lasso'). */
  readonly lasso: LassoOptions;
  /** Fewest usable training days in every window for a forecast to be made [days]. */
  readonly minTrainingDays: number;
  /** Adds the time spent fitting (Grams and solves, per slot and window) to this counter. Default none. */
  readonly stopwatch?: FitStopwatch;
}

/**
 * Names of the ARX regressors, in column order, before the exogenous columns (those of the day
 * itself, then those of the day before, each in the history's order).
 */
export const ARX_COLUMNS: readonly string[] = Object.freeze(['price(d-1,s)', 'price(d-2,s)', 'price(d-7,s)', 'min price(d-1)', 'max price(d-1)', 'price(d-1,last)', ...weekdayColumns()]);

/** Names of the weekday dummies, Monday to Saturday (Sunday is the reference). */
export function weekdayColumns(): string[] {
  return ['monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday'];
}

const LAGS = [1, 2, 7] as const;

/**
 * Per-slot ARX point forecast on asinh-transformed prices, averaged over calibration windows.
 *
 * Model, one per clock slot s and calibration window, fitted on the days d' of the window:
 *   Z(d',s) = b0 + b1 Z(d'-1,s) + b2 Z(d'-2,s) + b3 Z(d'-7,s)
 *             + b4 min_t Z(d'-1,t) + b5 max_t Z(d'-1,t) + b6 Z(d'-1,S-1)
 *             + sum_{w = Mon..Sat} c_w D_w(d') + sum_j (g_j X_j(d',s) + h_j X_j(d'-1,s)) + e(d',s),
 * an autoregression with exogenous inputs (ARX; Box and Jenkins 1970) on the same slot 1, 2 and 7
 * days back, the previous day's minimum, maximum and last slot, weekday dummies (Sunday is the
 * reference) and the exogenous columns X_j of day d' itself (known before gate closure) and of the
 * day before (as in the LEAR model of Lago et al. 2021; with them the model can tell the part of
 * yesterday's price that yesterday's load and renewables explain from a persistent price level);
 * in the last slot, where Z(d'-1,S-1) is the lag-1 regressor itself, b6 is left out. Lags are
 * calendar days; a training day is used only when its three lag days are in the history. Every price
 * regressor (the lags, min, max and last) is read clipped at Tukey's far-out fences [Q1 - 3 IQR,
 * Q3 + 3 IQR] of the training days' prices, on the Z scale, in the fit and in the forecast alike (see
 * fitWindows; Tukey 1977); the response is not clipped. Each window's forecast is held within the
 * lowest and highest Z of the training days.
 * Z = asinh((P - a) / b) with a, b the median and normalised MAD of all prices of the training days
 * of the longest window (Uniejewski, Weron and Ziel 2018), one transformation per delivery day shared
 * by its windows, so that each shorter window is a prefix of the longest and one pass over the days
 * serves them all; the forecast is mapped back with P = a + b sinh(Z).
 * Estimation: least squares (Cholesky on the standardised normal equations) or LASSO with BIC, both
 * with a free intercept. The forecast of the delivery day is the arithmetic mean over the windows of
 * the back-transformed forecasts (Hubicka, Marcjasz and Weron 2019). A lag day of the delivery day
 * missing from the history is replaced by the latest earlier day.
 *
 * References: G. E. P. Box and G. M. Jenkins (1970), Time Series Analysis: Forecasting and Control,
 * Holden-Day; J. W. Tukey (1977), Exploratory Data Analysis, Addison-Wesley, section 2H;
 * B. Uniejewski, R. Weron and F. Ziel (2018), Variance stabilizing transformations for electricity
 * spot price forecasting, IEEE Trans. Power Syst. 33(2), 2219-2229,
 * doi:10.1109/TPWRS.2017.2734563; K. Hubicka, G. Marcjasz and R. Weron (2019), A note on averaging
 * day-ahead electricity price forecasts across calibration windows, IEEE Trans. Sustain. Energy
 * 10(1), 321-323, doi:10.1109/TSTE.2018.2869557; J. Lago, G. Marcjasz, B. De Schutter and R. Weron
 * (2021), Forecasting day-ahead electricity prices: a review of state-of-the-art algorithms, best
 * practices and an open-access benchmark, Applied Energy 293, 116983,
 * doi:10.1016/j.apenergy.2021.116983.
 *
 * @returns the forecast (members = one per window, in the order of windowsDays), or null when a
 *   window has fewer than minTrainingDays usable days or no past day lies 7 days before the delivery
 *   day or earlier
 */
export function arxForecast(view: HistoryView, settings: ArxSettings): PointForecast | null {
  const targetLags = LAGS.map((lag) => view.indexAtOrBefore(view.target.dayNumber - lag));
  if (targetLags.some((i) => i < 0)) return null;
  const longest = Math.max(...settings.windowsDays);
  // Training days of the longest window, most recent first; each window is a prefix of them.
  const training = usableTrainingDays(view, view.target.dayNumber - longest).reverse();
  const sizeOf = (windowDays: number): number => {
    const first = view.target.dayNumber - windowDays;
    let count = 0;
    while (count < training.length && view.dayNumber(training[count] as number) >= first) count++;
    return count;
  };
  const sizes = settings.windowsDays.map(sizeOf);
  if (sizes.some((size) => size < settings.minTrainingDays)) return null;
  const forecasts = fitWindows(view, training, sizes, targetLags, settings);
  const members = sizes.map((size) => forecasts.get(size) as Float64Array);
  return { mean: averageMembers(members), members };
}

/** Past days on or after day number `first` whose lag days 1, 2 and 7 are all in the history (ascending). */
function usableTrainingDays(view: HistoryView, first: number): number[] {
  const out: number[] = [];
  for (let i = view.indexAtOrBefore(first - 1) + 1; i < view.pastCount; i++) {
    const dn = view.dayNumber(i);
    let usable = true;
    for (const lag of LAGS) usable &&= view.indexOf(dn - lag) >= 0;
    if (usable) out.push(i);
  }
  return out;
}

/**
 * Fits one model per slot and window (windows = the first `size` training days) and forecasts the
 * delivery day on the price scale; returns the forecast per slot for each distinct window size.
 */
function fitWindows(
  view: HistoryView,
  training: readonly number[],
  sizes: readonly number[],
  targetLags: readonly number[],
  settings: ArxSettings,
): Map<number, Float64Array> {
  const S = view.slotsPerDay;
  const names = view.exogenousNames.length;
  // The exogenous columns of the day itself, then those of the day before.
  const exo = 2 * names;
  const k = ARX_COLUMNS.length + exo;
  const a = 4 + exo;
  const counts = [...new Set(sizes)].sort((p, q) => p - q);
  const n = counts[counts.length - 1] as number;
  const rowsUsed = training.slice(0, n);
  const longest = Math.max(...settings.windowsDays);
  // Median and MAD of all prices of the training days (robustScale, kept sorted from one window to the
  // next), and the far-out fences and ends of the same prices.
  const { scale, bounds } = view.robustScaleWithBoundsOf(rowsUsed, longest);
  // The price lags are clipped at the far-out fences of the training days' prices, on the model's scale
  // (the transformation is increasing, so clipping at the transformed fences equals transforming the
  // clipped prices), as the driver regression clips its lags (farOutFences.ts, Tukey 1977): Z is linear
  // in the lags and P = a + b sinh(Z), so a lag far beyond what the fit saw (yesterday's spike) would be
  // extrapolated and sent back exponentially (medians of 1e6 and 1e12 on a market capped at 4 000). The
  // response is left as it is. Clipping is monotone: min, max and last of the clipped day are those of
  // the day, clipped. A fit whose training days hold spikes in the response can still extrapolate from
  // clipped lags (a point forecast of 27 120 on that market), so each window's forecast is also held
  // within the lowest and highest price of the training days: a centre beyond every price the fit saw
  // is an extrapolation, not a view of the market (the cases: docs/forecast-quality.md).
  const low = toAsinhScale(bounds.fences.low, scale);
  const high = toAsinhScale(bounds.fences.high, scale);
  const lowest = toAsinhScale(bounds.lowest, scale);
  const highest = toAsinhScale(bounds.highest, scale);
  const clip = (v: number): number => (v < low ? low : v > high ? high : v);
  // The past days the forecast reads, each transformed once: by row, the positions of its own day
  // (the response, its exogenous columns) and of its lag days (lag 1 also gives the day before's
  // exogenous columns and the min, max and last).
  const days = new PastDays(view.pastCount);
  const own = new Int32Array(n);
  const lag1 = new Int32Array(n);
  const lag2 = new Int32Array(n);
  const lag7 = new Int32Array(n);
  const weekdays = new Int8Array(n);
  for (let r = 0; r < n; r++) {
    const i = rowsUsed[r] as number;
    const dn = view.dayNumber(i);
    own[r] = days.use(i);
    lag1[r] = days.use(view.indexOf(dn - 1));
    lag2[r] = days.use(view.indexOf(dn - 2));
    lag7[r] = days.use(view.indexOf(dn - 7));
    weekdays[r] = view.past(i).weekday;
  }
  const [t1, t2, t7] = targetLags.map((i) => days.use(i)) as [number, number, number];
  const grids = days.transform(view, S, scale);
  const { z, exogenous, min, max, last } = grids;
  // The entries of the lag columns (lag1, lag2, lag7 of each row) whose day has a price beyond the
  // fences, the only ones clipping can change: clipped after each slot's columns are gathered.
  const clipAt: number[] = [];
  const farOut = (d: number): boolean => (min[d] as number) < low || (max[d] as number) > high;
  for (let r = 0; r < n; r++) {
    if (farOut(lag1[r] as number)) clipAt.push(r);
    if (farOut(lag2[r] as number)) clipAt.push(n + r);
    if (farOut(lag7[r] as number)) clipAt.push(2 * n + r);
  }
  const minMaxLast = new Float64Array(3 * n);
  for (let r = 0; r < n; r++) {
    const d = lag1[r] as number;
    minMaxLast[3 * r] = clip(min[d] as number);
    minMaxLast[3 * r + 1] = clip(max[d] as number);
    minMaxLast[3 * r + 2] = clip(last[d] as number);
  }
  const watch = settings.stopwatch;
  const builder = timedFits(watch, 0, () => new ArxGramBuilder({ minMaxLast, weekdays }, counts));
  const columns = new Float64Array(n * a);
  const features = new Float64Array(k);
  const targetExogenous = view.target.exogenous;
  const byCount = counts.map(() => new Float64Array(S));
  for (let s = 0; s < S; s++) {
    // The slot's columns, each over the training rows: lag1, lag2, lag7, the exogenous columns of the
    // day and of the day before, the response.
    for (let r = 0; r < n; r++) {
      columns[r] = z[(lag1[r] as number) * S + s] as number;
      columns[n + r] = z[(lag2[r] as number) * S + s] as number;
      columns[2 * n + r] = z[(lag7[r] as number) * S + s] as number;
      columns[(a - 1) * n + r] = z[(own[r] as number) * S + s] as number;
    }
    for (const at of clipAt) columns[at] = clip(columns[at] as number);
    for (let j = 0; j < names; j++) {
      const xs = j * S + s;
      const dayStride = names * S;
      const ownAt = (3 + j) * n;
      const beforeAt = (3 + names + j) * n;
      for (let r = 0; r < n; r++) {
        columns[ownAt + r] = exogenous[(own[r] as number) * dayStride + xs] as number;
        columns[beforeAt + r] = exogenous[(lag1[r] as number) * dayStride + xs] as number;
      }
    }
    // The delivery day's regressors, in the column order of ARX_COLUMNS; in the last slot `last`
    // equals price(d-1,s) and is left out (see ArxGramBuilder).
    features[0] = clip(z[t1 * S + s] as number);
    features[1] = clip(z[t2 * S + s] as number);
    features[2] = clip(z[t7 * S + s] as number);
    features[3] = clip(min[t1] as number);
    features[4] = clip(max[t1] as number);
    features[5] = s === S - 1 ? 0 : clip(last[t1] as number);
    for (let w = 1; w <= 6; w++) features[5 + w] = view.target.weekday === w ? 1 : 0;
    for (let j = 0; j < names; j++) {
      features[12 + j] = (targetExogenous[j] as Float64Array)[s] as number;
      features[12 + names + j] = exogenous[(t1 * names + j) * S + s] as number;
    }
    // One model per window; the timed stretch also holds its prediction, a k-term dot product.
    timedFits(watch, counts.length, () =>
      builder.forEachGram(columns, a, s === S - 1, (gram, w) => {
        const value = settings.estimator === 'lasso' ? predictLinear(lassoBic(gram, settings.lasso).model, features) : choleskyPrediction(gram, features);
        (byCount[w] as Float64Array)[s] = fromAsinhScale(value < lowest ? lowest : value > highest ? highest : value, scale);
      }),
    );
  }
  return new Map(counts.map((c, w) => [c, byCount[w] as Float64Array]));
}

/**
 * The past days a forecast reads, numbered in the order first used, and their grids laid out day by
 * day (z[d S + s] for slot s of S): the transformed prices, the exogenous columns (exogenous[(d J + j)
 * S + s] for column j of J) and each day's min, max and last transformed price. Day by day, each day is
 * written in one run (its exogenous columns copied whole), and the slot-by-slot reads of the fits step
 * through the same few cache lines from one slot to the next. The grids are scratch space kept between
 * forecasts: a forecast reads some 370 days.
 */
class PastDays {
  private readonly position: Int32Array;
  private readonly order: number[] = [];

  constructor(pastCount: number) {
    this.position = new Int32Array(pastCount).fill(-1);
  }

  /** The number of past day i among the days used (numbered on first use). */
  use(i: number): number {
    let d = this.position[i] as number;
    if (d < 0) {
      d = this.order.length;
      this.position[i] = d;
      this.order.push(i);
    }
    return d;
  }

  get count(): number {
    return this.order.length;
  }

  /** The grids of the days used, transformed with `scale` (asinh, robustAsinh.ts). */
  transform(view: HistoryView, S: number, scale: RobustScale): { z: Float64Array; exogenous: Float64Array; min: Float64Array; max: Float64Array; last: Float64Array } {
    const D = this.order.length;
    const names = view.exogenousNames.length;
    const z = scratch(0, S * D);
    const exogenous = scratch(1, names * S * D);
    const min = new Float64Array(D);
    const max = new Float64Array(D);
    const last = new Float64Array(D);
    const index = new Map<Float64Array, number>();
    for (let d = 0; d < D; d++) {
      const past = view.past(this.order[d] as number);
      const prices = past.prices;
      index.set(prices, d);
      let low = Infinity;
      let high = -Infinity;
      for (let s = 0; s < prices.length; s++) {
        const value = toAsinhScale(prices[s] as number, scale);
        z[d * S + s] = value;
        low = Math.min(low, value);
        high = Math.max(high, value);
      }
      min[d] = low;
      max[d] = high;
      last[d] = z[d * S + prices.length - 1] as number;
      for (let j = 0; j < names; j++) exogenous.set(past.exogenous[j] as Float64Array, (d * names + j) * S);
    }
    keptTransform = { scale, z, S, index };
    return { z, exogenous, min, max, last };
  }
}

/**
 * The grid of transformed prices of the last ARX fit (in the scratch buffer, until the next fit) and
 * the row of each day's price array, to be read once more: the calibration errors of the same delivery day are measured with the same scale
 * (robustScale of the same days, the same object from daySetScale.ts).
 */
let keptTransform: { scale: RobustScale; z: Float64Array; S: number; index: Map<Float64Array, number> } | null = null;

/**
 * Writes asinh((p_s - a) / b) of a past day's prices into `out` from the last ARX fit's grid, when that
 * fit transformed this day (the same price array) with this very scale object: the same numbers as
 * toAsinhScale, without computing them again.
 *
 * @returns false (and `out` untouched) when the last fit did not transform this day with `scale`
 */
export function keptAsinhDay(scale: RobustScale, prices: Float64Array, out: Float64Array): boolean {
  const kept = keptTransform;
  if (kept === null || kept.scale !== scale || prices.length !== kept.S) return false;
  const d = kept.index.get(prices);
  if (d === undefined) return false;
  out.set(kept.z.subarray(d * kept.S, (d + 1) * kept.S));
  return true;
}

/** Scratch buffers of the slot-by-slot grids, kept between forecasts and grown as needed. */
const scratchBuffers = [new Float64Array(0), new Float64Array(0)];

function scratch(which: 0 | 1, length: number): Float64Array {
  if ((scratchBuffers[which] as Float64Array).length < length) scratchBuffers[which] = new Float64Array(length);
  return scratchBuffers[which] as Float64Array;
}

