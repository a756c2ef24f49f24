import type { Matrix } from './matrix.js';
import { multiply, requireResponse } from './matrix.js';

/** Result of a least-squares fit. */
export interface LeastSquaresFit {
  /** b minimising ||y - X b||^2; zero for the columns dropped as linearly dependent. */
  readonly coefficients: Float64Array;
  /** y - X b, one per row. */
  readonly residuals: Float64Array;
  /** Residual sum of squares sum_i (y_i - x_i b)^2. */
  readonly rss: number;
  /** Numerical rank of X (columns kept). */
  readonly rank: number;
}

/** Options of {@link leastSquaresQr}. */
export interface LeastSquaresOptions {
  /** A pivot |R_jj| below rankTolerance * |R_00| ends the factorisation (column treated as dependent). Default 1e-12. */
  readonly rankTolerance?: number;
}

/**
 * Linear least squares min_b ||y - X b||_2 by Householder QR with column pivoting.
 *
 * Notes: X P = Q R with Householder reflections H_j = I - 2 v v' / (v' v) (Householder 1958) and the
 * column of largest remaining norm moved to position j at each step (Businger and Golub 1965). With
 * the numerical rank r (pivots |R_jj| > tol |R_00|), the basic solution solves R_11 z = (Q'y)_1 for
 * the first r pivoted columns and sets the others to zero. The normal equations are never formed, so
 * the error grows with cond(X), not cond(X)^2 (Golub and Van Loan 2013, section 5.3). One step of
 * refinement by the corrected semi-normal equations, R'R d = X'(y - X b), b <- b + d (Bjorck 1987),
 * removes most of the rounding left by the first solve.
 *
 * X holds every column, including a column of ones when an intercept is wanted.
 *
 * @example
 * // fit y = 1 + 2 x through (0, 1), (1, 3), (2, 5)
 * leastSquaresQr(matrixFromRows([[1, 0], [1, 1], [1, 2]]), [1, 3, 5]).coefficients; // [1, 2]
 *
 * References: A. S. Householder (1958), Unitary triangularization of a nonsymmetric matrix, JACM 5(4),
 * 339-342, doi:10.1145/320941.320947; P. Businger and G. H. Golub (1965), Linear least squares solutions
 * by Householder transformations, Numer. Math. 7, 269-276, doi:10.1007/BF01436084; A. Bjorck (1987),
 * Stability analysis of the method of seminormal equations for linear least squares problems, Linear
 * Algebra Appl. 88/89, 31-48, doi:10.1016/0024-3795(87)90101-7.
 */
export function leastSquaresQr(x: Matrix, y: ArrayLike<number>, options: LeastSquaresOptions = {}): LeastSquaresFit {
  requireResponse(x, y);
  const tol = options.rankTolerance ?? 1e-12;
  const qr = householderQr(x, tol);
  const b = solveFactored(qr, y);
  // One refinement step: R'R d = P' X'r on the kept columns.
  const r0 = residualsOf(x, y, b);
  const xtr = transposeTimes(x, r0);
  const d = solveSemiNormal(qr, xtr);
  for (let j = 0; j < x.cols; j++) b[j] = (b[j] as number) + (d[j] as number);
  const residuals = residualsOf(x, y, b);
  let rss = 0;
  for (let i = 0; i < residuals.length; i++) rss += (residuals[i] as number) ** 2;
  return { coefficients: b, residuals, rss, rank: qr.rank };
}

/**
 * Indices of a largest set of linearly independent columns of X, ascending: the first `rank` pivots
 * of the column-pivoted Householder QR above (the same rank rule as {@link leastSquaresQr}).
 */
export function independentColumns(x: Matrix, rankTolerance = 1e-12): number[] {
  return pivotedColumns(x, rankTolerance).sort((p, q) => p - q);
}

/**
 * The same `rank` columns as {@link independentColumns}, in the order the column-pivoted QR chose
 * them: each is the one farthest from the span of those before it, so the last is the most nearly
 * dependent on the rest (the one a rank-revealing QR gives up first; Golub and Van Loan 2013, Matrix
 * Computations, 4th ed., section 5.4.2).
 */
export function pivotedColumns(x: Matrix, rankTolerance = 1e-12): number[] {
  const qr = householderQr(x, rankTolerance);
  return [...qr.perm.subarray(0, qr.rank)];
}

/** Householder factors of X P: R (upper triangle, k x k), reflectors below the diagonal, pivots. */
interface QrFactors {
  readonly n: number;
  readonly k: number;
  /** Column-major n x k: R on and above the diagonal, the reflector v_j (without v_jj) below it. */
  readonly a: Float64Array;
  /** v_jj of each reflector and v'v. */
  readonly vHead: Float64Array;
  readonly vNorm2: Float64Array;
  /** perm[j] = original column at pivoted position j. */
  readonly perm: Int32Array;
  readonly rank: number;
}

function householderQr(x: Matrix, tol: number): QrFactors {
  const n = x.rows;
  const k = x.cols;
  const a = new Float64Array(n * k);
  for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) a[j * n + i] = x.data[i * k + j] as number;
  const perm = Int32Array.from({ length: k }, (_, j) => j);
  const vHead = new Float64Array(k);
  const vNorm2 = new Float64Array(k);
  let rank = 0;
  let r00 = 0;
  const steps = Math.min(n, k);
  for (let j = 0; j < steps; j++) {
    let best = j;
    let bestNorm = -1;
    for (let c = j; c < k; c++) {
      let s = 0;
      for (let i = j; i < n; i++) s += (a[c * n + i] as number) ** 2;
      if (s > bestNorm) {
        bestNorm = s;
        best = c;
      }
    }
    if (best !== j) swapColumns(a, n, j, best, perm);
    const normX = Math.sqrt(bestNorm);
    if (j === 0) r00 = normX;
    if (normX === 0 || normX <= tol * r00) break;
    const ajj = a[j * n + j] as number;
    const alpha = ajj >= 0 ? -normX : normX;
    const head = ajj - alpha;
    const vtv = head * head + bestNorm - ajj * ajj;
    vHead[j] = head;
    vNorm2[j] = vtv;
    a[j * n + j] = alpha;
    for (let c = j + 1; c < k; c++) {
      let s = head * (a[c * n + j] as number);
      for (let i = j + 1; i < n; i++) s += (a[j * n + i] as number) * (a[c * n + i] as number);
      const f = (2 * s) / vtv;
      a[c * n + j] = (a[c * n + j] as number) - f * head;
      for (let i = j + 1; i < n; i++) a[c * n + i] = (a[c * n + i] as number) - f * (a[j * n + i] as number);
    }
    rank = j + 1;
  }
  return { n, k, a, vHead, vNorm2, perm, rank };
}

function swapColumns(a: Float64Array, n: number, p: number, q: number, perm: Int32Array): void {
  for (let i = 0; i < n; i++) {
    const t = a[p * n + i] as number;
    a[p * n + i] = a[q * n + i] as number;
    a[q * n + i] = t;
  }
  const t = perm[p] as number;
  perm[p] = perm[q] as number;
  perm[q] = t;
}

/** Basic solution of min ||y - X b|| from the factors: Q'y, then back substitution on R_11. */
function solveFactored(qr: QrFactors, y: ArrayLike<number>): Float64Array {
  const { n, a, vHead, vNorm2, rank } = qr;
  const qty = Float64Array.from(y as ArrayLike<number>);
  for (let j = 0; j < rank; j++) {
    const head = vHead[j] as number;
    let s = head * (qty[j] as number);
    for (let i = j + 1; i < n; i++) s += (a[j * n + i] as number) * (qty[i] as number);
    const f = (2 * s) / (vNorm2[j] as number);
    qty[j] = (qty[j] as number) - f * head;
    for (let i = j + 1; i < n; i++) qty[i] = (qty[i] as number) - f * (a[j * n + i] as number);
  }
  const z = backSubstitute(qr, qty);
  return unpermute(qr, z);
}

/** Solves R_11' R_11 z = (P' g)_1 (forward then back substitution) and returns P z. */
function solveSemiNormal(qr: QrFactors, g: ArrayLike<number>): Float64Array {
  const { n, a, perm, rank } = qr;
  const w = new Float64Array(rank);
  for (let j = 0; j < rank; j++) {
    let s = g[perm[j] as number] as number;
    for (let i = 0; i < j; i++) s -= (a[j * n + i] as number) * (w[i] as number);
    w[j] = s / (a[j * n + j] as number);
  }
  return unpermute(qr, backSubstitute(qr, w));
}

function backSubstitute(qr: QrFactors, rhs: ArrayLike<number>): Float64Array {
  const { n, a, rank } = qr;
  const z = new Float64Array(rank);
  for (let j = rank - 1; j >= 0; j--) {
    let s = rhs[j] as number;
    for (let c = j + 1; c < rank; c++) s -= (a[c * n + j] as number) * (z[c] as number);
    z[j] = s / (a[j * n + j] as number);
  }
  return z;
}

function unpermute(qr: QrFactors, z: Float64Array): Float64Array {
  const b = new Float64Array(qr.k);
  for (let j = 0; j < qr.rank; j++) b[qr.perm[j] as number] = z[j] as number;
  return b;
}

function residualsOf(x: Matrix, y: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
  const fitted = multiply(x, b);
  for (let i = 0; i < fitted.length; i++) fitted[i] = (y[i] as number) - (fitted[i] as number);
  return fitted;
}

function transposeTimes(x: Matrix, r: ArrayLike<number>): Float64Array {
  const out = new Float64Array(x.cols);
  for (let i = 0; i < x.rows; i++) {
    const ri = r[i] as number;
    for (let j = 0; j < x.cols; j++) out[j] = (out[j] as number) + (x.data[i * x.cols + j] as number) * ri;
  }
  return out;
}
