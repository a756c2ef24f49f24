import type { GriddedDay, TargetDay } from './historyView.js';

/**
 * Which exogenous columns make up the residual load, load minus renewables: the driver of day-ahead
 * prices along the merit order (the residual load sets which plant is marginal; Sensfuss, Ragwitz and
 * Genoese 2008 measure the price effect of renewables along it).
 *
 * Rule, by column name (case-insensitive): a name holding `wind`, `solar`, `pv` or `renew` is a
 * renewables column (subtracted); a name holding `load`, `demand` or `consumption` is a load column
 * (added). Without a load column the first column that is not renewables stands for load. Columns of
 * neither kind are not part of the residual load. Null when no column is load or renewables.
 *
 * Reference: F. Sensfuss, M. Ragwitz and M. Genoese (2008), The merit-order effect: a detailed analysis
 * of the price effect of renewable electricity generation on spot market prices in Germany, Energy
 * Policy 36(8), 3086-3094, doi:10.1016/j.enpol.2008.03.035.
 *
 * @example
 * residualLoadColumns(['load_forecast_mw', 'renewables_forecast_mw']); // { added: [0], subtracted: [1] }
 */
export function residualLoadColumns(names: readonly string[]): ResidualLoadColumns | null {
  const renewables = /wind|solar|pv|renew/i;
  const load = /load|demand|consumption/i;
  const subtracted = names.flatMap((n, j) => (renewables.test(n) ? [j] : []));
  let added = names.flatMap((n, j) => (!renewables.test(n) && load.test(n) ? [j] : []));
  if (added.length === 0) {
    const first = names.findIndex((n) => !renewables.test(n));
    added = first >= 0 ? [first] : [];
  }
  if (added.length === 0 && subtracted.length === 0) return null;
  return { added, subtracted };
}

/** Indices into the exogenous columns: residual load = sum of `added` - sum of `subtracted`. */
export interface ResidualLoadColumns {
  readonly added: readonly number[];
  readonly subtracted: readonly number[];
}

/** The residual load of a day per slot [the columns' unit, e.g. MW]. */
export function residualLoad(day: GriddedDay | TargetDay, columns: ResidualLoadColumns): Float64Array {
  const first = day.exogenous[0];
  const out = new Float64Array(first?.length ?? 0);
  for (const j of columns.added) {
    const column = day.exogenous[j] as Float64Array;
    for (let s = 0; s < out.length; s++) out[s] = (out[s] as number) + (column[s] as number);
  }
  for (const j of columns.subtracted) {
    const column = day.exogenous[j] as Float64Array;
    for (let s = 0; s < out.length; s++) out[s] = (out[s] as number) - (column[s] as number);
  }
  return out;
}
