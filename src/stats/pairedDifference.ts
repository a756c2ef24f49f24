import { ArgumentError } from './argumentError.js';

/** Mean of paired differences and its standard error. */
export interface PairedDifference {
  /** n [-]. */
  readonly count: number;
  /** dbar = (1/n) sum_i (a_i - b_i). */
  readonly mean: number;
  /** s_d / sqrt(n), s_d the sample standard deviation of the differences (divisor n - 1); 0 when n < 2. */
  readonly standardError: number;
}

/**
 * The mean difference of two samples measured on the same units (here: two bids' profits on the same
 * price paths) and its standard error s_d / sqrt(n): the paired comparison, whose error is far smaller
 * than that of two independent means when the samples move together (e.g. Montgomery and Runger,
 * Applied Statistics and Probability for Engineers, section 10-4, the paired t-test).
 */
export function pairedDifference(a: ArrayLike<number>, b: ArrayLike<number>): PairedDifference {
  const n = a.length;
  if (n === 0 || b.length !== n) throw new ArgumentError('b', `as many values as a (${n}), at least one`, b.length);
  let sum = 0;
  for (let i = 0; i < n; i++) sum += (a[i] as number) - (b[i] as number);
  const mean = sum / n;
  if (n < 2) return { count: n, mean, standardError: 0 };
  let squares = 0;
  for (let i = 0; i < n; i++) {
    const d = (a[i] as number) - (b[i] as number) - mean;
    squares += d * d;
  }
  return { count: n, mean, standardError: Math.sqrt(squares / (n - 1) / n) };
}
