/**
 * Value of a continued fraction by the modified Lentz algorithm.
 *
 * Notes: evaluates f = b0 + a1 / (b1 + a2 / (b2 + a3 / (b3 + ...))) from the front, keeping the
 * ratios C_j = A_j / A_{j-1} and D_j = B_{j-1} / B_j of successive convergents:
 *   D_j = 1 / (b_j + a_j D_{j-1}),  C_j = b_j + a_j / C_{j-1},  f_j = f_{j-1} C_j D_j,
 * with any zero denominator replaced by a tiny number (1e-300), and stops when |C_j D_j - 1| < tolerance.
 * Starting values f_0 = C_0 = b0 (tiny when b0 = 0) and D_0 = 0.
 *
 * @param b0 leading term
 * @param term j -> [a_j, b_j] for j = 1, 2, ...
 * @param tolerance relative change that ends the iteration, default 2 * Number.EPSILON
 * @param maxTerms iteration cap; past it a NoConvergenceError is thrown
 * @example
 * // sqrt(2) = 1 + 1/(2 + 1/(2 + ...))
 * continuedFraction(1, () => [1, 2]); // 1.4142135623730951
 *
 * References: W. J. Lentz (1976), Applied Optics 15(3), 668-671, doi:10.1364/AO.15.000668;
 * I. J. Thompson and A. R. Barnett (1986), J. Comput. Phys. 64, 490-509,
 * doi:10.1016/0021-9991(86)90046-X; W. H. Press et al. (2007), Numerical Recipes, 3rd ed., sec. 5.2.
 */
export function continuedFraction(
  b0: number,
  term: (j: number) => readonly [number, number],
  tolerance = 2 * Number.EPSILON,
  maxTerms = 100_000,
): number {
  const tiny = 1e-300;
  let f = b0 === 0 ? tiny : b0;
  let c = f;
  let d = 0;
  for (let j = 1; j <= maxTerms; j++) {
    const [a, b] = term(j);
    d = b + a * d;
    if (d === 0) d = tiny;
    c = b + a / c;
    if (c === 0) c = tiny;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < tolerance) return f;
  }
  throw new NoConvergenceError(`continued fraction did not converge in ${maxTerms} terms`);
}

/** A numerical iteration did not reach its tolerance; the input is outside the method's working range. */
export class NoConvergenceError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NoConvergenceError';
  }
}
