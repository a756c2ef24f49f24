import { annuityFactor } from './annuityFactor.js';
import { requireIntegerIn } from '../stats/validate.js';

/**
 * Capital recovery factor: the equal end-of-year payment over n years whose present value is 1.
 *
 * Notes: CRF(r, n) = 1 / a(r, n) = r (1 + r)^n / ((1 + r)^n - 1), and CRF(0, n) = 1 / n.
 * Multiply a capital cost by it to get its equivalent annual cost (as in a levelised cost).
 *
 * @param rate r per year [-], > -1
 * @param years n, integer >= 1
 * @example
 * capitalRecoveryFactor(0.05, 10); // 0.1295045749654567
 *
 * Reference: W. Short, D. J. Packey and T. Holt (1995), A Manual for the Economic Evaluation of
 * Energy Efficiency and Renewable Energy Technologies (technical report), the capital recovery factor.
 */
export function capitalRecoveryFactor(rate: number, years: number): number {
  requireIntegerIn('years', years, 1);
  return 1 / annuityFactor(rate, years);
}
