import { ArgumentError } from './argumentError.js';
import { normalCdf } from './normalCdf.js';

// Rational approximations for the lower half p <= 1/2 (relative error below 1.15e-9 before refinement).
const A = [-39.69683028665376, 220.9460984245205, -275.9285104469687, 138.357751867269, -30.66479806614716, 2.506628277459239] as const;
const B = [-54.47609879822406, 161.5858368580409, -155.6989798598866, 66.80131188771972, -13.28068155288572] as const;
const C = [-0.007784894002430293, -0.3223964580411365, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783] as const;
const D = [0.007784695709041462, 0.3224671290700398, 2.445134137142996, 3.754408661907416] as const;
const P_LOW = 0.02425;
const SQRT_TWO_PI = Math.sqrt(2 * Math.PI);

/**
 * Standard normal quantile (inverse cdf) Phi^-1(p).
 *
 * Notes: Acklam's algorithm. For p > 1/2 the symmetry Phi^-1(p) = -Phi^-1(1 - p) (1 - p is exact in
 * floating point there). For p_low = 0.02425 <= p <= 1/2, with q = p - 1/2 and r = q^2,
 *   x = q (a1 r^5 + ... + a6) / (b1 r^5 + ... + b5 r + 1);
 * for p < p_low, with q = sqrt(-2 ln p),
 *   x = (c1 q^5 + ... + c6) / (d1 q^4 + ... + d4 q + 1).
 * One Halley step then brings it to full double precision:
 *   e = Phi(x) - p, u = e sqrt(2 pi) exp(x^2 / 2), x <- x - u / (1 + x u / 2).
 * Phi^-1(0) = -Infinity, Phi^-1(1) = Infinity. Below p = 1e-300 or so, where exp(x^2/2) overflows,
 * the unrefined value is returned (relative error about 1e-9).
 *
 * @param p probability [-], in [0, 1]
 * @example
 * normalQuantile(0.975); // 1.959963984540054
 *
 * References: P. J. Acklam (2003), An algorithm for computing the inverse normal cumulative
 * distribution function (web note); E. Halley (1694), the third-order Newton step;
 * M. Abramowitz and I. A. Stegun (1964), table 26.5 (1.959964 at 0.975).
 */
export function normalQuantile(p: number): number {
  if (typeof p !== 'number' || !(p >= 0 && p <= 1)) throw new ArgumentError('p', 'a probability in [0, 1]', p);
  if (p > 0.5) return -normalQuantile(1 - p);
  if (p === 0) return -Infinity;
  const x = p < P_LOW ? lowerTail(p) : central(p);
  const u = (normalCdf(x) - p) * SQRT_TWO_PI * Math.exp((x * x) / 2);
  const refined = x - u / (1 + (x * u) / 2);
  return Number.isFinite(refined) ? refined : x; // below about 1e-300 exp(x^2/2) overflows: keep x

}

function central(p: number): number {
  const q = p - 0.5;
  const r = q * q;
  const num = ((((A[0] * r + A[1]) * r + A[2]) * r + A[3]) * r + A[4]) * r + A[5];
  const den = ((((B[0] * r + B[1]) * r + B[2]) * r + B[3]) * r + B[4]) * r + 1;
  return (q * num) / den;
}

function lowerTail(p: number): number {
  const q = Math.sqrt(-2 * Math.log(p));
  const num = ((((C[0] * q + C[1]) * q + C[2]) * q + C[3]) * q + C[4]) * q + C[5];
  const den = (((D[0] * q + D[1]) * q + D[2]) * q + D[3]) * q + 1;
  return num / den;
}
