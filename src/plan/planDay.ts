import type { BatteryModel, DayOutcome, DayProblem, DeliveryPeriod, MarketSpec, Order, PlanPolicy, QuantileDay } from '../types.js';
import { exchangeSteps, roundingValue, roundLimit, roundSchedule, type ExchangeRounding } from './exchangeRounding.js';
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
      /**
       * The solver's outcome; with exchange steps in the market spec, its schedule and objective are
       * those of the rounded schedule the orders come from (the optimum before rounding is in `rounding`).
       */
      readonly outcome: Extract<DayOutcome, { status: 'optimal' }>;
      readonly orders: Order[];
      /** Value of the schedule at the median forecast [currency]: the spread the plan expects to capture. */
      readonly expectedValueAtMedian: number;
      /** What rounding to the market's steps did (exchangeRounding.ts); null when the market has none. */
      readonly rounding: ExchangeRounding | null;
    }
  | Exclude<DayOutcome, { status: 'optimal' }>;

/**
 * One delivery day: policy prices from the forecast -> day problem -> exact schedule -> orders.
 * The end-of-day floor is the battery's socFinalMinMwh, or else the day's starting state. With a
 * quantity step, minimum quantity or price tick in the market spec the schedule and the limits are
 * rounded to them (roundForExchange) and the orders are the rounded ones.
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
  const solved = solveDay(problem, request.solveOptions);
  if (solved.status !== 'optimal') return solved;
  const { outcome, orders, rounding } = roundForExchange(problem, solved, forecast.periods, prices, market);
  const median = policyPrices(forecast, 'point', alpha, market);
  const expectedValueAtMedian = scheduleValue({ ...problem, buyPricePerMwh: median.buyPricePerMwh, sellPricePerMwh: median.sellPricePerMwh }, outcome.schedule);
  return { status: 'optimal', problem, prices, outcome, orders, expectedValueAtMedian, rounding };
}

/**
 * Orders of a solved day, rounded to the market's steps when it has any (docs/design.md section 4.5):
 * the schedule by roundSchedule, the limits by roundLimit; the outcome then carries the rounded
 * schedule and its value. Without steps: the orders of the schedule as it is, and rounding null.
 */
export function roundForExchange(
  problem: DayProblem,
  solved: Extract<DayOutcome, { status: 'optimal' }>,
  periods: readonly DeliveryPeriod[],
  prices: PolicyPrices,
  market: MarketSpec,
): { outcome: Extract<DayOutcome, { status: 'optimal' }>; orders: Order[]; rounding: ExchangeRounding | null } {
  const exchange = exchangeSteps(market);
  if (exchange === null) return { outcome: solved, orders: scheduleOrders(periods, solved.schedule, prices), rounding: null };
  const rounded = roundSchedule(problem, solved.schedule, exchange);
  const tick = exchange.priceTickPerMwh;
  const limits =
    tick === null
      ? prices
      : { ...prices, buyLimitPerMwh: prices.buyLimitPerMwh.map((p) => roundLimit('buy', p, tick)), sellLimitPerMwh: prices.sellLimitPerMwh.map((p) => roundLimit('sell', p, tick)) };
  const orders = scheduleOrders(periods, rounded.schedule, limits);
  const index = new Map(periods.map((p, t) => [p.start, t]));
  const planned = (o: Order) => (o.side === 'buy' ? prices.buyLimitPerMwh : prices.sellLimitPerMwh)[index.get(o.periodStart) as number];
  const limitsMoved = orders.filter((o) => o.limitPrice !== planned(o)).length;
  const value = roundingValue(problem, solved.schedule, rounded.schedule);
  const { schedule, ...what } = rounded;
  return {
    outcome: { ...solved, schedule, objective: value.valueAfterRounding },
    orders,
    rounding: { ...exchange, ...what, limitsMoved, ...value },
  };
}
