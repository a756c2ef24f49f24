import type { UnacceptedRule } from '../settle/settleDay.js';
import { readsAlpha } from './backtestPolicy.js';
import { edgeTest } from './edgeTest.js';
import { policyMetrics } from './policyMetrics.js';
import { RunMemo, runPolicy, type PolicyRun } from './policyRun.js';
import type { BacktestInput } from './runBacktest.js';
import type { ScenarioPlanning } from './scenarioPlanning.js';

/**
 * Policies a sweep may run: the two whose orders depend on alpha, and the two that plan on whole-day
 * scenarios (curve, auto), which ignore alpha: their row is the same at every alpha of the axis.
 */
export const SWEEP_POLICIES = Object.freeze(['quantile', 'median', 'curve', 'auto'] as const);
export type SweepPolicy = (typeof SWEEP_POLICIES)[number];

/** One setting of `quantbid sweep`. */
export type SweepSetting = {
  /** Central interval [q(alpha), q(1 - alpha)], in (0, 0.5). */
  readonly alpha: number;
  readonly policy: SweepPolicy;
  readonly unaccepted: UnacceptedRule;
};

/**
 * Columns of `sweep.csv` after the axis columns `alpha,policy,unaccepted`, in this order. Sums are over
 * the covered days of [from, to]; cash + received, - paid [currency]; energies at the grid [MWh].
 * - `days`: covered days n;
 * - `profit`, `mean_daily_profit`: the setting's profit, and profit / n;
 * - `capture_ratio`: profit / perfect-foresight profit on the same days (empty when that is <= 0);
 * - `perfect_foresight_profit`, `point_profit`: the references, run under the same `unaccepted` rule;
 * - `edge_vs_point`: mean over days of (the setting's daily profit - the point policy's);
 * - `p_value_vs_point`: one-sided p-value of the Diebold-Mariano test with the Harvey-Leybourne-Newbold
 *   correction (h = 1) of that difference, H1: the setting earns more than the point policy
 *   (edgeTest.ts); empty when there is no test (fewer than 2 days, or every daily difference equal);
 * - `buy_acceptance_rate`, `sell_acceptance_rate`: accepted orders / orders (empty without orders);
 * - `imbalance_mwh`, `imbalance_cash`: energy bought plus sold at the imbalance price, and its cash;
 * - `auction_cash`, `degradation_cost`, `discharged_mwh`;
 * - `cycles`: discharged MWh / usable MWh (socMax - socMin), equivalent full cycles;
 * - `days_without_plan`: days the policy had no feasible plan and placed no orders;
 * - `daily_profit_sd`, `worst_day_5pct`, `max_drawdown`: as in backtest's summary (dailyProfitStats.ts).
 */
export const SWEEP_COLUMNS = Object.freeze([
  'days', 'profit', 'mean_daily_profit', 'capture_ratio', 'perfect_foresight_profit', 'point_profit', 'edge_vs_point', 'p_value_vs_point',
  'buy_acceptance_rate', 'sell_acceptance_rate', 'imbalance_mwh', 'imbalance_cash', 'auction_cash', 'degradation_cost', 'discharged_mwh',
  'cycles', 'days_without_plan', 'daily_profit_sd', 'worst_day_5pct', 'max_drawdown',
] as const);

/** One row of sweep.csv after the axis columns, in SWEEP_COLUMNS order. */
export type SweepRow = Readonly<Record<(typeof SWEEP_COLUMNS)[number], number | null>>;

/** A finished setting of a sweep with its row. */
export interface SweepResult {
  readonly setting: SweepSetting;
  readonly row: SweepRow;
}

/** Alpha handed to runs of policies that ignore it (point, perfect foresight). */
const UNUSED_ALPHA = 0.1;

/**
 * The row of one sweep setting. The setting's policy is run on its own; perfect foresight and the point
 * policy do not depend on alpha or on the swept policy, so they are run once per `unaccepted` rule and
 * kept in `memo` (the task's context), which changes no value (runPolicy.ts: policies do not interact);
 * so are curve and auto, which ignore alpha. `scenarioPlanning` is needed by curve and auto alone.
 */
export function sweepSettingRow(input: BacktestInput, setting: SweepSetting, memo: RunMemo<PolicyRun>, scenarioPlanning: ScenarioPlanning | null = null): SweepRow {
  const alphaFree = (policy: 'perfect-foresight' | 'point' | 'curve' | 'auto'): PolicyRun =>
    memo.get(`${policy}|${setting.unaccepted}`, () => runPolicy(input, policy, { alpha: UNUSED_ALPHA, unaccepted: setting.unaccepted, scenarioPlanning }));
  const perfect = alphaFree('perfect-foresight');
  const point = alphaFree('point');
  const policy = setting.policy;
  const run = readsAlpha(policy) ? runPolicy(input, policy, setting) : alphaFree(policy);
  const m = policyMetrics(run.runs, input.battery, perfect.profit);
  const edge = edgeTest({ name: policy, dailyProfit: run.dailyProfit }, { name: 'point', dailyProfit: point.dailyProfit });
  const row: Record<(typeof SWEEP_COLUMNS)[number], number | null> = {
    days: m.days,
    profit: m.profit,
    mean_daily_profit: m.meanDailyProfit,
    capture_ratio: m.captureRatio,
    perfect_foresight_profit: perfect.profit,
    point_profit: point.profit,
    edge_vs_point: edge.meanDifference,
    p_value_vs_point: edge.status === 'ok' ? edge.pValueOneSided : null,
    buy_acceptance_rate: m.buyAcceptanceRate,
    sell_acceptance_rate: m.sellAcceptanceRate,
    imbalance_mwh: m.boughtImbalanceMwh + m.soldImbalanceMwh,
    imbalance_cash: m.imbalanceCash,
    auction_cash: m.auctionCash,
    degradation_cost: m.degradationCost,
    discharged_mwh: m.dischargedMwh,
    cycles: m.equivalentFullCycles,
    days_without_plan: m.daysWithoutPlan,
    daily_profit_sd: m.dailyProfitStandardDeviation,
    worst_day_5pct: m.worstDay5Percent,
    max_drawdown: m.maxDrawdown,
  };
  return Object.fromEntries(SWEEP_COLUMNS.map((column) => [column, row[column]])) as SweepRow;
}
