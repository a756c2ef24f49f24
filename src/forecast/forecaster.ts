/**
 * Quantile forecasts of day-ahead prices from price history (docs/design.md section 6): for one delivery
 * day of a history, using only the days before it and the delivery day's own exogenous columns.
 *
 * Methods (point model + how the quantiles are made):
 * - `naive-hs`: seasonal naive (same slot `naiveLagDays` days back) + historical simulation;
 * - `arx-hs`: ARX by least squares on asinh prices, averaged over windows + historical simulation
 *   of its errors on the asinh scale;
 * - `lasso-hs`: the same ARX fitted by LASSO (BIC) + historical simulation on the asinh scale;
 * - `arx-conformal`: the ARX average + split conformal intervals on the asinh scale;
 * - `qra`: quantile regression averaging of the per-window forecasts of `qraModel`.
 * Every method's quantiles are repaired by monotone rearrangement. Optional whole-day scenario paths
 * add past days' error vectors to the method's point forecast (for `qra`, the `qraModel` average),
 * on the scale of `errorScale`.
 *
 * Calibration: the out-of-sample errors (or, for `qra`, the point forecasts) of the last
 * `calibrationDays` calendar days before the delivery day that could be forecast; each of those
 * days' forecasts is itself made from the days before it, so nothing after the delivery day, and
 * nothing of its prices, is ever read (HistoryView enforces it). Point forecasts of past days are
 * kept in the Forecaster, so a run over consecutive days fits each day's models once.
 */
import type { PriceHistory, QuantileDay } from '../types.js';
import { ArgumentError } from '../stats/argumentError.js';
import type { LassoOptions } from './linalg/lasso.js';
import { LASSO_DEFAULTS } from './linalg/lasso.js';
import type { FitStopwatch } from './fitStopwatch.js';
import { arxForecast } from './models/arx.js';
import { InsufficientHistoryError } from './models/errors.js';
import { GridCache, HistoryView } from './models/historyView.js';
import type { PointForecast } from './models/pointForecast.js';
import { seasonalNaive } from './models/seasonalNaive.js';
import { fromSlotGrid, slotLayout } from './models/slotGrid.js';
import { errorPaths } from './quantiles/errorPaths.js';
import { asinhErrorScale, PRICE_SCALE, type ErrorScale } from './quantiles/errorScale.js';
import { historicalSimulation } from './quantiles/historicalSimulation.js';
import { requireLevels } from './quantiles/levels.js';
import { QraWarmStarts, quantileRegressionAveraging } from './quantiles/quantileRegressionAveraging.js';
import { rearrangeDay } from './quantiles/rearrangeDay.js';
import { conformalQuantiles } from './quantiles/splitConformal.js';
import { DEFAULT_CALIBRATION_DAYS, FORECAST_METHODS, type ForecastMethod } from './forecastMethods.js';

export { DEFAULT_METHOD, FORECAST_METHODS, type ForecastMethod } from './forecastMethods.js';

/** Point models the methods are built on. */
export type PointModelName = 'naive' | 'arx' | 'lasso';

/** Settings of the forecaster; see {@link DEFAULTS}. */
export interface ForecastOptions {
  /** Calibration window lengths of the ARX and LASSO models [calendar days]; their forecasts are averaged. */
  readonly windowsDays: readonly number[];
  /** Fewest usable training days in every window for an ARX/LASSO forecast [days], >= 2. */
  readonly minTrainingDays: number;
  /** Calibration days: errors (or QRA rows) of at most this many calendar days before the delivery day [days]. */
  readonly calibrationDays: number;
  /** Fewest calibration days that could be forecast for a quantile forecast to be made [days], >= 2. */
  readonly minCalibrationDays: number;
  /** Lag of the seasonal naive model of `naive-hs` [days], >= 1 (7: same weekday last week). */
  readonly naiveLagDays: number;
  /** Point model whose per-window forecasts `qra` averages. */
  readonly qraModel: 'arx' | 'lasso';
  /** Whole-day scenario paths per delivery day [-], 0 for none, at most calibrationDays. */
  readonly scenarioPaths: number;
  /** LASSO path settings of `lasso-hs` (and of `qra` with qraModel 'lasso'). */
  readonly lasso: LassoOptions;
  /**
   * Scale on which the calibration errors of `*-hs`, `arx-conformal` and the paths are measured:
   * 'model', the point model's own (the asinh scale for ARX and LASSO, prices for the seasonal
   * naive), or 'price' (P - P_hat for every model). `qra` works on prices either way.
   */
  readonly errorScale: 'model' | 'price';
  /**
   * Adds the time spent fitting models (least squares and LASSO per slot and window, QRA's quantile
   * regressions; see fitStopwatch.ts) to this counter, with the clock the caller hands in
   * (benchmarks). It never changes a forecast and is no part of a forecast's identity (see
   * {@link forecastSettings}). Default none.
   */
  readonly stopwatch?: FitStopwatch;
}

/** The options that decide the forecasts: all but the stopwatch (for cache keys and summaries). */
export function forecastSettings(options: Partial<ForecastOptions>): Partial<Omit<ForecastOptions, 'stopwatch'>> {
  const { stopwatch: _measuresOnly, ...settings } = options;
  return settings;
}

/**
 * Defaults: windows of 56, 91, 182 and 364 days (two short, two long: Hubicka, Marcjasz and Weron
 * 2019 found mixing short and long windows best), at least 28 usable training days per window,
 * 364 calibration days (at least 28), the weekly naive lag, QRA over the ARX windows, no paths, the
 * LASSO path of LASSO_DEFAULTS (20 penalties down to lambda_max / 100), and errors on the point
 * model's scale. A year of calibration days holds every season and puts about 18 errors beyond each
 * 5% level of a clock slot, against 9 in half a year; with errors on the asinh scale it gave the
 * best-calibrated forecasts of the demo market (docs/forecast-quality.md).
 */
export const DEFAULTS: ForecastOptions = Object.freeze({
  windowsDays: Object.freeze([56, 91, 182, 364]),
  minTrainingDays: 28,
  calibrationDays: DEFAULT_CALIBRATION_DAYS,
  minCalibrationDays: 28,
  naiveLagDays: 7,
  qraModel: 'arx',
  scenarioPaths: 0,
  lasso: LASSO_DEFAULTS,
  errorScale: 'model',
});

/** A quantile forecast of one delivery day, with what it was made from. */
export interface DayForecast {
  /** Quantiles per delivery period, rearranged (non-decreasing in the level). */
  readonly quantiles: QuantileDay;
  /** The underlying point forecast per delivery period [currency/MWh]. */
  readonly point: readonly number[];
  /** Whole-day scenario paths, paths[j][t] [currency/MWh]; empty unless options.scenarioPaths > 0. */
  readonly paths: readonly (readonly number[])[];
  /** Calibration days used [-]. */
  readonly calibrationDays: number;
  /** Clock slots whose quantiles crossed and were sorted [-]. */
  readonly crossedSlots: number;
  /** Remarks a report should show, e.g. conformal intervals widened to the largest error. */
  readonly notes: readonly string[];
}

/**
 * Makes quantile forecasts for the days of one price history and keeps the per-day point forecasts
 * and QRA warm starts between calls (memoisation only: the answer for a day never depends on which
 * days were asked before).
 *
 * @example
 * const forecaster = new Forecaster(history, { calibrationDays: 91 });
 * const day = forecaster.forecast(history.days.length - 1, [0.1, 0.5, 0.9], 'arx-hs');
 */
export class Forecaster {
  readonly options: ForecastOptions;
  private readonly grids: GridCache | undefined;
  private readonly points = new Map<PointModelName, (PointForecast | null | undefined)[]>();
  private readonly warmStarts = new QraWarmStarts();

  constructor(
    private readonly history: PriceHistory,
    options: Partial<ForecastOptions> = {},
  ) {
    this.options = validateOptions({ ...DEFAULTS, ...options });
    const first = history.days[0];
    this.grids = first === undefined ? undefined : new GridCache(history.exogenousNames, slotLayout(first.periods, 'history.days[0].periods').slotsPerDay);
  }

  /**
   * The quantile forecast of delivery day `history.days[dayIndex]` at `levels` by `method`.
   *
   * @throws ForecastInputError for bad levels or a day index outside the history
   * @throws InsufficientHistoryError when the days before are too few for the method
   */
  forecast(dayIndex: number, levels: readonly number[], method: ForecastMethod): DayForecast {
    requireLevels(levels);
    if (!(FORECAST_METHODS as readonly string[]).includes(method)) {
      throw new ArgumentError('method', `one of ${FORECAST_METHODS.join(', ')}`, method);
    }
    const view = HistoryView.before(this.history, dayIndex, this.grids);
    const model = pointModelOf(method, this.options);
    const point = this.pointFor(model, dayIndex, view);
    if (point === null) {
      throw new InsufficientHistoryError(view.target.day, `the ${model} point forecast`, this.historyNeeded(model), view.pastCount);
    }
    const calibration = this.calibrationSet(model, view);
    if (calibration.length < this.options.minCalibrationDays) {
      throw new InsufficientHistoryError(view.target.day, `${method} calibration`, this.options.minCalibrationDays, calibration.length);
    }
    const scale = this.errorScaleOf(model, calibration);
    const centre = point.mean.map(scale.to);
    const errors = calibration.map((c) => Float64Array.from(c.realised, (p, s) => scale.to(p) - scale.to(c.forecast.mean[s] as number)));
    const notes: string[] = [];
    let grid: number[][];
    if (method === 'qra') {
      grid = quantileRegressionAveraging(
        point.members,
        {
          members: calibration.map((c) => c.forecast.members),
          realised: calibration.map((c) => c.realised),
          dayIds: Int32Array.from(calibration, (c) => c.dayNumber),
        },
        levels,
        this.warmStarts,
        this.options.stopwatch,
      );
    } else if (method === 'arx-conformal') {
      const conformal = conformalQuantiles(centre, errors, levels);
      if (conformal.clamped) notes.push(`too few calibration days (${calibration.length}) for the outermost levels: the largest absolute error was used`);
      grid = conformal.prices;
    } else {
      grid = historicalSimulation(centre, errors, levels);
    }
    if (method !== 'qra') grid = grid.map((row) => row.map(scale.from));
    const { prices, crossedRows } = rearrangeDay(grid);
    const layout = view.target.layout;
    const paths = errorPaths(centre, errors, this.options.scenarioPaths).map((path) => fromSlotGrid(path.map(scale.from), layout));
    return {
      quantiles: {
        day: view.target.day,
        levels: [...levels],
        periods: view.target.periods,
        prices: Array.from(layout.slots, (s) => prices[s] as number[]),
      },
      point: fromSlotGrid(point.mean, layout),
      paths,
      calibrationDays: calibration.length,
      crossedSlots: crossedRows,
      notes,
    };
  }

  /** The point forecast of past or delivery day `dayIndex`, made from the days before it, memoised. */
  private pointFor(model: PointModelName, dayIndex: number, view?: HistoryView): PointForecast | null {
    let cache = this.points.get(model);
    if (cache === undefined) {
      cache = [];
      this.points.set(model, cache);
    }
    let forecast = cache[dayIndex];
    if (forecast === undefined) {
      forecast = makePointForecast(view ?? HistoryView.before(this.history, dayIndex, this.grids), model, this.options);
      cache[dayIndex] = forecast;
    }
    return forecast;
  }

  /** The scale of the calibration errors: the point model's own for 'model', else prices. */
  private errorScaleOf(model: PointModelName, calibration: readonly { realised: Float64Array }[]): ErrorScale {
    if (this.options.errorScale === 'price' || model === 'naive') return PRICE_SCALE;
    return asinhErrorScale(concatenate(calibration.map((c) => c.realised)));
  }

  /** The calibration days before the delivery day that could be forecast, oldest first. */
  private calibrationSet(model: PointModelName, view: HistoryView) {
    const first = view.target.dayNumber - this.options.calibrationDays;
    const out: { dayNumber: number; forecast: PointForecast; realised: Float64Array }[] = [];
    for (let i = view.indexAtOrBefore(first - 1) + 1; i < view.pastCount; i++) {
      const forecast = this.pointFor(model, i);
      if (forecast === null) continue;
      out.push({ dayNumber: view.dayNumber(i), forecast, realised: view.past(i).prices });
    }
    return out;
  }

  private historyNeeded(model: PointModelName): number {
    return model === 'naive' ? this.options.naiveLagDays : 7 + this.options.minTrainingDays;
  }
}

/**
 * One-shot form of {@link Forecaster}: the forecast of one delivery day. For many days of the same
 * history use one Forecaster, which reuses the point forecasts of past days.
 */
export function forecastDay(
  history: PriceHistory,
  dayIndex: number,
  levels: readonly number[],
  method: ForecastMethod,
  options: Partial<ForecastOptions> = {},
): DayForecast {
  return new Forecaster(history, options).forecast(dayIndex, levels, method);
}

function pointModelOf(method: ForecastMethod, options: ForecastOptions): PointModelName {
  switch (method) {
    case 'naive-hs':
      return 'naive';
    case 'lasso-hs':
      return 'lasso';
    case 'qra':
      return options.qraModel;
    case 'arx-hs':
    case 'arx-conformal':
      return 'arx';
  }
}

function makePointForecast(view: HistoryView, model: PointModelName, options: ForecastOptions): PointForecast | null {
  if (model === 'naive') return seasonalNaive(view, options.naiveLagDays);
  return arxForecast(view, {
    windowsDays: options.windowsDays,
    estimator: model === 'lasso' ? 'lasso' : 'least-squares',
    lasso: options.lasso,
    minTrainingDays: options.minTrainingDays,
    stopwatch: options.stopwatch,
  });
}

function validateOptions(o: ForecastOptions): ForecastOptions {
  const positiveInteger = (name: string, v: number, min = 1): void => {
    if (!Number.isInteger(v) || v < min) throw new ArgumentError(`options.${name}`, `an integer >= ${min}`, v);
  };
  if (o.windowsDays.length === 0) throw new ArgumentError('options.windowsDays', 'at least one window length', o.windowsDays);
  o.windowsDays.forEach((w, i) => positiveInteger(`windowsDays[${i}]`, w, o.minTrainingDays));
  positiveInteger('minTrainingDays', o.minTrainingDays, 2);
  positiveInteger('minCalibrationDays', o.minCalibrationDays, Math.max(2, o.windowsDays.length + 2));
  positiveInteger('calibrationDays', o.calibrationDays, o.minCalibrationDays);
  positiveInteger('naiveLagDays', o.naiveLagDays);
  positiveInteger('scenarioPaths', o.scenarioPaths, 0);
  if (o.scenarioPaths > o.calibrationDays) {
    throw new ArgumentError('options.scenarioPaths', `at most calibrationDays = ${o.calibrationDays}`, o.scenarioPaths);
  }
  if (o.qraModel !== 'arx' && o.qraModel !== 'lasso') throw new ArgumentError('options.qraModel', "'arx' or 'lasso'", o.qraModel);
  if (o.errorScale !== 'model' && o.errorScale !== 'price') throw new ArgumentError('options.errorScale', "'model' or 'price'", o.errorScale);
  return o;
}

/** The arrays one after the other in one array. */
function concatenate(arrays: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(arrays.reduce((n, a) => n + a.length, 0));
  let at = 0;
  for (const a of arrays) {
    out.set(a, at);
    at += a.length;
  }
  return out;
}
