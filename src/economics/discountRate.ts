import { ArgumentError } from '../stats/argumentError.js';

/**
 * Checks a periodic discount rate r: finite and > -1, so that the discount factor (1 + r)^-t exists.
 *
 * @example
 * requireDiscountRate('rate', 0.07); // passes
 * requireDiscountRate('rate', -1);   // throws ArgumentError naming 'rate'
 */
export function requireDiscountRate(name: string, rate: number): void {
  if (typeof rate !== 'number' || !Number.isFinite(rate) || rate <= -1) {
    throw new ArgumentError(name, 'a finite rate per year > -1 (e.g. 0.07 for 7%)', rate);
  }
}
