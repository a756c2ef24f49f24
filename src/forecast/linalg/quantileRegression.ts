import { ArgumentError } from '../../stats/argumentError.js';
import { SolverError } from './errors.js';
import { leastSquaresQr } from './leastSquaresQr.js';
import type { Matrix } from './matrix.js';
import { multiply, requireResponse } from './matrix.js';

/** An exact quantile regression fit: a vertex of the problem's polyhedron. */
export interface QuantileRegressionFit {
  /** b(tau), length k. */
  readonly coefficients: Float64Array;
  /** sum_i rho_tau(y_i - x_i b), the minimised objective. */
  readonly objective: number;
  /** The k rows with zero residual that fix the vertex (X_h b = y_h), in ascending row order. */
  readonly basis: Int32Array;
  /**
   * With options.dual: a dual solution a in [0, 1]^n with X'a = (1 - tau) X'1 and
   * objective = y'a - (1 - tau) sum_i y_i, the certificate of optimality (a_i = 1 above the fit,
   * 0 below it). Otherwise undefined.
   */
  readonly dual?: Float64Array;
  /** Simplex iterations spent. */
  readonly iterations: number;
  /**
   * True when the optimum is certainly unique: every basic subgradient strictly inside
   * (tau - 1, tau) and no residual off the basis at zero (a non-degenerate, strictly complementary
   * vertex). A warm start that ends elsewhere is replaced by the cold-start answer.
   */
  readonly unique: boolean;
}

/** Options of {@link quantileRegression}. */
export interface QuantileRegressionOptions {
  /**
   * k row indices to start from, e.g. the basis of the fit at a neighbouring level (a warm start);
   * ignored when they do not give a nonsingular X_h. Default: a start near the least-squares fit.
   */
  readonly initialBasis?: ArrayLike<number>;
  /**
   * Coefficients to start near, e.g. the fit at a neighbouring level: the start is then built from the
   * rows closest to this fit moved to the tau-quantile of its residuals. Used when no initialBasis is
   * given. Default: the least-squares fit.
   */
  readonly initialCoefficients?: ArrayLike<number>;
  /** Most simplex iterations before a SolverError('iteration-limit'). Default 50 + 20 n. */
  readonly maxIterations?: number;
  /** Also return the dual certificate (an array of n per fit). Default false. */
  readonly dual?: boolean;
}

/**
 * Exact linear quantile regression (Koenker and Bassett 1978): minimises
 *   R(b) = sum_i rho_tau(y_i - x_i b),   rho_tau(u) = u (tau - 1{u < 0}),
 * over b in R^k, by a simplex method on the vertices of the problem that moves along edges with the
 * long steps of Barrodale and Roberts (1973, 1974).
 *
 * Notes. A vertex is fixed by a basis h of k rows with X_h nonsingular: b = X_h^{-1} y_h. With
 * z_j the columns of X_h^{-1}, psi_i = tau for a positive residual and tau - 1 for a negative one
 * (a zero residual off the basis keeps the side it was last on), and v = sum_{i not in h} psi_i x_i,
 * the basic subgradients are s = -X_h^{-T} v; the vertex is optimal when tau - 1 <= s_j <= tau for all
 * j (then 0 is in the subdifferential; 1e-10 is allowed for rounding). Otherwise the
 * edge b + t sigma z_j (t >= 0) with the most negative directional derivative,
 * (1 - tau) + s_j for sigma = +1 or tau - s_j for sigma = -1, is followed: R is convex and piecewise
 * linear along it, its slope growing by |x_i sigma z_j| where the residual of row i changes sign at
 * t_i = r_i / (x_i sigma z_j). The step goes to the breakpoint where the slope first becomes >= 0
 * (a weighted median; it may pass several vertices at once, as in Barrodale and Roberts), and that row
 * replaces h_j in the basis. Every non-degenerate step lowers R, so the method ends at an optimal
 * vertex; ties are broken by row order, so the result is deterministic. The dual certificate (on
 * request) is a_i = psi_i + 1 - tau off the basis and s_j + 1 - tau on it.
 *
 * The pivots update X_h^{-1}, b, the residuals and v in O(nk) each (product-form update, with a full
 * recomputation every 32 pivots); at the optimum b is recomputed from the basis in row order, so that
 * one basis always gives the same bits. A warm start (initialBasis or initialCoefficients) that ends
 * on an optimum that may not be unique is replaced by the cold-start answer, so the result never
 * depends on the start.
 *
 * The design must have full column rank (see `independentColumns`); include a column of ones for an
 * intercept. Exactness: the coefficients solve X_h b = y_h for the optimal basis (Koenker and Bassett
 * 1978, Theorem 3.1), to the rounding of that k x k solve.
 *
 * @param x design, n x k, full column rank, n >= k
 * @param y response, length n, finite
 * @param tau quantile level in (0, 1)
 * @example
 * // median of 1, 2, 10: the intercept-only fit is 2
 * quantileRegression(matrixFromRows([[1], [1], [1]]), [1, 2, 10], 0.5).coefficients; // [2]
 *
 * References: R. Koenker and G. Bassett (1978), Regression quantiles, Econometrica 46(1), 33-50,
 * doi:10.2307/1913643; I. Barrodale and F. D. K. Roberts (1973), An improved algorithm for discrete
 * l1 linear approximation, SIAM J. Numer. Anal. 10(5), 839-848, doi:10.1137/0710069; I. Barrodale and
 * F. D. K. Roberts (1974), Algorithm 478: solution of an overdetermined system of equations in the l1
 * norm, Comm. ACM 17(6), 319-320; R. Koenker and V. d'Orey (1987), Computing regression quantiles,
 * Appl. Stat. 36(3), 383-393 (the same edge method for general tau).
 * @throws ArgumentError for tau outside (0, 1), a response of the wrong length or n < k
 * @throws SolverError('singular-design') when X has no k independent rows
 */
export function quantileRegression(
  x: Matrix,
  y: ArrayLike<number>,
  tau: number,
  options: QuantileRegressionOptions = {},
): QuantileRegressionFit {
  return new QuantileRegressionProblem(x, y).fit(tau, options);
}

/**
 * One design and response, fitted at several levels: checks the inputs and allocates the working
 * arrays once (the fast path for quantile regression averaging, 19 levels per period and day).
 * See {@link quantileRegression} for the method.
 *
 * @example
 * const problem = new QuantileRegressionProblem(x, y);
 * const median = problem.fit(0.5);
 * const upper = problem.fit(0.9, { initialBasis: median.basis });
 */
export class QuantileRegressionProblem {
  private readonly n: number;
  private readonly k: number;
  private readonly data: ArrayLike<number>;
  private tau = 0.5;
  private readonly basis: Int32Array;
  /** Position of each row in the basis, or -1. */
  private readonly position: Int32Array;
  /** Last known side of each row's residual: +1 above the fit, -1 below. */
  private readonly side: Int8Array;
  /** X_h^{-1}, k x k row-major: column j is z_j. */
  private readonly inverse: Float64Array;
  private readonly b: Float64Array;
  private readonly r: Float64Array;
  /** sum_c |x_ic| per row, for the zero-residual tolerance. */
  private readonly rowNorm: Float64Array;
  /** v = sum_{i not in h} psi_i x_i. */
  private readonly v: Float64Array;
  private readonly s: Float64Array;
  private readonly a: Float64Array;
  private readonly heapT: Float64Array;
  private readonly heapRow: Int32Array;
  private readonly scratch: Float64Array;
  private readonly direction: Float64Array;
  private readonly projection: Float64Array;
  /** Largest |entry| of each column of X_h, for the singularity test. */
  private readonly columnScale: Float64Array;
  private readonly candidate: Int32Array;
  /** The edge chosen by descentEdge: basis position, direction sign and slope. */
  private edgeColumn = 0;
  private edgeSign: 1 | -1 = 1;
  private edgeSlope = 0;
  private bNorm = 0;
  private pivotsSinceRefresh = 0;

  constructor(
    private readonly x: Matrix,
    private readonly y: ArrayLike<number>,
  ) {
    requireResponse(x, y);
    this.n = x.rows;
    this.k = x.cols;
    const { n, k } = this;
    if (n < k || k === 0) throw new ArgumentError('x', `a design with at least one column and n >= k (k = ${k})`, n);
    this.data = x.data;
    this.basis = new Int32Array(k);
    this.position = new Int32Array(n).fill(-1);
    this.side = new Int8Array(n).fill(1);
    this.inverse = new Float64Array(k * k);
    this.b = new Float64Array(k);
    this.r = new Float64Array(n);
    this.rowNorm = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let sum = 0;
      for (let c = 0; c < k; c++) sum += Math.abs(x.data[i * k + c] as number);
      this.rowNorm[i] = sum;
    }
    this.v = new Float64Array(k);
    this.s = new Float64Array(k);
    this.a = new Float64Array(n);
    this.heapT = new Float64Array(n);
    this.heapRow = new Int32Array(n);
    this.scratch = new Float64Array(2 * k * k);
    this.direction = new Float64Array(k);
    this.projection = new Float64Array(k);
    this.columnScale = new Float64Array(k);
    this.candidate = new Int32Array(k);
  }

  /** The exact fit at level tau; options as for {@link quantileRegression}. */
  fit(tau: number, options: QuantileRegressionOptions = {}): QuantileRegressionFit {
    if (!(tau > 0 && tau < 1)) throw new ArgumentError('tau', 'a number in (0, 1)', tau);
    const { x, y, n, k } = this;
    this.tau = tau;
    this.position.fill(-1);
    this.side.fill(1);
    const warm = options.initialBasis !== undefined || options.initialCoefficients !== undefined;
    const start = options.initialBasis;
    if ((start === undefined || !this.setBasis(start)) && !this.setBasis(greedyBasis(x, y, tau, options.initialCoefficients))) {
      throw new SolverError('singular-design', 'quantile regression found no nonsingular starting basis: drop nearly dependent columns first');
    }
    const maxIterations = options.maxIterations ?? 50 + 20 * n;
    let iterations = 0;
    this.refresh();
    for (;;) {
      if (iterations % 32 === 31) this.refresh(); // bound the drift of the updates
      if (!this.descentEdge()) {
        // Recompute b from the basis in row order, so that the same basis always gives the same bits.
        if (!this.fresh) this.canonicalise();
        break;
      }
      if (iterations >= maxIterations) {
        throw new SolverError('iteration-limit', `quantile regression did not converge in ${maxIterations} iterations (n = ${n}, k = ${k}, tau = ${tau}); scale the columns or raise maxIterations`);
      }
      this.step(this.edgeColumn, this.edgeSign, this.edgeSlope);
      iterations++;
    }
    const fit = this.result(iterations, options.dual === true);
    // A warm start may end on another vertex of a flat optimal face: then answer as a cold start
    // would, so that the result never depends on the start.
    return warm && !fit.unique ? this.fit(tau, { maxIterations, dual: options.dual === true }) : fit;
  }

  /** Installs a basis if its rows are distinct, in range and give a nonsingular X_h. */
  private setBasis(rows: ArrayLike<number>): boolean {
    const { n, k, candidate } = this;
    if (rows.length !== k) return false;
    for (let j = 0; j < k; j++) {
      const i = rows[j] as number;
      if (!Number.isInteger(i) || i < 0 || i >= n) return false;
      candidate[j] = i;
    }
    candidate.sort();
    for (let j = 1; j < k; j++) if (candidate[j - 1] === candidate[j]) return false;
    if (!this.invertBasis(candidate)) return false;
    this.position.fill(-1);
    for (let j = 0; j < k; j++) {
      this.basis[j] = candidate[j] as number;
      this.position[candidate[j] as number] = j;
    }
    this.pivotsSinceRefresh = 0;
    return true;
  }

  /**
   * inverse <- X_h^{-1} by Gauss-Jordan elimination with partial pivoting; false when singular. The
   * singularity test compares each pivot with the largest entry of its own column of X_h, i.e. it is
   * the test |pivot| > 1e-13 of X_h D with D the column equilibration (Golub and Van Loan 2013, Matrix
   * Computations, 4th ed., section 3.5.2): the answer does not depend on the columns' units, so a
   * column far larger than the others (one huge regressor value) no longer makes every basis through
   * that row look singular. Pivot choices and the inverse are the same as without it.
   */
  private invertBasis(rows: Int32Array): boolean {
    const { k, data } = this;
    const m = this.scratch.subarray(0, k * k);
    const inv = this.scratch.subarray(k * k, 2 * k * k);
    const columnScale = this.columnScale;
    columnScale.fill(0);
    for (let j = 0; j < k; j++) {
      const base = (rows[j] as number) * k;
      for (let c = 0; c < k; c++) {
        const value = data[base + c] as number;
        m[j * k + c] = value;
        columnScale[c] = Math.max(columnScale[c] as number, Math.abs(value));
      }
    }
    inv.fill(0);
    for (let j = 0; j < k; j++) inv[j * k + j] = 1;
    for (let c = 0; c < k; c++) {
      let p = c;
      for (let i = c + 1; i < k; i++) if (Math.abs(m[i * k + c] as number) > Math.abs(m[p * k + c] as number)) p = i;
      const pivot = m[p * k + c] as number;
      if (!(Math.abs(pivot) > 1e-13 * (columnScale[c] as number))) return false;
      if (p !== c) {
        swapRows(m, k, p, c);
        swapRows(inv, k, p, c);
      }
      for (let j = 0; j < k; j++) {
        m[c * k + j] = (m[c * k + j] as number) / pivot;
        inv[c * k + j] = (inv[c * k + j] as number) / pivot;
      }
      for (let i = 0; i < k; i++) {
        if (i === c) continue;
        const f = m[i * k + c] as number;
        if (f === 0) continue;
        for (let j = 0; j < k; j++) {
          m[i * k + j] = (m[i * k + j] as number) - f * (m[c * k + j] as number);
          inv[i * k + j] = (inv[i * k + j] as number) - f * (inv[c * k + j] as number);
        }
      }
    }
    this.inverse.set(inv);
    return true;
  }

  /** Full recomputation from the basis: b = X_h^{-1} y_h, residuals, sides, v and s. */
  private refresh(): void {
    const { n, k, data, y, b, r, position, side, v, tau } = this;
    if (this.pivotsSinceRefresh > 0) this.reinvertInRowOrder();
    this.solveFromBasis();
    v.fill(0);
    for (let i = 0; i < n; i++) {
      if ((position[i] as number) >= 0) {
        r[i] = 0;
        continue;
      }
      const base = i * k;
      const ri = (y[i] as number) - dot(data, base, b, k);
      r[i] = ri;
      const tol = this.zeroTolerance(i);
      if (ri > tol) side[i] = 1;
      else if (ri < -tol) side[i] = -1;
      const psi = side[i] === 1 ? tau : tau - 1;
      for (let c = 0; c < k; c++) v[c] = (v[c] as number) + psi * (data[base + c] as number);
    }
    this.updateSubgradients();
  }

  private zeroTolerance(i: number): number {
    return 1e-11 * (Math.abs(this.y[i] as number) + (this.rowNorm[i] as number) * this.bNorm);
  }

  /** Basis in row order, X_h^{-1} afresh, b = X_h^{-1} y_h and s; residuals and v are kept. */
  private canonicalise(): void {
    this.reinvertInRowOrder();
    this.solveFromBasis();
    this.updateSubgradients();
  }

  /** Sorts the basis rows ascending and recomputes X_h^{-1} for that order. */
  private reinvertInRowOrder(): void {
    const { k, basis, position } = this;
    basis.sort();
    for (let j = 0; j < k; j++) position[basis[j] as number] = j;
    if (!this.invertBasis(basis)) {
      throw new SolverError('singular-design', 'quantile regression reached a singular basis: the design is not of full column rank');
    }
    this.pivotsSinceRefresh = 0;
  }

  /** b = X_h^{-1} y_h and its largest magnitude. */
  private solveFromBasis(): void {
    const { k, y, b, inverse, basis } = this;
    let bNorm = 0;
    for (let c = 0; c < k; c++) {
      let sum = 0;
      for (let j = 0; j < k; j++) sum += (inverse[c * k + j] as number) * (y[basis[j] as number] as number);
      b[c] = sum;
      bNorm = Math.max(bNorm, Math.abs(sum));
    }
    this.bNorm = bNorm;
    this.pivotsSinceRefresh = 0;
  }

  /** s = -X_h^{-T} v. */
  private updateSubgradients(): void {
    const { k, inverse, v, s } = this;
    for (let j = 0; j < k; j++) {
      let sum = 0;
      for (let c = 0; c < k; c++) sum += (inverse[c * k + j] as number) * (v[c] as number);
      s[j] = -sum;
    }
  }

  /** True when the last refresh was exact (no pivots since): an optimum found then is final. */
  private get fresh(): boolean {
    return this.pivotsSinceRefresh === 0;
  }

  /**
   * Picks the basic edge with the most negative directional derivative into edgeColumn, edgeSign and
   * edgeSlope; false at an optimum.
   */
  private descentEdge(): boolean {
    const { k, s, tau } = this;
    const eps = 1e-10;
    let slope = -eps;
    let found = false;
    for (let j = 0; j < k; j++) {
      const sj = s[j] as number;
      const up = 1 - tau + sj;
      const down = tau - sj;
      if (up < slope) {
        slope = up;
        this.edgeColumn = j;
        this.edgeSign = 1;
        found = true;
      }
      if (down < slope) {
        slope = down;
        this.edgeColumn = j;
        this.edgeSign = -1;
        found = true;
      }
    }
    this.edgeSlope = slope;
    return found;
  }

  /**
   * Follows edge sign * z_column to the breakpoint where the slope turns >= 0, pivots that row in and
   * updates b, the residuals, v, X_h^{-1} and s in O(nk).
   */
  private step(column: number, sign: 1 | -1, slope: number): void {
    const { n, k, data, inverse, position, side, r, a, heapT, heapRow, basis, v, b, tau, y, rowNorm } = this;
    const z = this.direction;
    for (let c = 0; c < k; c++) z[c] = sign * (inverse[c * k + column] as number);
    const tolScale = 1e-11 * this.bNorm;
    let count = 0;
    for (let i = 0; i < n; i++) {
      if ((position[i] as number) >= 0) continue;
      const base = i * k;
      const ai = dot(data, base, z, k);
      a[i] = ai;
      if (ai === 0) continue;
      const ri = r[i] as number;
      let t: number;
      if (Math.abs(ri) > 1e-11 * Math.abs(y[i] as number) + tolScale * (rowNorm[i] as number)) {
        t = ri / ai;
        if (!(t > 0)) continue;
      } else if ((side[i] === 1 && ai > 0) || (side[i] === -1 && ai < 0)) {
        t = 0;
      } else {
        continue;
      }
      heapT[count] = t;
      heapRow[count] = i;
      count++;
    }
    heapify(heapT, heapRow, count);
    let entering = -1;
    let tStar = 0;
    let g = slope;
    while (count > 0) {
      const t = heapT[0] as number;
      const i = heapRow[0] as number;
      count = popHeap(heapT, heapRow, count);
      g += Math.abs(a[i] as number);
      if (g >= 0) {
        entering = i;
        tStar = t;
        break;
      }
      // Row i changes side: its psi moves by -1 (to below) or +1 (to above).
      const delta = side[i] === 1 ? -1 : 1;
      side[i] = side[i] === 1 ? -1 : 1;
      const base = i * k;
      for (let c = 0; c < k; c++) v[c] = (v[c] as number) + delta * (data[base + c] as number);
    }
    if (entering < 0) {
      throw new SolverError('unbounded', 'quantile regression objective is unbounded along an edge: the design is not of full column rank');
    }
    // Move: b <- b + tStar sign z_column; residuals r_i <- r_i - tStar a_i.
    const leaving = basis[column] as number;
    for (let c = 0; c < k; c++) b[c] = (b[c] as number) + tStar * sign * (inverse[c * k + column] as number);
    for (let i = 0; i < n; i++) if ((position[i] as number) < 0) r[i] = (r[i] as number) - tStar * (a[i] as number);
    r[leaving] = -sign * tStar;
    r[entering] = 0;
    // The leaving row joins the side its residual moved to; the entering row leaves v.
    side[leaving] = sign === 1 ? -1 : 1;
    const leaveBase = leaving * k;
    const enterBase = entering * k;
    const psiLeaving = side[leaving] === 1 ? tau : tau - 1;
    const psiEntering = side[entering] === 1 ? tau : tau - 1;
    for (let c = 0; c < k; c++) {
      v[c] = (v[c] as number) + psiLeaving * (data[leaveBase + c] as number) - psiEntering * (data[enterBase + c] as number);
    }
    // Product-form update of X_h^{-1} for row `column` replaced by x_entering:
    // z_column' = z_column / (x_e z_column), z_j' = z_j - (x_e z_j) z_column'.
    const pivot = sign * (a[entering] as number);
    const proj = this.projection;
    for (let j = 0; j < k; j++) {
      let sum = 0;
      for (let c = 0; c < k; c++) sum += (data[enterBase + c] as number) * (inverse[c * k + j] as number);
      proj[j] = sum;
    }
    for (let c = 0; c < k; c++) inverse[c * k + column] = (inverse[c * k + column] as number) / pivot;
    for (let j = 0; j < k; j++) {
      if (j === column) continue;
      const f = proj[j] as number;
      if (f === 0) continue;
      for (let c = 0; c < k; c++) inverse[c * k + j] = (inverse[c * k + j] as number) - f * (inverse[c * k + column] as number);
    }
    position[leaving] = -1;
    position[entering] = column;
    basis[column] = entering;
    this.pivotsSinceRefresh++;
    this.updateSubgradients();
  }

  /** The fit at the current (freshly refreshed, optimal) basis. */
  private result(iterations: number, withDual: boolean): QuantileRegressionFit {
    const { n, k, r, position, side, s, tau, y, rowNorm } = this;
    let objective = 0;
    let unique = true;
    const eps = 1e-9;
    for (let j = 0; j < k; j++) {
      const sj = s[j] as number;
      if (!(sj > tau - 1 + eps && sj < tau - eps)) unique = false;
    }
    const tolScale = 1e-11 * this.bNorm;
    for (let i = 0; i < n; i++) {
      const ri = r[i] as number;
      objective += ri * (ri < 0 ? tau - 1 : tau);
      if ((position[i] as number) < 0 && Math.abs(ri) <= 1e-11 * Math.abs(y[i] as number) + tolScale * (rowNorm[i] as number)) unique = false;
    }
    const fit = { coefficients: Float64Array.from(this.b), objective, basis: Int32Array.from(this.basis), iterations, unique };
    if (!withDual) return fit;
    const dual = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const p = position[i] as number;
      dual[i] = p >= 0 ? (s[p] as number) + 1 - tau : side[i] === 1 ? 1 : 0;
    }
    return { ...fit, dual };
  }
}

/** x_i . z for the row starting at data[base], two running sums. */
function dot(data: ArrayLike<number>, base: number, z: ArrayLike<number>, k: number): number {
  let s0 = 0;
  let s1 = 0;
  let c = 0;
  for (; c + 1 < k; c += 2) {
    s0 += (data[base + c] as number) * (z[c] as number);
    s1 += (data[base + c + 1] as number) * (z[c + 1] as number);
  }
  if (c < k) s0 += (data[base + c] as number) * (z[c] as number);
  return s0 + s1;
}

/** Min-heap on (t, row) in two parallel arrays, built in O(m). */
function heapify(t: Float64Array, row: Int32Array, count: number): void {
  for (let i = (count >> 1) - 1; i >= 0; i--) siftDown(t, row, i, count);
}

/** Removes the top; returns the new count. */
function popHeap(t: Float64Array, row: Int32Array, count: number): number {
  const last = count - 1;
  t[0] = t[last] as number;
  row[0] = row[last] as number;
  siftDown(t, row, 0, last);
  return last;
}

function siftDown(t: Float64Array, row: Int32Array, start: number, count: number): void {
  let i = start;
  for (;;) {
    const left = 2 * i + 1;
    if (left >= count) return;
    let child = left;
    const right = left + 1;
    if (right < count && before(t, row, right, left)) child = right;
    if (!before(t, row, child, i)) return;
    const tt = t[i] as number;
    t[i] = t[child] as number;
    t[child] = tt;
    const rr = row[i] as number;
    row[i] = row[child] as number;
    row[child] = rr;
    i = child;
  }
}

function before(t: Float64Array, row: Int32Array, p: number, q: number): boolean {
  const tp = t[p] as number;
  const tq = t[q] as number;
  return tp < tq || (tp === tq && (row[p] as number) < (row[q] as number));
}

function swapRows(m: Float64Array, k: number, p: number, q: number): void {
  for (let j = 0; j < k; j++) {
    const t = m[p * k + j] as number;
    m[p * k + j] = m[q * k + j] as number;
    m[q * k + j] = t;
  }
}

/**
 * A starting basis near a given fit b0 (by default the least-squares fit) moved to the tau-quantile of
 * its residuals: rows in increasing |r_i - q_tau(r)|, taken while linearly independent of those taken
 * before (Gram-Schmidt on the rows, applied twice).
 */
function greedyBasis(x: Matrix, y: ArrayLike<number>, tau: number, start?: ArrayLike<number>): Int32Array {
  const { rows: n, cols: k, data } = x;
  const residuals = start === undefined ? leastSquaresQr(x, y).residuals : residualsAt(x, y, start);
  const sorted = Float64Array.from(residuals).sort();
  const shift = sorted[Math.min(n - 1, Math.floor(tau * n))] as number;
  const distance = Float64Array.from(residuals, (r) => Math.abs(r - shift));
  const chosen: number[] = [];
  const ortho: Float64Array[] = [];
  const w = new Float64Array(k);
  for (let tried = 0; tried < n && chosen.length < k; tried++) {
    // next nearest row not tried yet (distance set to Infinity once tried)
    let i = 0;
    for (let q = 1; q < n; q++) if ((distance[q] as number) < (distance[i] as number)) i = q;
    distance[i] = Infinity;
    let norm0 = 0;
    for (let c = 0; c < k; c++) {
      w[c] = data[i * k + c] as number;
      norm0 += (w[c] as number) ** 2;
    }
    for (let pass = 0; pass < 2; pass++) {
      for (const q of ortho) {
        let d = 0;
        for (let c = 0; c < k; c++) d += (w[c] as number) * (q[c] as number);
        for (let c = 0; c < k; c++) w[c] = (w[c] as number) - d * (q[c] as number);
      }
    }
    let norm = 0;
    for (let c = 0; c < k; c++) norm += (w[c] as number) ** 2;
    if (norm0 === 0 || !(norm > 1e-20 * norm0)) continue;
    ortho.push(Float64Array.from(w, (value) => value / Math.sqrt(norm)));
    chosen.push(i);
  }
  if (chosen.length < k) {
    throw new SolverError('singular-design', `the design has rank ${chosen.length} < ${k} columns; drop dependent columns first`);
  }
  return Int32Array.from(chosen);
}

function residualsAt(x: Matrix, y: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
  const fitted = multiply(x, b);
  for (let i = 0; i < fitted.length; i++) fitted[i] = (y[i] as number) - (fitted[i] as number);
  return fitted;
}
