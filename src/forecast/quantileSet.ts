/**
 * Operations on one period's quantiles: a set of prices at increasing levels tau in (0, 1).
 */

/**
 * Monotone rearrangement: sorts the prices so that they do not decrease with the level
 * (Chernozhukov, Fernandez-Val and Galichon 2010, "Quantile and probability curves without crossing",
 * Econometrica 78(3), doi:10.3982/ECTA7880). Sorting never moves the curve further from the true
 * quantile curve in any Lp norm (their Proposition 1), which is why it is the repair of choice.
 *
 * @returns the sorted copy and whether anything moved.
 */
export function rearrange(prices: readonly number[]): { prices: number[]; repaired: boolean } {
  let repaired = false;
  for (let k = 1; k < prices.length; k++) {
    if ((prices[k] as number) < (prices[k - 1] as number)) {
      repaired = true;
      break;
    }
  }
  const sorted = repaired ? [...prices].sort((a, b) => a - b) : [...prices];
  return { prices: sorted, repaired };
}

/** Thrown when a level lies outside the outermost levels of a forecast. */
export class LevelOutOfRangeError extends RangeError {
  constructor(
    readonly level: number,
    readonly lowest: number,
    readonly highest: number,
  ) {
    super(
      `level ${level} is outside the forecast's levels [${lowest}, ${highest}]; ` +
        'extrapolating a quantile is guesswork: choose alpha so that alpha and 1 - alpha lie between them',
    );
    this.name = 'LevelOutOfRangeError';
  }
}

/**
 * The price at level `tau` by linear interpolation between the two neighbouring levels
 * (piecewise-linear quantile function through the given points). Exact at a given level.
 *
 * Example: levels [0.1, 0.5, 0.9], prices [10, 20, 40]; tau 0.3 gives 15, tau 0.7 gives 30.
 *
 * @param levels strictly increasing levels in (0, 1)
 * @param prices non-decreasing prices at those levels [currency/MWh]
 * @throws LevelOutOfRangeError outside [levels[0], levels[last]]
 */
export function priceAtLevel(levels: readonly number[], prices: readonly number[], tau: number): number {
  return priceAt(levelPosition(levels, tau), prices);
}

/**
 * priceAtLevel of every period's prices at one level (the same numbers): the neighbouring levels are
 * found once, since every period of a forecast has the same levels.
 *
 * @param rows rows[t]: the prices of period t at `levels`
 */
export function pricesAtLevel(levels: readonly number[], rows: readonly (readonly number[])[], tau: number): number[] {
  const out = new Array<number>(rows.length);
  if (rows.length === 0) return out;
  const position = levelPosition(levels, tau);
  for (let t = 0; t < rows.length; t++) out[t] = priceAt(position, rows[t] as readonly number[]);
  return out;
}

/** Where a level lies among the levels: between levels lo and hi with weight w on hi, or at level lo (hi = lo). */
interface LevelPosition {
  readonly lo: number;
  readonly hi: number;
  readonly w: number;
}

function levelPosition(levels: readonly number[], tau: number): LevelPosition {
  const last = levels.length - 1;
  const lowest = levels[0];
  const highest = levels[last];
  if (lowest === undefined || highest === undefined) throw new RangeError('a quantile forecast needs at least one level');
  // Levels parsed from headers such as q0.1 may differ from a computed 1 - 0.9 by one ulp.
  const eps = 1e-9;
  if (tau < lowest - eps || tau > highest + eps) throw new LevelOutOfRangeError(tau, lowest, highest);
  if (tau <= lowest) return { lo: 0, hi: 0, w: 0 };
  if (tau >= highest) return { lo: last, hi: last, w: 0 };
  let hi = 1;
  while ((levels[hi] as number) < tau) hi++;
  const lo = hi - 1;
  const tauLo = levels[lo] as number;
  const tauHi = levels[hi] as number;
  if (Math.abs(tau - tauHi) <= eps) return { lo: hi, hi, w: 0 };
  if (Math.abs(tau - tauLo) <= eps) return { lo, hi: lo, w: 0 };
  return { lo, hi, w: (tau - tauLo) / (tauHi - tauLo) };
}

function priceAt(position: LevelPosition, prices: readonly number[]): number {
  const { lo, hi, w } = position;
  if (lo === hi) return prices[lo] as number;
  return (prices[lo] as number) * (1 - w) + (prices[hi] as number) * w;
}
