import { ArgumentError } from '../../stats/argumentError.js';
import type { LinearModel } from './linearModel.js';
import { fromStandardised } from './linearModel.js';
import type { StandardisedGram } from './standardisedGram.js';

/** Settings of the LASSO path; see {@link LASSO_DEFAULTS}. */
export interface LassoOptions {
  /** Number of lambda values on the path [-], >= 2. */
  readonly pathLength: number;
  /** lambda_min / lambda_max [-], in (0, 1). */
  readonly minRatio: number;
  /**
   * Coordinate descent stops when a sweep moves no coefficient by more than sqrt(tolerance var(y))
   * (in standardised units: max_j G_jj (delta beta_j)^2 <= tolerance var(y), as in Friedman, Hastie and
   * Tibshirani 2010) [-].
   */
  readonly tolerance: number;
  /** Most coordinate-descent sweeps per lambda [-]. */
  readonly maxSweeps: number;
}

/**
 * Defaults: 20 penalties from lambda_max down to lambda_max / 100 (a step of 0.785; below 1/100 the
 * fit is close to least squares, which BIC's penalty on df rarely prefers), glmnet's convergence
 * threshold 1e-7, at most 1000 sweeps per penalty.
 */
export const LASSO_DEFAULTS: LassoOptions = Object.freeze({
  pathLength: 20,
  minRatio: 1e-2,
  tolerance: 1e-7,
  maxSweeps: 1000,
});

/** One point of the path. */
export interface LassoPathPoint {
  /** Penalty lambda, in the units of the standardised problem. */
  readonly lambda: number;
  /** Coefficients of the standardised columns. */
  readonly beta: Float64Array;
  /** Residual sum of squares divided by n. */
  readonly meanSquaredResidual: number;
  /** Non-zero coefficients (the degrees of freedom of Zou, Hastie and Tibshirani 2007). */
  readonly nonZero: number;
  /** n ln(RSS/n) + df ln(n). */
  readonly bic: number;
}

/** The model chosen on the path, on the original scale, with the path itself. */
export interface LassoFit {
  readonly model: LinearModel;
  /** Index of the chosen lambda in `path`. */
  readonly chosen: number;
  readonly path: readonly LassoPathPoint[];
}

/**
 * LASSO with a free intercept by cyclic coordinate descent on standardised columns, over a path of
 * penalties, the penalty chosen by the Bayesian information criterion (BIC).
 *
 * Notes: minimises (1/(2n)) ||y - b0 - Z beta||^2 + lambda ||beta||_1 with the columns of Z centred
 * and scaled to unit variance (Tibshirani 1996). Coordinate update, with G = Z'Z/n and c = Z'(y - ybar)/n
 * (covariance updates, Friedman, Hastie and Tibshirani 2010, section 2.2):
 *   beta_j <- S(c_j - sum_{l != j} G_jl beta_l, lambda),  S(z, g) = sign(z) max(|z| - g, 0),
 * keeping the gradient c - G beta up to date in O(k) per change. The path runs over pathLength values
 * lambda_m = lambda_max minRatio^(m / (pathLength - 1)), lambda_max = max_j |c_j| (the smallest
 * penalty with all beta = 0), each started from the previous solution (warm starts), sweeping the
 * non-zero coefficients between full sweeps (active set). After each full sweep and every fourth
 * sweep, the exact solution for the current support and signs, beta_A = G_AA^{-1}(c_A - lambda sign(beta_A)), is tried and kept
 * when it meets the optimality (KKT) conditions (the active-set view of Osborne, Presnell and
 * Turlach 2000), which ends the descent early with the exact answer. On each,
 *   RSS/n = var(y) - 2 beta'c + beta'G beta,
 *   BIC = n ln(RSS/n) + df ln(n),   df = number of beta_j with |beta_j| > 1e-9 max_l |beta_l|,
 * (Schwarz 1978; df of the LASSO after Zou, Hastie and Tibshirani 2007), and the smallest BIC wins (the
 * earlier, sparser point on a tie). The penalty is chosen by BIC, not by a validation window.
 *
 * References: R. Tibshirani (1996), Regression shrinkage and selection via the lasso, JRSS B 58(1),
 * 267-288, doi:10.1111/j.2517-6161.1996.tb02080.x; J. Friedman, T. Hastie and R. Tibshirani (2010),
 * Regularization paths for generalized linear models via coordinate descent, J. Stat. Softw. 33(1),
 * doi:10.18637/jss.v033.i01; G. Schwarz (1978), Estimating the dimension of a model, Ann. Stat. 6(2),
 * 461-464; H. Zou, T. Hastie and R. Tibshirani (2007), On the "degrees of freedom" of the lasso,
 * Ann. Stat. 35(5), 2173-2192, doi:10.1214/009053607000000127; M. R. Osborne, B. Presnell and
 * B. A. Turlach (2000), A new approach to variable selection in least squares problems, IMA J. Numer.
 * Anal. 20(3), 389-403, doi:10.1093/imanum/20.3.389.
 */
export function lassoBic(gram: StandardisedGram, options: Partial<LassoOptions> = {}): LassoFit {
  const opts = { ...LASSO_DEFAULTS, ...options };
  if (!Number.isInteger(opts.pathLength) || opts.pathLength < 2) {
    throw new ArgumentError('options.pathLength', 'an integer >= 2', opts.pathLength);
  }
  if (!(opts.minRatio > 0 && opts.minRatio < 1)) throw new ArgumentError('options.minRatio', 'a number in (0, 1)', opts.minRatio);
  const { k, zty } = gram;
  let lambdaMax = 0;
  for (let j = 0; j < k; j++) lambdaMax = Math.max(lambdaMax, Math.abs(zty[j] as number));
  const beta = new Float64Array(k);
  const grad = Float64Array.from(zty);
  const path: LassoPathPoint[] = [];
  const work = workspace(k);
  let chosen = 0;
  for (let m = 0; m < opts.pathLength; m++) {
    const lambda = lambdaMax * opts.minRatio ** (m / (opts.pathLength - 1));
    coordinateDescent(gram, lambda, beta, grad, opts, work);
    const point = pathPoint(gram, lambda, beta, grad);
    path.push(point);
    if (point.bic < (path[chosen] as LassoPathPoint).bic) chosen = m;
  }
  return { model: fromStandardised(gram, (path[chosen] as LassoPathPoint).beta), chosen, path };
}

/** The LASSO solution at one penalty, from beta = 0; for checks and for callers with a fixed lambda. */
export function lassoAt(gram: StandardisedGram, lambda: number, options: Partial<LassoOptions> = {}): Float64Array {
  const opts = { ...LASSO_DEFAULTS, ...options };
  const beta = new Float64Array(gram.k);
  coordinateDescent(gram, lambda, beta, Float64Array.from(gram.zty), opts);
  return beta;
}

/** Scratch arrays of the descent, allocated once per path. */
interface Workspace {
  readonly l: Float64Array;
  readonly solution: Float64Array;
  readonly candidate: Float64Array;
  readonly nextGrad: Float64Array;
  readonly support: Int32Array;
}

function workspace(k: number): Workspace {
  return {
    l: new Float64Array(k * k),
    solution: new Float64Array(k),
    candidate: new Float64Array(k),
    nextGrad: new Float64Array(k),
    support: new Int32Array(k),
  };
}

function coordinateDescent(
  gram: StandardisedGram,
  lambda: number,
  beta: Float64Array,
  grad: Float64Array,
  opts: LassoOptions,
  work: Workspace = workspace(gram.k),
): void {
  const { k } = gram;
  const limit = opts.tolerance * gram.yVariance;
  const active: number[] = [];
  for (let sweep = 0; sweep < opts.maxSweeps; ) {
    // A full sweep over all columns, then sweeps over the non-zero ones until they settle
    // (the active-set strategy of Friedman, Hastie and Tibshirani 2010, section 2.6).
    let moved = sweepColumns(gram, lambda, beta, grad, null);
    sweep++;
    if (moved <= limit || exactOnSupport(gram, lambda, beta, grad, work)) return;
    active.length = 0;
    for (let j = 0; j < k; j++) if ((beta[j] as number) !== 0) active.push(j);
    while (sweep < opts.maxSweeps) {
      moved = sweepColumns(gram, lambda, beta, grad, active);
      sweep++;
      if (moved <= limit) break;
      // Every few sweeps, try the exact solution on the support and signs reached.
      if (sweep % 4 === 0 && exactOnSupport(gram, lambda, beta, grad, work)) return;
    }
  }
}

/**
 * The exact LASSO solution for the support and signs of the current iterate: with A the non-zero
 * coefficients and s their signs, beta_A = G_AA^{-1} (c_A - lambda s_A) (Cholesky), beta_j = 0 off A.
 * It is the solution when the signs agree with s and |c_j - G_jA beta_A| <= lambda off A (the KKT
 * conditions; Osborne, Presnell and Turlach 2000). Then beta and the gradient are replaced and the
 * result is true; otherwise nothing changes.
 */
function exactOnSupport(gram: StandardisedGram, lambda: number, beta: Float64Array, grad: Float64Array, work: Workspace): boolean {
  const { k, gram: g, zty, scales } = gram;
  const { l, solution, candidate, nextGrad, support } = work;
  let m = 0;
  for (let j = 0; j < k; j++) if ((beta[j] as number) !== 0) support[m++] = j;
  if (m === 0) return false;
  // Cholesky of G_AA, then the two triangular solves.
  for (let p = 0; p < m; p++) {
    const jp = support[p] as number;
    for (let q = 0; q <= p; q++) {
      const jq = support[q] as number;
      let sum = g[jp * k + jq] as number;
      for (let r = 0; r < q; r++) sum -= (l[p * k + r] as number) * (l[q * k + r] as number);
      if (p === q) {
        if (!(sum > 1e-10)) return false;
        l[p * k + p] = Math.sqrt(sum);
      } else {
        l[p * k + q] = sum / (l[q * k + q] as number);
      }
    }
  }
  for (let p = 0; p < m; p++) {
    const j = support[p] as number;
    let sum = (zty[j] as number) - lambda * Math.sign(beta[j] as number);
    for (let r = 0; r < p; r++) sum -= (l[p * k + r] as number) * (solution[r] as number);
    solution[p] = sum / (l[p * k + p] as number);
  }
  for (let p = m - 1; p >= 0; p--) {
    let sum = solution[p] as number;
    for (let r = p + 1; r < m; r++) sum -= (l[r * k + p] as number) * (solution[r] as number);
    solution[p] = sum / (l[p * k + p] as number);
  }
  candidate.fill(0);
  for (let p = 0; p < m; p++) {
    const j = support[p] as number;
    if (Math.sign(solution[p] as number) !== Math.sign(beta[j] as number)) return false;
    candidate[j] = solution[p] as number;
  }
  for (let j = 0; j < k; j++) {
    let sum = zty[j] as number;
    for (let p = 0; p < m; p++) {
      const q = support[p] as number;
      sum -= (g[j * k + q] as number) * (candidate[q] as number);
    }
    nextGrad[j] = sum;
    if ((candidate[j] as number) === 0 && (scales[j] as number) !== 0 && Math.abs(sum) > lambda * (1 + 1e-9)) return false;
  }
  beta.set(candidate);
  grad.set(nextGrad);
  return true;
}

/** One coordinate-descent sweep over `columns` (all when null); returns max_j (delta beta_j)^2. */
function sweepColumns(
  gram: StandardisedGram,
  lambda: number,
  beta: Float64Array,
  grad: Float64Array,
  columns: readonly number[] | null,
): number {
  const { k, gram: g, scales } = gram;
  const count = columns === null ? k : columns.length;
  let moved = 0;
  for (let q = 0; q < count; q++) {
    const j = columns === null ? q : (columns[q] as number);
    if ((scales[j] as number) === 0) continue;
    const old = beta[j] as number;
    const z = (grad[j] as number) + old;
    const next = z > lambda ? z - lambda : z < -lambda ? z + lambda : 0;
    if (next === old) continue;
    const delta = next - old;
    beta[j] = next;
    for (let l = 0; l < k; l++) grad[l] = (grad[l] as number) - delta * (g[l * k + j] as number);
    moved = Math.max(moved, delta * delta);
  }
  return moved;
}

function pathPoint(gram: StandardisedGram, lambda: number, beta: Float64Array, grad: Float64Array): LassoPathPoint {
  const { n, k, zty } = gram;
  // RSS/n = var(y) - 2 beta'c + beta'G beta, with G beta = c - grad.
  let bc = 0;
  let bg = 0;
  let largest = 0;
  for (let j = 0; j < k; j++) {
    const b = beta[j] as number;
    largest = Math.max(largest, Math.abs(b));
    bc += b * (zty[j] as number);
    bg += b * (grad[j] as number);
  }
  // A coefficient left at rounding level (|beta_j| <= 1e-9 max |beta|), as happens to the second of
  // two identical columns, does not count as a degree of freedom.
  let nonZero = 0;
  for (let j = 0; j < k; j++) if (Math.abs(beta[j] as number) > 1e-9 * largest) nonZero++;
  const meanSquaredResidual = Math.max(gram.yVariance - bc - bg, 0);
  const bic = n * Math.log(Math.max(meanSquaredResidual, Number.MIN_VALUE)) + nonZero * Math.log(n);
  return { lambda, beta: Float64Array.from(beta), meanSquaredResidual, nonZero, bic };
}
