import type { BatteryModel } from '../types.js';
import type { BacktestPolicy } from './backtestPolicy.js';
import { edgeTest, type EdgeTest } from './edgeTest.js';
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

export interface BacktestMetrics {
  /** By policy, in the backtest's policy order. */
  readonly policies: Readonly<Record<string, PolicyMetrics>>;
  /** quantile against point (Diebold-Mariano with HLN); null unless both were run. */
  readonly edge: EdgeTest | null;
  readonly months: readonly MonthRow[];
}

/** Metrics of every policy over the covered days, the month table and the edge of quantile over point. */
export function backtestMetrics(result: BacktestResult, battery: BatteryModel): BacktestMetrics {
  return {
    policies: metricsByPolicy(result.days, result.policies, battery),
    edge: quantileOverPoint(result),
    months: monthTable(result, battery),
  };
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
