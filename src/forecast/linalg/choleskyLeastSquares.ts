import type { LinearModel } from './linearModel.js';
import { fromStandardised, predictStandardised } from './linearModel.js';
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
 * @param coefficients where the model's coefficients are written (at least gram.k long), for a caller
 *   that fits many models and keeps none; default a fresh array
 */
export function choleskyLeastSquares(gram: StandardisedGram, dropTolerance = 1e-10, coefficients?: Float64Array): LinearModel {
  return fromStandardised(gram, choleskyCoefficients(gram, dropTolerance), coefficients);
}

/**
 * predictLinear(choleskyLeastSquares(gram, dropTolerance), row), the same number, without making the
 * model: the many per-slot fits of a forecast each predict once and keep nothing.
 */
export function choleskyPrediction(gram: StandardisedGram, row: ArrayLike<number>, dropTolerance = 1e-10): number {
  return predictStandardised(gram, choleskyCoefficients(gram, dropTolerance), row, scratch.coefficients);
}

/**
 * The coefficients beta of the standardised columns (0 for a column left out), in scratch space that
 * the next call overwrites.
 */
function choleskyCoefficients(gram: StandardisedGram, dropTolerance: number): Float64Array {
  const { k, gram: g, zty, scales } = gram;
  const { l, w, beta, kept } = scratchFor(k);
  beta.fill(0, 0, k);
  let keptCount = 0;
  for (let j = 0; j < k; j++) {
    if ((scales[j] as number) === 0) continue;
    const jk = j * k;
    // While no column was left out, the kept columns are 0..j-1: the same sums without the index list.
    const contiguous = keptCount === j;
    let d = g[jk + j] as number;
    if (contiguous) for (let p = 0; p < j; p++) d -= (l[jk + p] as number) ** 2;
    else for (let q = 0; q < keptCount; q++) d -= (l[jk + (kept[q] as number)] as number) ** 2;
    if (d <= dropTolerance) continue;
    const ljj = Math.sqrt(d);
    l[jk + j] = ljj;
    for (let i = j + 1; i < k; i++) {
      if ((scales[i] as number) === 0) continue;
      const ik = i * k;
      let s = g[ik + j] as number;
      if (contiguous) {
        for (let p = 0; p < j; p++) s -= (l[ik + p] as number) * (l[jk + p] as number);
      } else {
        for (let q = 0; q < keptCount; q++) {
          const p = kept[q] as number;
          s -= (l[ik + p] as number) * (l[jk + p] as number);
        }
      }
      l[ik + j] = s / ljj;
    }
    kept[keptCount++] = j;
  }
  // L w = zty (forward), L' beta = w (backward), over the kept columns only.
  for (let q = 0; q < keptCount; q++) {
    const j = kept[q] as number;
    let s = zty[j] as number;
    for (let r = 0; r < q; r++) {
      const p = kept[r] as number;
      s -= (l[j * k + p] as number) * (w[p] as number);
    }
    w[j] = s / (l[j * k + j] as number);
  }
  for (let q = keptCount - 1; q >= 0; q--) {
    const j = kept[q] as number;
    let s = w[j] as number;
    for (let r = q + 1; r < keptCount; r++) {
      const i = kept[r] as number;
      s -= (l[i * k + j] as number) * (beta[i] as number);
    }
    beta[j] = s / (l[j * k + j] as number);
  }
  return beta;
}

/**
 * Scratch space of the factorisation, kept between calls and grown as needed (the solver is
 * synchronous, so never shared). An entry of L or w is read only after this call wrote it; beta is
 * cleared, since a column left out keeps coefficient 0.
 */
let scratch = { k: 0, l: new Float64Array(0), w: new Float64Array(0), beta: new Float64Array(0), coefficients: new Float64Array(0), kept: new Int32Array(0) };

function scratchFor(k: number): typeof scratch {
  if (scratch.k < k) {
    scratch = { k, l: new Float64Array(k * k), w: new Float64Array(k), beta: new Float64Array(k), coefficients: new Float64Array(k), kept: new Int32Array(k) };
  }
  return scratch;
}
