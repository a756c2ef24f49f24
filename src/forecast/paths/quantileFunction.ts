/**
 * The quantile function of one period from its quantiles at a few levels: linear between the levels,
 * and beyond the outermost ones continued with the slope of the two outermost levels on that side
 * (linear extrapolation), then kept within [floor, cap]. With a single level it is that price.
 *
 * Notes: between the given levels this is the piecewise-linear quantile function that quantbid's
 * planner reads (quantileSet.ts); the tails beyond them are a guess that only the paths need, since a
 * path takes values at every level in (0, 1). Clamping into the market's [floor, cap] keeps them
 * prices that can clear.
 *
 * @param levels strictly increasing levels in (0, 1)
 * @param prices non-decreasing prices at the levels
 * @param u level in (0, 1)
 */
export function quantileAt(levels: readonly number[], prices: readonly number[], u: number, floor = -Infinity, cap = Infinity): number {
  const K = levels.length;
  let value: number;
  if (K === 1) value = prices[0] as number;
  else {
    let hi = 1;
    while (hi < K - 1 && (levels[hi] as number) < u) hi++;
    const lo = u <= (levels[0] as number) ? 0 : hi - 1;
    const upper = u <= (levels[0] as number) ? 1 : hi;
    const tauLo = levels[lo] as number;
    const tauHi = levels[upper] as number;
    const w = (u - tauLo) / (tauHi - tauLo);
    value = (prices[lo] as number) + w * ((prices[upper] as number) - (prices[lo] as number));
  }
  return Math.min(cap, Math.max(floor, value));
}

/**
 * The inverse of {@link quantileAt} without the clamp: the level at which the quantile function
 * reaches y (the forecast's CDF at y, its probability integral transform), kept within [0, 1]. On a
 * flat stretch (equal prices) it gives the stretch's upper level.
 */
export function levelOf(levels: readonly number[], prices: readonly number[], y: number): number {
  const K = levels.length;
  if (K === 1) return y < (prices[0] as number) ? 0 : y > (prices[0] as number) ? 1 : 0.5;
  let k = 0;
  while (k < K - 2 && (prices[k + 1] as number) <= y) k++;
  const q0 = prices[k] as number;
  const q1 = prices[k + 1] as number;
  const t0 = levels[k] as number;
  const t1 = levels[k + 1] as number;
  const t = q1 > q0 ? t0 + ((y - q0) / (q1 - q0)) * (t1 - t0) : y >= q1 ? t1 : t0;
  return Math.min(1, Math.max(0, t));
}
