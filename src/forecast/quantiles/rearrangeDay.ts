import { rearrange } from '../quantileSet.js';

/**
 * Monotone rearrangement of every period's quantiles: each row sorted ascending, so that the prices
 * never decrease with the level (Chernozhukov, Fernandez-Val and Galichon 2010). Sorting never moves
 * a row further from a non-decreasing target in any Lp norm over the levels (their Proposition 1).
 *
 * Reference: V. Chernozhukov, I. Fernandez-Val and A. Galichon (2010), Quantile and probability curves
 * without crossing, Econometrica 78(3), 1093-1125, doi:10.3982/ECTA7880.
 *
 * @param prices prices[t][k] at increasing levels (not changed)
 * @returns the sorted rows and how many rows had crossed
 */
export function rearrangeDay(prices: readonly (readonly number[])[]): { prices: number[][]; crossedRows: number } {
  let crossedRows = 0;
  const out = prices.map((row) => {
    const { prices: sorted, repaired } = rearrange(row);
    if (repaired) crossedRows++;
    return sorted;
  });
  return { prices: out, crossedRows };
}
