import type { BatteryModel, DayOutcome, DayProblem, DeliveryPeriod, MarketSpec, Order, PlanPolicy, QuantileDay } from '../types.js';
import { exchangeSteps, roundingValue, roundLimit, roundSchedule, type ExchangeRounding } from './exchangeRounding.js';
import { pricesAtLevel } from '../forecast/quantileSet.js';
import { policyPrices, type PolicyPrices } from './policyPrices.js';
import { scheduleOrders } from './scheduleOrders.js';
import { scheduleValue } from './scheduleValue.js';
import { solveDay, type SolveDayOptions } from './solveDay.js';
import { solveDayWithRecovery, windowRecovery, type WindowRecovery } from './windowRecovery.js';

export interface PlanRequest {
  readonly forecast: QuantileDay;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  readonly policy: PlanPolicy;
  /** Tail level: buys limited at q(1 - alpha), sells at q(alpha); in (0, 0.5). */
  readonly alpha: number;
  /** State of charge at the start of the day [MWh]; outside the window, the plan first comes back into it (windowRecovery.ts). */
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
      /**
       * How a start outside the window comes back into it, with the periods bid at the price cap
       * (buys) or floor (sells) so that the auction accepts them: the forced ones and the crossing
       * period; null when the day starts inside the window.
       */
      readonly recovery: (WindowRecovery & { readonly periodsAtCapOrFloor: number }) | null;
    }
  | Exclude<DayOutcome, { status: 'optimal' }>;

/**
 * One delivery day: policy prices from the forecast -> day problem -> exact schedule -> orders.
 * The end-of-day floor is the battery's socFinalMinMwh, or else the day's starting state, moved into
 * the window when the start lies outside it. With a quantity step, minimum quantity or price tick in
 * the market spec the schedule and the limits are rounded to them (roundForExchange) and the orders
 * are the rounded ones.
 *
 * A start outside the window: the periods windowRecovery forces run at full power toward the window,
 * the rest of the day is solved from where they leave the battery (within one period of the window:
 * the day solver must end its first period inside it), with the cycle cap lowered by the energy the
 * forced periods discharge. The forced periods and the crossing period must happen whatever the
 * prices, so their orders are limited at the price cap (buys) or floor (sells).
 */
export function planDay(request: PlanRequest): PlanResult {
  const { forecast, market, battery, policy, alpha, socStartMwh } = request;
  const prices = policyPrices(forecast, policy, alpha, market);
  const floor = battery.socFinalMinMwh ?? socStartMwh;
  const problem: DayProblem = {
    periodHours: market.periodMinutes / 60,
    buyPricePerMwh: prices.buyPricePerMwh,
    sellPricePerMwh: prices.sellPricePerMwh,
    battery,
    socStartMwh,
    socEndMinMwh: Math.min(battery.socMaxMwh, Math.max(battery.socMinMwh, floor)),
  };
  const recovery = windowRecovery(battery, problem.periodHours, socStartMwh, forecast.periods.length);
  const solved = recovery === null ? solveDay(problem, request.solveOptions) : solveDayWithRecovery(problem, recovery, request.solveOptions);
  if (solved.status !== 'optimal') return solved;
  const { outcome, orders: rounded, rounding } = roundForExchange(problem, solved, forecast.periods, prices, market);
  const atCapOrFloor = recovery === null ? 0 : Math.min(forecast.periods.length, recovery.forcedPeriods + (insideWindow(battery, recovery.socAfterMwh) ? 0 : 1));
  // Pushed into an array literal rather than made by map: the engine then gives a day without orders
  // the same kind of array as a day with some (map makes an empty list an array of small integers,
  // and code compiled on lists of orders is thrown away at the first day without one).
  const orders: Order[] = [];
  for (const o of rounded) orders.push(recoveryOrder(o, forecast, atCapOrFloor) ? { ...o, limitPrice: o.side === 'buy' ? market.priceCap : market.priceFloor, quantileLevel: null } : o);
  // The median and point policies schedule on the median already.
  const median = policy === 'median' || policy === 'point' ? prices.buyPricePerMwh : pricesAtLevel(forecast.levels, forecast.prices, 0.5);
  const expectedValueAtMedian = scheduleValue({ ...problem, buyPricePerMwh: median, sellPricePerMwh: median }, outcome.schedule);
  return { status: 'optimal', problem, prices, outcome, orders, expectedValueAtMedian, rounding, recovery: recovery === null ? null : { ...recovery, periodsAtCapOrFloor: atCapOrFloor } };
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

function insideWindow(battery: BatteryModel, socMwh: number): boolean {
  const tol = 1e-9 * Math.max(1, battery.energyMwh);
  return socMwh >= battery.socMinMwh - tol && socMwh <= battery.socMaxMwh + tol;
}

function recoveryOrder(order: Order, forecast: QuantileDay, periods: number): boolean {
  for (let t = 0; t < periods; t++) if ((forecast.periods[t] as { start: string }).start === order.periodStart) return true;
  return false;
}

