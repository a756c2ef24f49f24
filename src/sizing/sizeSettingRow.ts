import { batteryModel } from '../battery/batteryModel.js';
import type { BatterySpec, MarketSpec, PriceHistory } from '../types.js';
import type { UnacceptedRule } from '../settle/settleDay.js';
import { readsAlpha } from '../backtest/backtestPolicy.js';
import { policyMetrics } from '../backtest/policyMetrics.js';
import { RunMemo, runPolicy, type PolicyRun } from '../backtest/policyRun.js';
import type { BacktestInput, ForecastDays } from '../backtest/runBacktest.js';
import type { ScenarioPlanning } from '../backtest/scenarioPlanning.js';
import { alphaSplit, chooseAlpha, type AlphaMode } from './alphaChoice.js';
import { scaledBatterySpec, type BatterySize } from './scaledBattery.js';
import { sizeEconomics, type SizeCosts } from './sizeEconomics.js';
import type { SizePolicy } from './sizePolicy.js';

export { SIZE_POLICIES, type SizePolicy } from './sizePolicy.js';

/** Everything a sizing's rows depend on besides the size and the policy. */
export interface SizeStudy {
  readonly market: MarketSpec;
  /** The scenario's battery, scaled for each size (scaledBattery.ts). */
  readonly batterySpec: BatterySpec;
  readonly history: PriceHistory;
  readonly forecast: ForecastDays;
  /** First and last delivery day, YYYY-MM-DD, both included. */
  readonly from: string;
  readonly to: string;
  /** A given alpha, or `best`: chosen per size and policy on the first half, scored on the second. */
  readonly alpha: AlphaMode;
  readonly unaccepted: UnacceptedRule;
  readonly costs: SizeCosts;
  /** Paths, solver and settings of the curve and auto policies (the battery is each size's); null when neither runs. */
  readonly scenarioPlanning?: ScenarioPlanning | null;
}

/** One setting of `quantbid size`: a size (efficiency undefined: the spec's) and a policy. */
export interface SizeSetting extends BatterySize {
  readonly policy: SizePolicy;
}

/**
 * A setting of the sizing grid as size.csv names its axis columns: energy [MWh], power [MW],
 * round-trip efficiency (the spec's when no efficiencies are given) and policy.
 */
export type SizeGridSetting = {
  readonly energy_mwh: number;
  readonly power_mw: number;
  readonly round_trip_efficiency: number;
  readonly policy: SizePolicy;
};

/**
 * Columns of `size.csv` after the axis columns `energy_mwh,power_mw,round_trip_efficiency,policy`, in
 * this order; the first five are a contract. Money in the market's currency; "per year" annualised by
 * the covered days (sizeEconomics.ts).
 * - `alpha`: the alpha used (with `--alpha best` the one chosen for this size and policy); empty for
 *   point, price-taking, curve, auto and perfect-foresight, which do not use one;
 * - `profit`: profit over the scored days (all of [from, to], or its second half with `--alpha best`);
 * - `profit_per_year`, `npv`, `irr` (`none` when NPV has no root, e.g. flows without a sign change);
 * - `days`: days scored; `capture_ratio`: profit / perfect-foresight profit on those days;
 * - `profit_per_mwh`, `profit_per_mw`: profit over the scored days per MWh of energy and per MW of power;
 * - `revenue_per_mwh_year`, `revenue_per_mw_year`: trading cash (auction + imbalance, before the wear
 *   cost) per year, per MWh and per MW;
 * - `spread_per_mwh_discharged`: trading cash / MWh discharged, the spread captured per MWh sold;
 * - `cycles_per_year` (equivalent full cycles: MWh taken out of the store / usable window, per year),
 *   `throughput_mwh_per_year` (MWh discharged at the grid per year);
 * - `capex`, `annual_fixed_om`, `replacements` (of the cells over the life);
 * - `simple_payback_years`, `discounted_payback_years` (`never` when not within the life);
 * - `buy_acceptance_rate`, `sell_acceptance_rate`, `days_without_plan`;
 * - `residual_value`: the last replacement set's value at the end of life, credited in the last year.
 */
export const SIZE_COLUMNS = Object.freeze([
  'alpha', 'profit', 'profit_per_year', 'npv', 'irr',
  'days', 'capture_ratio', 'profit_per_mwh', 'profit_per_mw', 'revenue_per_mwh_year', 'revenue_per_mw_year', 'spread_per_mwh_discharged',
  'cycles_per_year', 'throughput_mwh_per_year', 'capex', 'annual_fixed_om', 'replacements', 'simple_payback_years', 'discounted_payback_years',
  'buy_acceptance_rate', 'sell_acceptance_rate', 'days_without_plan', 'residual_value',
] as const);

/** One row of size.csv after the axis columns, in SIZE_COLUMNS order. */
export type SizeRow = Readonly<Record<(typeof SIZE_COLUMNS)[number], number | string | null>>;

/** Alpha handed to runs of policies that ignore it. */
const UNUSED_ALPHA = 0.1;

/**
 * The row of one size and policy. The battery is the scenario's scaled to the size; the days scored
 * are [from, to] with a given alpha, else the later part of alphaSplit, after the alpha was chosen
 * on the earlier part (chooseAlpha). The perfect-foresight run of a size, needed by every row of that
 * size for its capture ratio, is kept in `memo` (a pure function of the size, so a hit changes nothing).
 */
export function sizeSettingRow(study: SizeStudy, setting: SizeSetting, memo: RunMemo<PolicyRun>): SizeRow {
  const battery = batteryModel(scaledBatterySpec(study.batterySpec, setting));
  const base = { market: study.market, battery, history: study.history, forecast: study.forecast };
  const mode = study.alpha;
  const split = mode.method === 'best' ? alphaSplit(study.from, study.to) : null;
  const scored: BacktestInput = { ...base, ...(split?.score ?? { from: study.from, to: study.to }) };
  const sizeKey = `${setting.energyMwh}|${setting.powerMw}|${setting.roundTripEfficiency ?? 'spec'}`;
  const perfect = memo.get(sizeKey, () => runPolicy(scored, 'perfect-foresight', { alpha: UNUSED_ALPHA, unaccepted: study.unaccepted }));

  let alpha: number | null = null;
  let run = perfect;
  if (setting.policy !== 'perfect-foresight') {
    if (readsAlpha(setting.policy)) {
      alpha = mode.method === 'fixed' ? mode.alpha : chooseAlpha({ ...base, ...alphaSplit(study.from, study.to).choose }, setting.policy, mode.alphas, study.unaccepted).alpha;
    }
    run = runPolicy(scored, setting.policy, { alpha: alpha ?? UNUSED_ALPHA, unaccepted: study.unaccepted, scenarioPlanning: study.scenarioPlanning ?? null });
  }
  const m = policyMetrics(run.runs, battery, perfect.profit);
  const tradingCash = m.auctionCash + m.imbalanceCash;
  const e = sizeEconomics(setting, { days: m.days, profit: m.profit, tradingCash, dischargedMwh: m.dischargedMwh, equivalentFullCycles: m.cyclesTotal }, study.costs);
  const row: Record<(typeof SIZE_COLUMNS)[number], number | string | null> = {
    alpha,
    profit: m.profit,
    profit_per_year: e.profitPerYear,
    npv: e.npv,
    irr: e.irr ?? 'none',
    days: m.days,
    capture_ratio: m.captureRatio,
    profit_per_mwh: m.profit / setting.energyMwh,
    profit_per_mw: m.profit / setting.powerMw,
    revenue_per_mwh_year: e.revenuePerYear / setting.energyMwh,
    revenue_per_mw_year: e.revenuePerYear / setting.powerMw,
    spread_per_mwh_discharged: e.spreadPerMwhDischarged,
    cycles_per_year: e.cyclesPerYear,
    throughput_mwh_per_year: e.throughputMwhPerYear,
    capex: e.capex,
    annual_fixed_om: e.annualFixedOm,
    replacements: e.replacements,
    simple_payback_years: e.simplePaybackYears ?? 'never',
    discounted_payback_years: e.discountedPaybackYears ?? 'never',
    buy_acceptance_rate: m.buyAcceptanceRate,
    sell_acceptance_rate: m.sellAcceptanceRate,
    days_without_plan: m.daysWithoutPlan,
    residual_value: e.residualValue,
  };
  return Object.fromEntries(SIZE_COLUMNS.map((column) => [column, row[column]])) as SizeRow;
}
