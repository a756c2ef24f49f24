import type { FitStopwatch } from '../fitStopwatch.js';
import { timedFits } from '../fitStopwatch.js';
import { independentColumns } from '../linalg/leastSquaresQr.js';
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
 * columns is kept (column-pivoted QR) and the rest left out. Quantiles may cross between levels;
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
 * @returns prices[s][k] at levels[k], before rearrangement
 */
export function quantileRegressionAveraging(
  target: readonly ArrayLike<number>[],
  calibration: QraCalibration,
  levels: readonly number[],
  warmStarts?: QraWarmStarts,
  stopwatch?: FitStopwatch,
): number[][] {
  const slots = target[0]?.length ?? 0;
  const n = calibration.realised.length;
  const rowOfId = new Map<number, number>();
  for (let d = 0; d < n; d++) rowOfId.set(calibration.dayIds[d] as number, d);
  const full = { rows: n, cols: target.length + 1, data: new Float64Array(n * (target.length + 1)) };
  const y = new Float64Array(n);
  /** The quantiles of slot s at every level, from the design and response just filled in. */
  const fitSlot = (s: number): number[] => {
    const kept = independentColumns(full);
    const x = kept.length === full.cols ? full : { rows: n, cols: kept.length, data: keepColumns(full.data, n, full.cols, kept) };
    const problem = new QuantileRegressionProblem(x, y);
    const features = kept.map((c) => (c === 0 ? 1 : ((target[c - 1] as ArrayLike<number>)[s] as number)));
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
  return Array.from({ length: slots }, (_, s) => {
    fillDesign(calibration, s, full.data, y);
    return timedFits(stopwatch, levels.length, () => fitSlot(s));
  });
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
