import { continuedFraction } from './continuedFraction.js';
import { logGamma } from './logGamma.js';
import { ArgumentError } from './argumentError.js';
import { requirePositive } from './validate.js';

/**
 * Regularized incomplete beta function I_x(a, b) = B(x; a, b) / B(a, b).
 *
 * Notes: I_x(a, b) = (1 / B(a, b)) int_0^x t^(a-1) (1 - t)^(b-1) dt. For x < (a + 1) / (a + b + 2)
 *   I_x(a, b) = x^a (1 - x)^b / (a B(a, b)) * 1 / (1 + d_1 / (1 + d_2 / (1 + ...))),
 *   d_{2m+1} = -(a + m)(a + b + m) x / ((a + 2m)(a + 2m + 1)),
 *   d_{2m}   = m (b - m) x / ((a + 2m - 1)(a + 2m)),
 * evaluated by the modified Lentz algorithm; otherwise the symmetry I_x(a, b) = 1 - I_{1-x}(b, a).
 *
 * @param x upper limit [-], in [0, 1]
 * @param a first shape [-], > 0
 * @param b second shape [-], > 0
 * @example
 * regularizedBeta(0.3, 1, 1); // 0.3 (uniform distribution)
 * regularizedBeta(0.5, 2, 3); // 11/16 = 0.6875
 *
 * References: M. Abramowitz and I. A. Stegun (1964), Handbook of Mathematical Functions,
 * formulas 26.5.1, 26.5.8; W. H. Press et al. (2007), Numerical Recipes, 3rd ed., sec. 6.4.
 */
export function regularizedBeta(x: number, a: number, b: number): number {
  if (typeof x !== 'number' || !(x >= 0 && x <= 1)) throw new ArgumentError('x', 'a number in [0, 1]', x);
  requirePositive('a', a);
  requirePositive('b', b);
  if (x === 0 || x === 1) return x;
  if (x > (a + 1) / (a + b + 2)) return 1 - lowerBetaFraction(1 - x, b, a);
  return lowerBetaFraction(x, a, b);
}

function lowerBetaFraction(x: number, a: number, b: number): number {
  const logFront = a * Math.log(x) + b * Math.log1p(-x) - (logGamma(a) + logGamma(b) - logGamma(a + b));
  const fraction = continuedFraction(0, (j) => (j === 1 ? [1, 1] : [betaFractionTerm(j - 1, x, a, b), 1]));
  return (Math.exp(logFront) * fraction) / a;
}

/** d_i of the incomplete beta continued fraction, i >= 1. */
function betaFractionTerm(i: number, x: number, a: number, b: number): number {
  const m = Math.floor(i / 2);
  if (i % 2 === 0) return (m * (b - m) * x) / ((a + 2 * m - 1) * (a + 2 * m));
  return (-(a + m) * (a + b + m) * x) / ((a + 2 * m) * (a + 2 * m + 1));
}
