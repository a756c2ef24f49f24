import type { BatteryModel } from '../types.js';
import type { BacktestPolicy } from './backtestPolicy.js';
import { edgeTest, profitDifference, type DailyProfits, type EdgeTest } from './edgeTest.js';
import { policyMetrics, type PolicyMetrics } from './policyMetrics.js';
import type { BacktestDay, BacktestResult, PolicyDay } from './runBacktest.js';

/** One calendar month of a backtest, per policy. */
export interface MonthRow {
  /** YYYY-MM. */
  readonly month: string;
  /** Covered days in the month. */
  readonly days: number;
  readonly policies: Readonly<Record<string, { readonly profit: number; readonly meanDailyProfit: number | null; readonly captureRatio: number | null }>>;
}

/** The comparison a backtest leads with: the tested policy against the strongest simple baseline. */
export interface BaselineComparison {
  /** `point` or `price-taking`: the one with the higher profit over the run (point on a tie). */
  readonly policy: BacktestPolicy;
  /** tested minus baseline, Diebold-Mariano with HLN on daily profits. */
  readonly edge: EdgeTest;
  /** Whether the tested policy earned less than the baseline over the run. */
  readonly testedLoses: boolean;
}

export interface BacktestMetrics {
  /** By policy, in the backtest's policy order. */
  readonly policies: Readonly<Record<string, PolicyMetrics>>;
  /** The policy the edges test: the first one run other than perfect foresight; null when there is none. */
  readonly tested: BacktestPolicy | null;
  /** The tested policy against the strongest simple baseline (STRONGEST_BASELINE_RULE); null when neither baseline was run beside it. */
  readonly baseline: BaselineComparison | null;
  /** The tested policy against every other policy run, in policy order (Diebold-Mariano with HLN). */
  readonly edges: readonly EdgeTest[];
  /** quantile against point (Diebold-Mariano with HLN); null unless both were run. Kept for scripts: `baseline` is the headline. */
  readonly edge: EdgeTest | null;
  readonly months: readonly MonthRow[];
}

/** Which baseline a backtest's headline compares with, in words. */
export const STRONGEST_BASELINE_RULE = 'the more profitable of point and price-taking';

/**
 * Metrics of every policy over the covered days, the month table, and the edge of the tested policy
 * (the first one run other than perfect foresight) over every other one, led by the strongest simple
 * baseline: of point and price-taking, the one with the higher profit over the run.
 */
export function backtestMetrics(result: BacktestResult, battery: BatteryModel): BacktestMetrics {
  const policies = metricsByPolicy(result.days, result.policies, battery);
  const tested = result.policies.find((p) => p !== 'perfect-foresight') ?? null;
  const profits = (policy: BacktestPolicy): DailyProfits => {
    const k = result.policies.indexOf(policy);
    return { name: policy, dailyProfit: result.days.map((day) => (day.runs[k] as PolicyDay).totals.profit) };
  };
  const edges = tested === null ? [] : result.policies.filter((p) => p !== tested).map((p) => edgeTest(profits(tested), profits(p)));
  return {
    policies,
    tested,
    baseline: tested === null ? null : strongestBaseline(tested, policies, edges),
    edges,
    edge: quantileOverPoint(result),
    months: monthTable(result, battery),
  };
}

function strongestBaseline(tested: BacktestPolicy, policies: Readonly<Record<string, PolicyMetrics>>, edges: readonly EdgeTest[]): BaselineComparison | null {
  const candidates = (['point', 'price-taking'] as const).filter((p) => p !== tested && policies[p] !== undefined);
  if (candidates.length === 0) return null;
  const best = candidates.reduce((a, b) => ((policies[b] as PolicyMetrics).profit > (policies[a] as PolicyMetrics).profit ? b : a));
  const edge = edges.find((e) => e.reference === best) as EdgeTest;
  return { policy: best, edge, testedLoses: profitDifference((policies[tested] as PolicyMetrics).profit, (policies[best] as PolicyMetrics).profit) < 0 };
}

function metricsByPolicy(days: readonly BacktestDay[], policies: readonly BacktestPolicy[], battery: BatteryModel): Record<string, PolicyMetrics> {
  const runsOf = (k: number): PolicyDay[] => days.map((day) => day.runs[k] as PolicyDay);
  const pf = policies.indexOf('perfect-foresight');
  const pfProfit = pf < 0 ? null : runsOf(pf).reduce((sum, run) => sum + run.totals.profit, 0);
  return Object.fromEntries(policies.map((policy, k) => [policy, policyMetrics(runsOf(k), battery, pfProfit)]));
}

function quantileOverPoint(result: BacktestResult): EdgeTest | null {
  const q = result.policies.indexOf('quantile');
  const p = result.policies.indexOf('point');
  if (q < 0 || p < 0) return null;
  const profits = (k: number): number[] => result.days.map((day) => (day.runs[k] as PolicyDay).totals.profit);
  return edgeTest({ name: 'quantile', dailyProfit: profits(q) }, { name: 'point', dailyProfit: profits(p) });
}

function monthTable(result: BacktestResult, battery: BatteryModel): MonthRow[] {
  const byMonth = new Map<string, BacktestDay[]>();
  for (const day of result.days) {
    const month = day.day.slice(0, 7);
    const list = byMonth.get(month) ?? [];
    list.push(day);
    byMonth.set(month, list);
  }
  return [...byMonth.entries()].map(([month, days]) => {
    const metrics = metricsByPolicy(days, result.policies, battery);
    const policies = Object.fromEntries(
      Object.entries(metrics).map(([name, m]) => [name, { profit: m.profit, meanDailyProfit: m.meanDailyProfit, captureRatio: m.captureRatio }]),
    );
    return { month, days: days.length, policies };
  });
}
