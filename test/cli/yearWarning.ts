/**
 * The warning `backtest` and `size` write on stderr when their yearly figures are extrapolated from less
 * than a year (economics/yearCoverage.ts): tests of short runs that expect nothing else on stderr strip it.
 */
export const YEAR_WARNING = /^warning: .* are extrapolated to a year: scaled x 365\.25 \/ \d+ = [\d.]+ from .*\n/gm;

/** stderr without the extrapolation warning. */
export function stripYearWarning(stderr: string): string {
  return stderr.replace(YEAR_WARNING, '');
}

/** A run's result with the extrapolation warning taken out of its stderr. */
export function withoutYearWarning<T extends { readonly stderr: string }>(run: T): T {
  return { ...run, stderr: stripYearWarning(run.stderr) };
}
