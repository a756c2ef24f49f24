import type { LinearModel } from './linearModel.js';
import { fromStandardised } from './linearModel.js';
import type { StandardisedGram } from './standardisedGram.js';

/**
 * Least squares with a free intercept from the normal equations of the centred and scaled columns,
 * solved by Cholesky factorisation; the fast path for the many small per-period fits.
 *
 * Notes: solves G beta = Z'(y - ybar)/n with G the correlation matrix of {@link StandardisedGram},
 * by G = L L' (Cholesky), then maps beta back with b_j = beta_j / s_j, b_0 = ybar - sum_j b_j m_j.
 * Care taken against the squared condition number of the normal equations: the columns are centred
 * (which removes their collinearity with the intercept) and scaled to unit variance before the
 * products are formed, and the factorisation drops a column whose pivot
 * d_j = G_jj - sum_l L_jl^2 = 1 - R_j^2 (R_j^2 of column j on the columns kept before it) falls below
 * `dropTolerance`, leaving its coefficient 0. A constant column is likewise left out. For a design
 * that is ill-conditioned after centring use {@link leastSquaresQr}.
 *
 * References: G. H. Golub and C. F. Van Loan (2013), Matrix Computations, 4th ed., sections 4.2 and
 * 5.3.2 (normal equations); A. Bjorck (1996), Numerical Methods for Least Squares Problems, SIAM,
 * section 2.2.
 *
 * @param dropTolerance smallest accepted pivot 1 - R_j^2 [-], default 1e-10
 */
export function choleskyLeastSquares(gram: StandardisedGram, dropTolerance = 1e-10): LinearModel {
  const { k, gram: g, zty, scales } = gram;
  const l = new Float64Array(k * k);
  const kept: number[] = [];
  for (let j = 0; j < k; j++) {
    if ((scales[j] as number) === 0) continue;
    let d = g[j * k + j] as number;
    for (const p of kept) d -= (l[j * k + p] as number) ** 2;
    if (d <= dropTolerance) continue;
    const ljj = Math.sqrt(d);
    l[j * k + j] = ljj;
    for (let i = j + 1; i < k; i++) {
      if ((scales[i] as number) === 0) continue;
      let s = g[i * k + j] as number;
      for (const p of kept) s -= (l[i * k + p] as number) * (l[j * k + p] as number);
      l[i * k + j] = s / ljj;
    }
    kept.push(j);
  }
  // L w = zty (forward), L' beta = w (backward), over the kept columns only.
  const w = new Float64Array(k);
  for (const j of kept) {
    let s = zty[j] as number;
    for (const p of kept) {
      if (p >= j) break;
      s -= (l[j * k + p] as number) * (w[p] as number);
    }
    w[j] = s / (l[j * k + j] as number);
  }
  const beta = new Float64Array(k);
  for (let q = kept.length - 1; q >= 0; q--) {
    const j = kept[q] as number;
    let s = w[j] as number;
    for (let r = q + 1; r < kept.length; r++) {
      const i = kept[r] as number;
      s -= (l[i * k + j] as number) * (beta[i] as number);
    }
    beta[j] = s / (l[j * k + j] as number);
  }
  return fromStandardised(gram, beta);
}
