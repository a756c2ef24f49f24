/**
 * Time spent fitting models, read with a clock the caller hands in (benchmarks): domain code never
 * reads the clock itself. The same shape as the day solver's stopwatch (src/plan/solveDay.ts).
 *
 * What counts as a fit: estimating one model's coefficients, that is forming the normal equations
 * (the standardised Gram matrices of the ARX design) and solving them by least squares or LASSO, one
 * model per clock slot and calibration window; and, for quantile regression averaging, the column
 * selection and the exact quantile regression of one slot at one level. Building the regressors,
 * the asinh transform, the calibration errors and the quantiles from them are not fits.
 */
export interface FitStopwatch {
  /** The caller's clock [ms], e.g. `() => performance.now()`. */
  readonly now: () => number;
  /** Time spent fitting, added to on every timed stretch [ms]. */
  spentMs: number;
  /** Models fitted [-]. */
  calls: number;
}

/**
 * Runs `fit`, which fits `models` models, adding its time and the models to `watch` (when given).
 * The result of `fit` is returned unchanged, so forecasts are the same with or without a stopwatch.
 */
export function timedFits<T>(watch: FitStopwatch | undefined, models: number, fit: () => T): T {
  if (watch === undefined) return fit();
  const started = watch.now();
  try {
    return fit();
  } finally {
    watch.spentMs += watch.now() - started;
    watch.calls += models;
  }
}
