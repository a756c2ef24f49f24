import { ArgumentError } from './argumentError.js';
import { bernoulliLogLikelihood } from './bernoulliLogLikelihood.js';
import { chiSquareSurvival } from './chiSquare.js';
import { unconditionalCoverageLr } from './kupiec.js';
import { transitionCounts, type TransitionCounts } from './transitionCounts.js';
import { requireIntegerIn, requireOpenUnit } from './validate.js';

/** Christoffersen interval-forecast test result. */
export interface ChristoffersenResult {
  readonly counts: TransitionCounts;
  /** pi_01 = n01 / (n00 + n01), hit probability after a non-hit (0 when n00 + n01 = 0). */
  readonly pi01: number;
  /** pi_11 = n11 / (n10 + n11), hit probability after a hit (0 when n10 + n11 = 0). */
  readonly pi11: number;
  /** pi = (n01 + n11) / (n00 + n01 + n10 + n11), the hit rate over the counted transitions. */
  readonly pi: number;
  /** LR_uc on the T - 1 counted observations, chi-square 1 df. */
  readonly lrUnconditional: number;
  readonly pValueUnconditional: number;
  /** LR_ind, chi-square 1 df. */
  readonly lrIndependence: number;
  readonly pValueIndependence: number;
  /** LR_cc = LR_uc + LR_ind, chi-square 2 df. */
  readonly lrConditionalCoverage: number;
  readonly pValueConditionalCoverage: number;
}

/**
 * Christoffersen tests of independence and conditional coverage, from transition counts.
 *
 * Notes: a first-order Markov chain of hits with pi_01 = n01 / (n00 + n01), pi_11 = n11 / (n10 + n11)
 * against independence with pi = (n01 + n11) / N, N = n00 + n01 + n10 + n11, and log-likelihoods
 *   l(pi)          = (n00 + n10) ln(1 - pi) + (n01 + n11) ln pi,
 *   l(pi01, pi11)  = n00 ln(1 - pi01) + n01 ln pi01 + n10 ln(1 - pi11) + n11 ln pi11   (0 ln 0 = 0),
 *   LR_ind = -2 [ l(pi) - l(pi01, pi11) ]                    ~ chi-square, 1 df,
 *   LR_uc  = -2 [ l(p)  - l(pi) ]   (Kupiec, on the same N)  ~ chi-square, 1 df,
 *   LR_cc  = LR_uc + LR_ind = -2 [ l(p) - l(pi01, pi11) ]    ~ chi-square, 2 df.
 * Convention: all three use the N = T - 1 transitions, i.e. the first observation of a hit sequence
 * is left out, which makes LR_cc exactly the sum. Tiny negative values from rounding are clamped to 0.
 *
 * @param counts n00, n01, n10, n11, non-negative integers with N >= 1
 * @param expectedRate p, the nominal hit probability, in (0, 1): e.g. 0.2 for an 80% central interval
 *   when a hit is a realised value outside it on either side
 * @example
 * christoffersenFromCounts({ n00: 70, n01: 10, n10: 10, n11: 10 }, 0.2);
 * // { lrIndependence: 12.0714, lrConditionalCoverage: 12.0714, pValueConditionalCoverage: 0.00239, ... }
 *
 * Reference: P. F. Christoffersen (1998), Evaluating interval forecasts, Int. Economic Review 39(4),
 * 841-862, doi:10.2307/2527341, section 3.
 */
export function christoffersenFromCounts(counts: TransitionCounts, expectedRate: number): ChristoffersenResult {
  const { n00, n01, n10, n11 } = counts;
  for (const [name, value] of Object.entries({ n00, n01, n10, n11 })) requireIntegerIn(`counts.${name}`, value, 0);
  requireOpenUnit('expectedRate', expectedRate);
  const total = n00 + n01 + n10 + n11;
  if (total === 0) throw new ArgumentError('counts', 'counts with at least one transition', JSON.stringify(counts));
  const pi01 = n00 + n01 > 0 ? n01 / (n00 + n01) : 0;
  const pi11 = n10 + n11 > 0 ? n11 / (n10 + n11) : 0;
  const pi = (n01 + n11) / total;
  const markov = bernoulliLogLikelihood(n00, n01, pi01) + bernoulliLogLikelihood(n10, n11, pi11);
  const lrIndependence = Math.max(0, -2 * (bernoulliLogLikelihood(n00 + n10, n01 + n11, pi) - markov));
  const lrUnconditional = unconditionalCoverageLr(total, n01 + n11, expectedRate);
  const lrConditionalCoverage = lrUnconditional + lrIndependence;
  return {
    counts: { n00, n01, n10, n11 },
    pi01,
    pi11,
    pi,
    lrUnconditional,
    pValueUnconditional: chiSquareSurvival(lrUnconditional, 1),
    lrIndependence,
    pValueIndependence: chiSquareSurvival(lrIndependence, 1),
    lrConditionalCoverage,
    pValueConditionalCoverage: chiSquareSurvival(lrConditionalCoverage, 2),
  };
}

/**
 * Christoffersen tests from a 0/1 hit sequence: transitionCounts, then christoffersenFromCounts
 * (the first observation only starts the chain; see the convention there).
 *
 * @param hits I_1..I_T, each 0, 1, false or true, T >= 2
 * @param expectedRate p, in (0, 1)
 * @example
 * christoffersenFromHits([0, 0, 0, 1, 0, 0, 1, 0, 0, 0], 0.1).counts; // { n00: 5, n01: 2, n10: 2, n11: 0 }
 */
export function christoffersenFromHits(
  hits: readonly (number | boolean)[],
  expectedRate: number,
): ChristoffersenResult {
  return christoffersenFromCounts(transitionCounts(hits), expectedRate);
}
