import { dieboldMariano, type DieboldMarianoResult } from '../stats/dieboldMariano.js';
import { studentTCdf } from '../stats/studentTCdf.js';

/**
 * The edge of one policy over another: is its mean daily profit higher? (docs/design.md section 6)
 *
 * Notes: with daily profits a_t (the tested policy, e.g. quantile) and b_t (the reference, e.g. point)
 * on the same days, d_t = a_t - b_t. Taking the loss of a policy to be its negated profit, d_t is the
 * reference's loss minus the tested policy's loss, so the Diebold-Mariano test with horizon h = 1 and
 * the Harvey-Leybourne-Newbold correction (src/stats/dieboldMariano.ts) tests H0: E[d] = 0 against
 * H1: E[d] > 0 ("the tested policy earns more"), and `pValueOneSided` is P(T >= HLN), T ~ t(n - 1).
 * Fewer than 2 days give `too-few-days` instead of a test.
 *
 * References: F. X. Diebold and R. S. Mariano (1995), J. Business & Economic Statistics 13(3), 253-263,
 * doi:10.1080/07350015.1995.10524599; D. Harvey, S. Leybourne and P. Newbold (1997), Int. J.
 * Forecasting 13(2), 281-291, doi:10.1016/S0169-2070(96)00719-4.
 */
export type EdgeTest = { readonly tested: string; readonly reference: string } & (
  | (Extract<DieboldMarianoResult, { status: 'ok' }> & {
      /** P(T >= HLN): small when the tested policy earns more (= pValueOneSided). */
      readonly pValueTestedEarnsMore: number;
      /** P(T <= HLN): small when the reference earns more, computed as such (not as 1 - pValueOneSided, which loses small values). */
      readonly pValueReferenceEarnsMore: number;
    })
  | Exclude<DieboldMarianoResult, { status: 'ok' }>
  | { readonly status: 'too-few-days'; readonly n: number; readonly meanDifference: number | null; readonly reason: string }
);

/** A policy's name and its profit per day [currency], in day order. */
export interface DailyProfits {
  readonly name: string;
  readonly dailyProfit: readonly number[];
}

/**
 * a - b, or 0 when the two differ by no more than floating-point rounding of sums of this size
 * (relative 1e-9): two policies that made the same trades (auto that kept price-taking's bids, or a
 * curve whose steps settle as price-taking's orders) must tie, not lose by 1e-14 and be tested on noise.
 */
export function profitDifference(a: number, b: number): number {
  const d = a - b;
  return Math.abs(d) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b)) ? 0 : d;
}

/** Diebold-Mariano / HLN test (h = 1) of d_t = tested_t - reference_t (profitDifference), one-sided H1: E[d] > 0. */
export function edgeTest(tested: DailyProfits, reference: DailyProfits): EdgeTest {
  const n = tested.dailyProfit.length;
  if (reference.dailyProfit.length !== n) throw new RangeError(`edgeTest: ${n} and ${reference.dailyProfit.length} days differ`);
  const names = { tested: tested.name, reference: reference.name };
  const d = tested.dailyProfit.map((a, t) => profitDifference(a, reference.dailyProfit[t] as number));
  if (n < 2) return { ...names, status: 'too-few-days', n, meanDifference: d[0] ?? null, reason: 'the test needs at least 2 days' };
  const test = dieboldMariano(d, 1);
  if (test.status !== 'ok') return { ...names, ...test };
  return { ...names, ...test, pValueTestedEarnsMore: test.pValueOneSided, pValueReferenceEarnsMore: studentTCdf(test.hln, test.degreesOfFreedom) };
}
