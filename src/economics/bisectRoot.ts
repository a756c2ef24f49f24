import { ArgumentError } from '../stats/argumentError.js';

/**
 * Root of a continuous function on a bracket [lo, hi] where it changes sign, by bisection.
 *
 * Notes: keeps an interval whose end values have opposite signs and halves it until it is no wider
 * than tolerance * max(1, |x|) or no double lies strictly inside it; returns the midpoint (or an end
 * where f is exactly 0). Each step halves the error bound, so about 60 steps reach double precision
 * from a bracket of width 1.
 *
 * @param f continuous function
 * @param lo, hi bracket with f(lo) f(hi) <= 0
 * @param tolerance relative width that ends the search, default 1e-15
 * @example
 * bisectRoot((x) => x * x - 2, 0, 2); // 1.4142135623730951
 *
 * Reference: R. L. Burden and J. D. Faires (2011), Numerical Analysis, 9th ed., section 2.1.
 */
export function bisectRoot(f: (x: number) => number, lo: number, hi: number, tolerance = 1e-15): number {
  let a = Math.min(lo, hi);
  let b = Math.max(lo, hi);
  let fa = f(a);
  const fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(Math.sign(fa) * Math.sign(fb) < 0)) {
    throw new ArgumentError('lo, hi', 'a bracket where f changes sign', `f(${a}) = ${fa}, f(${b}) = ${fb}`);
  }
  for (let step = 0; step < 2000; step++) {
    const mid = a + (b - a) / 2;
    if (b - a <= tolerance * Math.max(1, Math.abs(mid)) || mid <= a || mid >= b) return mid;
    const fm = f(mid);
    if (fm === 0) return mid;
    if (Math.sign(fm) === Math.sign(fa)) {
      a = mid;
      fa = fm;
    } else {
      b = mid;
    }
  }
  return a + (b - a) / 2;
}
