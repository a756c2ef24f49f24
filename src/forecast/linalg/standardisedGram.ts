import type { Matrix } from './matrix.js';
import { requireResponse } from './matrix.js';
import { twoByFourProducts } from './twoByFourProducts.js';

/**
 * Cross products of a design whose columns are centred and scaled, for models with a free intercept
 * (least squares via Cholesky, LASSO via coordinate descent).
 *
 * Notes: with column means m_j, population standard deviations s_j = sqrt((1/n) sum_i (x_ij - m_j)^2),
 * z_ij = (x_ij - m_j) / s_j and ybar the mean of y,
 *   gram_jl = (1/n) sum_i z_ij z_il   (a correlation matrix, unit diagonal),
 *   zty_j   = (1/n) sum_i z_ij (y_i - ybar),
 *   yVariance = (1/n) sum_i (y_i - ybar)^2.
 * Means are taken in a first pass and the centred products in a second, which keeps the rounding
 * error of the products at the level of the centred data (Chan, Golub and LeVeque 1983). A column
 * with s_j <= 1e-12 (1 + |m_j|) is constant: its scale is set to 0 and its row and column of `gram`
 * to 0, and the solvers leave it out (its coefficient is 0). This is the standardisation of
 * Tibshirani (1996) and Friedman, Hastie and Tibshirani (2010).
 *
 * References: T. F. Chan, G. H. Golub and R. J. LeVeque (1983), Algorithms for computing the sample
 * variance, The American Statistician 37(3), 242-247, doi:10.1080/00031305.1983.10483115;
 * J. Friedman, T. Hastie and R. Tibshirani (2010), Regularization paths for generalized linear models
 * via coordinate descent, J. Stat. Softw. 33(1), doi:10.18637/jss.v033.i01.
 */
export interface StandardisedGram {
  /** Rows n [-]. */
  readonly n: number;
  /** Columns k (the intercept is not a column) [-]. */
  readonly k: number;
  /** Column means m_j. */
  readonly means: Float64Array;
  /** Column standard deviations s_j (population, divisor n); 0 marks a constant column. */
  readonly scales: Float64Array;
  /** Mean of y. */
  readonly yMean: number;
  /** k x k row-major correlation matrix of the columns (zero rows and columns for constant ones). */
  readonly gram: Float64Array;
  /** (1/n) Z'(y - ybar). */
  readonly zty: Float64Array;
  /** (1/n) sum (y - ybar)^2. */
  readonly yVariance: number;
}

/**
 * Builds the {@link StandardisedGram} of `x` (n x k, no column of ones) and `y` (length n >= 1).
 *
 * Each sum is taken over the rows in row order, one sum at a time, with the centred columns laid out
 * column by column (two columns against four per pass over the rows, as arxGram.ts): the same
 * additions in the same order as row by row, so the same bits, with the running sums in registers.
 */
export function standardisedGram(x: Matrix, y: ArrayLike<number>): StandardisedGram {
  requireResponse(x, y);
  const { rows: n, cols: k, data } = x;
  const means = new Float64Array(k);
  let yMean = 0;
  // Row by row (the data are row-major): each column's sum still adds its values in row order.
  for (let i = 0; i < n; i++) {
    yMean += y[i] as number;
    for (let j = 0; j < k; j++) means[j] = (means[j] as number) + (data[i * k + j] as number);
  }
  yMean /= n;
  for (let j = 0; j < k; j++) means[j] = (means[j] as number) / n;
  // Centred columns 0..k-1, then y - ybar (column k), then a column of zeros (column k + 1).
  const width = k + 1;
  const cols = centredScratch((width + 1) * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < k; j++) cols[j * n + i] = (data[i * k + j] as number) - (means[j] as number);
    cols[k * n + i] = (y[i] as number) - yMean;
  }
  cols.fill(0, width * n, (width + 1) * n);
  // products[j width + l], l >= j: sum_i c_ij c_il over the centred columns and y.
  const products = new Float64Array(width * width);
  for (let j = 0; j < width; j += 2) {
    for (let l = j; l < width; l += 4) crossProducts(cols, n, width, j, l, products);
  }
  const gram = new Float64Array(k * k);
  const cy = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    cy[j] = products[j * width + k] as number;
    for (let l = j; l < k; l++) gram[j * k + l] = products[j * width + l] as number;
  }
  return standardiseCentredSums(n, means, yMean, gram, cy, products[k * width + k] as number);
}

/**
 * Sums over the n rows of columns j, j + 1 times columns l..l + 3 (columns at or past `width` read as
 * the column of zeros at width n, their sums dropped), into products[r width + c] for c >= r.
 */
function crossProducts(cols: Float64Array, n: number, width: number, j: number, l: number, products: Float64Array): void {
  const zeros = width * n;
  const at = (c: number): number => (c < width ? c * n : zeros);
  twoByFourProducts(cols, at(j), at(j + 1), at(l), at(l + 1), at(l + 2), at(l + 3), [n], blockSums);
  for (let r = 0; r < 2; r++) {
    for (let t = 0; t < 4; t++) {
      const row = j + r;
      const column = l + t;
      if (row < width && column < width && column >= row) products[row * width + column] = blockSums[4 * r + t] as number;
    }
  }
}

const blockSums = new Float64Array(8);

/** Scratch space of the centred columns, reused from call to call (each call overwrites what it reads). */
let centredColumns = new Float64Array(0);

function centredScratch(length: number): Float64Array {
  if (centredColumns.length < length) centredColumns = new Float64Array(length);
  return centredColumns;
}

/**
 * The {@link StandardisedGram}s of the leading rows of one design: entry i is the Gram of rows
 * 0 .. counts[i] - 1. For nested calibration windows with the rows ordered most recent first, one
 * pass serves every window.
 *
 * Notes: one pass of shifted sums (Chan, Golub and LeVeque 1983, the shifted-data algorithm), with
 * the shift K = the first row: S_j = sum_i (x_ij - K_j), S_jl = sum_i (x_ij - K_j)(x_il - K_l); at each
 * count n the centred products are S_jl - S_j S_l / n. With K one of the observations, the
 * cancellation in that difference is that of data a few standard deviations from their mean.
 *
 * @param counts strictly increasing row counts, each in [1, rows]
 */
export function nestedStandardisedGrams(x: Matrix, y: ArrayLike<number>, counts: readonly number[]): StandardisedGram[] {
  requireResponse(x, y);
  const { cols: k, data } = x;
  const shift = Float64Array.from({ length: k }, (_, j) => data[j] as number);
  const yShift = y[0] as number;
  const sums = new Float64Array(k);
  const products = new Float64Array(k * k);
  const cross = new Float64Array(k);
  let ySum = 0;
  let ySquares = 0;
  const row = new Float64Array(k);
  const out: StandardisedGram[] = [];
  let i = 0;
  for (const n of counts) {
    for (; i < n; i++) {
      const dy = (y[i] as number) - yShift;
      ySum += dy;
      ySquares += dy * dy;
      for (let j = 0; j < k; j++) row[j] = (data[i * k + j] as number) - (shift[j] as number);
      for (let j = 0; j < k; j++) {
        const rj = row[j] as number;
        sums[j] = (sums[j] as number) + rj;
        cross[j] = (cross[j] as number) + rj * dy;
        for (let l = j; l < k; l++) products[j * k + l] = (products[j * k + l] as number) + rj * (row[l] as number);
      }
    }
    const means = Float64Array.from(sums, (v, j) => (shift[j] as number) + v / n);
    const gram = new Float64Array(k * k);
    const cy = new Float64Array(k);
    for (let j = 0; j < k; j++) {
      cy[j] = (cross[j] as number) - ((sums[j] as number) * ySum) / n;
      for (let l = j; l < k; l++) gram[j * k + l] = (products[j * k + l] as number) - ((sums[j] as number) * (sums[l] as number)) / n;
    }
    out.push(standardiseCentredSums(n, means, yShift + ySum / n, gram, cy, ySquares - (ySum * ySum) / n));
  }
  return out;
}

/**
 * Scales centred sums into the standardised form: `gram` holds sum (x_j - m_j)(x_l - m_l) on and above
 * the diagonal (it is overwritten with the full correlation matrix), `cy` sum (x_j - m_j)(y - ybar),
 * `ySquares` sum (y - ybar)^2; all are divided by n and by the standard deviations, and constant
 * columns are marked. For callers that accumulate the sums their own way; `into` (arrays of length k)
 * takes the scales and zty instead of new arrays, for a caller that uses each result before the next.
 */
export function standardiseCentredSums(
  n: number,
  means: Float64Array,
  yMean: number,
  gram: Float64Array,
  cy: Float64Array,
  ySquares: number,
  into?: { readonly scales: Float64Array; readonly zty: Float64Array },
): StandardisedGram {
  const k = means.length;
  const scales = into?.scales ?? new Float64Array(k);
  for (let j = 0; j < k; j++) {
    const sd = Math.sqrt(Math.max(gram[j * k + j] as number, 0) / n);
    scales[j] = sd <= 1e-12 * (1 + Math.abs(means[j] as number)) ? 0 : sd;
  }
  const zty = into?.zty ?? new Float64Array(k);
  for (let j = 0; j < k; j++) {
    const sj = scales[j] as number;
    zty[j] = sj === 0 ? 0 : (cy[j] as number) / (n * sj);
    for (let l = j; l < k; l++) {
      const sl = scales[l] as number;
      const v = sj === 0 || sl === 0 ? 0 : (gram[j * k + l] as number) / (n * sj * sl);
      gram[j * k + l] = v;
      gram[l * k + j] = v;
    }
  }
  return { n, k, means, scales, yMean, gram, zty, yVariance: Math.max(ySquares, 0) / n };
}
