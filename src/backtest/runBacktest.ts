import type { BatteryModel, DeliveryPeriod, HistoryDay, MarketSpec, PriceHistory, QuantileDay } from '../types.js';
import { daysBetween } from '../market/calendar.js';
import { chooseImbalanceSource, dayImbalancePrices, NoImbalancePriceError, type ImbalancePrices, type ImbalanceSource } from '../settle/imbalancePrices.js';
import { settleDay, type SettledPeriod, type UnacceptedRule } from '../settle/settleDay.js';
import type { SettlementTotals } from '../settle/settlementTotals.js';
import type { BacktestPolicy } from './backtestPolicy.js';
import { BACKTEST_DEFAULTS, type BacktestOptions } from './backtestOptions.js';
import type { DayBid } from './dayBid.js';
import { planPolicyDay, type PlanFailure, type ScenarioReport } from './planPolicyDay.js';
import type { DayScenarios } from './scenarioPlanning.js';
import { DaySolveMemo } from '../plan/daySolveMemo.js';

export { BACKTEST_DEFAULTS, type BacktestOptions } from './backtestOptions.js';

/** Quantile forecasts by day, and the days the forecast file left out (a QuantileForecastFile fits). */
export interface ForecastDays {
  readonly days: ReadonlyMap<string, QuantileDay>;
  readonly incompleteDays: readonly { readonly day: string; readonly reason: string }[];
}

export interface BacktestInput {
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  readonly history: PriceHistory;
  readonly forecast: ForecastDays;
  /** First and last delivery day, YYYY-MM-DD, both included. */
  readonly from: string;
  readonly to: string;
}

/** One policy on one day. */
export interface PolicyDay {
  readonly policy: BacktestPolicy;
  /** `optimal`, or why the policy had no plan and placed no orders that day. */
  readonly planStatus: 'optimal' | PlanFailure;
  readonly planReason: string | null;
  /** Objective of the plan at the prices it was scheduled on [currency]; null without a plan. */
  readonly plannedValue: number | null;
  /** `curves` when the day's bids were curves (settled by what cleared); null without a plan. */
  readonly bidKind: 'schedule' | 'curves' | null;
  /** What `curve` and `auto` saw on the day's scenarios; null for the other policies. */
  readonly scenarioReport: ScenarioReport | null;
  readonly socStartMwh: number;
  readonly socEndMwh: number;
  readonly totals: SettlementTotals;
  /** Orders and per-period settlement, when the ledger is kept. */
  readonly ledger: { readonly orders: readonly DayBid[]; readonly periods: readonly SettledPeriod[] } | null;
}

/** One covered delivery day: realised prices and every policy's result, in the options' policy order. */
export interface BacktestDay {
  readonly day: string;
  readonly periods: readonly DeliveryPeriod[];
  readonly clearingPricePerMwh: readonly number[];
  readonly imbalance: ImbalancePrices;
  readonly runs: readonly PolicyDay[];
}

export interface BacktestResult {
  readonly from: string;
  readonly to: string;
  readonly alpha: number;
  readonly unaccepted: UnacceptedRule;
  readonly policies: readonly BacktestPolicy[];
  readonly imbalanceSource: ImbalanceSource;
  /** Days with a complete history and forecast, ascending. */
  readonly days: readonly BacktestDay[];
  /** Days of [from, to] left out, with the reason; never filled in. */
  readonly skippedDays: readonly { readonly day: string; readonly reason: string }[];
  /** State of charge each policy ends the backtest with [MWh]. */
  readonly socEndMwh: Readonly<Record<string, number>>;
}

/**
 * Replays the policies day by day over [from, to] (docs/design.md sections 3 and 5).
 *
 * For each delivery day in order: a day without a complete history or forecast is skipped and listed
 * (never filled in); otherwise each policy plans from that day's forecast alone and its own state of
 * charge carried from its previous covered day (the first day starts at battery.socInitialMwh), its
 * orders are settled against the realised clearing and imbalance prices (settleDay), and the state of
 * charge at the end is carried on - across skipped days unchanged. All policies see the same days.
 *
 * @throws NoImbalancePriceError when neither the history nor the market spec gives an imbalance price;
 *   LevelOutOfRangeError when alpha or 1 - alpha lies outside the forecast's levels; RangeError for
 *   from > to.
 */
export function runBacktest(input: BacktestInput, options: Partial<BacktestOptions> = {}): BacktestResult {
  const settings: BacktestOptions = { ...BACKTEST_DEFAULTS, ...options };
  const { market, battery, history, forecast } = input;
  if (input.from > input.to) throw new RangeError(`runBacktest: from ${input.from} is after to ${input.to}`);
  const imbalanceSource = chooseImbalanceSource(history, market);
  if (imbalanceSource === null) throw new NoImbalancePriceError();
  const historyByDay = new Map(history.days.map((d) => [d.day, d]));
  const skipReasons = skippedReasons(history, forecast);
  const soc = new Map<BacktestPolicy, number>(settings.policies.map((p) => [p, battery.socInitialMwh]));
  const days: BacktestDay[] = [];
  const skippedDays: { day: string; reason: string }[] = [];
  const calendarDays = daysBetween(input.from, input.to);
  calendarDays.forEach((day, i) => {
    const realised = historyByDay.get(day);
    const dayForecast = forecast.days.get(day);
    if (realised === undefined || dayForecast === undefined) {
      skippedDays.push({ day, reason: skipReasons(day, realised === undefined, dayForecast === undefined) });
    } else {
      const day = runDay(realised, dayForecast, input, settings, imbalanceSource, soc);
      settings.onLedgerDay?.(day);
      days.push(settings.keepLedger || settings.onLedgerDay === null ? day : { ...day, runs: day.runs.map((run) => ({ ...run, ledger: null })) });
    }
    settings.onDay?.({ day, done: i + 1, total: calendarDays.length });
  });
  return {
    from: input.from,
    to: input.to,
    alpha: settings.alpha,
    unaccepted: settings.unaccepted,
    policies: settings.policies,
    imbalanceSource,
    days,
    skippedDays,
    socEndMwh: Object.fromEntries(soc),
  };
}

function runDay(
  realised: HistoryDay,
  forecast: QuantileDay,
  input: BacktestInput,
  settings: BacktestOptions,
  imbalanceSource: ImbalanceSource,
  soc: Map<BacktestPolicy, number>,
): BacktestDay {
  const { market, battery } = input;
  if (forecast.periods.length !== realised.periods.length) {
    throw new RangeError(`day ${realised.day}: the forecast has ${forecast.periods.length} periods, the history ${realised.periods.length}`);
  }
  const imbalance = dayImbalancePrices(realised, imbalanceSource);
  // One set of scenarios per day, made when the first policy asks, shared by curve and auto.
  const planning = settings.scenarioPlanning;
  let made: DayScenarios | undefined;
  const scenarios = planning === null ? null : (): DayScenarios => (made ??= planning.scenarios(forecast));
  // Policies that schedule on the same prices from the same state solve the day once (daySolveMemo.ts).
  const solveOptions = { ...settings.solveOptions, memo: new DaySolveMemo() };
  const runs = settings.policies.map((policy): PolicyDay => {
    const socStartMwh = soc.get(policy) as number;
    const plan = planPolicyDay({
      policy, forecast, realised, market, battery, alpha: settings.alpha, socStartMwh, solveOptions,
      unaccepted: settings.unaccepted, scenarioPlanning: planning, scenarios,
    });
    const optimal = plan.status === 'optimal';
    const keepLedger = settings.keepLedger || settings.onLedgerDay !== null;
    const settled = settleDay({
      keepPeriods: keepLedger,
      periodHours: market.periodMinutes / 60,
      battery,
      socStartMwh,
      orders: plan.orders,
      clearingPricePerMwh: realised.pricePerMwh,
      imbalance,
      // A curve has no schedule apart from what clears: it is settled by what cleared under either rule.
      unaccepted: optimal && plan.kind === 'curves' ? 'follow-accepted' : settings.unaccepted,
    });
    soc.set(policy, settled.socEndMwh);
    return {
      policy,
      planStatus: plan.status,
      planReason: plan.status === 'optimal' ? null : plan.reason,
      plannedValue: optimal ? plan.plannedValue : null,
      bidKind: optimal ? plan.kind : null,
      scenarioReport: optimal ? plan.scenarioReport : null,
      socStartMwh,
      socEndMwh: settled.socEndMwh,
      totals: settled.totals,
      ledger: keepLedger ? { orders: plan.orders, periods: settled.periods } : null,
    };
  });
  return { day: realised.day, periods: realised.periods, clearingPricePerMwh: realised.pricePerMwh, imbalance, runs };
}

/** Why a day is skipped: missing or incomplete in the history, the forecast, or both. */
function skippedReasons(history: PriceHistory, forecast: ForecastDays): (day: string, noHistory: boolean, noForecast: boolean) => string {
  const historyGaps = new Map(history.incompleteDays.map((d) => [d.day, d.reason]));
  const forecastGaps = new Map(forecast.incompleteDays.map((d) => [d.day, d.reason]));
  return (day, noHistory, noForecast) => {
    const reasons: string[] = [];
    if (noHistory) reasons.push(historyGaps.has(day) ? `history incomplete: ${historyGaps.get(day) as string}` : 'no history');
    if (noForecast) reasons.push(forecastGaps.has(day) ? `forecast incomplete: ${forecastGaps.get(day) as string}` : 'no forecast');
    return reasons.join('; ');
  };
}
