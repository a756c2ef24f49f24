import { ArgumentError } from '../../stats/argumentError.js';

/**
 * Energy score of an ensemble of whole-day paths x_1..x_n (each a vector over the day's periods) for the
 * realised vector y (Gneiting and Raftery 2007, section 4.3; the ensemble form of Gneiting, Stanberry,
 * Grimit, Held and Johnson 2008, eq. 6):
 *   ES = (1/n) sum_j ||x_j - y|| - (1 / (2 n^2)) sum_j sum_k ||x_j - x_k||,
 * with ||.|| the Euclidean norm over the periods. A proper score for multivariate forecasts that
 * reduces to the CRPS for one period; lower is better. Unit: that of y [currency/MWh].
 *
 * @example
 * // two paths (0, 0) and (2, 0), y = (0, 0): (0 + 2)/2 - (2 + 2)/(2 * 4) = 0.5
 * energyScore([[0, 0], [2, 0]], [0, 0]); // 0.5
 *
 * References: T. Gneiting and A. E. Raftery (2007), Strictly proper scoring rules, prediction, and
 * estimation, JASA 102(477), 359-378, doi:10.1198/016214506000001437; T. Gneiting, L. I. Stanberry,
 * E. P. Grimit, L. Held and N. A. Johnson (2008), Assessing probabilistic forecasts of multivariate
 * quantities, with an application to ensemble predictions of surface winds, TEST 17(2), 211-235,
 * doi:10.1007/s11749-008-0114-x.
 *
 * @param paths n >= 1 paths, each as long as y
 * @param y the realised values
 */
export function energyScore(paths: readonly ArrayLike<number>[], y: ArrayLike<number>): number {
  requirePaths(paths, y);
  const n = paths.length;
  const T = y.length;
  let toObservation = 0;
  let between = 0;
  for (let j = 0; j < n; j++) {
    const xj = paths[j] as ArrayLike<number>;
    let d = 0;
    for (let t = 0; t < T; t++) d += ((xj[t] as number) - (y[t] as number)) ** 2;
    toObservation += Math.sqrt(d);
    for (let k = j + 1; k < n; k++) {
      const xk = paths[k] as ArrayLike<number>;
      let e = 0;
      for (let t = 0; t < T; t++) e += ((xj[t] as number) - (xk[t] as number)) ** 2;
      between += 2 * Math.sqrt(e);
    }
  }
  return toObservation / n - between / (2 * n * n);
}

/** Checks that there is at least one path and that every path is as long as y. */
export function requirePaths(paths: readonly ArrayLike<number>[], y: ArrayLike<number>): void {
  if (paths.length === 0) throw new ArgumentError('paths', 'at least one path', paths);
  paths.forEach((path, j) => {
    if (path.length !== y.length) throw new ArgumentError(`paths[${j}]`, `${y.length} values, one per period of y`, path.length);
  });
}
