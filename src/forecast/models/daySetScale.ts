import type { RobustScale } from './robustAsinh.js';
import { MAD_TO_SIGMA, robustScale } from './robustAsinh.js';
import { sortedSampleBounds, type SampleBounds } from './farOutFences.js';

/**
 * robustScale of the prices of a set of days, kept sorted between calls: the same numbers, bit for
 * bit, as robustScale of the days' prices one after the other, for a set that moves a few days at a
 * time (the rolling windows of a run of daily forecasts).
 *
 * Notes: the prices of the last set are kept in ascending order; the next set's is made by one merge
 * pass that drops the values of the days that left and inserts those of the days that came (each
 * group sorted first), O(N + m log m) for N values and m changed ones, instead of two selections over
 * all N values. The median is then read off at positions floor(N / 2) (and floor(N / 2) - 1 when N is
 * even); the MAD, the k-th smallest |x - a| of a sorted sample, by walking outwards from the median,
 * since |x - a| is non-increasing to its left and non-decreasing to its right (rounding is monotone).
 * Order statistics do not depend on the order of the sample, so these are robustScale's values. Where
 * robustScale's answer can depend on that order (a median of 0, whose sign is the one selection met
 * first, or a MAD of 0, whose mean-absolute-deviation fallback sums in order), robustScale itself is
 * called on the days in the order given.
 *
 * Reference: C. A. R. Hoare (1961), Algorithm 65: Find, Commun. ACM 4(7), 321-322 (the selection
 * robustScale uses); D. E. Knuth (1998), The Art of Computer Programming vol. 3, 2nd ed., section 5.2.4
 * (merging sorted sequences).
 */
export class DaySetScale {
  /** The days of the last set, by identity of their price arrays. */
  private members = new Set<Float64Array>();
  private sorted: Float64Array = new Float64Array(0);
  private spare: Float64Array = new Float64Array(0);
  private length = 0;

  /**
   * robustScale of the prices of `days` one after the other (the arrays must not change while kept);
   * for the same set as the last call, the same object as that call returned (unless robustScale's own
   * answer was taken), so that a scale can be recognised by identity.
   *
   * @param days price arrays of the days, each finite, at least one value in all, no array twice
   */
  of(days: readonly Float64Array[]): RobustScale {
    return this.scaleOf(days, new Set(days));
  }

  /**
   * {@link of} and, from the same sorted prices, their far-out fences, lowest and highest value
   * (sortedSampleBounds, farOutFences.ts): the same numbers as of the days' prices sorted afresh.
   *
   * @param days as for {@link of}
   */
  withBounds(days: readonly Float64Array[]): { scale: RobustScale; bounds: SampleBounds } {
    const next = new Set(days);
    const scale = this.scaleOf(days, next);
    // A day given twice: `of` answers from the days themselves and the kept set is not moved.
    const sorted = next.size === days.length ? this.sorted.subarray(0, this.length) : concatenate(days).sort();
    return { scale, bounds: sortedSampleBounds(sorted) };
  }

  private scaleOf(days: readonly Float64Array[], next: Set<Float64Array>): RobustScale {
    if (next.size !== days.length) return robustScale(concatenate(days));
    if (this.update(days, next) && this.last !== null) return this.last;
    this.last = null;
    const sorted = this.sorted;
    const n = this.length;
    const half = n >> 1;
    const median = n % 2 === 1 ? (sorted[half] as number) : ((sorted[half - 1] as number) + (sorted[half] as number)) / 2;
    const mad = median === 0 ? 0 : sortedMad(sorted, n, median);
    if (mad === 0) return robustScale(concatenate(days));
    this.last = { median, scale: mad * MAD_TO_SIGMA };
    return this.last;
  }

  /** The answer for the last set, when it did not depend on the days' order (asked again: the same object). */
  private last: RobustScale | null = null;

  /** Makes `sorted` hold the values of `days`: merged from the last set's, or sorted afresh; true when the set is the last one. */
  private update(days: readonly Float64Array[], next: Set<Float64Array>): boolean {
    const left: Float64Array[] = [];
    for (const day of this.members) if (!next.has(day)) left.push(day);
    const came = days.filter((day) => !this.members.has(day));
    const total = days.reduce((sum, day) => sum + day.length, 0);
    const changed = left.reduce((sum, day) => sum + day.length, 0) + came.reduce((sum, day) => sum + day.length, 0);
    this.members = next;
    if (changed === 0) return true;
    if (2 * changed > total || !this.merge(concatenate(left).sort(), concatenate(came).sort(), total)) {
      this.sorted = growTo(this.sorted, total);
      let at = 0;
      for (const day of days) {
        this.sorted.set(day, at);
        at += day.length;
      }
      this.sorted.subarray(0, total).sort();
      this.length = total;
    }
    return false;
  }

  /**
   * One pass over the kept values: drops those of `removed` and inserts those of `added` (both
   * ascending). False when a value to drop is not among the kept ones (then nothing is changed).
   */
  private merge(removed: Float64Array, added: Float64Array, total: number): boolean {
    const from = this.sorted;
    const to = growTo(this.spare, total);
    let r = 0;
    let a = 0;
    let out = 0;
    for (let i = 0; i < this.length; i++) {
      const x = from[i] as number;
      if (r < removed.length) {
        const drop = removed[r] as number;
        if (drop < x) return false;
        if (drop === x) {
          r++;
          continue;
        }
      }
      while (a < added.length && (added[a] as number) < x) to[out++] = added[a++] as number;
      to[out++] = x;
    }
    if (r < removed.length) return false;
    while (a < added.length) to[out++] = added[a++] as number;
    this.spare = from;
    this.sorted = to;
    this.length = out;
    return true;
  }
}

/**
 * Median of |x_i - a| over x_0 <= ... <= x_{n-1} (the mean of the two middle values for even n), in
 * O(log n): the distances of the values left of a grow leftwards and those right of it rightwards, two
 * ascending runs, and the k-th smallest of two sorted runs is found by bisecting on how many of the
 * first k + 1 come from the left run.
 */
export function sortedMad(sorted: Float64Array, n: number, median: number): number {
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((sorted[mid] as number) < median) lo = mid + 1;
    else hi = mid;
  }
  const k = n >> 1;
  const upper = kthDistance(sorted, n, median, lo, k);
  return n % 2 === 1 ? upper : (kthDistance(sorted, n, median, lo, k - 1) + upper) / 2;
}

/**
 * The k-th smallest (0-based) |x_i - a|, with x_0..x_{split-1} < a <= x_split..x_{n-1}: runs
 * L_i = |x_{split-1-i} - a| and R_j = |x_{split+j} - a|, both ascending.
 */
function kthDistance(sorted: Float64Array, n: number, median: number, split: number, k: number): number {
  const nl = split;
  const nr = n - split;
  const leftAt = (i: number): number => Math.abs((sorted[split - 1 - i] as number) - median);
  const rightAt = (j: number): number => Math.abs((sorted[split + j] as number) - median);
  // i = how many of the k + 1 smallest come from L: the least i with L_i >= R_{k-i} (or the bound).
  let lo = Math.max(0, k + 1 - nr);
  let hi = Math.min(k + 1, nl);
  while (lo < hi) {
    const i = (lo + hi) >> 1;
    if (leftAt(i) < rightAt(k - i)) lo = i + 1;
    else hi = i;
  }
  const j = k + 1 - lo;
  const fromLeft = lo > 0 ? leftAt(lo - 1) : -Infinity;
  const fromRight = j > 0 ? rightAt(j - 1) : -Infinity;
  return Math.max(fromLeft, fromRight);
}

function concatenate(arrays: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(arrays.reduce((sum, a) => sum + a.length, 0));
  let at = 0;
  for (const a of arrays) {
    out.set(a, at);
    at += a.length;
  }
  return out;
}

function growTo(buffer: Float64Array, length: number): Float64Array {
  return buffer.length >= length ? buffer : new Float64Array(Math.max(length, Math.ceil(buffer.length * 1.25)));
}
