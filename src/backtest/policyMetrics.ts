import type { BatteryModel } from '../types.js';
import { equivalentFullCycles } from '../battery/equivalentFullCycles.js';
import { addTotals, ZERO_TOTALS, type SettlementTotals } from '../settle/settlementTotals.js';
import { dailyProfitStats } from './dailyProfitStats.js';
import type { PolicyDay } from './runBacktest.js';

/** Days in a year for annualising [d] (the Julian year, common practice). */
export const DAYS_PER_YEAR = 365.25;

/** What one policy earned over a set of days; totals as in SettlementTotals. */
export interface PolicyMetrics extends SettlementTotals {
  /** Days covered n. */
  readonly days: number;
  /** Days the policy had no feasible plan and placed no orders. */
  readonly daysWithoutPlan: number;
  readonly meanDailyProfit: number | null;
  /** profit / (n / 365.25) / dischargeMw [currency/(MW year)]: per MW of discharge power (common practice). */
  readonly profitPerMwYear: number | null;
  /** profit / (n / 365.25) / energyMwh [currency/(MWh year)]: per MWh of nameplate energy. */
  readonly profitPerMwhYear: number | null;
  /** profit / perfect-foresight profit on the same days [-]; null without perfect foresight or when its profit is <= 0. */
  readonly captureRatio: number | null;
  /** Accepted buy orders / buy orders (counted per order) [-]; null without buy orders. */
  readonly buyAcceptanceRate: number | null;
  readonly sellAcceptanceRate: number | null;
  /**
   * Equivalent full cycles over all the days: energy taken out of the store (discharged at the grid /
   * eta_d) / usable energy (socMax - socMin) [-], the count the daily cycle cap bounds (equivalentFullCycles.ts).
   */
  readonly cyclesTotal: number;
  /** cyclesTotal / days [1/day]; null without days. */
  readonly cyclesPerDay: number | null;
  readonly dailyProfitStandardDeviation: number | null;
  readonly worstDay5Percent: number | null;
  readonly maxDrawdown: number;
}

/**
 * Metrics of one policy over its days in time order. `perfectForesightProfit` is the upper bound's
 * profit on the same days, or null when it was not run.
 */
export function policyMetrics(runs: readonly PolicyDay[], battery: BatteryModel, perfectForesightProfit: number | null): PolicyMetrics {
  const totals = runs.reduce((sum, run) => addTotals(sum, run.totals), ZERO_TOTALS);
  const n = runs.length;
  const stats = dailyProfitStats(runs.map((run) => run.totals.profit));
  const years = n / DAYS_PER_YEAR;
  const ratio = (num: number, den: number): number | null => (den > 0 ? num / den : null);
  return {
    days: n,
    daysWithoutPlan: runs.filter((run) => run.planStatus !== 'optimal').length,
    ...totals,
    meanDailyProfit: stats.mean,
    profitPerMwYear: n === 0 ? null : totals.profit / years / battery.dischargeMw,
    profitPerMwhYear: n === 0 ? null : totals.profit / years / battery.energyMwh,
    captureRatio: perfectForesightProfit === null ? null : ratio(totals.profit, perfectForesightProfit),
    buyAcceptanceRate: ratio(totals.buysAccepted, totals.buys),
    sellAcceptanceRate: ratio(totals.sellsAccepted, totals.sells),
    cyclesTotal: equivalentFullCycles(totals.dischargedMwh, battery),
    cyclesPerDay: n === 0 ? null : equivalentFullCycles(totals.dischargedMwh, battery) / n,
    dailyProfitStandardDeviation: stats.standardDeviation,
    worstDay5Percent: stats.worstDay5Percent,
    maxDrawdown: stats.maxDrawdown,
  };
}
