import { dieboldMariano, type DieboldMarianoResult } from '../../stats/dieboldMariano.js';
import { mean } from '../../stats/mean.js';
import { ForecastInputError } from '../models/errors.js';
import { crpsFromQuantiles } from './crps.js';
import type { ScoredDay } from './scoreForecasts.js';

/**
 * The loss of one scored day: the mean over its periods of the mean pinball loss over the levels,
 *   L(d) = (1/T) sum_t (1/K) sum_k rho_{tau_k}(y_t - q_t(tau_k)),
 * i.e. the day's `crps` (factor 2 not included, see crps.ts) [currency/MWh].
 *
 * @example
 * // one period, levels 0.1 and 0.9 at 8 and 12, realised 13: (0.1 * 5 + 0.9 * 1) / 2 = 0.7
 */
export function dailyLoss(scored: ScoredDay): number {
  const { forecast, realised } = scored;
  let sum = 0;
  realised.forEach((y, t) => (sum += crpsFromQuantiles(y, forecast.prices[t] as number[], forecast.levels)));
  return sum / realised.length;
}

/** Two forecasts of the same days compared by their daily losses. */
export interface ForecastComparison {
  /** Days compared [-]. */
  readonly days: number;
  /**
   * The crps of the first and of the second forecast over the compared days, each period counting
   * once (the definition of `crps` everywhere): the mean of the weighted daily losses [currency/MWh].
   */
  readonly lossFirst: number;
  readonly lossSecond: number;
  /** Diebold-Mariano test with the HLN correction on d = L_first - L_second, horizon 1. */
  readonly test: DieboldMarianoResult;
}

/**
 * Diebold-Mariano comparison of two quantile forecasts of the same delivery days on their daily
 * losses, with the Harvey-Leybourne-Newbold correction and horizon h = 1: each day's forecast is made
 * the day before, so the loss differences of a correctly specified forecast form no moving average.
 * d_t = L_first(t) - L_second(t): d > 0 on average means the second forecast is better; the one-sided
 * p-value of the result is for that alternative.
 *
 * One crps per forecast: `crps` is the mean over every period (and level), so a 100-period day weighs
 * 100/96 of a 96-period one. The daily loss is therefore the day's crps summed over its periods and
 * divided by the mean number of periods per compared day, L(t) = T_t dailyLoss(t) / Tbar: its mean
 * over the days is exactly the crps of those days (lossFirst, lossSecond), and on days of equal
 * length it is dailyLoss itself.
 *
 * References: F. X. Diebold and R. S. Mariano (1995), J. Business & Economic Statistics 13(3),
 * 253-263; D. Harvey, S. Leybourne and P. Newbold (1997), Int. J. Forecasting 13(2), 281-291 (see
 * src/stats/dieboldMariano.ts).
 *
 * @param first, second the same days in the same order, with the same realised prices and levels
 * @throws ForecastInputError when the days or levels differ, or fewer than two days are given
 */
export function compareForecasts(first: readonly ScoredDay[], second: readonly ScoredDay[]): ForecastComparison {
  if (first.length !== second.length || first.length < 2) {
    throw new ForecastInputError('second', `${first.length} and ${second.length} days`, 'compare two forecasts of the same two or more days');
  }
  first.forEach((a, d) => {
    const b = second[d] as ScoredDay;
    if (a.forecast.day !== b.forecast.day) {
      throw new ForecastInputError(`second[${d}]`, `day ${b.forecast.day} is not ${a.forecast.day}`, 'give the same days in the same order');
    }
    if (a.forecast.levels.length !== b.forecast.levels.length || a.forecast.levels.some((tau, k) => tau !== b.forecast.levels[k])) {
      throw new ForecastInputError(`second[${d}].forecast.levels`, 'the levels differ from those of the first forecast', 'compare forecasts made at the same levels');
    }
  });
  const periodsPerDay = first.reduce((sum, day) => sum + day.realised.length, 0) / first.length;
  const weighted = (day: ScoredDay): number => (dailyLoss(day) * day.realised.length) / periodsPerDay;
  const lossesFirst = first.map(weighted);
  const lossesSecond = second.map(weighted);
  const differences = lossesFirst.map((loss, d) => loss - (lossesSecond[d] as number));
  const lossFirst = mean(lossesFirst);
  const lossSecond = mean(lossesSecond);
  return { days: first.length, lossFirst, lossSecond, test: dieboldMariano(differences, 1) };
}
