import { normalQuantile } from '../../stats/normalQuantile.js';

/** Centre and scale of the robust standardisation [currency/MWh]. */
export interface RobustScale {
  /** a: the sample median. */
  readonly median: number;
  /** b: the normalised median absolute deviation, MAD / Phi^-1(3/4) (> 0). */
  readonly scale: number;
}

/** 1 / Phi^-1(3/4) = 1.4826...: makes the MAD a consistent estimate of sigma for normal data. */
export const MAD_TO_SIGMA = 1 / normalQuantile(0.75);
/** sqrt(pi / 2): the same for the mean absolute deviation, used when the MAD is 0. */
const MEAN_ABS_TO_SIGMA = Math.sqrt(Math.PI / 2);

/**
 * Median and normalised MAD of a sample, the centre and scale of the asinh variance-stabilising
 * transformation.
 *
 * Notes: a = median(x), b = median(|x - a|) / Phi^-1(3/4) (Hampel 1974; the standardisation used with
 * the asinh transformation by Uniejewski, Weron and Ziel 2018). When more than half of the values are equal the MAD is 0; b then falls back to
 * the mean absolute deviation about the median times sqrt(pi/2), and to 1 for a constant sample, so
 * that b > 0 always. The median of an even sample is the mean of the two middle values.
 *
 * @param values the sample, finite, at least one (not changed)
 * @example
 * robustScale([1, 2, 3, 4, 100]); // { median: 3, scale: 1.4826... }
 *
 * Reference: F. R. Hampel (1974), The influence curve and its role in robust estimation, JASA 69(346),
 * 383-393, doi:10.1080/01621459.1974.10482962.
 */
export function robustScale(values: ArrayLike<number>): RobustScale {
  const work = Float64Array.from(values as ArrayLike<number>);
  const median = medianInPlace(work);
  for (let i = 0; i < work.length; i++) work[i] = Math.abs((work[i] as number) - median);
  const mad = medianInPlace(work);
  if (mad > 0) return { median, scale: mad * MAD_TO_SIGMA };
  let sum = 0;
  for (let i = 0; i < work.length; i++) sum += work[i] as number;
  const meanAbs = sum / work.length;
  return { median, scale: meanAbs > 0 ? meanAbs * MEAN_ABS_TO_SIGMA : 1 };
}

/**
 * The asinh transformation after robust standardisation (Uniejewski, Weron and Ziel 2018):
 *   z = asinh((p - a) / b),   asinh(x) = ln(x + sqrt(x^2 + 1)).
 * It is odd, near-linear around 0 and logarithmic in the tails, so it damps price spikes of either
 * sign and accepts negative prices.
 *
 * Reference: B. Uniejewski, R. Weron and F. Ziel (2018), Variance stabilizing transformations for
 * electricity spot price forecasting, IEEE Trans. Power Syst. 33(2), 2219-2229,
 * doi:10.1109/TPWRS.2017.2734563.
 */
export function toAsinhScale(price: number, s: RobustScale): number {
  return Math.asinh((price - s.median) / s.scale);
}

/**
 * {@link toAsinhScale} of values[0 .. out.length - 1] into `out`: the same numbers, in a loop that reads
 * a and b once (the daily calibrations transform some 35,000 values per window).
 */
export function toAsinhScales(values: ArrayLike<number>, s: RobustScale, out: Float64Array): void {
  const { median, scale } = s;
  for (let i = 0; i < out.length; i++) out[i] = Math.asinh(((values[i] as number) - median) / scale);
}

/** Inverse of {@link toAsinhScale}: p = a + b sinh(z). */
export function fromAsinhScale(z: number, s: RobustScale): number {
  return s.median + s.scale * Math.sinh(z);
}

/** Median of `work` (reordered in place) by quickselect: O(n) expected (Hoare 1961). */
function medianInPlace(work: Float64Array): number {
  const n = work.length;
  const upper = selectInPlace(work, n >> 1);
  if (n % 2 === 1) return upper;
  // The lower middle is the largest value left of position n/2 after selection.
  let lower = -Infinity;
  for (let i = 0; i < n >> 1; i++) lower = Math.max(lower, work[i] as number);
  return (lower + upper) / 2;
}

/** k-th smallest (0-based) of `a`, partially sorting it (Hoare's FIND with a middle pivot). */
export function selectInPlace(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1] as number;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while ((a[i] as number) < pivot) i++;
      while ((a[j] as number) > pivot) j--;
      if (i <= j) {
        const t = a[i] as number;
        a[i] = a[j] as number;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k] as number;
}
