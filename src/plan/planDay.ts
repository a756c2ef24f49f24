import type { BatteryModel, DayOutcome, DayProblem, MarketSpec, Order, PlanPolicy, QuantileDay } from '../types.js';
import { pricesAtLevel } from '../forecast/quantileSet.js';
import { policyPrices, type PolicyPrices } from './policyPrices.js';
import { scheduleOrders } from './scheduleOrders.js';
import { scheduleValue } from './scheduleValue.js';
import { solveDay, type SolveDayOptions } from './solveDay.js';

export interface PlanRequest {
  readonly forecast: QuantileDay;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  readonly policy: PlanPolicy;
  /** Width of the central interval [q(alpha), q(1 - alpha)], in (0, 0.5). */
  readonly alpha: number;
  /** State of charge at the start of the day [MWh]. */
  readonly socStartMwh: number;
  readonly solveOptions?: Partial<SolveDayOptions>;
}

export type PlanResult =
  | {
      readonly status: 'optimal';
      readonly problem: DayProblem;
      readonly prices: PolicyPrices;
      readonly outcome: Extract<DayOutcome, { status: 'optimal' }>;
      readonly orders: Order[];
      /** Value of the schedule at the median forecast [currency]: the spread the plan expects to capture. */
      readonly expectedValueAtMedian: number;
    }
  | Exclude<DayOutcome, { status: 'optimal' }>;

/**
 * One delivery day: policy prices from the forecast -> day problem -> exact schedule -> orders.
 * The end-of-day floor is the battery's socFinalMinMwh, or else the day's starting state.
 */
export function planDay(request: PlanRequest): PlanResult {
  const { forecast, market, battery, policy, alpha, socStartMwh } = request;
  const prices = policyPrices(forecast, policy, alpha, market);
  const problem: DayProblem = {
    periodHours: market.periodMinutes / 60,
    buyPricePerMwh: prices.buyPricePerMwh,
    sellPricePerMwh: prices.sellPricePerMwh,
    battery,
    socStartMwh,
    socEndMinMwh: battery.socFinalMinMwh ?? socStartMwh,
  };
  const outcome = solveDay(problem, request.solveOptions);
  if (outcome.status !== 'optimal') return outcome;
  const orders = scheduleOrders(forecast.periods, outcome.schedule, prices);
  // The median and point policies schedule on the median already.
  const median = policy === 'median' || policy === 'point' ? prices.buyPricePerMwh : pricesAtLevel(forecast.levels, forecast.prices, 0.5);
  const expectedValueAtMedian = scheduleValue({ ...problem, buyPricePerMwh: median, sellPricePerMwh: median }, outcome.schedule);
  return { status: 'optimal', problem, prices, outcome, orders, expectedValueAtMedian };
}
