import { requireIntegerIn } from '../stats/validate.js';
import { requireDiscountRate } from './discountRate.js';

/**
 * Annuity factor: present value at t = 0 of 1 per year paid at the end of years 1..n.
 *
 * Notes: a(r, n) = sum_{t=1}^{n} (1 + r)^-t = (1 - (1 + r)^-n) / r, and a(0, n) = n.
 * Computed as -expm1(-n log1p(r)) / r so that small rates keep their precision.
 *
 * @param rate r per year [-], > -1
 * @param years n, integer >= 0
 * @example
 * annuityFactor(0.05, 10); // 7.721734929184818 = (1 - 1.05^-10) / 0.05
 *
 * Reference: R. A. Brealey, S. C. Myers and F. Allen, Principles of Corporate Finance (any
 * recent edition), the annuity formula.
 */
export function annuityFactor(rate: number, years: number): number {
  requireDiscountRate('rate', rate);
  requireIntegerIn('years', years, 0);
  if (rate === 0) return years;
  return -Math.expm1(-years * Math.log1p(rate)) / rate;
}
