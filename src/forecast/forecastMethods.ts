/** Method names, for the CLI's `--method`. */
export const FORECAST_METHODS = ['auto', 'naive-hs', 'arx-hs', 'lasso-hs', 'arx-conformal', 'qra', 'driver-hs', 'driver-fhs', 'driver-qr'] as const;
export type ForecastMethod = (typeof FORECAST_METHODS)[number];
/** The methods `auto` chooses among (every method but itself). */
export type SingleMethod = Exclude<ForecastMethod, 'auto'>;

/** One candidate of `auto`: a method and its calibration window [calendar days]. */
export interface AutoCandidate {
  readonly method: SingleMethod;
  readonly calibrationDays: number;
}

/**
 * The method `quantbid forecast` uses when none is named: `auto`, which chooses each day among
 * AUTO_CANDIDATES by their pinball loss on the days just before (docs/forecast-quality.md: on the
 * known-distribution bench markets and the demo, bench/forecastKnownMarkets.js and
 * bench/forecastQuality.js).
 */
export const DEFAULT_METHOD: ForecastMethod = 'auto';

/** Calibration days of the forecaster's DEFAULTS [calendar days]. */
export const DEFAULT_CALIBRATION_DAYS = 364;

/**
 * A candidate of `auto` made of others: the quantile average (Vincentization) of its members' forecasts
 * with equal weights, q_tau = (1/M) sum_m q_tau,m (Lichtendahl, Grushka-Cockayne and Winkler 2013). It
 * is scored on the validation days and chosen like any other candidate.
 */
export interface AutoAverage {
  /** Two or more single candidates, none twice. */
  readonly averageOf: readonly AutoCandidate[];
}

/** An entry of `auto`'s candidates: a single method and window, or a quantile average of several. */
export type AutoEntry = AutoCandidate | AutoAverage;

/** The single candidates an entry forecasts with: itself, or the members of its average. */
export function entryMembers(entry: AutoEntry): readonly AutoCandidate[] {
  return 'averageOf' in entry ? entry.averageOf : [entry];
}

const DRIVER_FHS_364: AutoCandidate = Object.freeze({ method: 'driver-fhs', calibrationDays: 364 });
const DRIVER_FHS_728: AutoCandidate = Object.freeze({ method: 'driver-fhs', calibrationDays: 728 });

/**
 * The single candidates of `auto`, in order of preference (a tie or a day without validation days goes
 * to the first that can forecast); those needing residual-load columns are left out for a history without them.
 * `driver-fhs` twice, with a year's and two years' calibration days: the longer pool gives the level-weighted
 * error pool more errors near each level, the shorter follows a change of regime sooner. `arx-hs` is not
 * among them: where the drivers are known it was chosen on few days of the known-distribution markets and
 * cost more than it brought (docs/forecast-quality.md, the sixth wave); it is AUTO_FALLBACK. These four
 * alone (autoCandidates: AUTO_SINGLE_CANDIDATES) are `auto` before the seventh wave.
 */
export const AUTO_SINGLE_CANDIDATES: readonly AutoCandidate[] = Object.freeze([
  Object.freeze({ method: 'driver-hs', calibrationDays: 364 }),
  Object.freeze({ method: 'driver-hs', calibrationDays: 91 }),
  DRIVER_FHS_364,
  DRIVER_FHS_728,
] as const);

/**
 * Candidates of `auto`: AUTO_SINGLE_CANDIDATES and, last, the quantile average of `driver-fhs` over its
 * two calibration windows (averaging one model's forecasts across calibration windows: Hubicka, Marcjasz
 * and Weron 2019). Chosen by the same validation, it takes the days where neither window is clearly
 * better; the average of all four, or weights from the validation losses, did worse on the
 * known-distribution markets (docs/forecast-quality.md, the seventh wave).
 */
export const AUTO_CANDIDATES: readonly AutoEntry[] = Object.freeze([
  ...AUTO_SINGLE_CANDIDATES,
  Object.freeze({ averageOf: Object.freeze([DRIVER_FHS_364, DRIVER_FHS_728]) }),
]);

/**
 * What `auto` forecasts with when the history has no residual-load columns (load and renewables),
 * which every candidate of AUTO_CANDIDATES needs: the ARX on prices alone.
 */
export const AUTO_FALLBACK: AutoCandidate = Object.freeze({ method: 'arx-hs', calibrationDays: 364 });

/** Validation days of `auto`: the most recent days before the delivery day it scores the candidates on [days]. */
export const AUTO_VALIDATION_DAYS = 28;

/** Most whole-day paths per day [-]. */
export const MAX_PATHS = 10_000;

/** Seed of the whole-day paths when none is given. */
export const DEFAULT_PATH_SEED = 1;
