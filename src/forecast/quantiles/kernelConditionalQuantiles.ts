/**
 * Quantiles of a sample conditional on a scalar state, by kernel weights: the value u_i observed in the
 * state x_i gets the weight w_i = K((x_i - x) / h) for the target state x, with the Epanechnikov kernel
 * K(r) = max(0, 1 - r^2), and the tau-quantile is read from the weighted empirical distribution. That is
 * the inverse of the Nadaraya-Watson estimate of the conditional distribution function,
 *   F(y | x) = sum_i w_i 1{u_i <= y} / sum_i w_i
 * (Hall, Wolff and Yao 1999, their local-constant estimator), whose quantiles are the kernel conditional
 * quantiles of Bhattacharya and Gangopadhyay (1990).
 *
 * The weighted quantile is Hyndman and Fan's definition 7 carried over to weights: with the values of
 * positive weight in ascending order v_0 <= ... <= v_(n-1), their weights w_j and the cumulative sums
 * C_j = w_0 + ... + w_j, the value v_j sits at the level p_j = (C_j - w_j) / (C_(n-1) - w_(n-1)), and
 * the quantile is interpolated linearly between the two levels around tau. With equal weights p_j =
 * j / (n - 1), which is definition 7 itself (sortedQuantile.ts): a bandwidth wider than every distance
 * gives back the pooled sample quantiles.
 *
 * When the weights' effective sample size, (sum w)^2 / sum w^2 (Kish 1965), is below `minEffective`
 * (or below the sample's size, if that is smaller), the bandwidth is doubled until it is not: a state
 * seldom seen borrows from farther states instead of resting on a handful of values.
 *
 * References: P. Hall, R. C. L. Wolff and Q. Yao (1999), Methods for estimating a conditional
 * distribution function, J. Am. Stat. Assoc. 94(445), 154-163, doi:10.1080/01621459.1999.10473832;
 * P. K. Bhattacharya and A. K. Gangopadhyay (1990), Kernel and nearest-neighbor estimation of a
 * conditional quantile, Ann. Stat. 18(3), 1400-1415, doi:10.1214/aos/1176347757; V. A. Epanechnikov
 * (1969), Non-parametric estimation of a multivariate probability density, Theory Probab. Appl. 14(1),
 * 153-158; L. Kish (1965), Survey Sampling, Wiley, New York (the effective sample size); R. J. Hyndman
 * and Y. Fan (1996), Sample quantiles in statistical packages, Am. Stat. 50(4), 361-365.
 *
 * @example
 * // far-apart states, a narrow bandwidth: the quantiles of the values observed near the target state
 * kernelConditionalQuantiles({ sorted: [1, 2, 3, 10], states: [0, 0, 5, 0] }, 5, [0.5], 1, 1, new Float64Array(4)); // [3]
 *
 * @param sample values in ascending order, with the state each was observed in
 * @param target the target state, on the scale of the states
 * @param levels levels in [0, 1], ascending
 * @param bandwidth h > 0, on the scale of the states
 * @param minEffective the fewest effective values (>= 1) before the bandwidth is widened
 * @param weights scratch space of at least sample.sorted.length values (overwritten: the cumulative weights
 *   C_(j-1) of the values of positive weight, in order)
 * @param byState optional, the same quantiles faster for many targets on one sample: its positions grouped by
 *   the cells of their states ({@link StateCells}, built on sample.states)
 * @returns one quantile per level, non-decreasing
 */
export function kernelConditionalQuantiles(
  sample: { readonly sorted: ArrayLike<number>; readonly states: ArrayLike<number> },
  target: number,
  levels: readonly number[],
  bandwidth: number,
  minEffective: number,
  weights: Float64Array,
  byState?: StateCells,
): number[] {
  return kernelQuantilesWithin(Infinity, sample, target, levels, bandwidth, minEffective, weights, byState) as number[];
}

/**
 * {@link kernelConditionalQuantiles}, or null when the bandwidth would have to be widened past `widest`: for a
 * sample that holds only the values within `widest` of the target (those beyond have no weight up to it).
 */
export function kernelQuantilesWithin(widest: number, ...args: Parameters<typeof kernelConditionalQuantiles>): number[] | null {
  const [sample, target, levels, bandwidth, minEffective, weights, byState] = args;
  const n = sample.sorted.length;
  const enough = Math.min(minEffective, n);
  if (positions.length < n) positions = new Int32Array(n);
  const at = positions;
  const states = sample.states;
  // The values of positive weight, in ascending order: their positions in the sample and (in `weights`) the sums
  // of the weights before each, C_(j-1), added up in that order; `last` is the last one's weight.
  let count = 0;
  let h = bandwidth;
  let total = 0;
  let last = 0;
  for (;;) {
    const inverse = 1 / (h * h);
    let squares = 0;
    total = 0;
    count = 0;
    // The values that may have a positive weight are marked in a bit set over the positions (every value, or,
    // with `byState`, those of the cells within the kernel's reach and a cell more on each side against
    // rounding), then visited in ascending position: the weights are the same numbers, summed in the same
    // order, whichever values were marked.
    const words = (n + 31) >>> 5;
    let marked: Int32Array;
    if (byState === undefined) {
      if (everything.length < words) everything = new Int32Array(words);
      everything.fill(-1, 0, words);
      if ((n & 31) !== 0) everything[words - 1] = (1 << (n & 31)) - 1;
      marked = everything;
    } else {
      marked = byState.marked(Math.max(0, byState.cellOf(target - h) - 1), Math.min(2 * CELLS, byState.cellOf(target + h) + 2));
    }
    for (let word = 0; word < words; word++) {
      let bits = marked[word] as number;
      while (bits !== 0) {
        const i = (word << 5) + 31 - Math.clz32(bits & -bits);
        bits &= bits - 1;
        const d = (states[i] as number) - target;
        const w = 1 - d * d * inverse;
        if (w > 0) {
          weights[count] = total;
          at[count++] = i;
          total += w;
          squares += w * w;
          last = w;
        }
      }
    }
    // A bandwidth of 2^40 times the first reaches every finite state: stop there whatever the count.
    if ((total > 0 && (total * total) / squares >= enough) || h > bandwidth * 2 ** 40) break;
    if (2 * h > widest) return null;
    h *= 2;
  }
  const lastValue = sample.sorted[positions[count - 1] as number] as number;
  const span = total - last;
  const out = new Array<number>(levels.length);
  // One value of positive weight: every quantile is that value.
  if (span <= 0) return out.fill(lastValue);
  // The value v_j sits at the level p_j = C_(j-1) / span, non-decreasing in j (so is rounding): each tau's first
  // j with tau <= p_j, at or after the last tau's, is found by bisection, where a walk over every j finds the same.
  const sorted = sample.sorted;
  let k = 0;
  let from = 0;
  for (; k < levels.length; k++) {
    const tau = levels[k] as number;
    let lo = from;
    let hi = count;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (tau <= (weights[mid] as number) / span) hi = mid;
      else lo = mid + 1;
    }
    if (lo === count) break;
    const level = (weights[lo] as number) / span;
    const value = sorted[positions[lo] as number] as number;
    // At or below the first level (0) the first value; else linear between the two levels around tau,
    // kept at most `value` (p + 1 (v - p) can round past v).
    const previousValue = lo === 0 ? NaN : (sorted[positions[lo - 1] as number] as number);
    const previousLevel = lo === 0 ? 0 : (weights[lo - 1] as number) / span;
    out[k] = Number.isNaN(previousValue) ? value : Math.min(value, previousValue + ((tau - previousLevel) / (level - previousLevel)) * (value - previousValue));
    from = lo;
  }
  while (k < levels.length) out[k++] = lastValue;
  return out;
}

/**
 * A sample's positions grouped by cells of its states, for a kernel to visit only the values it can
 * reach: state x falls in cell floor(x / width) (kept within +-CELLS; beyond, the outermost cells), and
 * the positions of a run of cells are a run of `positions`. A state that is not finite gets no weight
 * from any kernel and no cell.
 */
export class StateCells {
  /** The positions of the finite states, cell by cell, ascending within a cell. */
  positions = new Int32Array(0);
  /** starts[c + CELLS]: where cell c begins in `positions`; starts[2 CELLS] is their count. */
  readonly starts = new Int32Array(2 * CELLS + 1);
  private cells = new Int32Array(0);
  width = 1;
  /** One bit per position: those of the cells [markedFrom, markedTo) (see {@link marked}). */
  private marks = new Int32Array(0);
  private markedFrom = 0;
  private markedTo = 0;

  /** Groups states[0 .. n - 1] into cells `width` wide (width > 0). */
  build(states: ArrayLike<number>, width: number): this {
    const n = states.length;
    if (this.cells.length < n) {
      this.cells = new Int32Array(Math.max(n, Math.ceil(1.25 * this.cells.length)));
      this.positions = new Int32Array(this.cells.length);
    }
    const { cells, starts, positions } = this;
    this.width = width;
    starts.fill(0);
    for (let i = 0; i < n; i++) {
      const x = states[i] as number;
      // cellOf(x), written out
      const c = Number.isFinite(x) ? Math.max(0, Math.min(2 * CELLS - 1, Math.floor(x / width) + CELLS)) : -1;
      cells[i] = c;
      if (c >= 0) starts[c + 1] = (starts[c + 1] as number) + 1;
    }
    for (let c = 1; c <= 2 * CELLS; c++) starts[c] = (starts[c] as number) + (starts[c - 1] as number);
    // Placed by a counting pass, each position at its cell's next free place (then each start is moved back).
    for (let i = 0; i < n; i++) {
      const c = cells[i] as number;
      if (c < 0) continue;
      const at = starts[c] as number;
      positions[at] = i;
      starts[c] = at + 1;
    }
    for (let c = 2 * CELLS - 1; c > 0; c--) starts[c] = starts[c - 1] as number;
    starts[0] = 0;
    const words = (n + 31) >>> 5;
    if (this.marks.length < words) this.marks = new Int32Array(Math.max(words, Math.ceil(1.25 * this.marks.length)));
    this.marks.fill(0, 0, words);
    this.markedFrom = 0;
    this.markedTo = 0;
    return this;
  }

  /**
   * A bit set over the positions (bit i & 31 of word i >>> 5) with exactly those of the cells [from, to)
   * marked: the last call's set with the cells that entered or left toggled, so that the kernel's reach
   * moving a few cells from one target to the next marks only those (overwritten by the next call).
   */
  marked(from: number, to: number): Int32Array {
    const [oldFrom, oldTo] = [this.markedFrom, this.markedTo];
    if (!(from < to)) [from, to] = [0, 0];
    if (oldFrom === oldTo || to <= oldFrom || oldTo <= from) {
      this.toggle(oldFrom, oldTo);
      this.toggle(from, to);
    } else {
      this.toggle(Math.min(from, oldFrom), Math.max(from, oldFrom));
      this.toggle(Math.min(to, oldTo), Math.max(to, oldTo));
    }
    this.markedFrom = from;
    this.markedTo = to;
    return this.marks;
  }

  /** Flips the bits of the positions of the cells [from, to): each position is in one cell. */
  private toggle(from: number, to: number): void {
    const { marks, positions } = this;
    for (let j = this.starts[from] as number, end = this.starts[to] as number; j < end; j++) {
      const i = positions[j] as number;
      marks[i >>> 5] = (marks[i >>> 5] as number) ^ (1 << (i & 31));
    }
  }

  /** The index (0 .. 2 CELLS - 1) of the cell of a finite or infinite x. */
  cellOf(x: number): number {
    return Math.max(0, Math.min(2 * CELLS - 1, Math.floor(x / this.width) + CELLS));
  }
}

/** Cells on either side of zero (driver-fhs's cells, 1/32 of a standard deviation wide, span +-128 standard deviations). */
const CELLS = 4096;

/** Scratch space: positions of the values of positive weight (grown as needed, reused from call to call). */
let positions = new Int32Array(0);
/** Scratch space: one bit per position, every one set (the kernel's reach without StateCells). */
let everything = new Int32Array(0);
