import type { FitStopwatch } from '../fitStopwatch.js';
import { timedFits } from '../fitStopwatch.js';
import { pivotedColumns } from '../linalg/leastSquaresQr.js';
import { SolverError } from '../linalg/errors.js';
import { QuantileRegressionProblem } from '../linalg/quantileRegression.js';

/**
 * Warm starts for quantile regression averaging across delivery days: the optimal basis of each
 * (slot, level), remembered by calibration-day id, so that the next day's fit, whose calibration
 * window has moved by a day, starts one or two pivots from its optimum. Results do not depend on it
 * (the solver answers as from a cold start whenever the optimum might not be unique); it only saves
 * time.
 */
export class QraWarmStarts {
  private readonly bases = new Map<string, Int32Array>();
  private rows = new Int32Array(0);

  /**
   * The remembered basis mapped to rows of the current calibration set, or undefined. The array is
   * reused by the next lookup.
   */
  lookup(key: string, rowOfId: ReadonlyMap<number, number>): Int32Array | undefined {
    const ids = this.bases.get(key);
    if (ids === undefined) return undefined;
    if (this.rows.length !== ids.length) this.rows = new Int32Array(ids.length);
    for (let j = 0; j < ids.length; j++) {
      const row = rowOfId.get(ids[j] as number);
      if (row === undefined) return undefined;
      this.rows[j] = row;
    }
    return this.rows;
  }

  remember(key: string, basis: Int32Array, ids: ArrayLike<number>): void {
    let remembered = this.bases.get(key);
    if (remembered === undefined || remembered.length !== basis.length) {
      remembered = new Int32Array(basis.length);
      this.bases.set(key, remembered);
    }
    for (let j = 0; j < basis.length; j++) remembered[j] = ids[basis[j] as number] as number;
  }
}

/** Calibration data of quantile regression averaging. */
export interface QraCalibration {
  /** members[d][m][s]: point forecast m of calibration day d, per slot [currency/MWh]. */
  readonly members: readonly (readonly ArrayLike<number>[])[];
  /** realised[d][s]: realised price of calibration day d [currency/MWh]. */
  readonly realised: readonly ArrayLike<number>[];
  /** A distinct id per calibration day (e.g. its day number), for warm starts. */
  readonly dayIds: ArrayLike<number>;
}

/**
 * Quantile regression averaging (QRA): for each clock slot s and level tau, the linear quantile
 * regression of the realised price on several point forecasts over the calibration days,
 *   q_tau(s) = b0(tau, s) + sum_m b_m(tau, s) P_hat_m(d, s),
 *   b(tau, s) = argmin_b sum_{d'} rho_tau(P(d', s) - b0 - sum_m b_m P_hat_m(d', s)),
 * solved exactly (see quantileRegression.ts). When the point forecasts are linearly dependent over
 * the calibration days (e.g. two windows that saw the same days), a largest independent set of the
 * columns is kept (column-pivoted QR on the equilibrated columns) and the rest left out; should the
 * simplex still meet a numerically singular basis, the most nearly dependent column is left out and
 * the slot refitted, with a note. Quantiles may cross between levels;
 * repair them with monotone rearrangement.
 *
 * Reference: J. Nowotarski and R. Weron (2015), Computing electricity spot price prediction intervals
 * using quantile regression and forecast averaging, Comput. Stat. 30(3), 791-803,
 * doi:10.1007/s00180-014-0523-0; R. Koenker and G. Bassett (1978), Regression quantiles,
 * Econometrica 46(1), 33-50.
 *
 * @param target target[m][s]: point forecast m of the delivery day
 * @param calibration point forecasts and realised prices of the calibration days (at least 1 + m)
 * @param levels strictly increasing levels in (0, 1)
 * @param warmStarts optional warm-start store kept between delivery days
 * @param stopwatch optional counter of the time spent fitting: per slot, the column selection and the
 *   quantile regressions of every level (one model per level)
 * @param notes optional list that receives one note when a slot had to be fitted on fewer point
 *   forecasts than the pivoted QR kept
 * @returns prices[s][k] at levels[k], before rearrangement
 */
export function quantileRegressionAveraging(
  target: readonly ArrayLike<number>[],
  calibration: QraCalibration,
  levels: readonly number[],
  warmStarts?: QraWarmStarts,
  stopwatch?: FitStopwatch,
  notes?: string[],
): number[][] {
  const slots = target[0]?.length ?? 0;
  const n = calibration.realised.length;
  const rowOfId = new Map<number, number>();
  for (let d = 0; d < n; d++) rowOfId.set(calibration.dayIds[d] as number, d);
  const full = { rows: n, cols: target.length + 1, data: new Float64Array(n * (target.length + 1)) };
  const y = new Float64Array(n);
  const scales = new Float64Array(full.cols);
  const fellBack: string[] = [];
  /** The quantiles of slot s at every level on the columns `kept` of the (equilibrated) design. */
  const fitColumns = (s: number, kept: readonly number[]): number[] => {
    const x = kept.length === full.cols ? full : { rows: n, cols: kept.length, data: keepColumns(full.data, n, full.cols, kept) };
    const problem = new QuantileRegressionProblem(x, y);
    const features = kept.map((c) => (c === 0 ? 1 : ((target[c - 1] as ArrayLike<number>)[s] as number)) * (scales[c] as number));
    const signature = `${s}|${kept.join(',')}|`;
    let previous: Int32Array | undefined;
    return levels.map((tau) => {
      const key = signature + tau;
      const initialBasis = warmStarts?.lookup(key, rowOfId) ?? previous;
      const fit = problem.fit(tau, initialBasis === undefined ? {} : { initialBasis });
      previous = fit.basis;
      warmStarts?.remember(key, fit.basis, calibration.dayIds);
      let q = 0;
      for (let j = 0; j < features.length; j++) q += (features[j] as number) * (fit.coefficients[j] as number);
      return q;
    });
  };
  /**
   * The quantiles of slot s from the design and response just filled in: on a largest independent set
   * of columns, and when the simplex still meets a numerically singular basis, on one column fewer at
   * a time, the most nearly dependent (the last pivot of the column-pivoted QR) first, down to one
   * column, which cannot be singular.
   */
  const fitSlot = (s: number): number[] => {
    const order = pivotedColumns(full);
    for (;;) {
      try {
        return fitColumns(s, [...order].sort((p, q) => p - q));
      } catch (err) {
        if (!(err instanceof SolverError) || err.reason !== 'singular-design' || order.length <= 1) throw err;
        const dropped = order.pop() as number;
        fellBack.push(`slot ${s + 1}: ${dropped === 0 ? 'the intercept' : `point forecast ${dropped}`} left out`);
      }
    }
  };
  const quantiles = Array.from({ length: slots }, (_, s) => {
    fillDesign(calibration, s, full.data, y);
    equilibrateColumns(full, scales);
    return timedFits(stopwatch, levels.length, () => fitSlot(s));
  });
  if (fellBack.length > 0) {
    notes?.push(`quantile regression met a numerically singular design and used fewer point forecasts (${fellBack.join('; ')})`);
  }
  return quantiles;
}

/**
 * Scales each column of X in place by a power of two near 1 / max_i |x_ic| and writes the factors to
 * `scales`. Column equilibration makes the rank decision of the pivoted QR and the pivot tolerances
 * of the simplex independent of the columns' units (Golub and Van Loan 2013, Matrix Computations, 4th
 * ed., section 3.5.2), so that a member forecast far larger than the rest on one day no longer
 * hides the intercept. Powers of two scale exactly, and quantile regression is equivariant under
 * column scaling, b(tau; y, X D) = D^{-1} b(tau; y, X) (Koenker and Bassett 1978, Theorem 3.2), so the
 * fitted quantiles are those of the unscaled design.
 */
function equilibrateColumns(x: { rows: number; cols: number; data: Float64Array }, scales: Float64Array): void {
  const { rows, cols, data } = x;
  for (let c = 0; c < cols; c++) {
    let largest = 0;
    for (let i = 0; i < rows; i++) largest = Math.max(largest, Math.abs(data[i * cols + c] as number));
    const scale = largest > 0 ? 2 ** -Math.floor(Math.log2(largest)) : 1;
    scales[c] = scale;
    if (scale !== 1) for (let i = 0; i < rows; i++) data[i * cols + c] = (data[i * cols + c] as number) * scale;
  }
}

/** Writes the design [1, P_hat_1, ..., P_hat_m] and response of slot s over the calibration days. */
function fillDesign(calibration: QraCalibration, s: number, data: Float64Array, y: Float64Array): void {
  calibration.realised.forEach((realised, d) => {
    const members = calibration.members[d] as readonly ArrayLike<number>[];
    const cols = members.length + 1;
    data[d * cols] = 1;
    for (let j = 0; j < members.length; j++) data[d * cols + j + 1] = (members[j] as ArrayLike<number>)[s] as number;
    y[d] = realised[s] as number;
  });
}

function keepColumns(data: Float64Array, n: number, cols: number, kept: readonly number[]): Float64Array {
  const out = new Float64Array(n * kept.length);
  for (let i = 0; i < n; i++) kept.forEach((c, j) => (out[i * kept.length + j] = data[i * cols + c] as number));
  return out;
}
