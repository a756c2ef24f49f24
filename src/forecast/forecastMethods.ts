/** Method names, for the CLI's `--method`. */
export const FORECAST_METHODS = ['naive-hs', 'arx-hs', 'lasso-hs', 'arx-conformal', 'qra'] as const;
export type ForecastMethod = (typeof FORECAST_METHODS)[number];

/**
 * The method `quantbid forecast` uses when none is named: of the methods that met every quality
 * target on a year of the demo market (coverage of the 80% and 90% intervals within 3 points, Kupiec
 * not rejected at 5%, CRPS at least 25% below naive-hs), the one with the lowest CRPS
 * (docs/forecast-quality.md, bench/forecastQuality.js).
 */
export const DEFAULT_METHOD: ForecastMethod = 'arx-hs';

/**
 * Calibration days of the forecaster's DEFAULTS [calendar days]: also the most whole-day scenario
 * paths a day can have (one per calibration day).
 */
export const DEFAULT_CALIBRATION_DAYS = 364;
