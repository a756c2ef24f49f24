import { regularizedGammaP, regularizedGammaQ } from './regularizedGamma.js';
import { requireNonNegative, requirePositive } from './validate.js';

/**
 * Cumulative distribution function of the chi-square distribution with k degrees of freedom.
 *
 * Notes: F(x; k) = P(k/2, x/2), the regularized lower incomplete gamma function.
 * With k = 2 it is 1 - exp(-x/2).
 *
 * @param x value [-], >= 0
 * @param degreesOfFreedom k [-], > 0
 * @example
 * chiSquareCdf(2, 2); // 1 - e^-1 = 0.6321205588285577
 *
 * Reference: M. Abramowitz and I. A. Stegun (1964), Handbook of Mathematical Functions, formula 26.4.19.
 */
export function chiSquareCdf(x: number, degreesOfFreedom: number): number {
  requireNonNegative('x', x);
  requirePositive('degreesOfFreedom', degreesOfFreedom);
  return regularizedGammaP(degreesOfFreedom / 2, x / 2);
}

/**
 * Upper tail of the chi-square distribution, 1 - F(x; k) = Q(k/2, x/2): the p-value of a
 * likelihood-ratio statistic x, computed directly so that small p-values keep their accuracy.
 *
 * @example
 * chiSquareSurvival(3.841458820694124, 1); // 0.05
 */
export function chiSquareSurvival(x: number, degreesOfFreedom: number): number {
  requireNonNegative('x', x);
  requirePositive('degreesOfFreedom', degreesOfFreedom);
  return regularizedGammaQ(degreesOfFreedom / 2, x / 2);
}
