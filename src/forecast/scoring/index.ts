/** Scores of quantile forecasts: pinball loss, CRPS (as mean pinball, factor 2 not included), coverage, calibration. */
export { compareForecasts, dailyLoss } from './compareForecasts.js';
export type { ForecastComparison } from './compareForecasts.js';
export { crpsFromQuantiles, crpsNormal } from './crps.js';
export { pinballLoss } from './pinball.js';
export { centralPairs, scoreForecasts } from './scoreForecasts.js';
export type { IntervalCoverage, ScoreTable, ScoredDay, Scores } from './scoreForecasts.js';
