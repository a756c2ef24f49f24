import type { DayForecast } from './forecaster.js';

/**
 * The equal-weight average of the members' forecasts of one day, level by level: q_tau = (1/M) sum_m
 * q_tau,m, the quantile average (Vincentization) of Lichtendahl, Grushka-Cockayne and Winkler (2013).
 * Rows stay non-decreasing (a sum of non-decreasing rows), and by the convexity of the pinball loss in q
 * its loss is never above the mean of the members' losses. Paths, when the members have them: per
 * period the members' sorted path values are averaged rank by rank (the same average of their empirical
 * marginals), then laid out in the ranks of the first member's paths, so the whole-day dependence is
 * that member's (the reordering of the Schaake shuffle, Clark et al. 2004).
 *
 * References: K. C. Lichtendahl, Y. Grushka-Cockayne and R. L. Winkler (2013), Is it better to average
 * probabilities or quantiles?, Management Science 59(7), 1594-1611, doi:10.1287/mnsc.1120.1667;
 * M. Clark, S. Gangopadhyay, L. Hay, B. Rajagopalan and R. Wilby (2004), The Schaake shuffle,
 * J. Hydrometeorology 5(1), 243-262.
 */
export function averageForecast(members: readonly DayForecast[]): DayForecast {
  const first = members[0];
  if (first === undefined || members.length < 2) throw new Error('averageForecast: needs two or more members');
  const M = members.length;
  const mean = (value: (f: DayForecast) => number): number => members.reduce((sum, f) => sum + value(f), 0) / M;
  const prices = first.quantiles.prices.map((row, t) => row.map((_, k) => mean((f) => (f.quantiles.prices[t] as readonly number[])[k] as number)));
  return {
    quantiles: { ...first.quantiles, prices },
    point: first.point.map((_, t) => mean((f) => f.point[t] as number)),
    paths: averagePaths(members),
    calibrationDays: Math.max(...members.map((f) => f.calibrationDays)),
    crossedSlots: Math.max(...members.map((f) => f.crossedSlots)),
    notes: [...new Set(members.flatMap((f) => f.notes))],
    chosen: null,
  };
}

/** Per period, the members' path values averaged rank by rank and laid out in the ranks of the first member's paths. */
function averagePaths(members: readonly DayForecast[]): number[][] {
  const template = members[0] as DayForecast;
  const n = template.paths.length;
  if (n === 0) return [];
  const periods = (template.paths[0] as readonly number[]).length;
  const out = Array.from({ length: n }, () => new Array<number>(periods).fill(0));
  const column = new Float64Array(n);
  const averaged = new Float64Array(n);
  const order = Array.from({ length: n }, (_, j) => j);
  for (let t = 0; t < periods; t++) {
    averaged.fill(0);
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
