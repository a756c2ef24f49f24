import { requireFiniteArray } from '../stats/validate.js';
import { requireDiscountRate } from './discountRate.js';

/** Payback outcome: a status union. */
export type PaybackResult =
  | {
      readonly status: 'reached';
      /** Years from t = 0 until the cumulative cash flow first reaches 0 [year], fractional. */
      readonly years: number;
    }
  | { readonly status: 'never'; readonly reason: string };

/**
 * Simple payback period: when the cumulative (undiscounted) cash flow first reaches zero.
 *
 * Notes: C_t = sum_{s=0}^{t} CF_s with CF_0 at t = 0 and CF_t at the end of year t. The payback is
 * the first t with C_t >= 0; within year t the flow CF_t is taken as spread evenly over the year,
 * so by linear interpolation payback = (t - 1) + (-C_{t-1}) / CF_t. If C_0 >= 0 it is 0. A later
 * dip below zero (e.g. a replacement) does not change it: it is the first crossing. 'never' when C_t
 * stays below zero up to year N. To absorb rounding, C_t counts as reached when
 * C_t >= -1e-12 * max_s |CF_s| (so a project that pays back exactly at a year end is found there).
 *
 * @param cashFlows CF_0..CF_N [currency], finite, at least one
 * @example
 * simplePayback([-100, 30, 40, 50]); // 2.6 years: after 2 years -30 remains, 30/50 of year 3
 *
 * Reference: R. A. Brealey, S. C. Myers and F. Allen, Principles of Corporate Finance (any recent
 * edition), the payback rule and the discounted payback rule.
 */
export function simplePayback(cashFlows: readonly number[]): PaybackResult {
  requireFiniteArray('cashFlows', cashFlows, 1);
  return firstCrossing(cashFlows, 'cumulative cash flow');
}

/**
 * Discounted payback period: simplePayback applied to the discounted flows CF_t / (1 + r)^t, with the
 * same end-of-year timing and linear interpolation within the year of the crossing.
 *
 * @param rate r per year [-], > -1
 * @param cashFlows CF_0..CF_N [currency], finite, at least one
 * @example
 * discountedPayback(0.1, [-100, 55, 60.5]); // 2 years: 55/1.1 + 60.5/1.21 = 50 + 50
 */
export function discountedPayback(rate: number, cashFlows: readonly number[]): PaybackResult {
  requireDiscountRate('rate', rate);
  requireFiniteArray('cashFlows', cashFlows, 1);
  return firstCrossing(
    cashFlows.map((c, t) => c / (1 + rate) ** t),
    'discounted cumulative cash flow',
  );
}

function firstCrossing(flows: readonly number[], what: string): PaybackResult {
  const slack = 1e-12 * flows.reduce((m, c) => Math.max(m, Math.abs(c)), 0);
  let cumulative = flows[0] as number;
  if (cumulative >= -slack) return { status: 'reached', years: 0 };
  for (let t = 1; t < flows.length; t++) {
    const flow = flows[t] as number;
    const next = cumulative + flow;
    if (next >= -slack) return { status: 'reached', years: t - 1 + Math.min(1, -cumulative / flow) };
    cumulative = next;
  }
  return { status: 'never', reason: `the ${what} stays below zero over the ${flows.length - 1} years` };
}
