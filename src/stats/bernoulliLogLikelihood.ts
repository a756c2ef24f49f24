/**
 * Log-likelihood of n0 outcomes 0 and n1 outcomes 1 of independent Bernoulli trials with
 * P(outcome 1) = pi, using the convention 0 log 0 = 0.
 *
 * Notes: l = n0 ln(1 - pi) + n1 ln(pi), where a term with a zero count is 0 whatever pi is
 * (the limit of n ln pi as n -> 0), so pi = 0 with n1 = 0 and pi = 1 with n0 = 0 are fine.
 *
 * @param zeros n0, count of outcomes 0, >= 0
 * @param ones n1, count of outcomes 1, >= 0
 * @param probability pi, probability of outcome 1, in [0, 1]
 * @example
 * bernoulliLogLikelihood(85, 15, 0.15); // 85 ln 0.85 + 15 ln 0.15 = -42.27...
 * bernoulliLogLikelihood(10, 0, 0);     // 0
 *
 * Reference: P. F. Christoffersen (1998), Evaluating interval forecasts, Int. Economic Review 39(4),
 * 841-862, doi:10.2307/2527341 (the likelihoods L(pi; I) of section 3).
 */
export function bernoulliLogLikelihood(zeros: number, ones: number, probability: number): number {
  return xLogY(zeros, 1 - probability) + xLogY(ones, probability);
}

/** x ln y with 0 ln y = 0. */
function xLogY(x: number, y: number): number {
  return x === 0 ? 0 : x * Math.log(y);
}
