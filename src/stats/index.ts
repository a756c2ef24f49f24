/**
 * Statistics: distribution functions, descriptive statistics and the tests used to score forecasts
 * and compare policies. Pure, synchronous functions; invalid arguments throw ArgumentError.
 */

// errors
export { ArgumentError } from './argument-error.js';
export { NoConvergenceError } from './continued-fraction.js';

// special functions
export { continuedFraction } from './continued-fraction.js';
export { logGamma } from './log-gamma.js';
export { regularizedGammaP, regularizedGammaQ } from './regularized-gamma.js';
export { regularizedBeta } from './regularized-beta.js';

// distributions
export { normalCdf } from './normal-cdf.js';
export { normalQuantile } from './normal-quantile.js';
export { studentTCdf } from './student-t-cdf.js';
export { chiSquareCdf, chiSquareSurvival } from './chi-square.js';

// descriptive statistics
export { mean } from './mean.js';
export { sampleVariance } from './sample-variance.js';
export { quantileSorted } from './quantile-sorted.js';
export { autocovariance } from './autocovariance.js';

// tests of forecasts and policies
export { dieboldMariano, type DieboldMarianoResult } from './diebold-mariano.js';
export { bernoulliLogLikelihood } from './bernoulli-log-likelihood.js';
export { kupiecPof, type KupiecResult } from './kupiec.js';
export { transitionCounts, type TransitionCounts } from './transition-counts.js';
export {
  christoffersenFromCounts,
  christoffersenFromHits,
  type ChristoffersenResult,
} from './christoffersen.js';
