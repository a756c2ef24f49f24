import { mean } from '../stats/mean.js';
import { quantileSorted } from '../stats/quantileSorted.js';
import { sampleVariance } from '../stats/sampleVariance.js';

/** Spread and downside of a series of daily profits [currency]. */
export interface DailyProfitStats {
  /** Mean daily profit [currency]; null without days. */
  readonly mean: number | null;
  /** Sample standard deviation (divisor n - 1) [currency]; null for fewer than 2 days. */
  readonly standardDeviation: number | null;
  /**
   * The 5% worst day: the empirical 5% quantile of the daily profits by linear interpolation between
   * order statistics (Hyndman and Fan 1996, definition 7, the default of R and NumPy) [currency]; null
   * without days.
   */
  readonly worstDay5Percent: number | null;
  /**
   * Largest fall of cumulative profit from an earlier peak [currency], >= 0. The cumulative profit
   * starts at 0 before the first day, so a first losing day counts as a drawdown.
   */
  readonly maxDrawdown: number;
}

/** Level of the "worst day" quantile [-]. */
export const WORST_DAY_LEVEL = 0.05;

/**
 * Statistics of daily profits in time order.
 *
 * @example
 * dailyProfitStats([10, -5, 20, -30, 5]);
 * // mean 0, sd sqrt(1450 / 4) = 19.039, 5% quantile -30 + 0.2 x (-5 + 30) = -25, drawdown 25 - (-5) = 30
 *
 * Reference: R. J. Hyndman and Y. Fan (1996), Sample quantiles in statistical packages, The American
 * Statistician 50(4), 361-365, doi:10.1080/00031305.1996.10473566.
 */
export function dailyProfitStats(profits: readonly number[]): DailyProfitStats {
  let cumulative = 0;
  let peak = 0;
  let maxDrawdown = 0;
  for (const p of profits) {
    cumulative += p;
    peak = Math.max(peak, cumulative);
    maxDrawdown = Math.max(maxDrawdown, peak - cumulative);
  }
  if (profits.length === 0) return { mean: null, standardDeviation: null, worstDay5Percent: null, maxDrawdown };
  const sorted = [...profits].sort((a, b) => a - b);
  return {
    mean: mean(profits),
    standardDeviation: profits.length < 2 ? null : Math.sqrt(sampleVariance(profits)),
    worstDay5Percent: quantileSorted(sorted, WORST_DAY_LEVEL),
    maxDrawdown,
  };
}
