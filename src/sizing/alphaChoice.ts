import { daysBetween, shiftDay } from '../market/calendar.js';
import type { UnacceptedRule } from '../settle/settleDay.js';
import type { BacktestPolicy } from '../backtest/backtestPolicy.js';
import { runPolicy } from '../backtest/policyRun.js';
import type { BacktestInput } from '../backtest/runBacktest.js';

/** A span of delivery days, YYYY-MM-DD, both ends included. */
export interface DayRange {
  readonly from: string;
  readonly to: string;
}

/** How a sizing sets alpha: one given value, or the best of a grid chosen on earlier days. */
export type AlphaMode = { readonly method: 'fixed'; readonly alpha: number } | { readonly method: 'best'; readonly alphas: readonly number[] };

/** Where `--alpha best` chooses and where it is scored. */
export interface AlphaSplit {
  readonly choose: DayRange;
  readonly score: DayRange;
}

/**
 * Splits [from, to] for `--alpha best` into an earlier part to choose alpha on and a later part to
 * score on. Convention: the first floor(n / 2) calendar days of the n in [from, to] choose, the other
 * ceil(n / 2) score (for two years, the first year chooses and the second scores). The parts never
 * overlap and every chosen-on day comes before every scored day, so no choice is made on a scored day.
 *
 * @example
 * alphaSplit('2026-01-01', '2026-01-05'); // choose 2026-01-01..2026-01-02, score 2026-01-03..2026-01-05
 * @throws RangeError for fewer than 2 days
 */
export function alphaSplit(from: string, to: string): AlphaSplit {
  const n = daysBetween(from, to).length;
  if (n < 2) throw new RangeError(`alphaSplit: [${from}, ${to}] has ${n} day(s); choosing and scoring need 2 or more`);
  const chooseDays = Math.floor(n / 2);
  return { choose: { from, to: shiftDay(from, chooseDays - 1) }, score: { from: shiftDay(from, chooseDays), to } };
}

/** The alpha a policy earned most with on some days, and what each alpha earned there. */
export interface AlphaChoice {
  readonly alpha: number;
  /** Profit over the days of each alpha of the grid, in grid order [currency]. */
  readonly profits: readonly number[];
}

/**
 * Backtests `policy` at each alpha of the grid over [input.from, input.to] (pass the choosing part
 * only) and takes the one with the highest profit; on a tie the first in grid order.
 */
export function chooseAlpha(input: BacktestInput, policy: BacktestPolicy, alphas: readonly number[], unaccepted: UnacceptedRule): AlphaChoice {
  if (alphas.length === 0) throw new RangeError('chooseAlpha: the alpha grid is empty');
  const profits = alphas.map((alpha) => runPolicy(input, policy, { alpha, unaccepted }).profit);
  let best = 0;
  profits.forEach((profit, i) => {
    if (profit > (profits[best] as number)) best = i;
  });
  return { alpha: alphas[best] as number, profits };
}
