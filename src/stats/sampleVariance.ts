import { mean } from './mean.js';
import { requireFiniteArray } from './validate.js';

/**
 * Sample variance with the n - 1 (Bessel) divisor.
 *
 * Notes: s^2 = (1/(n-1)) sum_i (x_i - xbar)^2, n >= 2, by the corrected two-pass algorithm
 *   s^2 = ( sum_i e_i^2 - (sum_i e_i)^2 / n ) / (n - 1),  e_i = x_i - xbar,
 * whose second term removes most of the rounding error in xbar.
 *
 * @param values x_1..x_n, finite, at least two
 * @example
 * sampleVariance([2, 4, 4, 4, 5, 5, 7, 9]); // 32/7 = 4.571428571428571
 *
 * Reference: T. F. Chan, G. H. Golub and R. J. LeVeque (1983), Algorithms for computing the sample
 * variance: analysis and recommendations, The American Statistician 37(3), 242-247,
 * doi:10.1080/00031305.1983.10483115.
 */
export function sampleVariance(values: readonly number[]): number {
  requireFiniteArray('values', values, 2);
  const xbar = mean(values);
  let sumSquares = 0;
  let sum = 0;
  for (const v of values) {
    const e = v - xbar;
    sumSquares += e * e;
    sum += e;
  }
  return Math.max(0, (sumSquares - (sum * sum) / values.length) / (values.length - 1));
}
