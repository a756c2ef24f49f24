import type { BatteryModel, DayOutcome, DayProblem, HistoryDay, MarketSpec, Order, QuantileDay } from '../types.js';
import { planDay, roundForExchange } from '../plan/planDay.js';
import { NodeLimitError, solveDay, type SolveDayOptions } from '../plan/solveDay.js';
import { ordersByPeriod } from '../settle/ordersByPeriod.js';
import type { BacktestPolicy } from './backtestPolicy.js';

export interface PolicyDayRequest {
  readonly policy: BacktestPolicy;
  /** The day's quantile forecast (the only forecast information a policy sees). */
  readonly forecast: QuantileDay;
  /** The day's realised prices: seen only by `perfect-foresight`. */
  readonly realised: HistoryDay;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** Tail level: buys limited at q(1 - alpha), sells at q(alpha); in (0, 0.5). */
  readonly alpha: number;
  /** State of charge at the start of the day [MWh], carried from the policy's previous day. */
  readonly socStartMwh: number;
  /** Passed to every solveDay call (the place to plug in another solver). */
  readonly solveOptions: Partial<SolveDayOptions>;
}

/** A policy's orders for one day, laid out by period, or why it has none. */
export type PolicyDayPlan =
  | {
      readonly status: 'optimal';
      readonly orders: readonly (Order | null)[];
      /** Objective of the plan at the prices it was scheduled on [currency]. */
      readonly plannedValue: number;
    }
  | { readonly status: PlanFailure; readonly reason: string; readonly orders: readonly (Order | null)[] };

/**
 * Why a policy has no plan for a day: the day problem has no feasible or bounded schedule, or the
 * exact solver could not prove an optimum within its node budget (never a silent suboptimum: the
 * policy then places no orders, and the backtest lists the day).
 */
export type PlanFailure = 'infeasible' | 'unbounded' | 'node-limit';

/**
 * One policy's orders for one day. `quantile`, `median`, `point` and `price-taking` are planDay
 * itself (the `point` schedule with buys limited at the price cap and sells at the floor is
 * policyPrices' `price-taking`, the same code `quantbid plan --policy price-taking` runs);
 * `perfect-foresight` solves the day problem on the realised prices (buy = sell = clearing) with the
 * same end-of-day floor as planDay (the battery's socFinalMinMwh, else the day's starting state) and
 * bids at the cap and floor. Without a plan the policy places no orders that day.
 */
export function planPolicyDay(request: PolicyDayRequest): PolicyDayPlan {
  try {
    return request.policy === 'perfect-foresight' ? perfectForesight(request) : fromForecast(request, request.policy);
  } catch (err) {
    if (!(err instanceof NodeLimitError)) throw err;
    return { status: 'node-limit', reason: err.message, orders: new Array<Order | null>(request.forecast.periods.length).fill(null) };
  }
}

function fromForecast(request: PolicyDayRequest, policy: Exclude<BacktestPolicy, 'perfect-foresight'>): PolicyDayPlan {
  const { forecast, market, battery, alpha, socStartMwh, solveOptions } = request;
  const plan = planDay({ forecast, market, battery, policy, alpha, socStartMwh, solveOptions });
  if (plan.status !== 'optimal') return noPlan(plan, forecast.periods.length);
  return { status: 'optimal', orders: ordersByPeriod(forecast.periods, plan.orders), plannedValue: plan.outcome.objective };
}

function perfectForesight(request: PolicyDayRequest): PolicyDayPlan {
  const { realised, market, battery, socStartMwh } = request;
  const prices = realised.pricePerMwh;
  const problem: DayProblem = {
    periodHours: market.periodMinutes / 60,
    buyPricePerMwh: prices,
    sellPricePerMwh: prices,
    battery,
    socStartMwh,
    socEndMinMwh: battery.socFinalMinMwh ?? socStartMwh,
  };
  const solved = solveDay(problem, request.solveOptions);
  if (solved.status !== 'optimal') return noPlan(solved, prices.length);
  // Bids like price-taking: every buy limited at the cap, every sell at the floor, so every order is accepted.
  const atCapAndFloor = {
    buyPricePerMwh: [...prices],
    sellPricePerMwh: [...prices],
    buyLimitPerMwh: prices.map(() => market.priceCap),
    sellLimitPerMwh: prices.map(() => market.priceFloor),
    buyLevel: null,
    sellLevel: null,
  };
  // With the market's order steps the schedule is rounded to them, as planDay does (planDay.ts).
  const { outcome, orders } = roundForExchange(problem, solved, realised.periods, atCapAndFloor, market);
  return { status: 'optimal', orders: ordersByPeriod(realised.periods, orders), plannedValue: outcome.objective };
}

function noPlan(outcome: Exclude<DayOutcome, { status: 'optimal' }>, periods: number): PolicyDayPlan {
  return { status: outcome.status, reason: outcome.reason, orders: new Array<Order | null>(periods).fill(null) };
}
