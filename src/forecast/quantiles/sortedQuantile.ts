/**
 * Sample quantile of values sorted in ascending order, Hyndman and Fan's definition 7 (the default of
 * R and NumPy): with order statistics x_(0) <= ... <= x_(n-1), h = (n - 1) tau, j = floor(h),
 *   Q_tau = x_(j) + (h - j)(x_(j+1) - x_(j)).
 * The unchecked fast path for the forecasters' inner loops (src/stats/quantileSorted.ts checks its input).
 *
 * @example
 * sortedQuantile(Float64Array.of(1, 2, 3, 4), 0.25); // 1.75, as R's quantile(1:4, 0.25)
 *
 * Reference: R. J. Hyndman and Y. Fan (1996), Sample quantiles in statistical packages, Am. Stat.
 * 50(4), 361-365, doi:10.1080/00031305.1996.10473566.
 *
 * @param sorted at least one value, ascending
 * @param tau level in [0, 1]
 */
export function sortedQuantile(sorted: ArrayLike<number>, tau: number): number {
  const n = sorted.length;
  const h = (n - 1) * tau;
  const j = Math.floor(h);
  const lower = sorted[j] as number;
  const upper = sorted[Math.min(j + 1, n - 1)] as number;
  return lower + (h - j) * (upper - lower);
}
