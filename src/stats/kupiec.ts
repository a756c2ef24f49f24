import { bernoulliLogLikelihood } from './bernoulliLogLikelihood.js';
import { chiSquareSurvival } from './chiSquare.js';
import { requireIntegerIn, requireOpenUnit } from './validate.js';

/** Kupiec proportion-of-failures test result. */
export interface KupiecResult {
  /** Number of observations n. */
  readonly n: number;
  /** Number of failures x (observations outside the interval, or below the quantile). */
  readonly failures: number;
  /** Expected failure rate p under the null [-]. */
  readonly expectedRate: number;
  /** Observed failure rate x / n [-]. */
  readonly observedRate: number;
  /** Likelihood-ratio statistic, >= 0. */
  readonly lr: number;
  /** P(chi-square with 1 df >= lr). */
  readonly pValue: number;
}

/**
 * Kupiec proportion-of-failures (POF) test of unconditional coverage.
 *
 * Notes: H0: the failure probability is p. With x failures in n observations and phat = x / n,
 *   LR_uc = -2 [ (n - x) ln(1 - p) + x ln p - (n - x) ln(1 - phat) - x ln phat ],
 * with 0 ln 0 = 0 (so x = 0 and x = n are allowed), asymptotically chi-square with 1 df.
 * Tiny negative values from rounding are clamped to 0.
 *
 * @param n number of observations, integer >= 1
 * @param failures x, integer in [0, n]
 * @param expectedRate p, in (0, 1)
 * @example
 * kupiecPof(100, 15, 0.1); // { lr: 2.44702, pValue: 0.11775, ... }
 *
 * Reference: P. H. Kupiec (1995), Techniques for verifying the accuracy of risk measurement models,
 * J. Derivatives 3(2), 73-84, doi:10.3905/jod.1995.407942.
 */
export function kupiecPof(n: number, failures: number, expectedRate: number): KupiecResult {
  requireIntegerIn('n', n, 1);
  requireIntegerIn('failures', failures, 0, n);
  requireOpenUnit('expectedRate', expectedRate);
  const lr = unconditionalCoverageLr(n, failures, expectedRate);
  return { n, failures, expectedRate, observedRate: failures / n, lr, pValue: chiSquareSurvival(lr, 1) };
}

/** LR_uc of kupiecPof without argument checks (shared with the Christoffersen test). */
export function unconditionalCoverageLr(n: number, failures: number, expectedRate: number): number {
  const observed = failures / n;
  const lr =
    -2 *
    (bernoulliLogLikelihood(n - failures, failures, expectedRate) -
      bernoulliLogLikelihood(n - failures, failures, observed));
  return Math.max(0, lr);
}
