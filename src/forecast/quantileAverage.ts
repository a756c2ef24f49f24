import type { DayForecast } from './forecaster.js';
import { InsufficientHistoryError } from './models/errors.js';

/**
 * The average of the candidates' forecasts of one day, level by level: q_tau = (1/M) sum_m q_tau,m, the
 * quantile average (Vincentization) of Lichtendahl, Grushka-Cockayne and Winkler (2013); rows stay
 * non-decreasing, and by the convexity of the pinball loss in q its loss is never above the mean of the
 * members' losses. Paths, when the members have them: per period the members' sorted path values are
 * averaged rank by rank (the same average of their empirical marginals), then given the ranks of
 * `template`'s paths (the best single candidate by validation), so the whole-day dependence is that
 * candidate's (the Schaake shuffle's reordering, Clark et al. 2004). The first reason a member has
 * none when any member cannot forecast the day.
 *
 * References: K. C. Lichtendahl, Y. Grushka-Cockayne and R. L. Winkler (2013), Is it better to average
 * probabilities or quantiles?, Management Science 59(7), 1594-1611, doi:10.1287/mnsc.1120.1667;
 * M. Clark, S. Gangopadhyay, L. Hay, B. Rajagopalan and R. Wilby (2004), J. Hydrometeorology 5(1), 243-262.
 */
export function averageForecast(made: readonly (DayForecast | InsufficientHistoryError)[], template: DayForecast | null): DayForecast | InsufficientHistoryError {
  const failed = made.find((f) => f instanceof InsufficientHistoryError);
  if (failed !== undefined) return failed;
  const members = made as readonly DayForecast[];
  const first = members[0] as DayForecast;
  const M = members.length;
  const prices = first.quantiles.prices.map((row, t) => row.map((_, k) => members.reduce((sum, f) => sum + ((f.quantiles.prices[t] as readonly number[])[k] as number), 0) / M));
  const point = first.point.map((_, t) => members.reduce((sum, f) => sum + (f.point[t] as number), 0) / M);
  return {
    quantiles: { ...first.quantiles, prices },
    point,
    paths: averagePaths(members, template ?? first),
    calibrationDays: Math.max(...members.map((f) => f.calibrationDays)),
    crossedSlots: Math.max(...members.map((f) => f.crossedSlots)),
    notes: [...new Set(members.flatMap((f) => f.notes))],
    chosen: null,
  };
}

/** Per period, the members' path values averaged rank by rank and laid out in the ranks of `template`'s paths. */
function averagePaths(members: readonly DayForecast[], template: DayForecast): number[][] {
  const n = template.paths.length;
  if (n === 0) return [];
  const periods = (template.paths[0] as readonly number[]).length;
  const out = Array.from({ length: n }, () => new Array<number>(periods).fill(0));
  const column = new Float64Array(n);
  const order = Array.from({ length: n }, (_, j) => j);
  for (let t = 0; t < periods; t++) {
    const averaged = new Float64Array(n);
    for (const f of members) {
      for (let j = 0; j < n; j++) column[j] = (f.paths[j] as readonly number[])[t] as number;
      column.sort();
      for (let j = 0; j < n; j++) averaged[j] = (averaged[j] as number) + (column[j] as number) / members.length;
    }
    // Ties keep path order, so the layout is deterministic.
    order.sort((p, q) => ((template.paths[p] as readonly number[])[t] as number) - ((template.paths[q] as readonly number[])[t] as number) || p - q);
    order.forEach((j, rank) => ((out[j] as number[])[t] = averaged[rank] as number));
  }
  return out;
}
