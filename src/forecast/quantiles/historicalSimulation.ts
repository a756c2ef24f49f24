import type { PoolOrder } from './poolOrder.js';
import { sortedQuantile } from './sortedQuantile.js';

/**
 * Quantiles by historical simulation: the point forecast plus the empirical quantiles of the recent
 * out-of-sample errors of the same clock slot,
 *   q_tau(s) = P_hat(s) + Q_tau({e(d', s) : d' in the calibration days}),   e = P - P_hat,
 * with Q_tau the sample quantile of Hyndman and Fan's definition 7 (the default of R and NumPy):
 * with order statistics x_(0) <= ... <= x_(n-1), h = (n - 1) tau, j = floor(h),
 *   Q_tau = x_(j) + (h - j)(x_(j+1) - x_(j)).
 * Non-decreasing in tau by construction.
 *
 * References: R. Weron (2014), Electricity price forecasting: a review of the state-of-the-art with a
 * look into the future, Int. J. Forecast. 30(4), 1030-1081, doi:10.1016/j.ijforecast.2014.08.008
 * (historical simulation for interval forecasts); R. J. Hyndman and Y. Fan (1996), Sample quantiles
 * in statistical packages, Am. Stat. 50(4), 361-365, doi:10.1080/00031305.1996.10473566.
 *
 * @param point point forecast per slot [currency/MWh]
 * @param errors errors per calibration day and slot, errors[d][s] [currency/MWh], at least one day
 * @param levels strictly increasing levels in (0, 1)
 * @param kept the pools' order from the last call and the day ids of `errors` (ascending), to sort the
 *   pools from that order (poolOrder.ts; the same quantiles, faster for a window that moved a day)
 * @returns prices[s][k] at levels[k]
 */
export function historicalSimulation(
  point: ArrayLike<number>,
  errors: readonly ArrayLike<number>[],
  levels: readonly number[],
  kept?: { readonly order: PoolOrder; readonly dayIds: ArrayLike<number> },
): number[][] {
  const n = errors.length;
  const sorted = new Float64Array(n);
  kept?.order.begin(kept.dayIds);
  return Array.from({ length: point.length }, (_, s) => {
    if (kept === undefined) {
      for (let d = 0; d < n; d++) sorted[d] = (errors[d] as ArrayLike<number>)[s] as number;
      sorted.sort();
    } else {
      kept.order.sortSlot(errors, s, sorted);
    }
    return levels.map((tau) => (point[s] as number) + sortedQuantile(sorted, tau));
  });
}
