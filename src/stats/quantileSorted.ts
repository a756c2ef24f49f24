import { ArgumentError } from './argumentError.js';
import { requireFiniteArray } from './validate.js';

/**
 * Quantile of data already sorted in ascending order, by linear interpolation between order
 * statistics (Hyndman and Fan's definition 7, the default of R's `quantile` and NumPy's `quantile`).
 *
 * Notes: with 0-based order statistics x_(0) <= ... <= x_(n-1), h = (n - 1) p, j = floor(h),
 *   Q(p) = x_(j) + (h - j) (x_(j+1) - x_(j)),
 * so Q(0) is the minimum, Q(1) the maximum and Q(1/2) the usual median.
 *
 * @param sorted data in non-decreasing order, finite, at least one value (checked, not sorted here)
 * @param p probability [-], in [0, 1]
 * @example
 * quantileSorted([1, 2, 3, 4], 0.5);  // 2.5
 * quantileSorted([1, 2, 3, 4], 0.25); // 1.75
 *
 * Reference: R. J. Hyndman and Y. Fan (1996), Sample quantiles in statistical packages,
 * The American Statistician 50(4), 361-365, doi:10.1080/00031305.1996.10473566.
 */
export function quantileSorted(sorted: readonly number[], p: number): number {
  requireFiniteArray('sorted', sorted, 1);
  if (typeof p !== 'number' || !(p >= 0 && p <= 1)) throw new ArgumentError('p', 'a probability in [0, 1]', p);
  for (let i = 1; i < sorted.length; i++) {
    if ((sorted[i] as number) < (sorted[i - 1] as number)) {
      throw new ArgumentError('sorted', `in non-decreasing order (index ${i} is below index ${i - 1})`, sorted);
    }
  }
  const h = (sorted.length - 1) * p;
  const j = Math.floor(h);
  const lower = sorted[j] as number;
  const upper = sorted[Math.min(j + 1, sorted.length - 1)] as number;
  return lower + (h - j) * (upper - lower);
}
