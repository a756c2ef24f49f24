/**
 * Whole-day scenario paths: the point forecast plus the whole error vector of a past day,
 *   path_j(s) = P_hat(s) + e(d_j, s),   e = P - P_hat (out of sample),
 * one path per calibration day d_j, the most recent first. Adding a day's errors as a block keeps
 * the dependence between the periods of a day (the error of 18:00 moves with the error of 19:00),
 * which independent per-period quantiles lose; each path's marginal per slot is the historical
 * simulation distribution. This is the whole-day (vector) form of historical simulation, the
 * residual bootstrap that resamples whole days (Efron and Tibshirani 1993).
 *
 * Reference: B. Efron and R. J. Tibshirani (1993), An Introduction to the Bootstrap, Chapman & Hall,
 * doi:10.1201/9780429246593.
 *
 * @param point point forecast per slot [currency/MWh]
 * @param errors errors per calibration day and slot, most recent day last
 * @param count number of paths S (at most errors.length)
 * @returns paths[j][s], j = 0 the most recent day's errors
 */
export function errorPaths(point: ArrayLike<number>, errors: readonly ArrayLike<number>[], count: number): number[][] {
  const paths: number[][] = [];
  for (let j = 0; j < count && j < errors.length; j++) {
    const e = errors[errors.length - 1 - j] as ArrayLike<number>;
    paths.push(Array.from({ length: point.length }, (_, s) => (point[s] as number) + (e[s] as number)));
  }
  return paths;
}
