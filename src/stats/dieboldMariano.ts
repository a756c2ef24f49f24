import { autocovariance } from './autocovariance.js';
import { mean } from './mean.js';
import { studentTCdf } from './studentTCdf.js';
import { requireFiniteArray, requireIntegerIn } from './validate.js';

/** Outcome of the Diebold-Mariano test: a status union, never NaN. */
export type DieboldMarianoResult =
  | {
      readonly status: 'ok';
      /** Number of loss differences n. */
      readonly n: number;
      /** Forecast horizon h used for the long-run variance. */
      readonly horizon: number;
      /** dbar, mean of d [loss units]. */
      readonly meanDifference: number;
      /** Long-run variance estimate V = gamma_0 + 2 sum_{k=1}^{h-1} gamma_k [loss units^2]. */
      readonly longRunVariance: number;
      /** DM = dbar / sqrt(V / n). */
      readonly dm: number;
      /** HLN = DM * sqrt((n + 1 - 2h + h(h - 1)/n) / n). */
      readonly hln: number;
      /** n - 1, the degrees of freedom of the Student t reference distribution. */
      readonly degreesOfFreedom: number;
      /** P(T >= HLN), T ~ t(n - 1): small when the first loss is larger on average (H1: E[d] > 0). */
      readonly pValueOneSided: number;
      /** P(|T| >= |HLN|) (H1: E[d] != 0). */
      readonly pValueTwoSided: number;
    }
  | {
      /**
       * 'zero-variance': every d is the same number, so the statistic is undefined (0/0) or infinite;
       * 'non-positive-variance': with h > 1 the autocovariances cancel gamma_0 (V <= 1e-12 gamma_0).
       */
      readonly status: 'zero-variance' | 'non-positive-variance';
      readonly n: number;
      readonly horizon: number;
      readonly meanDifference: number;
      readonly longRunVariance: number;
      readonly reason: string;
    };

/**
 * Diebold-Mariano test of equal predictive accuracy with the Harvey-Leybourne-Newbold small-sample
 * correction.
 *
 * Notes: d_t = L(e1_t) - L(e2_t), t = 1..n, is the loss of forecast (or policy) 1 minus the loss of
 * forecast 2 (for policies, use negated profit as the loss, or profit 2 minus profit 1). With dbar the
 * mean of d and gamma_k the autocovariance of d with divisor n (see autocovariance),
 *   V   = gamma_0 + 2 sum_{k=1}^{h-1} gamma_k          (rectangular window, h-step forecasts are
 *                                                      MA(h-1) under the null),
 *   DM  = dbar / sqrt(V / n),
 *   HLN = DM * sqrt((n + 1 - 2h + h(h - 1)/n) / n),
 * and HLN is referred to Student t with n - 1 degrees of freedom. The one-sided alternative is
 * E[d] > 0, i.e. forecast 2 is more accurate.
 *
 * @param differences d_1..d_n, finite, n >= 2
 * @param horizon h, an integer in [1, n - 1], default 1
 * @example
 * dieboldMariano([0.5, -0.2, 0.8, 0.1, 0.3, -0.4, 0.6, 0.2, 0, 0.4], 1);
 * // { status: 'ok', dm: 2.08147, hln: 1.97466, pValueOneSided: 0.03987, ... }
 *
 * References: F. X. Diebold and R. S. Mariano (1995), Comparing predictive accuracy, J. Business &
 * Economic Statistics 13(3), 253-263, doi:10.1080/07350015.1995.10524599; D. Harvey, S. Leybourne and
 * P. Newbold (1997), Testing the equality of prediction mean squared errors, Int. J. Forecasting
 * 13(2), 281-291, doi:10.1016/S0169-2070(96)00719-4.
 */
export function dieboldMariano(differences: readonly number[], horizon = 1): DieboldMarianoResult {
  requireFiniteArray('differences', differences, 2);
  const n = differences.length;
  requireIntegerIn('horizon', horizon, 1, n - 1);
  const meanDifference = mean(differences);
  const gamma0 = autocovariance(differences, 0);
  let longRunVariance = gamma0;
  for (let k = 1; k < horizon; k++) longRunVariance += 2 * autocovariance(differences, k);
  const common = { n, horizon, meanDifference, longRunVariance };

  if (differences.every((d) => d === differences[0])) {
    return { status: 'zero-variance', ...common, reason: 'every loss difference is the same number' };
  }
  if (!(longRunVariance > 1e-12 * gamma0)) {
    return {
      status: 'non-positive-variance',
      ...common,
      reason: `the autocovariances up to lag ${horizon - 1} cancel the variance; try a smaller horizon`,
    };
  }
  const dm = meanDifference / Math.sqrt(longRunVariance / n);
  const hln = dm * Math.sqrt((n + 1 - 2 * horizon + (horizon * (horizon - 1)) / n) / n);
  const degreesOfFreedom = n - 1;
  return {
    status: 'ok',
    ...common,
    dm,
    hln,
    degreesOfFreedom,
    pValueOneSided: studentTCdf(-hln, degreesOfFreedom),
    pValueTwoSided: 2 * studentTCdf(-Math.abs(hln), degreesOfFreedom),
  };
}
