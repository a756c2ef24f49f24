import { requireFiniteArray } from './validate.js';

/**
 * Arithmetic mean.
 *
 * Notes: xbar = (1/n) sum_{i=1}^{n} x_i, n >= 1 (plain left-to-right summation).
 *
 * @param values x_1..x_n, finite, at least one
 * @example
 * mean([1, 2, 3, 6]); // 3
 *
 * Reference: the definition; see T. F. Chan, G. H. Golub and R. J. LeVeque (1983), Algorithms for
 * computing the sample variance, The American Statistician 37(3), 242-247,
 * doi:10.1080/00031305.1983.10483115.
 */
export function mean(values: readonly number[]): number {
  requireFiniteArray('values', values, 1);
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}
