import { regularizedGammaP, regularizedGammaQ } from './regularizedGamma.js';
import { ArgumentError } from './argumentError.js';

/**
 * Standard normal cumulative distribution function Phi(x).
 *
 * Notes: Phi(x) = (1/2) erfc(-x / sqrt 2), with erf(z) = P(1/2, z^2) and erfc(z) = Q(1/2, z^2) for
 * z >= 0 (regularized incomplete gamma), so
 *   Phi(x) = Q(1/2, x^2/2) / 2       for x < 0 (full relative accuracy in the lower tail),
 *   Phi(x) = 1/2 + P(1/2, x^2/2) / 2 for x >= 0.
 * Phi(-Infinity) = 0, Phi(Infinity) = 1.
 *
 * @param x standard normal quantile [-], not NaN
 * @returns P(Z <= x) for Z ~ N(0, 1)
 * @example
 * normalCdf(1.959963984540054); // 0.975
 *
 * Reference: M. Abramowitz and I. A. Stegun (1964), Handbook of Mathematical Functions,
 * formulas 7.1.2, 6.5.17 and 26.2.29.
 */
export function normalCdf(x: number): number {
  if (typeof x !== 'number' || Number.isNaN(x)) throw new ArgumentError('x', 'a number', x);
  if (x === -Infinity) return 0;
  if (x === Infinity) return 1;
  const halfSquare = (x * x) / 2;
  return x < 0 ? regularizedGammaQ(0.5, halfSquare) / 2 : 0.5 + regularizedGammaP(0.5, halfSquare) / 2;
}
