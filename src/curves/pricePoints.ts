import type { ScenarioSet } from '../scenarios/scenarioSet.js';

/**
 * The price points at which one period's step curve may change: breakpoints b_1 < ... < b_m. Step k
 * holds the prices between b_k and b_{k+1} (b_0 = -infinity, b_{m+1} = +infinity).
 */
export interface PeriodPricePoints {
  /** Breakpoints, ascending, none equal to a planning path's price [currency/MWh]. */
  readonly breakpoints: Float64Array;
  /**
   * Whether the curve may sell in each step (length m + 1): false for a step holding a planning path
   * with a negative price. The stored-energy program is exact only when it never sells where a
   * planning price is negative (curveProgram.ts); a curve that does not sell below zero is also common
   * practice.
   */
  readonly sellable: Uint8Array;
  /** The step of each planning path, indexed by path (the program's assignment) [-]. */
  readonly stepOfPath: Int32Array;
}

/**
 * Breakpoints of every period from the planning paths' prices, at most `steps` steps per period:
 * - cuts at the ranks round(k S / steps), k = 1 .. steps - 1, of the period's sorted planning prices,
 *   each halfway between the two neighbouring prices, so that every step holds about S / steps paths and
 *   no planning price sits on a breakpoint (the step of every planning path is then the same whichever
 *   way the exchange settles a tie); a cut inside a run of equal prices is dropped;
 * - when the period has planning prices below and above 0, a cut at 0 (halfway between 0 and the next
 *   price above it when a planning price is exactly 0), so that every step's planning prices are all
 *   >= 0 or all <= 0; it takes the place of the nearest rank cut when the steps are at their maximum.
 * No step is empty of planning paths.
 *
 * @param steps the most steps per period, >= 1 (1: a flat curve)
 */
export function curvePricePoints(scenarios: ScenarioSet, steps: number): PeriodPricePoints[] {
  if (!(Number.isInteger(steps) && steps >= 1)) throw new RangeError(`curvePricePoints: ${steps} steps; give a whole number >= 1`);
  const S = scenarios.pathCount;
  const out: PeriodPricePoints[] = [];
  const sorted = new Float64Array(S);
  for (let t = 0; t < scenarios.periodCount; t++) {
    const prices = scenarios.clearingPricePerMwh.subarray(t * S, (t + 1) * S);
    sorted.set(prices);
    sorted.sort();
    const cuts = new Map<number, number>(); // rank -> breakpoint
    for (let k = 1; k < steps; k++) {
      const r = Math.round((k * S) / steps);
      if (r <= 0 || r >= S) continue;
      const below = sorted[r - 1] as number;
      const above = sorted[r] as number;
      if (below < above) cuts.set(r, below + (above - below) / 2);
    }
    const low = sorted[0] as number;
    const high = sorted[S - 1] as number;
    if (low < 0 && high > 0) {
      let r0 = 0;
      while ((sorted[r0] as number) <= 0) r0++;
      const below = sorted[r0 - 1] as number;
      const zero = below < 0 ? 0 : (sorted[r0] as number) / 2;
      if (!cuts.has(r0)) {
        if (cuts.size >= steps - 1 && cuts.size > 0) cuts.delete(nearestRank(cuts, r0));
        cuts.set(r0, zero);
      } else cuts.set(r0, zero);
    }
    const ranks = [...cuts.keys()].sort((a, b) => a - b);
    const breakpoints = Float64Array.from(ranks, (r) => cuts.get(r) as number);
    const sellable = new Uint8Array(breakpoints.length + 1).fill(1);
    const stepOfPath = new Int32Array(S);
    for (let w = 0; w < S; w++) {
      const step = stepOf(breakpoints, prices[w] as number);
      stepOfPath[w] = step;
      if ((prices[w] as number) < 0) sellable[step] = 0;
    }
    out.push({ breakpoints, sellable, stepOfPath });
  }
  return out;
}

/** The step of a price: the number of breakpoints below it (ties count as below: a sell at b is accepted at b). */
export function stepOf(breakpoints: ArrayLike<number>, price: number): number {
  let lo = 0;
  let hi = breakpoints.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((breakpoints[mid] as number) <= price) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function nearestRank(cuts: Map<number, number>, rank: number): number {
  let best = -1;
  for (const r of cuts.keys()) if (best < 0 || Math.abs(r - rank) < Math.abs(best - rank)) best = r;
  return best;
}
