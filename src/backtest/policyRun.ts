import type { UnacceptedRule } from '../settle/settleDay.js';
import type { BacktestPolicy } from './backtestPolicy.js';
import { runBacktest, type BacktestInput, type PolicyDay } from './runBacktest.js';
import type { ScenarioPlanning } from './scenarioPlanning.js';

/** One policy replayed alone over a backtest's days, without a ledger. */
export interface PolicyRun {
  readonly policy: BacktestPolicy;
  /** Covered delivery days, ascending (YYYY-MM-DD). */
  readonly days: readonly string[];
  /** The policy's result on each covered day, in day order. */
  readonly runs: readonly PolicyDay[];
  /** Profit on each covered day [currency]. */
  readonly dailyProfit: readonly number[];
  /** Sum of the daily profits [currency]. */
  readonly profit: number;
}

/** What a single-policy run needs besides the inputs. */
export interface PolicyRunOptions {
  /** Tail level of the quantile and median policies, in (0, 0.5); ignored by the others. */
  readonly alpha: number;
  readonly unaccepted: UnacceptedRule;
  /** Paths, solver and settings of the `curve` and `auto` policies; needed by them alone. */
  readonly scenarioPlanning?: ScenarioPlanning | null;
}

/**
 * Runs one policy over [input.from, input.to] with runBacktest (keepLedger false). Policies do not
 * interact (each carries its own state of charge), so a policy run alone earns on each day exactly
 * what it earns beside the others, and runs of different policies over the same input cover the same
 * days: their daily profits pair up day by day.
 */
export function runPolicy(input: BacktestInput, policy: BacktestPolicy, options: PolicyRunOptions): PolicyRun {
  const result = runBacktest(input, { policies: [policy], alpha: options.alpha, unaccepted: options.unaccepted, keepLedger: false, scenarioPlanning: options.scenarioPlanning ?? null });
  const runs = result.days.map((day) => day.runs[0] as PolicyDay);
  const dailyProfit = runs.map((run) => run.totals.profit);
  return {
    policy,
    days: result.days.map((day) => day.day),
    runs,
    dailyProfit,
    profit: dailyProfit.reduce((sum, p) => sum + p, 0),
  };
}

/**
 * A small first-in, first-out memory of computed values for a task's context: runs that do not depend
 * on the setting (perfect foresight, the point policy) are made once per worker and reused. Values
 * must be pure functions of their key, so a hit gives what a recomputation would.
 */
export class RunMemo<T> {
  private readonly values = new Map<string, T>();

  /** @param capacity entries kept [-], >= 1; the oldest goes first. */
  constructor(private readonly capacity = 16) {}

  get(key: string, compute: () => T): T {
    const known = this.values.get(key);
    if (known !== undefined) return known;
    const value = compute();
    if (this.values.size >= this.capacity) this.values.delete(this.values.keys().next().value as string);
    this.values.set(key, value);
    return value;
  }
}
