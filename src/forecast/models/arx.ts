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
import { fromAsinhScale, robustScale, toAsinhScale } from './robustAsinh.js';

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
export const ARX_COLUMNS: readonly string[] = Object.freeze([
  'price(d-1,s)',
  'price(d-2,s)',
  'price(d-7,s)',
  'min price(d-1)',
  'max price(d-1)',
  'price(d-1,last)',
  'monday',
  'tuesday',
  'wednesday',
  'thursday',
  'friday',
  'saturday',
]);

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
 * calendar days; a training day is used only when its three lag days are in the history.
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
 * Holden-Day; B. Uniejewski, R. Weron and F. Ziel (2018), Variance stabilizing transformations for
 * electricity spot price forecasting, IEEE Trans. Power Syst. 33(2), 2219-2229,
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
    if (LAGS.every((lag) => view.indexOf(dn - lag) >= 0)) out.push(i);
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
  // The exogenous columns of the day itself, then those of the day before.
  const exo = 2 * view.exogenousNames.length;
  const withDayBefore = (own: readonly Float64Array[], dayBefore: number): readonly Float64Array[] => [...own, ...view.past(dayBefore).exogenous];
  const k = ARX_COLUMNS.length + exo;
  const a = 4 + exo;
  const counts = [...new Set(sizes)].sort((p, q) => p - q);
  const n = counts[counts.length - 1] as number;
  const rowsUsed = training.slice(0, n);
  const scale = windowScale(view, rowsUsed);
  const z = new Map<number, Float64Array>();
  const transformed = (i: number): Float64Array => {
    let grid = z.get(i);
    if (grid === undefined) {
      const prices = view.past(i).prices;
      grid = new Float64Array(prices.length);
      for (let s = 0; s < prices.length; s++) grid[s] = toAsinhScale(prices[s] as number, scale);
      z.set(i, grid);
    }
    return grid;
  };
  const rows = rowsUsed.map((i) => {
    const dn = view.dayNumber(i);
    return dayRegressors(LAGS.map((lag) => transformed(view.indexOf(dn - lag))), view.past(i).weekday, withDayBefore(view.past(i).exogenous, view.indexOf(dn - 1)));
  });
  const responses = rowsUsed.map(transformed);
  const target = dayRegressors(targetLags.map(transformed), view.target.weekday, withDayBefore(view.target.exogenous, targetLags[0] as number));
  const dayLevel = {
    minMaxLast: Float64Array.from(rows.flatMap((r) => [r.min, r.max, r.last])),
    weekdays: Int8Array.from(rows, (r) => r.weekday),
  };
  const watch = settings.stopwatch;
  const builder = timedFits(watch, 0, () => new ArxGramBuilder(dayLevel, counts));
  // Each slot column's source, per training row: the lag grids, the exogenous columns, the response.
  const sources: Float64Array[][] = [
    rows.map((row) => row.lag1),
    rows.map((row) => row.lag2),
    rows.map((row) => row.lag7),
    ...Array.from({ length: exo }, (_, j) => rows.map((row) => row.exogenous[j] as Float64Array)),
    responses,
  ];
  // Laid out slot by slot, then column by column: the a columns of slot s are columns[s a n, (s + 1) a n).
  const columns = slotColumns(S * a * n);
  for (let p = 0; p < a; p++) {
    const source = sources[p] as Float64Array[];
    for (let r = 0; r < n; r++) {
      const grid = source[r] as Float64Array;
      for (let s = 0, at = p * n + r; s < S; s++, at += a * n) columns[at] = grid[s] as number;
    }
  }
  const features = new Float64Array(k);
  const byCount = counts.map(() => new Float64Array(S));
  for (let s = 0; s < S; s++) {
    target.fill(features, s);
    // One model per window; the timed stretch also holds its prediction, a k-term dot product.
    timedFits(watch, counts.length, () =>
      builder.forEachGram(columns.subarray(s * a * n, (s + 1) * a * n), a, s === S - 1, (gram, w) => {
        const z = settings.estimator === 'lasso' ? predictLinear(lassoBic(gram, settings.lasso).model, features) : choleskyPrediction(gram, features);
        (byCount[w] as Float64Array)[s] = fromAsinhScale(z, scale);
      }),
    );
  }
  return new Map(counts.map((c, w) => [c, byCount[w] as Float64Array]));
}

/** Scratch space for the slot columns of a forecast, kept between forecasts (a year of quarter-hours: 2 MiB). */
let columnScratch = new Float64Array(0);

function slotColumns(length: number): Float64Array {
  if (columnScratch.length < length) columnScratch = new Float64Array(length);
  return columnScratch;
}

/** Median and MAD of all prices of the training days. */
function windowScale(view: HistoryView, training: readonly number[]): RobustScale {
  const S = view.slotsPerDay;
  const all = new Float64Array(training.length * S);
  training.forEach((i, r) => all.set(view.past(i).prices, r * S));
  return robustScale(all);
}

/** The regressors of one day (lag grids already transformed). */
interface DayRegressors {
  readonly lag1: Float64Array;
  readonly lag2: Float64Array;
  readonly lag7: Float64Array;
  readonly min: number;
  readonly max: number;
  readonly last: number;
  readonly weekday: number;
  readonly exogenous: readonly Float64Array[];
  /** Writes the day's row of slot s, in the column order of ARX_COLUMNS. */
  fill(out: Float64Array, s: number): void;
}

function dayRegressors(lags: readonly Float64Array[], weekday: number, exogenous: readonly Float64Array[]): DayRegressors {
  const [lag1, lag2, lag7] = lags as [Float64Array, Float64Array, Float64Array];
  let min = Infinity;
  let max = -Infinity;
  for (let s = 0; s < lag1.length; s++) {
    min = Math.min(min, lag1[s] as number);
    max = Math.max(max, lag1[s] as number);
  }
  const last = lag1[lag1.length - 1] as number;
  return {
    lag1,
    lag2,
    lag7,
    min,
    max,
    last,
    weekday,
    exogenous,
    fill(out: Float64Array, s: number): void {
      out[0] = lag1[s] as number;
      out[1] = lag2[s] as number;
      out[2] = lag7[s] as number;
      out[3] = min;
      out[4] = max;
      // In the last slot this regressor equals price(d-1,s): left out there (see ArxGramBuilder).
      out[5] = s === lag1.length - 1 ? 0 : last;
      for (let w = 1; w <= 6; w++) out[5 + w] = weekday === w ? 1 : 0;
      for (let j = 0; j < exogenous.length; j++) out[12 + j] = (exogenous[j] as Float64Array)[s] as number;
    },
  };
}
