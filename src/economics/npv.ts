import { requireFiniteArray } from '../stats/validate.js';
import { requireDiscountRate } from './discountRate.js';

/**
 * Net present value of a series of yearly cash flows.
 *
 * Notes: NPV(r) = sum_{t=0}^{N} CF_t / (1 + r)^t. Convention (as numpy-financial's `npv`): the first
 * flow is at t = 0 (the investment, undiscounted) and flow t falls at the end of year t.
 * Evaluated by Horner's scheme in v = 1 / (1 + r).
 *
 * @param rate discount rate r per year [-], > -1 (0.07 is 7%)
 * @param cashFlows CF_0..CF_N [currency], finite, at least one
 * @returns NPV [currency] at t = 0
 * @example
 * npv(0.1, [-100, 110]); // 0
 * npv(0.281, [-100, 39, 59, 55, 20]); // -0.0084786
 *
 * Reference: R. A. Brealey, S. C. Myers and F. Allen, Principles of Corporate Finance (any
 * recent edition), the chapters on present value and net present value.
 */
export function npv(rate: number, cashFlows: readonly number[]): number {
  requireDiscountRate('rate', rate);
  requireFiniteArray('cashFlows', cashFlows, 1);
  const v = 1 / (1 + rate);
  let sum = 0;
  for (let t = cashFlows.length - 1; t >= 0; t--) sum = sum * v + (cashFlows[t] as number);
  return sum;
}
