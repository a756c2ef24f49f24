/**
 * Statistics: distribution functions, descriptive statistics and the tests used to score forecasts
 * and compare policies. Pure, synchronous functions; invalid arguments throw ArgumentError.
 */

// errors
export { ArgumentError } from './argumentError.js';
export { NoConvergenceError } from './continuedFraction.js';

// special functions
export { continuedFraction } from './continuedFraction.js';
export { logGamma } from './logGamma.js';
export { regularizedGammaP, regularizedGammaQ } from './regularizedGamma.js';
export { regularizedBeta } from './regularizedBeta.js';

// distributions
export { normalCdf } from './normalCdf.js';
export { normalQuantile } from './normalQuantile.js';
export { studentTCdf } from './studentTCdf.js';
export { chiSquareCdf, chiSquareSurvival } from './chiSquare.js';

// descriptive statistics
export { mean } from './mean.js';
export { sampleVariance } from './sampleVariance.js';
export { quantileSorted } from './quantileSorted.js';
export { autocovariance } from './autocovariance.js';

// tests of forecasts and policies
export { dieboldMariano, type DieboldMarianoResult } from './dieboldMariano.js';
export { bernoulliLogLikelihood } from './bernoulliLogLikelihood.js';
export { kupiecPof, type KupiecResult } from './kupiec.js';
export { transitionCounts, type TransitionCounts } from './transitionCounts.js';
export {
  christoffersenFromCounts,
  christoffersenFromHits,
  type ChristoffersenResult,
} from './christoffersen.js';
