import type { UnacceptedRule } from '../settle/settleDay.js';
import { smallPValueText } from '../stats/smallPValue.js';
import { readsAlpha, SWEEP_REFERENCE_POLICIES, type BacktestPolicy, type SweepPolicy, type SweepReferencePolicy } from './backtestPolicy.js';
import { edgeTest, type EdgeTest } from './edgeTest.js';
import { policyMetrics } from './policyMetrics.js';
import { RunMemo, runPolicy, type PolicyRun } from './policyRun.js';
import type { BacktestInput } from './runBacktest.js';
import type { ScenarioPlanning } from './scenarioPlanning.js';

export { SWEEP_POLICIES, SWEEP_REFERENCE_POLICIES, type SweepPolicy, type SweepReferencePolicy } from './backtestPolicy.js';

/** One setting of `quantbid sweep`. */
export type SweepSetting = {
  /** Tail level: buys limited at q(1 - alpha), sells at q(alpha); in (0, 0.5). */
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
 *   below 1e-4 written in scientific notation (`3.2e-7`, stats/smallPValue.ts), never `0`;
 * - `buy_acceptance_rate`, `sell_acceptance_rate`: accepted orders / orders (empty without orders);
 * - `imbalance_mwh`, `imbalance_cash`: energy bought plus sold at the imbalance price, and its gross cash
 *   (the whole price, + received; its cost against the clearing price is in backtest's days.csv);
 * - `auction_cash`, `degradation_cost`, `discharged_mwh`;
 * - `cycles_total`: equivalent full cycles over the days, MWh taken out of the store (discharged / eta_d) /
 *   usable MWh (socMax - socMin), the count the daily cycle cap bounds; `cycles_per_day`: cycles_total / days;
 * - `days_without_plan`: days the policy had no feasible plan and placed no orders;
 * - `daily_profit_sd`, `worst_day_5pct`, `max_drawdown`: as in backtest's summary (dailyProfitStats.ts);
 * - `price_taking_profit`, `edge_vs_price_taking`, `p_value_vs_price_taking`: as for point, against the
 *   price-taking policy (the point schedule bid at the cap and floor), run under the same rule.
 */
export const SWEEP_COLUMNS = Object.freeze([
  'days', 'profit', 'mean_daily_profit', 'capture_ratio', 'perfect_foresight_profit', 'point_profit', 'edge_vs_point', 'p_value_vs_point',
  'buy_acceptance_rate', 'sell_acceptance_rate', 'imbalance_mwh', 'imbalance_cash', 'auction_cash', 'degradation_cost', 'discharged_mwh',
  'cycles_total', 'cycles_per_day', 'days_without_plan', 'daily_profit_sd', 'worst_day_5pct', 'max_drawdown',
  'price_taking_profit', 'edge_vs_price_taking', 'p_value_vs_price_taking',
] as const);

/** One row of sweep.csv after the axis columns, in SWEEP_COLUMNS order; a p-value below 1e-4 is text (`3.2e-7`). */
export type SweepRow = Readonly<Record<(typeof SWEEP_COLUMNS)[number], number | string | null>>;

/** A reference row of sweep.csv: its policy and rule (alpha empty) and the row. */
export interface SweepReferenceRow {
  readonly setting: { readonly alpha: null; readonly policy: SweepReferencePolicy; readonly unaccepted: UnacceptedRule };
  readonly row: SweepRow;
}

/** A finished setting of a sweep with its row. */
export interface SweepResult {
  readonly setting: SweepSetting;
  readonly row: SweepRow;
}

/** Alpha handed to runs of policies that ignore it (point, perfect foresight). */
const UNUSED_ALPHA = 0.1;

/**
 * The row of one sweep setting. The setting's policy is run on its own; the references (perfect
 * foresight, point, price-taking) do not depend on alpha or on the swept policy, so they are run once
 * per `unaccepted` rule and kept in `memo` (the task's context), which changes no value
 * (runPolicy.ts: policies do not interact); so are curve and auto, which ignore alpha.
 * `scenarioPlanning` is needed by curve and auto alone.
 */
export function sweepSettingRow(input: BacktestInput, setting: SweepSetting, memo: RunMemo<PolicyRun>, scenarioPlanning: ScenarioPlanning | null = null): SweepRow {
  const { policy, unaccepted } = setting;
  const run = readsAlpha(policy)
    ? runPolicy(input, policy, setting)
    : memo.get(`${policy}|${unaccepted}`, () => runPolicy(input, policy, { alpha: UNUSED_ALPHA, unaccepted, scenarioPlanning }));
  return rowOf(input, run, unaccepted, memo);
}

/** A reference setting of a sweep: a reference policy under a rule, alpha empty. */
export type SweepReferenceSetting = SweepReferenceRow['setting'];

/**
 * The reference settings of a sweep, in the order of their rows: the rules, and within each
 * SWEEP_REFERENCE_POLICIES.
 */
export function sweepReferenceSettings(rules: readonly UnacceptedRule[]): SweepReferenceSetting[] {
  return rules.flatMap((unaccepted) => SWEEP_REFERENCE_POLICIES.map((policy) => ({ alpha: null, policy, unaccepted })));
}

/**
 * The row of a reference policy under a rule, with the same columns as a setting's; its run, and the
 * other references of the rule, are kept in `memo` for the settings of that rule.
 */
export function sweepReferenceRow(input: BacktestInput, setting: SweepReferenceSetting, memo: RunMemo<PolicyRun>): SweepRow {
  return rowOf(input, reference(input, setting.policy, setting.unaccepted, memo), setting.unaccepted, memo);
}

function reference(input: BacktestInput, policy: BacktestPolicy, unaccepted: UnacceptedRule, memo: RunMemo<PolicyRun>): PolicyRun {
  return memo.get(`${policy}|${unaccepted}`, () => runPolicy(input, policy, { alpha: UNUSED_ALPHA, unaccepted }));
}

/** A p-value cell: the number from 1e-4 up, below it the text in scientific notation; empty without a test. */
function pValueCell(edge: EdgeTest): number | string | null {
  if (edge.status !== 'ok') return null;
  return smallPValueText(edge.pValueOneSided) ?? edge.pValueOneSided;
}

function rowOf(input: BacktestInput, run: PolicyRun, unaccepted: UnacceptedRule, memo: RunMemo<PolicyRun>): SweepRow {
  const perfect = reference(input, 'perfect-foresight', unaccepted, memo);
  const point = reference(input, 'point', unaccepted, memo);
  const priceTaking = reference(input, 'price-taking', unaccepted, memo);
  const m = policyMetrics(run.runs, input.battery, perfect.profit);
  const edge = edgeTest({ name: run.policy, dailyProfit: run.dailyProfit }, { name: 'point', dailyProfit: point.dailyProfit });
  const edgeTaking = edgeTest({ name: run.policy, dailyProfit: run.dailyProfit }, { name: 'price-taking', dailyProfit: priceTaking.dailyProfit });
  const row: Record<(typeof SWEEP_COLUMNS)[number], number | string | null> = {
    days: m.days,
    profit: m.profit,
    mean_daily_profit: m.meanDailyProfit,
    capture_ratio: m.captureRatio,
    perfect_foresight_profit: perfect.profit,
    point_profit: point.profit,
    edge_vs_point: edge.meanDifference,
    p_value_vs_point: pValueCell(edge),
    buy_acceptance_rate: m.buyAcceptanceRate,
    sell_acceptance_rate: m.sellAcceptanceRate,
    imbalance_mwh: m.boughtImbalanceMwh + m.soldImbalanceMwh,
    imbalance_cash: m.imbalanceCash,
    auction_cash: m.auctionCash,
    degradation_cost: m.degradationCost,
    discharged_mwh: m.dischargedMwh,
    cycles_total: m.cyclesTotal,
    cycles_per_day: m.cyclesPerDay,
    days_without_plan: m.daysWithoutPlan,
    daily_profit_sd: m.dailyProfitStandardDeviation,
    worst_day_5pct: m.worstDay5Percent,
    max_drawdown: m.maxDrawdown,
    price_taking_profit: priceTaking.profit,
    edge_vs_price_taking: edgeTaking.meanDifference,
    p_value_vs_price_taking: pValueCell(edgeTaking),
  };
  return Object.fromEntries(SWEEP_COLUMNS.map((column) => [column, row[column]])) as SweepRow;
}
