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
import { arxForecast, keptAsinhDay } from './models/arx.js';
import { toAsinhScales } from './models/robustAsinh.js';
import { DriverFits, driverForecast, refitDayOf } from './models/driverRegression.js';
import { KeptFits } from './keptFits.js';
import { InsufficientHistoryError } from './models/errors.js';
import { dayNumberOf, GridCache, HistoryView } from './models/historyView.js';
import type { PointForecast } from './models/pointForecast.js';
import { seasonalNaive } from './models/seasonalNaive.js';
import { fromSlotGrid, slotLayout } from './models/slotGrid.js';
import { asinhErrorScaleOf, PRICE_SCALE, type ErrorScale } from './quantiles/errorScale.js';
import { driverSpreadQuantiles, fitSpreadModel, SpreadFeatureRows, spreadFeatures, type SpreadPool } from './quantiles/driverSpread.js';
import type { LinearModel } from './linalg/linearModel.js';
import { historicalSimulation } from './quantiles/historicalSimulation.js';
import { dayLevel, fitErrorLevel, type ErrorLevelFit, type ErrorLevelShifts } from './quantiles/errorLevel.js';
import { PoolOrder } from './quantiles/poolOrder.js';
import { requireLevels } from './quantiles/levels.js';
import { QraWarmStarts, quantileRegressionAveraging } from './quantiles/quantileRegressionAveraging.js';
import { rearrangeDay } from './quantiles/rearrangeDay.js';
import { scenarioPaths } from './paths/scenarioPaths.js';
import { daySeed } from './paths/seededStream.js';
import { crpsFromQuantiles } from './scoring/crps.js';
import { residualLoadColumns } from './models/residualLoad.js';
import { plausibleRanges, withinRange, type PriceRange } from './plausibleRange.js';
import { conformalQuantiles } from './quantiles/splitConformal.js';
import { averageForecast } from './quantileAverage.js';
import { chosenCandidate, type ChosenCandidate } from './autoChoices.js';
import { AUTO_CANDIDATES, AUTO_FALLBACK, AUTO_VALIDATION_DAYS, DEFAULT_CALIBRATION_DAYS, DEFAULT_PATH_SEED, entryMembers, FORECAST_METHODS, MAX_PATHS, type AutoCandidate, type AutoEntry, type ForecastMethod, type SingleMethod } from './forecastMethods.js';

export { AUTO_CANDIDATES, AUTO_FALLBACK, AUTO_SINGLE_CANDIDATES, AUTO_VALIDATION_DAYS, DEFAULT_METHOD, FORECAST_METHODS, MAX_PATHS, type AutoAverage, type AutoCandidate, type AutoEntry, type ForecastMethod, type SingleMethod } from './forecastMethods.js';

/** What `auto` chose for a day (a method and window, or a quantile average of several), and on what evidence. */
export interface AutoChoice extends ChosenCandidate {
  /** Validation days the candidates were compared on [-] (0: none yet, the first candidate that could forecast was taken). */
  readonly validationDays: number;
  /** Mean pinball loss of the chosen candidate over the validation days [currency/MWh], or null without any. */
  readonly validationLoss: number | null;
}

/** A calibration day: its point forecast (made from the days before it), realised prices and drivers. */
interface CalibrationDay {
  readonly dayNumber: number;
  readonly forecast: PointForecast;
  readonly realised: Float64Array;
  readonly exogenous: readonly Float64Array[];
}

/** What the methods of one point model and calibration window share for a delivery day. */
interface CalibrationState {
  readonly calibration: readonly CalibrationDay[];
  readonly scale: ErrorScale;
  /** The point forecast on the error scale, per slot. */
  readonly centre: Float64Array;
  /** errors[d][s] of the calibration days on the error scale. */
  readonly errors: readonly Float64Array[];
  /** The calibration days' point forecasts on the error scale, [d][s] (what their errors were taken from). */
  readonly forecastsOnScale: readonly Float64Array[];
  /** What `driver-hs` and `driver-fhs` add to their quantiles on the error scale (options.driverCentre 'recent'; else 0). */
  readonly centreShift: number;
}

/** Levels added to the asked ones for the paths' marginals (their tails). */
const PATH_TAIL_LEVELS: readonly number[] = Object.freeze([0.001, 0.005, 0.01, 0.02, 0.03, 0.04, 0.96, 0.97, 0.98, 0.99, 0.995, 0.999]);

/** Point models the methods are built on. */
export type PointModelName = 'naive' | 'arx' | 'lasso' | 'drivers';

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
  /**
   * Calibration window lengths of the driver regression [calendar days]; their forecasts are averaged.
   * Default 182, 364 and 728: one model per clock slot with 15 coefficients rests on one observation a
   * day, and on the known-distribution bench adding the 728-day window's lower estimation noise helped
   * every setting of its own draw; without the 182-day window one setting of a fresh draw lost
   * (docs/forecast-quality.md). A window longer than the history uses all of it.
   */
  readonly driverWindowsDays: readonly number[];
  /** Hinge knots of the residual load in the driver regression [-]. */
  readonly driverKnots: number;
  /** Scale the driver regression is fitted on (and its errors measured on, with errorScale 'model'). */
  readonly driverScale: 'asinh' | 'price';
  /**
   * Refit cadence of the driver regression [days], >= 1: its coefficients are estimated on the day
   * numbers that are multiples of it, each from the days before, and every delivery day until the next
   * refit uses them with its own drivers and lags (driverRegression.ts, DriverSettings.refitDays); so is
   * driver-fhs's spread regression, fitted on the refit day's calibration days and applied to each
   * delivery day's own errors and features (refitDaySpreadModel). 1 fits every day afresh. Default 5: `auto`'s year takes 0.7x the CPU of daily refits, with pinball losses
   * within 0.002 of theirs on every setting of two draws of the known-distribution bench
   * (docs/forecast-quality.md, section "Speed of `auto`").
   */
  readonly driverRefitDays: number;
  /**
   * Candidates of `auto`, in order of preference (a tie or a day without validation days goes to the
   * first that can forecast): single methods with their calibration windows, and `{ averageOf }`, the
   * equal-weight quantile average of two or more of them (quantileAverage.ts). Candidates with a member
   * needing residual-load columns are left out for a history without them. AUTO_SINGLE_CANDIDATES is
   * `auto` before the seventh wave's average.
   */
  readonly autoCandidates: readonly AutoEntry[];
  /**
   * What `auto` forecasts with when the history cannot serve any of autoCandidates (it has no
   * residual-load columns and every candidate needs them).
   */
  readonly autoFallback: AutoCandidate;
  /** Validation days of `auto`: the most recent days before the delivery day it scores the candidates on [days], >= 1. */
  readonly autoValidationDays: number;
  /** How `driver-fhs` pools the standardised errors: per clock slot, over all slots, or over all slots weighted by the point forecast's level. */
  readonly spreadPool: SpreadPool;
  /**
   * The centre of `driver-hs` and `driver-fhs`: 'recent', every quantile of the day shifted by the level
   * of the recent calibration errors beyond the pool's, by weights estimated on the calibration days and
   * used only where an F test at 1% finds the recent errors' level predictive, and the pool made of the
   * errors of the forecasts shifted the same way (quantiles/errorLevel.ts: an intercept correction,
   * Clements and Hendry 1996, by a heterogeneous autoregression of the errors' day level, Corsi 2009),
   * the weights estimated on the refit days of driverRefitDays (errorLevelShiftsOf); 'recent-quadratic'
   * (default), 'recent' and then, on what its weights leave, a weight of the centred square of the day
   * before's mean realised price on the error scale with an F test of its own (errorLevel.ts,
   * fitErrorLevel with day means; the same forecasts as 'recent' where that test does not reject);
   * 'pool', the point forecast plus the error pool's quantiles as they are (the default before the eighth
   * wave). 'recent' brought the demo's share below the median from 0.479 to 0.492 and its CRPS from 5.007
   * to 4.978 (docs/forecast-quality.md, "the eighth wave: `recent` the default"); 'recent-quadratic' takes
   * `auto` on convex-hetero from 1.076 / 1.092 / 1.094 the truth's pinball loss (own draw and two fresh
   * ones) to 1.067 / 1.082 / 1.076, every other known-distribution cell within 0.002 and the demo the
   * same (docs/forecast-quality.md, "the ninth wave: the level read through the merit order's slope").
   */
  readonly driverCentre: 'pool' | 'recent' | 'recent-quadratic';
  /**
   * How the driver regression reads the day before's price level: 'mean' (the default), its mean price and
   * mean residual load as linear columns; 'shift', besides those, as a shift of the residual load: the
   * residual-load offset D the slot curves read off the day before's prices (inverse prediction), with the
   * hinges evaluated at x + lambda D, lambda from {0, 0.5, 1} per fit (driverRegression.ts,
   * residualLoadShift.ts; docs/forecast-quality.md, "the tenth wave").
   */
  readonly driverLevel?: 'mean' | 'shift';
  /** Lag of the seasonal naive model of `naive-hs` [days], >= 1 (7: same weekday last week). */
  readonly naiveLagDays: number;
  /** Point model whose per-window forecasts `qra` averages. */
  readonly qraModel: 'arx' | 'lasso';
  /**
   * Whole-day scenario paths per delivery day [-], 0 for none (at most MAX_PATHS): the Schaake shuffle
   * of the method's quantiles by the calibration days' whole-day errors (paths/scenarioPaths.ts).
   */
  readonly scenarioPaths: number;
  /** Seed of the paths [-], an integer; each day's paths are drawn with daySeed(pathSeed, day). */
  readonly pathSeed: number;
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
  driverWindowsDays: Object.freeze([182, 364, 728]),
  driverKnots: 3,
  driverScale: 'asinh',
  driverRefitDays: 5,
  spreadPool: 'level',
  driverCentre: 'recent-quadratic',
  autoCandidates: AUTO_CANDIDATES,
  autoFallback: AUTO_FALLBACK,
  autoValidationDays: AUTO_VALIDATION_DAYS,
  naiveLagDays: 7,
  qraModel: 'arx',
  scenarioPaths: 0,
  pathSeed: DEFAULT_PATH_SEED,
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
  /** With method `auto`: the candidate chosen for this day; otherwise null. */
  readonly chosen: AutoChoice | null;
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
  private readonly driverWarmStarts = new QraWarmStarts();
  /** The driver regression's fits on its refit days (speed only: a fit depends only on the days before its day). */
  private readonly driverFits = new DriverFits();
  /** driver-fhs's spread regressions by calibration window and the refit day they were fitted on (speed only: see refitDaySpreadModel). */
  private readonly spreadModels = new KeptFits<string, LinearModel>();
  private readonly losses = new Map<string, number | null>();
  /** Candidates' forecasts of days not yet scored (the days `auto` forecast last), by candidate and day. */
  private readonly pending = new Map<string, DayForecast | InsufficientHistoryError>();
  private readonly states = new Map<string, CalibrationState>();
  /** The delivery day (day number) whose calibration states `states` holds. */
  private statesDay = Number.NaN;
  /** The arrays of the kept states' grids, by point model, window and grid (see dayViews). */
  private readonly stateBlocks = new Map<string, Float64Array>();
  /** driverCentre 'recent': the day-level fits of the refit days and the scale of each (speed only: see errorLevelShiftsOf). */
  private readonly errorLevelFits = new KeptFits<string, ErrorLevelFit & { readonly scale: ErrorScale }>();
  /** The error pools' order at the last historical simulation, by point model and calibration window (speed only). */
  private readonly poolOrders = new Map<string, PoolOrder>();
  /** Per history day, the price range beyond which `auto` passes a candidate's forecast over (made when first needed). */
  private ranges: (PriceRange | null)[] | undefined;
  /** driver-fhs's spread features of the calibration days, kept between delivery days (speed only). */
  private readonly spreadFeatureRows = new SpreadFeatureRows();
  /** The view of the last day asked (its candidates and point models read the same one; speed only). */
  private lastView: { readonly dayIndex: number; readonly view: HistoryView } | undefined;

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
    if (method === 'auto') return this.autoForecast(dayIndex, levels);
    return this.forecastWith(dayIndex, levels, method, this.options.calibrationDays);
  }

  /**
   * `auto`: rolling-origin validation (Tashman 2000). Each candidate forecasts every one of the
   * `autoValidationDays` most recent history days before the delivery day, each from the days before
   * that day only, and is scored by the mean pinball loss of those forecasts against the realised prices
   * (the days every candidate could forecast); the candidate with the lowest loss forecasts the delivery
   * day. Nothing of the delivery day or after it is read. A candidate's forecast of a past day is the
   * same whatever day it is validated for, so it is scored once and kept. A candidate whose delivery-day
   * forecast leaves the plausible range (plausibleRange.ts: beyond the prices of the days before by
   * their own span) is passed over for the next best, unless every candidate's does.
   *
   * Reference: L. J. Tashman (2000), Out-of-sample tests of forecasting accuracy: an analysis and review,
   * Int. J. Forecast. 16(4), 437-450, doi:10.1016/S0169-2070(00)00065-0.
   */
  private autoForecast(dayIndex: number, levels: readonly number[]): DayForecast {
    const entries = this.autoCandidates();
    const levelsKey = levels.join(',');
    const validation: number[] = [];
    for (let j = dayIndex - 1; j >= 0 && validation.length < this.options.autoValidationDays; j--) validation.push(j);
    const losses = entries.map((): (number | null)[] => []);
    validation.forEach((j, v) => this.validationLosses(entries, j, levels, levelsKey).forEach((l, i) => ((losses[i] as (number | null)[])[v] = l)));
    const common = validation.flatMap((_, v) => (losses.every((l) => l[v] !== null) ? [v] : []));
    const totals = losses.map((l) => common.reduce((sum, v) => sum + (l[v] as number), 0));
    const order = entries.map((_, i) => i).sort((p, q) => (common.length === 0 ? p - q : (totals[p] as number) - (totals[q] as number) || p - q));
    // Every candidate forecasts the delivery day now: the chosen one's forecast is the answer, and all of
    // them are scored when this day becomes a validation day (its prices are then known).
    const made = this.entryForecasts(entries, dayIndex, levels, levelsKey);
    const able = order.filter((i) => !((made[i] as DayForecast | InsufficientHistoryError) instanceof InsufficientHistoryError));
    // A candidate whose forecast runs far beyond every price seen before is passed over (plausibleRange.ts).
    this.ranges ??= plausibleRanges(this.history);
    const range = this.ranges[dayIndex] ?? null;
    const chosen = able.find((i) => withinRange((made[i] as DayForecast).quantiles.prices, range)) ?? able[0];
    if (chosen === undefined) throw made[0] as InsufficientHistoryError;
    const validationLoss = common.length === 0 ? null : (totals[chosen] as number) / common.length;
    return { ...(made[chosen] as DayForecast), chosen: { ...chosenCandidate(entries[chosen] as AutoEntry), validationDays: common.length, validationLoss } };
  }

  /**
   * Each entry's forecast of day j: a single candidate's own, or the quantile average of its members'
   * (quantileAverage.ts), or the reason it has none (a member's, when any member cannot forecast the
   * day). Each single candidate forecasts the day once, those on the ARX first (evaluationOrder).
   */
  private entryForecasts(entries: readonly AutoEntry[], j: number, levels: readonly number[], levelsKey: string): (DayForecast | InsufficientHistoryError)[] {
    const singles = new Map<string, DayForecast | InsufficientHistoryError>();
    for (const c of this.evaluationOrder(entries.flatMap(entryMembers))) singles.set(candidateKey(c), this.candidateForecast(c, j, levels, levelsKey));
    return entries.map((entry) => {
      const members = entryMembers(entry).map((c) => singles.get(candidateKey(c)) as DayForecast | InsufficientHistoryError);
      const failed = members.find((f) => f instanceof InsufficientHistoryError);
      if (failed !== undefined || members.length === 1) return failed ?? (members[0] as DayForecast);
      return averageForecast(members as DayForecast[]);
    });
  }

  /**
   * The single candidates in the order their forecasts of a day are made, each once: those on the ARX
   * first, then the others in their order. Only the speed depends on it (each forecast is the same
   * whatever was made before): the ARX fit of a day keeps its training days' prices on the asinh
   * scale of its window (keptAsinhDay), and another candidate's calibration on a window of the same
   * days then reads them instead of computing them again.
   */
  private evaluationOrder(candidates: readonly AutoCandidate[]): AutoCandidate[] {
    const unique = [...new Map(candidates.map((c) => [candidateKey(c), c])).values()];
    const onArx = (c: AutoCandidate) => (pointModelOf(c.method, this.options) === 'arx' ? 0 : 1);
    return unique.map((c, i) => ({ c, i })).sort((p, q) => onArx(p.c) - onArx(q.c) || p.i - q.i).map(({ c }) => c);
  }

  /** A candidate's forecast of day j (kept until its loss is scored), or the reason it has none. */
  private candidateForecast(candidate: AutoCandidate, j: number, levels: readonly number[], levelsKey: string): DayForecast | InsufficientHistoryError {
    const key = `${candidateKey(candidate)}|${levelsKey}|${j}`;
    const kept = this.pending.get(key);
    if (kept !== undefined) return kept;
    let made: DayForecast | InsufficientHistoryError;
    try {
      made = this.forecastWith(j, levels, candidate.method, candidate.calibrationDays);
    } catch (err) {
      if (!(err instanceof InsufficientHistoryError)) throw err;
      made = err;
    }
    this.pending.set(key, made);
    return made;
  }

  /**
   * The entries of `auto` this history can serve (those with a member on residual load need its
   * columns), else the fallback alone.
   */
  private autoCandidates(): readonly AutoEntry[] {
    const drivers = residualLoadColumns(this.history.exogenousNames) !== null;
    const served = this.options.autoCandidates.filter((e) => drivers || entryMembers(e).every((c) => pointModelOf(c.method, this.options) !== 'drivers'));
    return served.length > 0 ? served : [this.options.autoFallback];
  }

  /**
   * Mean pinball loss of each entry's forecast of past day j, or null where it cannot forecast it
   * (kept by entry and day); the single candidates' forecasts of day j are then dropped.
   */
  private validationLosses(entries: readonly AutoEntry[], j: number, levels: readonly number[], levelsKey: string): (number | null)[] {
    const keys = entries.map((e) => `${entryMembers(e).map(candidateKey).join('+')}|${levelsKey}|${j}`);
    if (keys.every((k) => this.losses.has(k))) return keys.map((k) => this.losses.get(k) as number | null);
    const made = this.entryForecasts(entries, j, levels, levelsKey);
    const realised = (this.history.days[j] as PriceHistory['days'][number]).pricePerMwh;
    const out = made.map((f, i) => {
      let loss: number | null = null;
      if (!(f instanceof InsufficientHistoryError)) {
        let sum = 0;
        f.quantiles.prices.forEach((row, t) => (sum += crpsFromQuantiles(realised[t] as number, row, levels)));
        loss = sum / realised.length;
      }
      this.losses.set(keys[i] as string, loss);
      return loss;
    });
    for (const c of entries.flatMap(entryMembers)) this.pending.delete(`${candidateKey(c)}|${levelsKey}|${j}`);
    return out;
  }

  /** The forecast of day `dayIndex` by one method with a calibration window of `calibrationDays`. */
  private forecastWith(dayIndex: number, levels: readonly number[], method: SingleMethod, calibrationDays: number): DayForecast {
    // Before this day's view and states are built: the refit day's forecast may have to be made first.
    const refitSpreadModel = method === 'driver-fhs' ? this.refitDaySpreadModel(dayIndex, levels, calibrationDays) : undefined;
    const view = this.viewBefore(dayIndex);
    const model = pointModelOf(method, this.options);
    const point = this.pointFor(model, dayIndex, view);
    if (point === null) {
      throw new InsufficientHistoryError(view.target.day, `the ${model} point forecast`, this.historyNeeded(model), view.pastCount);
    }
    const { calibration, scale, centre, errors, forecastsOnScale, centreShift } = this.calibrationState(model, view, point, calibrationDays);
    if (calibration.length < this.options.minCalibrationDays) {
      throw new InsufficientHistoryError(view.target.day, `${method} calibration`, this.options.minCalibrationDays, calibration.length);
    }
    const notes: string[] = [];
    // driver-fhs's spread regression, fitted once for the day's levels and its paths' levels alike.
    let spreadModel: LinearModel | undefined;
    /** The method's quantiles at levels `at`, per slot, on the price scale, before rearrangement. */
    const quantileStep = (at: readonly number[]): number[][] => {
      /** Quantile regression of the realised prices on `regressors` of the calibration days (QRA's solver). */
      const regressionQuantiles = (target: readonly ArrayLike<number>[], regressors: (c: CalibrationDay) => readonly ArrayLike<number>[], warmStarts: QraWarmStarts) =>
        quantileRegressionAveraging(
          target,
          { members: calibration.map(regressors), realised: calibration.map((c) => c.realised), dayIds: Int32Array.from(calibration, (c) => c.dayNumber) },
          at,
          warmStarts,
          this.options.stopwatch,
          at === levels ? notes : undefined,
        );
      let grid: number[][];
      if (method === 'qra') {
        grid = regressionQuantiles(point.members, (c) => c.forecast.members, this.warmStarts);
      } else if (method === 'arx-conformal') {
        const conformal = conformalQuantiles(centre, errors, at);
        if (conformal.clamped && at === levels) notes.push(`too few calibration days (${calibration.length}) for the outermost levels: the largest absolute error was used`);
        grid = conformal.prices;
      } else if (method === 'driver-qr') {
        grid = regressionQuantiles([point.mean, ...view.target.exogenous], (c) => [c.forecast.mean, ...c.exogenous], this.driverWarmStarts);
      } else if (method === 'driver-fhs') {
        const asinh = scale.robust !== undefined;
        const features = calibration.map((c, d) => this.spreadFeatureRows.of(c.exogenous, forecastsOnScale[d] as Float64Array, asinh));
        const kept = { order: this.poolOrder(model, calibrationDays, 'standardised'), dayIds: Int32Array.from(calibration, (c) => c.dayNumber) };
        spreadModel ??= refitSpreadModel ?? this.keptSpreadModel(calibrationDays, view.target.dayNumber, fitSpreadModel({ errors, features }, centre.length));
        grid = driverSpreadQuantiles(centre, spreadFeatures(view.target.exogenous, centre, asinh), { errors, features, rows: this.spreadFeatureRows }, at, this.options.spreadPool, kept, spreadModel);
      } else {
        grid = historicalSimulation(centre, errors, at, { order: this.poolOrder(model, calibrationDays), dayIds: Int32Array.from(calibration, (c) => c.dayNumber) });
      }
      if (method === 'qra' || method === 'driver-qr') return grid;
      const shift = method === 'driver-hs' || method === 'driver-fhs' ? centreShift : 0;
      return shift === 0 ? grid.map((row) => row.map(scale.from)) : grid.map((row) => row.map((v) => scale.from(v + shift)));
    };
    const { prices, crossedRows } = rearrangeDay(quantileStep(levels));
    const layout = view.target.layout;
    const paths = this.options.scenarioPaths === 0 ? [] : this.dayPaths(view, levels, quantileStep, errors);
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
      chosen: null,
    };
  }

  /**
   * Whole-day paths of the delivery day: the Schaake shuffle (paths/scenarioPaths.ts) of the method's
   * own quantiles, at the asked levels and at tail levels down to 0.001 and up to 0.999 (so that the
   * paths carry the method's tails, not a straight continuation of its outermost levels), reordered by
   * the ranks of the calibration days' whole-day errors. Seeded per day by options.pathSeed.
   */
  private dayPaths(view: HistoryView, levels: readonly number[], quantileStep: (at: readonly number[]) => number[][], errors: readonly Float64Array[]): number[][] {
    const pathLevels = [...new Set([...PATH_TAIL_LEVELS, ...levels])].sort((a, b) => a - b);
    const grid = rearrangeDay(quantileStep(pathLevels)).prices;
    const layout = view.target.layout;
    const quantileDay = { day: view.target.day, levels: pathLevels, periods: view.target.periods, prices: Array.from(layout.slots, (s) => grid[s] as number[]) };
    return scenarioPaths({ quantileDay, template: errors, n: this.options.scenarioPaths, seed: daySeed(this.options.pathSeed, view.target.dayNumber) });
  }

  /**
   * The calibration days, error scale, centre and errors of a delivery day for a point model and window,
   * kept for the methods that share them (e.g. driver-hs and driver-fhs under auto) until another day asks.
   */
  private calibrationState(model: PointModelName, view: HistoryView, point: PointForecast, calibrationDays: number): CalibrationState {
    const key = `${model}|${calibrationDays}|${view.target.dayNumber}`;
    const kept = this.states.get(key);
    if (kept !== undefined) return kept;
    const calibration = this.calibrationSet(model, view, calibrationDays);
    const scale = calibration.length === 0 ? PRICE_SCALE : this.errorScaleOf(model, calibration, calibrationDays);
    const centre = point.mean.map(scale.to);
    // Only one day's states are kept (below), so the last day's arrays of this model and window take the new grids.
    if (this.statesDay !== view.target.dayNumber) this.states.clear();
    const forecastsOnScale = this.dayViews(`${model}|${calibrationDays}|forecasts`, calibration.map((c) => c.forecast.mean.length));
    const errors = this.dayViews(`${model}|${calibrationDays}|errors`, calibration.map((c) => c.realised.length));
    calibration.forEach((c, d) => errorsOn(c, scale, errors[d] as Float64Array, forecastsOnScale[d] as Float64Array));
    let centreShift = 0;
    if (model === 'drivers' && this.options.driverCentre !== 'pool') {
      const shifts = this.errorLevelShiftsOf(model, view, calibration, scale, errors, forecastsOnScale, calibrationDays);
      if (shifts !== null) {
        centreShift = shifts.target;
        // The pool holds the errors of the shifted forecasts, as the delivery day's quantiles are made.
        errors.forEach((e, d) => {
          const v = shifts.days[d] as number;
          for (let s = 0; s < e.length; s++) e[s] = (e[s] as number) - v;
        });
      }
    }
    const state = { calibration, scale, centre, errors, forecastsOnScale, centreShift };
    // Only one day's states are kept: its methods ask for them one after the other. (Clearing at a size
    // instead dropped a day's driver state between driver-hs and driver-fhs every third day.)
    this.statesDay = view.target.dayNumber;
    this.states.set(key, state);
    return state;
  }

  /**
   * driverCentre 'recent' under the refit cadence of the driver regression (options.driverRefitDays, k):
   * the slot medians, the error scale and the weights of the day-level regression (errorLevel.ts) are
   * those of the refit day R, the latest day number on or before the delivery day that is a multiple of
   * k, estimated on R's calibration days (all before R); every day's level y(d) is measured on R's scale
   * against R's slot medians, and each day's shift sum_k b_k x_k(d) from the levels of the days before it
   * back to R's first calibration day, so that from R until the next refit a calibration day keeps its
   * shift (its errors in the pool move only with the delivery day's scale). Null when R's weights are not
   * used (too few days, singular, the F test does not reject) or the delivery day lacks a lookback: no
   * shift at all. Nothing on or after the delivery day is read, and R's fit is the same whatever day
   * asks for it first (made from the history before R alone), so a day's forecast does not depend on
   * which days were asked before it.
   *
   * With driverCentre 'recent-quadratic' every day's level comes with its mean realised price on the same
   * scale (the quadratic term of fitErrorLevel).
   *
   * @param calibration the delivery day's calibration days, with `errors` on its scale `scale` (before any shift)
   *   and their point forecasts on it, `forecastsOnScale`
   */
  private errorLevelShiftsOf(
    model: PointModelName,
    view: HistoryView,
    calibration: readonly CalibrationDay[],
    scale: ErrorScale,
    errors: readonly Float64Array[],
    forecastsOnScale: readonly Float64Array[],
    calibrationDays: number,
  ): ErrorLevelShifts | null {
    const dayNumber = view.target.dayNumber;
    const refitDay = refitDayOf(dayNumber, this.options.driverRefitDays);
    const quadratic = this.options.driverCentre === 'recent-quadratic';
    const key = `${model}|${calibrationDays}|${refitDay}`;
    let fit = this.errorLevelFits.get(key);
    if (fit === undefined) {
      if (refitDay === dayNumber) {
        const means = quadratic ? errors.map((e, d) => realisedMean(e, forecastsOnScale[d] as Float64Array)) : undefined;
        fit = { ...fitErrorLevel(Int32Array.from(calibration, (c) => c.dayNumber), errors, refitDay, means), scale };
      } else {
        const days = this.calibrationSet(model, view, calibrationDays, refitDay);
        const refitScale = days.length === 0 ? PRICE_SCALE : this.errorScaleOf(model, days, calibrationDays);
        const onScale = days.map((c) => levelInputsOn(c, refitScale, quadratic));
        const means = quadratic ? onScale.map((d) => d.mean) : undefined;
        fit = { ...fitErrorLevel(Int32Array.from(days, (c) => c.dayNumber), onScale.map((d) => d.e), refitDay, means), scale: refitScale };
      }
      this.errorLevelFits.set(key, fit);
    }
    const { weights, levels, slotMedians, curvature } = fit;
    if (weights === null) return null;
    // The days from R on not yet measured (those before the delivery day), each once, on R's scale, ascending.
    if (levels.through < dayNumber - 1) {
      const work = new Float64Array(slotMedians.length);
      for (const c of this.calibrationSet(model, view, dayNumber - 1 - levels.through)) {
        const { e, mean } = levelInputsOn(c, fit.scale, quadratic);
        levels.append(c.dayNumber, dayLevel(e, slotMedians, work), mean);
      }
      levels.coverThrough(dayNumber - 1);
    }
    const target = levels.shift(weights, dayNumber, curvature);
    if (target === null) return null;
    return { target, days: Float64Array.from(calibration, (c) => levels.shift(weights, c.dayNumber, curvature) ?? 0) };
  }

  /**
   * Arrays of the given lengths, views one after the other of the array kept under `key` (grown by a
   * quarter at least when short; values left by the last day, to be written): a state's grids reuse those of the last day's
   * state, which nothing reads once that day's states are dropped (DayForecasts keep none of them).
   */
  private dayViews(key: string, lengths: readonly number[]): Float64Array[] {
    const total = lengths.reduce((sum, length) => sum + length, 0);
    let block = this.stateBlocks.get(key);
    if (block === undefined || block.length < total) {
      block = new Float64Array(Math.max(total, Math.ceil(1.25 * (block?.length ?? 0))));
      this.stateBlocks.set(key, block);
    }
    let at = 0;
    return lengths.map((length) => (block as Float64Array).subarray(at, (at += length)));
  }

  /** The kept order of the historical-simulation pools of a point model and calibration window (of its errors or driver-fhs's standardised ones). */
  private poolOrder(model: PointModelName, calibrationDays: number, errors: 'errors' | 'standardised' = 'errors'): PoolOrder {
    const key = `${model}|${calibrationDays}|${errors}`;
    let order = this.poolOrders.get(key);
    if (order === undefined) {
      order = new PoolOrder();
      this.poolOrders.set(key, order);
    }
    return order;
  }

  /**
   * The spread regression of driver-fhs for day `dayIndex` under the refit cadence of the driver
   * regression (options.driverRefitDays, k): the one fitted on the refit day, the latest day number on
   * or before the delivery day that is a multiple of k, from that day's calibration days (all before
   * it, so before the delivery day's gate closure); undefined when the delivery day fits its own (k = 1,
   * a refit day itself, a refit day missing from the history or one that cannot be forecast). The refit
   * day's forecast is made first when its fit is not kept, so a day's forecast does not depend on
   * which days were asked before it.
   */
  private refitDaySpreadModel(dayIndex: number, levels: readonly number[], calibrationDays: number): LinearModel | undefined {
    const every = this.options.driverRefitDays;
    if (every === 1) return undefined;
    const dayNumberAt = (i: number): number => dayNumberOf((this.history.days[i] as { readonly day: string }).day);
    const dayNumber = dayNumberAt(dayIndex);
    const refitDay = refitDayOf(dayNumber, every);
    if (refitDay === dayNumber) return undefined;
    const key = `${calibrationDays}|${refitDay}`;
    if (this.spreadModels.get(key) === undefined) {
      let i = dayIndex;
      while (i > 0 && dayNumberAt(i) > refitDay) i--;
      if (dayNumberAt(i) !== refitDay) return undefined;
      try {
        this.forecastWith(i, levels, 'driver-fhs', calibrationDays);
      } catch (err) {
        if (!(err instanceof InsufficientHistoryError)) throw err;
        return undefined;
      }
    }
    return this.spreadModels.get(key);
  }

  /** Keeps the spread regression a refit day fitted (a bounded number of them) and returns it. */
  private keptSpreadModel(calibrationDays: number, dayNumber: number, model: LinearModel): LinearModel {
    const every = this.options.driverRefitDays;
    if (every > 1 && refitDayOf(dayNumber, every) === dayNumber) this.spreadModels.set(`${calibrationDays}|${dayNumber}`, model);
    return model;
  }

  /** HistoryView.before of day `dayIndex`, the same view again while the same day is asked (a view never changes). */
  private viewBefore(dayIndex: number): HistoryView {
    if (this.lastView?.dayIndex !== dayIndex) this.lastView = { dayIndex, view: HistoryView.before(this.history, dayIndex, this.grids) };
    return this.lastView.view;
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
      forecast = makePointForecast(view ?? this.viewBefore(dayIndex), model, this.options, this.driverFits);
      cache[dayIndex] = forecast;
    }
    return forecast;
  }

  /** The scale of the calibration errors: the point model's own for 'model', else prices. */
  private errorScaleOf(model: PointModelName, calibration: readonly { realised: Float64Array }[], calibrationDays: number): ErrorScale {
    if (this.options.errorScale === 'price' || model === 'naive' || (model === 'drivers' && this.options.driverScale === 'price')) return PRICE_SCALE;
    return asinhErrorScaleOf((this.grids as GridCache).scales(calibrationDays).of(calibration.map((c) => c.realised)));
  }

  /**
   * The calibration days before the delivery day that could be forecast, oldest first; with `before`, those
   * of a day `before` (<= the delivery day) instead: the days in [before - calibrationDays, before - 1].
   */
  private calibrationSet(model: PointModelName, view: HistoryView, calibrationDays: number, before = view.target.dayNumber) {
    const first = before - calibrationDays;
    const out: CalibrationDay[] = [];
    for (let i = view.indexAtOrBefore(first - 1) + 1; i < view.pastCount && view.dayNumber(i) < before; i++) {
      const forecast = this.pointFor(model, i);
      if (forecast === null) continue;
      const past = view.past(i);
      out.push({ dayNumber: view.dayNumber(i), forecast, realised: past.prices, exogenous: past.exogenous });
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

function pointModelOf(method: SingleMethod, options: ForecastOptions): PointModelName {
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
    case 'driver-hs':
    case 'driver-fhs':
    case 'driver-qr':
      return 'drivers';
  }
}

function makePointForecast(view: HistoryView, model: PointModelName, options: ForecastOptions, driverFits: DriverFits): PointForecast | null {
  if (model === 'naive') return seasonalNaive(view, options.naiveLagDays);
  if (model === 'drivers') {
    return driverForecast(view, {
      windowsDays: options.driverWindowsDays,
      minTrainingDays: options.minTrainingDays,
      knots: options.driverKnots,
      scale: options.driverScale,
      refitDays: options.driverRefitDays,
      ...(options.driverLevel === 'shift' ? { level: 'shift' as const } : {}),
      fits: driverFits,
      stopwatch: options.stopwatch,
    });
  }
  return arxForecast(view, {
    windowsDays: options.windowsDays,
    estimator: model === 'lasso' ? 'lasso' : 'least-squares',
    lasso: options.lasso,
    minTrainingDays: options.minTrainingDays,
    stopwatch: options.stopwatch,
  });
}

/** A single candidate's key in the Forecaster's kept forecasts and losses. */
function candidateKey(c: AutoCandidate): string {
  return `${c.method}|${c.calibrationDays}`;
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
  if (o.scenarioPaths > MAX_PATHS) throw new ArgumentError('options.scenarioPaths', `at most ${MAX_PATHS}`, o.scenarioPaths);
  if (!Number.isInteger(o.pathSeed)) throw new ArgumentError('options.pathSeed', 'an integer', o.pathSeed);
  if (!(o.autoCandidates.length > 0)) throw new ArgumentError('options.autoCandidates', 'at least one candidate', o.autoCandidates);
  /** A candidate of `auto` (or its fallback) names a single method, among `allowed`, and a calibration window. */
  const candidate = (name: string, c: AutoCandidate, allowed: readonly SingleMethod[], what: string): void => {
    if (!(allowed as readonly string[]).includes(c.method)) throw new ArgumentError(`options.${name}.method`, `${what}${allowed.join(', ')}`, c.method);
    positiveInteger(`${name}.calibrationDays`, c.calibrationDays, o.minCalibrationDays);
  };
  const single = FORECAST_METHODS.filter((m): m is SingleMethod => m !== 'auto');
  o.autoCandidates.forEach((e, i) => {
    if (!('averageOf' in e)) return candidate(`autoCandidates[${i}]`, e, single, 'one of ');
    const members = e.averageOf as readonly AutoCandidate[] | unknown;
    if (!Array.isArray(members) || members.length < 2) throw new ArgumentError(`options.autoCandidates[${i}].averageOf`, 'two or more candidates to average', members);
    members.forEach((c: AutoCandidate, m) => candidate(`autoCandidates[${i}].averageOf[${m}]`, c, single, 'one of '));
    if (new Set(members.map(candidateKey)).size < members.length) throw new ArgumentError(`options.autoCandidates[${i}].averageOf`, 'each candidate once', members);
  });
  candidate('autoFallback', o.autoFallback, single.filter((m) => pointModelOf(m, o) !== 'drivers'), 'a method on prices alone: one of ');
  positiveInteger('autoValidationDays', o.autoValidationDays);
  positiveInteger('driverKnots', o.driverKnots, 0);
  positiveInteger('driverRefitDays', o.driverRefitDays);
  if (o.driverWindowsDays.length === 0) throw new ArgumentError('options.driverWindowsDays', 'at least one window length', o.driverWindowsDays);
  o.driverWindowsDays.forEach((w, i) => positiveInteger(`driverWindowsDays[${i}]`, w, o.minTrainingDays));
  if (o.driverScale !== 'asinh' && o.driverScale !== 'price') throw new ArgumentError('options.driverScale', "'asinh' or 'price'", o.driverScale);
  if (o.spreadPool !== 'slot' && o.spreadPool !== 'all' && o.spreadPool !== 'level') throw new ArgumentError('options.spreadPool', "'slot', 'all' or 'level'", o.spreadPool);
  if (o.driverCentre !== 'pool' && o.driverCentre !== 'recent' && o.driverCentre !== 'recent-quadratic') {
    throw new ArgumentError('options.driverCentre', "'pool', 'recent' or 'recent-quadratic'", o.driverCentre);
  }
  if (o.driverLevel !== undefined && o.driverLevel !== 'mean' && o.driverLevel !== 'shift') throw new ArgumentError('options.driverLevel', "'mean' or 'shift'", o.driverLevel);
  if (o.qraModel !== 'arx' && o.qraModel !== 'lasso') throw new ArgumentError('options.qraModel', "'arx' or 'lasso'", o.qraModel);
  if (o.errorScale !== 'model' && o.errorScale !== 'price') throw new ArgumentError('options.errorScale', "'model' or 'price'", o.errorScale);
  return o;
}

/**
 * A calibration day's errors on `scale`, realised less forecast, into `e` (returned), with its point forecast on
 * the scale into `f`. The realised prices on an asinh scale come from the delivery day's ARX fit when it made
 * them with this scale (keptAsinhDay: the same numbers).
 */
function errorsOn(c: CalibrationDay, scale: ErrorScale, e: Float64Array = new Float64Array(c.realised.length), f: Float64Array = new Float64Array(c.realised.length)): Float64Array {
  onErrorScale(c.forecast.mean, scale, f);
  if (scale.robust === undefined || !keptAsinhDay(scale.robust, c.realised, e)) onErrorScale(c.realised, scale, e);
  for (let s = 0; s < e.length; s++) e[s] = (e[s] as number) - (f[s] as number);
  return e;
}

/** A calibration day's errors on `scale` and, `withMean`, its mean realised price on it (NaN otherwise): what the day-level regression reads. */
function levelInputsOn(c: CalibrationDay, scale: ErrorScale, withMean: boolean): { e: Float64Array; mean: number } {
  const f = new Float64Array(c.realised.length);
  const e = errorsOn(c, scale, undefined, f);
  return { e, mean: withMean ? realisedMean(e, f) : Number.NaN };
}

/** A day's mean realised price on the error scale from its errors e and point forecast f on it (e + f, the realised values). */
function realisedMean(e: Float64Array, f: Float64Array): number {
  let sum = 0;
  for (let s = 0; s < e.length; s++) sum += (e[s] as number) + (f[s] as number);
  return sum / e.length;
}

/** scale.to of every value into `out`, the same numbers (an asinh scale's loop written out: toAsinhScales). */
function onErrorScale(values: ArrayLike<number>, scale: ErrorScale, out: Float64Array): void {
  if (scale.robust !== undefined) toAsinhScales(values, scale.robust, out);
  else for (let s = 0; s < out.length; s++) out[s] = scale.to(values[s] as number);
}
