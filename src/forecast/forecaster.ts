/**
 * Quantile forecasts of day-ahead prices from price history (DESIGN.md section 6): for one delivery
 * day of a history, using only the days before it and the delivery day's own exogenous columns.
 *
 * Methods (point model + how the quantiles are made):
 * - `naive-hs`: seasonal naive (same slot `naiveLagDays` days back) + historical simulation;
 * - `arx-hs`: ARX by least squares on asinh prices, averaged over windows + historical simulation;
 * - `lasso-hs`: the same ARX fitted by LASSO (BIC) + historical simulation;
 * - `arx-conformal`: the ARX average + split conformal intervals;
 * - `qra`: quantile regression averaging of the per-window forecasts of `qraModel`.
 * Every method's quantiles are repaired by monotone rearrangement. Optional whole-day scenario paths
 * add past days' error vectors to the method's point forecast (for `qra`, the `qraModel` average).
 *
 * Calibration: the out-of-sample errors (or, for `qra`, the point forecasts) of the last
 * `calibrationDays` calendar days before the delivery day that could be forecast; each of those
 * days' forecasts is itself made from the days before it, so nothing after the delivery day, and
 * nothing of its prices, is ever read (HistoryView enforces it). Point forecasts of past days are
 * kept in the Forecaster, so a run over consecutive days fits each day's models once.
 */
import type { PriceHistory, QuantileDay } from '../types.js';
import { ArgumentError } from '../stats/argument-error.js';
import type { LassoOptions } from './linalg/lasso.js';
import { LASSO_DEFAULTS } from './linalg/lasso.js';
import { arxForecast } from './models/arx.js';
import { InsufficientHistoryError } from './models/errors.js';
import { GridCache, HistoryView } from './models/historyView.js';
import type { PointForecast } from './models/pointForecast.js';
import { seasonalNaive } from './models/seasonalNaive.js';
import { fromAsinhScale, robustScale, toAsinhScale } from './models/robustAsinh.js';
import { fromSlotGrid, slotLayout } from './models/slotGrid.js';
import { errorPaths } from './quantiles/errorPaths.js';
import { historicalSimulation } from './quantiles/historicalSimulation.js';
import { requireLevels } from './quantiles/levels.js';
import { QraWarmStarts, quantileRegressionAveraging } from './quantiles/quantileRegressionAveraging.js';
import { rearrangeDay } from './quantiles/rearrangeDay.js';
import { conformalQuantiles } from './quantiles/splitConformal.js';

/** Method names, for the CLI's `--method`. */
export const FORECAST_METHODS = ['naive-hs', 'arx-hs', 'lasso-hs', 'arx-conformal', 'qra'] as const;
export type ForecastMethod = (typeof FORECAST_METHODS)[number];

/**
 * The method `quantbid forecast` uses when none is named: the one with the lowest CRPS among those
 * that met the coverage targets on the demo market (docs/forecast-quality.md).
 */
export const DEFAULT_METHOD: ForecastMethod = 'arx-conformal';

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
  /** Scale of the calibration errors: 'price' or 'asinh'. */
  readonly errorScale: 'price' | 'asinh';
}

/**
 * Defaults: windows of 56, 91, 182 and 364 days (two short, two long: Hubicka, Marcjasz and Weron
 * 2019 found mixing short and long windows best), at least 28 usable training days per window,
 * 182 calibration days (at least 28), the weekly naive lag, QRA over the ARX windows, no paths, and
 * the LASSO path of LASSO_DEFAULTS (20 penalties down to lambda_max / 100).
 */
export const DEFAULTS: ForecastOptions = Object.freeze({
  windowsDays: Object.freeze([56, 91, 182, 364]),
  minTrainingDays: 28,
  calibrationDays: 182,
  minCalibrationDays: 28,
  naiveLagDays: 7,
  qraModel: 'arx',
  scenarioPaths: 0,
  lasso: LASSO_DEFAULTS,
  errorScale: 'price',
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
    const scale = this.options.errorScale === 'asinh' ? robustScale(concatenate(calibration.map((c) => c.realised))) : null;
    const toScale = (p: number): number => (scale === null ? p : toAsinhScale(p, scale));
    const fromScale = (z: number): number => (scale === null ? z : fromAsinhScale(z, scale));
    const centre = scale === null ? point.mean : point.mean.map(toScale);
    let errors = scale === null ? calibration.map((c) => c.errors) : calibration.map((c) => Float64Array.from(c.realised, (p, s) => toScale(p) - toScale(c.forecast.mean[s] as number)));
    const lambda = Number(process.env.FHS ?? '0');
    let sigmaTarget = 1;
    if (lambda > 0) {
      // v per calibration-able day: mean squared error of the day; sigma of day c from the days before it.
      const vol = (dayNumbers: number[], v: number[], at: number): number => {
        let sw = 0;
        let sv = 0;
        for (let j = 0; j < dayNumbers.length; j++) {
          const age = at - 1 - (dayNumbers[j] as number);
          if (age < 0 || age > 75) continue;
          const w = lambda ** age;
          sw += w;
          sv += w * (v[j] as number);
        }
        return sw > 0 ? Math.sqrt(sv / sw) : NaN;
      };
      const extended = this.calibrationSet(model, view, this.options.calibrationDays + 76);
      const dn = extended.map((c) => c.dayNumber);
      const v = extended.map((c) => {
        let sum = 0;
        c.realised.forEach((p, s) => (sum += (toScale(p) - toScale(c.forecast.mean[s] as number)) ** 2));
        return sum / c.realised.length;
      });
      const sig = calibration.map((c) => vol(dn, v, c.dayNumber));
      errors = errors.map((e, i) => e.map((x) => x / (sig[i] as number)));
      const keep = sig.map((x) => Number.isFinite(x));
      errors = errors.filter((_, i) => keep[i]);
      sigmaTarget = vol(dn, v, view.target.dayNumber);
    }
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
      );
    } else if (method === 'arx-conformal') {
      const conformal = conformalQuantiles(centre, errors, levels);
      if (conformal.clamped) notes.push(`too few calibration days (${calibration.length}) for the outermost levels: the largest absolute error was used`);
      grid = conformal.prices;
    } else {
      grid = historicalSimulation(centre, errors, levels);
    }
    if (sigmaTarget !== 1) grid = grid.map((row, s) => row.map((q) => (centre[s] as number) + sigmaTarget * (q - (centre[s] as number))));
    if (scale !== null && method !== 'qra') grid = grid.map((row) => row.map(fromScale));
    const { prices, crossedRows } = rearrangeDay(grid);
    const layout = view.target.layout;
    const paths = errorPaths(centre, errors, this.options.scenarioPaths).map((path) => fromSlotGrid(path.map(fromScale), layout));
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

  /** The calibration days before the delivery day that could be forecast, oldest first. */
  private calibrationSet(model: PointModelName, view: HistoryView, days = this.options.calibrationDays) {
    const first = view.target.dayNumber - days;
    const out: { dayNumber: number; forecast: PointForecast; realised: Float64Array; errors: Float64Array }[] = [];
    for (let i = view.indexAtOrBefore(first - 1) + 1; i < view.pastCount; i++) {
      const forecast = this.pointFor(model, i);
      if (forecast === null) continue;
      const realised = view.past(i).prices;
      const errors = Float64Array.from(realised, (p, s) => p - (forecast.mean[s] as number));
      out.push({ dayNumber: view.dayNumber(i), forecast, realised, errors });
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
  return o;
}

function concatenate(arrays: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(arrays.reduce((n, a) => n + a.length, 0));
  let at = 0;
  for (const a of arrays) {
    out.set(a, at);
    at += a.length;
  }
  return out;
}
