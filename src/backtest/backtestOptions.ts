import type { SolveDayOptions } from '../plan/solveDay.js';
import type { UnacceptedRule } from '../settle/unacceptedRule.js';
import { DEFAULT_BACKTEST_POLICIES, type BacktestPolicy } from './backtestPolicy.js';
import type { BacktestDay } from './runBacktest.js';
import type { ScenarioPlanning } from './scenarioPlanning.js';

/** Options of runBacktest, merged over BACKTEST_DEFAULTS. */
export interface BacktestOptions {
  /** Tail level of the quantile and median policies (buys limited at q(1 - alpha), sells at q(alpha)), in (0, 0.5). Default 0.1. */
  readonly alpha: number;
  /** What the battery does about unaccepted orders. Default `follow-plan`. */
  readonly unaccepted: UnacceptedRule;
  /** Policies to run side by side, in this order. Default the five that need no scenarios (DEFAULT_BACKTEST_POLICIES). */
  readonly policies: readonly BacktestPolicy[];
  /** Keep every period's orders and settlement (for ledger.csv); a sweep turns it off. Default true. */
  readonly keepLedger: boolean;
  /**
   * Passed to every solveDay call, e.g. another LP solver. This is where a faster exact day solver
   * plugs in once solveDay (or planDay) accepts it; the backtest itself does not care which solves.
   */
  readonly solveOptions: Partial<SolveDayOptions>;
  /** Called after each day of [from, to], covered or skipped (progress display). Default none. */
  readonly onDay: ((progress: { readonly day: string; readonly done: number; readonly total: number }) => void) | null;
  /**
   * Called with each covered day, its ledger included, as soon as it is settled: a long backtest can
   * write ledger.csv day by day and, with keepLedger false, keep no ledger in memory (ten years of
   * quarter-hours and five policies are 1.75 million settled periods). Default none.
   */
  readonly onLedgerDay: ((day: BacktestDay) => void) | null;
  /** Paths, solver and settings of the `curve` and `auto` policies; null when neither runs. Default null. */
  readonly scenarioPlanning: ScenarioPlanning | null;
}

export const BACKTEST_DEFAULTS: BacktestOptions = Object.freeze({
  alpha: 0.1,
  unaccepted: 'follow-plan',
  policies: DEFAULT_BACKTEST_POLICIES,
  keepLedger: true,
  solveOptions: Object.freeze({}),
  onDay: null,
  onLedgerDay: null,
  scenarioPlanning: null,
});
