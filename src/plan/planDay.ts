import type { BatteryModel, DayOutcome, DayProblem, MarketSpec, Order, PlanPolicy, QuantileDay } from '../types.js';
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
      readonly outcome: Extract<DayOutcome, { status: 'optimal' }>;
      readonly orders: Order[];
      /** Value of the schedule at the median forecast [currency]: the spread the plan expects to capture. */
      readonly expectedValueAtMedian: number;
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
 * the window when the start lies outside it.
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
  const outcome = solved;
  const atCapOrFloor = recovery === null ? 0 : Math.min(forecast.periods.length, recovery.forcedPeriods + (insideWindow(battery, recovery.socAfterMwh) ? 0 : 1));
  const orders = scheduleOrders(forecast.periods, outcome.schedule, prices).map((o) => (recoveryOrder(o, forecast, atCapOrFloor) ? { ...o, limitPrice: o.side === 'buy' ? market.priceCap : market.priceFloor, quantileLevel: null } : o));
  const median = policyPrices(forecast, 'point', alpha, market);
  const expectedValueAtMedian = scheduleValue({ ...problem, buyPricePerMwh: median.buyPricePerMwh, sellPricePerMwh: median.sellPricePerMwh }, outcome.schedule);
  return { status: 'optimal', problem, prices, outcome, orders, expectedValueAtMedian, recovery: recovery === null ? null : { ...recovery, periodsAtCapOrFloor: atCapOrFloor } };
}

function insideWindow(battery: BatteryModel, socMwh: number): boolean {
  const tol = 1e-9 * Math.max(1, battery.energyMwh);
  return socMwh >= battery.socMinMwh - tol && socMwh <= battery.socMaxMwh + tol;
}

function recoveryOrder(order: Order, forecast: QuantileDay, periods: number): boolean {
  for (let t = 0; t < periods; t++) if ((forecast.periods[t] as { start: string }).start === order.periodStart) return true;
  return false;
}

