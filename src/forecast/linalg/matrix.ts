import { ArgumentError } from '../../stats/argumentError.js';

/**
 * A dense real matrix stored row-major: entry (i, j) is `data[i * cols + j]`.
 *
 * Functions in this folder take matrices as inputs and never change them; `data` is typed as
 * `ArrayLike<number>` so that a caller may pass a frozen array, a `Float64Array` or a plain array.
 */
export interface Matrix {
  /** Number of rows n (observations) [-]. */
  readonly rows: number;
  /** Number of columns k (regressors) [-]. */
  readonly cols: number;
  /** Entries, row-major, length rows * cols. */
  readonly data: ArrayLike<number>;
}

/**
 * Builds a row-major matrix from an array of rows of equal length.
 *
 * @example
 * matrixFromRows([[1, 2], [3, 4]]); // { rows: 2, cols: 2, data: Float64Array [1, 2, 3, 4] }
 * @throws ArgumentError when the rows differ in length or hold a non-finite value
 */
export function matrixFromRows(rows: readonly (readonly number[])[]): Matrix {
  const cols = rows[0]?.length ?? 0;
  const data = new Float64Array(rows.length * cols);
  rows.forEach((row, i) => {
    if (row.length !== cols) throw new ArgumentError(`rows[${i}]`, `an array of length ${cols}, like rows[0]`, row);
    row.forEach((v, j) => {
      if (!Number.isFinite(v)) throw new ArgumentError(`rows[${i}][${j}]`, 'a finite number', v);
      data[i * cols + j] = v;
    });
  });
  return { rows: rows.length, cols, data };
}

/** Checks that `y` has one finite entry per row of `x`. */
export function requireResponse(x: Matrix, y: ArrayLike<number>): void {
  if (x.data.length !== x.rows * x.cols) {
    throw new ArgumentError('x.data', `of length rows * cols = ${x.rows * x.cols}`, x.data.length);
  }
  if (y.length !== x.rows) throw new ArgumentError('y', `of length ${x.rows} (one value per row of x)`, y.length);
  for (let i = 0; i < y.length; i++) {
    if (!Number.isFinite(y[i] as number)) throw new ArgumentError(`y[${i}]`, 'a finite number', y[i]);
  }
}

/** x b: the fitted values of coefficients `b` (length cols) at every row of `x`. */
export function multiply(x: Matrix, b: ArrayLike<number>): Float64Array {
  const out = new Float64Array(x.rows);
  const { cols, data } = x;
  for (let i = 0; i < x.rows; i++) {
    let s = 0;
    const base = i * cols;
    for (let j = 0; j < cols; j++) s += (data[base + j] as number) * (b[j] as number);
    out[i] = s;
  }
  return out;
}
