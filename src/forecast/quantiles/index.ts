/** Quantiles from point forecasts: historical simulation, split conformal, QRA; rearrangement; paths. */
export { historicalSimulation } from './historicalSimulation.js';
export { requireLevels } from './levels.js';
export { QraWarmStarts, quantileRegressionAveraging } from './quantileRegressionAveraging.js';
export type { QraCalibration } from './quantileRegressionAveraging.js';
export { rearrangeDay } from './rearrangeDay.js';
export { conformalHalfWidth, conformalQuantiles, conformalRank } from './splitConformal.js';
