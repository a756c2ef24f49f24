/**
 * The natural cubic spline basis of one variable with K knots xi_1 < ... < xi_K (Hastie, Tibshirani and
 * Friedman 2009, The Elements of Statistical Learning, 2nd ed., section 5.2.1, eqs. 5.4-5.5):
 *   N_1(x) = 1, N_2(x) = x, N_{k+2}(x) = d_k(x) - d_{K-1}(x), k = 1..K-2,
 *   d_k(x) = ((x - xi_k)_+^3 - (x - xi_K)_+^3) / (xi_K - xi_k).
 * Every N is a cubic between the knots, twice continuously differentiable, and linear below xi_1 and above
 * xi_K: K functions span the natural cubic splines with these knots. Here the K - 2 columns N_3..N_K (the
 * intercept and x are the regression's own) are divided by (xi_K - xi_1)^2, which keeps them in x's
 * units and changes no fit (Harrell 2001, Regression Modeling Strategies, section 2.4.5, normalises the
 * restricted cubic spline's columns the same way).
 */

/**
 * Knot quantiles of a natural (restricted) cubic spline with K knots, 3 <= K <= 5: F. E. Harrell (2001),
 * Regression Modeling Strategies, Springer, section 2.4.6: the outer knots inside the data's tails, the
 * inner ones evenly between them.
 */
export const NATURAL_SPLINE_KNOT_LEVELS: Readonly<Record<number, readonly number[]>> = Object.freeze({
  3: [0.1, 0.5, 0.9],
  4: [0.05, 0.35, 0.65, 0.95],
  5: [0.05, 0.275, 0.5, 0.725, 0.95],
});

/** Fewest and most knots of the natural spline (those with a published placement). */
export const MIN_SPLINE_KNOTS = 3;
export const MAX_SPLINE_KNOTS = 5;

/**
 * The K - 2 non-linear columns N_3(x)..N_K(x) / (xi_K - xi_1)^2 at knots `knots` (ascending) into
 * out[at + (k - 1) stride], k = 1..K-2. Knots that coincide (a slot whose residual load takes few values)
 * would divide by zero: a column whose knot is not below xi_K, or every column when xi_{K-1} is not below
 * xi_K, is 0 (the support rule of the fit then leaves it out, and the fit is linear in x there).
 */
export function naturalSplineColumns(x: number, knots: ArrayLike<number>, out: Float64Array, at = 0, stride = 1): void {
  const K = knots.length;
  const last = knots[K - 1] as number;
  const beforeLast = knots[K - 2] as number;
  const norm = (last - (knots[0] as number)) ** 2;
  const cubeAbove = (knot: number): number => (x > knot ? (x - knot) ** 3 : 0);
  const tail = cubeAbove(last);
  const dBeforeLast = beforeLast < last ? (cubeAbove(beforeLast) - tail) / (last - beforeLast) : Number.NaN;
  for (let k = 1; k <= K - 2; k++) {
    const knot = knots[k - 1] as number;
    const value = knot < last && !Number.isNaN(dBeforeLast) ? ((cubeAbove(knot) - tail) / (last - knot) - dBeforeLast) / norm : 0;
    out[at + (k - 1) * stride] = value;
  }
}
