import { regularizedBeta } from './regularizedBeta.js';
import { ArgumentError } from './argumentError.js';
import { requirePositive } from './validate.js';

/**
 * Cumulative distribution function of Student's t distribution with nu degrees of freedom.
 *
 * Notes: with x = nu / (nu + t^2), the two-tailed probability is P(|T| >= |t|) = I_x(nu/2, 1/2)
 * (regularized incomplete beta), so
 *   F(t) = I_x(nu/2, 1/2) / 2 for t <= 0 and F(t) = 1 - I_x(nu/2, 1/2) / 2 for t > 0.
 * The upper tail is F(-t) by symmetry, which keeps full relative accuracy: use it for p-values.
 * nu may be any positive real. F(-Infinity) = 0, F(Infinity) = 1.
 *
 * @param t value of the statistic [-], not NaN
 * @param degreesOfFreedom nu [-], > 0
 * @example
 * studentTCdf(1, 1); // Cauchy: 0.5 + atan(1)/pi = 0.75
 *
 * References: M. Abramowitz and I. A. Stegun (1964), Handbook of Mathematical Functions,
 * formula 26.7.1 and 26.5.27; W. H. Press et al. (2007), Numerical Recipes, 3rd ed., sec. 6.14.
 */
export function studentTCdf(t: number, degreesOfFreedom: number): number {
  if (typeof t !== 'number' || Number.isNaN(t)) throw new ArgumentError('t', 'a number', t);
  requirePositive('degreesOfFreedom', degreesOfFreedom);
  if (t === -Infinity) return 0;
  if (t === Infinity) return 1;
  const tail = regularizedBeta(degreesOfFreedom / (degreesOfFreedom + t * t), degreesOfFreedom / 2, 0.5) / 2;
  return t > 0 ? 1 - tail : tail;
}
