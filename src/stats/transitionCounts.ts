import { ArgumentError } from './argumentError.js';

/** Counts n_ij of transitions from state i at t - 1 to state j at t of a 0/1 hit sequence. */
export interface TransitionCounts {
  readonly n00: number;
  readonly n01: number;
  readonly n10: number;
  readonly n11: number;
}

/**
 * Transition counts of a hit sequence (1 or true = a hit: the realised value fell outside the
 * interval, or below the quantile).
 *
 * Notes: n_ij = #{t = 2..T : I_{t-1} = i, I_t = j}; the counts add up to T - 1 (the first
 * observation has no predecessor).
 *
 * @param hits I_1..I_T, each 0, 1, false or true, T >= 2
 * @example
 * transitionCounts([0, 0, 1, 1, 0]); // { n00: 1, n01: 1, n10: 1, n11: 1 }
 *
 * Reference: P. F. Christoffersen (1998), Evaluating interval forecasts, Int. Economic Review 39(4),
 * 841-862, doi:10.2307/2527341, section 3.
 */
export function transitionCounts(hits: readonly (number | boolean)[]): TransitionCounts {
  if (!Array.isArray(hits) || hits.length < 2) {
    throw new ArgumentError('hits', 'an array of at least two 0/1 values', hits);
  }
  const states = hits.map((h, i) => {
    if (h === 0 || h === false) return 0;
    if (h === 1 || h === true) return 1;
    throw new ArgumentError(`hits[${i}]`, '0, 1, false or true', h);
  });
  const counts = [0, 0, 0, 0];
  for (let t = 1; t < states.length; t++) {
    const index = 2 * (states[t - 1] as number) + (states[t] as number);
    counts[index] = (counts[index] as number) + 1;
  }
  const [n00 = 0, n01 = 0, n10 = 0, n11 = 0] = counts;
  return { n00, n01, n10, n11 };
}
