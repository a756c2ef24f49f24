import type { DayProblem, MarketSpec, Schedule, Side } from '../types.js';
import { MIN_ORDER_MW } from './scheduleOrders.js';
import { scheduleValue, socPath } from './scheduleValue.js';

/** The market's order steps (market.json), each null when the market has none. */
export interface ExchangeSteps {
  /** Quantities are whole multiples of it [MW]. */
  readonly quantityStepMw: number | null;
  /** Smallest order [MW]; smaller orders are dropped. */
  readonly minimumQuantityMw: number | null;
  /** Limit prices are whole multiples of it [currency/MWh]. */
  readonly priceTickPerMwh: number | null;
}

/** The market's steps, or null when market.json gives none of them (orders are then left as planned). */
export function exchangeSteps(market: MarketSpec): ExchangeSteps | null {
  const steps = { quantityStepMw: market.quantityStepMw ?? null, minimumQuantityMw: market.minimumQuantityMw ?? null, priceTickPerMwh: market.priceTickPerMwh ?? null };
  return steps.quantityStepMw === null && steps.minimumQuantityMw === null && steps.priceTickPerMwh === null ? null : steps;
}

/**
 * A quotient x / step within this many steps of a whole number is taken as that number: 2.3 / 0.1 is
 * 22.999999999999996 in floating point and must give 23 steps, not 22. It may round a quantity up by at
 * most 1e-9 steps (1e-10 MW for a 0.1 MW step), far below settlement's tolerance (SETTLE_TOLERANCE).
 */
const STEP_DUST = 1e-9;

/** Decimals of a step written in its shortest form (0.1 -> 1, 0.25 -> 2, 5 -> 0, 1e-7 -> 7). */
function decimalsOf(step: number): number {
  const [mantissa, exponent] = step.toExponential().split('e') as [string, string];
  const fraction = mantissa.split('.')[1]?.length ?? 0;
  return Math.max(0, fraction - Number(exponent));
}

/** k steps, written exactly to the step's decimals (3 x 0.1 is 0.30000000000000004 otherwise). */
function steps(k: number, step: number): number {
  const decimals = decimalsOf(step);
  return decimals <= 15 ? Number((k * step).toFixed(decimals)) : k * step;
}

/** The largest whole multiple of step at or below x (x >= 0) [same unit]. */
export function roundDownToStep(x: number, step: number): number {
  return steps(Math.floor(x / step + STEP_DUST), step);
}

/** The smallest whole multiple of step at or above x [same unit]. */
export function roundUpToStep(x: number, step: number): number {
  return steps(Math.ceil(x / step - STEP_DUST), step);
}

/**
 * A limit price on the tick, in the safe direction: a buy limit down, a sell limit up. A buy limited lower
 * is accepted only at clearing prices the planned limit accepted too, and a sell limited higher likewise,
 * so every trade the rounded order makes is one the plan was willing to make: rounding can lose a trade,
 * never add one at a price the plan refused. (Rounding the other way would buy above, or sell below, the
 * price the plan found worth it.) Floor and cap lie on the tick (marketSpec.ts), so the result stays
 * inside [floor, cap]. A limit within 1e-9 of a tick of a whole number of ticks is taken as on it
 * (STEP_DUST): 45.67 is stored as a binary number a hair off 45.67.
 */
export function roundLimit(side: Side, limitPerMwh: number, tickPerMwh: number): number {
  return side === 'buy' ? roundDownToStep(limitPerMwh, tickPerMwh) : roundUpToStep(limitPerMwh, tickPerMwh);
}

/** The market spec without its order steps: orders as planned (the backtest's reference for the loss). */
export function withoutExchangeSteps(market: MarketSpec): MarketSpec {
  const { quantityStepMw: _step, minimumQuantityMw: _minimum, priceTickPerMwh: _tick, ...plain } = market;
  return plain;
}

/** A schedule made exchange-ready, and what the rounding cost. */
export interface RoundedSchedule {
  /** Flows on the quantity step, each >= the minimum or 0, and the state of charge they give. */
  readonly schedule: Schedule;
  /** Orders of the planned schedule dropped entirely (below the minimum after rounding, or no room). */
  readonly ordersDropped: number;
  /** Energy no longer bought and no longer sold because of the rounding [MWh at the grid]. */
  readonly boughtMwhRemoved: number;
  readonly soldMwhRemoved: number;
  /** How far the rounded schedule ends below the end-of-day floor [MWh]; 0 when it reaches it. */
  readonly socEndShortMwh: number;
}

/**
 * Rounds a feasible schedule's flows to the exchange's quantity step so that the battery can always
 * deliver the rounded orders (docs/design.md section 4.5):
 * 1. forward, period by period from the day's start: a charge is rounded down to the step after being
 *    capped at the room the store has left (s_max - s) / (eta_c dt), a discharge after being capped at
 *    what the store holds (s - s_min) eta_d / dt; a flow below the minimum quantity is dropped. Each
 *    rounded order therefore fits the state of charge the rounded orders before it leave, whatever the
 *    rounding did earlier (a sale rounded down leaves more in store, hence less room for a later buy);
 * 2. back to the end-of-day floor: buying less may end the day below max(s_min, socEndMin); the deficit
 *    is made up by selling less, from the last sale backwards, each cut rounded up to the step (a sale
 *    left below the minimum is dropped) and never so deep that the store would overflow after it. What
 *    cannot be made up is reported (socEndShortMwh);
 * 3. down to the end-of-day floor: selling less may end the day above the floor, and with the default
 *    floor (the day's start) that energy would stay in store for good, each day starting a little fuller;
 *    the excess is bought less, from the last buy backwards, each cut on the step, never below the floor
 *    and never so deep that a later sale finds the store short. What is left is usually under one
 *    step's energy.
 * Quantities only ever go down, so power limits hold; the window holds by construction.
 */
export function roundSchedule(problem: DayProblem, schedule: Schedule, exchange: ExchangeSteps): RoundedSchedule {
  const b = problem.battery;
  const dt = problem.periodHours;
  const periods = schedule.chargeMw.length;
  const step = exchange.quantityStepMw;
  const minimum = exchange.minimumQuantityMw ?? 0;
  const down = (x: number): number => (step === null ? x : roundDownToStep(x, step));
  const up = (x: number): number => (step === null ? x : roundUpToStep(x, step));
  const keep = (x: number): number => (x < MIN_ORDER_MW || x < minimum ? 0 : x);
  const chargeMw = new Array<number>(periods).fill(0);
  const dischargeMw = new Array<number>(periods).fill(0);
  let s = problem.socStartMwh;
  for (let t = 0; t < periods; t++) {
    const c = schedule.chargeMw[t] as number;
    const d = schedule.dischargeMw[t] as number;
    if (c >= MIN_ORDER_MW) {
      const room = Math.max(0, (b.socMaxMwh - s) / (b.chargeEfficiency * dt));
      chargeMw[t] = keep(down(Math.min(c, room)));
      s += b.chargeEfficiency * dt * (chargeMw[t] as number);
    } else if (d >= MIN_ORDER_MW) {
      const held = Math.max(0, ((s - b.socMinMwh) * b.dischargeEfficiency) / dt);
      dischargeMw[t] = keep(down(Math.min(d, held)));
      s -= (dt * (dischargeMw[t] as number)) / b.dischargeEfficiency;
    }
  }
  let soc = socPath(problem, chargeMw, dischargeMw);
  const floor = Math.max(b.socMinMwh, problem.socEndMinMwh);
  const tol = 1e-9 * Math.max(1, b.energyMwh);
  const end = (): number => (periods === 0 ? problem.socStartMwh : (soc[periods - 1] as number));
  for (let t = periods - 1; t >= 0 && end() < floor - tol; t--) {
    const d = dischargeMw[t] as number;
    if (d === 0) continue;
    let headroomMwh = Infinity;
    for (let u = t; u < periods; u++) headroomMwh = Math.min(headroomMwh, b.socMaxMwh - (soc[u] as number));
    const deepestCut = (headroomMwh * b.dischargeEfficiency) / dt;
    const wanted = ((floor - end()) * b.dischargeEfficiency) / dt;
    // The sale after the cut: d - wanted rounded down to the step (the cut rounded up, so that it closes
    // the deficit), but never cut deeper than the headroom allows, and either 0 or at least the minimum.
    let kept = down(Math.max(0, d - wanted));
    if (kept > 0 && kept < minimum) kept = d <= deepestCut ? 0 : up(minimum);
    if (d - kept > deepestCut) kept = up(d - deepestCut);
    if (kept > 0 && kept < minimum) kept = up(minimum);
    if (kept >= d) continue;
    dischargeMw[t] = kept;
    soc = socPath(problem, chargeMw, dischargeMw);
  }
  // Energy left over above the floor would stay in store for good when the floor is the day's start
  // (each day would start a little fuller): buy less, from the last buy backwards, never below the floor
  // and never so much that a later sale finds the store short.
  for (let t = periods - 1; t >= 0 && end() > floor + tol; t--) {
    const c = chargeMw[t] as number;
    if (c === 0) continue;
    let slackMwh = Infinity;
    for (let u = t; u < periods; u++) slackMwh = Math.min(slackMwh, (soc[u] as number) - b.socMinMwh);
    const deepestCut = Math.max(0, Math.min(slackMwh, end() - floor)) / (b.chargeEfficiency * dt);
    // The smallest purchase on the step that cuts no deeper than that, either 0 or at least the minimum.
    let kept = up(Math.max(0, c - deepestCut));
    if (kept > 0 && kept < minimum) kept = c <= deepestCut ? 0 : up(minimum);
    if (kept >= c) continue;
    chargeMw[t] = kept;
    soc = socPath(problem, chargeMw, dischargeMw);
  }
  let ordersDropped = 0;
  let boughtMwhRemoved = 0;
  let soldMwhRemoved = 0;
  for (let t = 0; t < periods; t++) {
    const c = schedule.chargeMw[t] as number;
    const d = schedule.dischargeMw[t] as number;
    if ((c >= MIN_ORDER_MW && chargeMw[t] === 0) || (c < MIN_ORDER_MW && d >= MIN_ORDER_MW && dischargeMw[t] === 0)) ordersDropped++;
    if (c >= MIN_ORDER_MW) boughtMwhRemoved += dt * (c - (chargeMw[t] as number));
    else if (d >= MIN_ORDER_MW) soldMwhRemoved += dt * (d - (dischargeMw[t] as number));
  }
  return { schedule: { chargeMw, dischargeMw, socMwh: soc }, ordersDropped, boughtMwhRemoved, soldMwhRemoved, socEndShortMwh: Math.max(0, floor - end()) };
}

/** What rounding a plan to the exchange's steps did and cost (plan.json `rounding`). */
export interface ExchangeRounding extends Omit<RoundedSchedule, 'schedule'>, ExchangeSteps {
  /** Orders whose limit moved onto the tick [-]. */
  readonly limitsMoved: number;
  /** The planned schedule's value at the policy's prices [currency] (the solver's optimum). */
  readonly valueBeforeRounding: number;
  /** The rounded schedule's value at the same prices [currency]. */
  readonly valueAfterRounding: number;
  /** valueBeforeRounding - valueAfterRounding [currency], >= 0 up to the end-of-day floor's slack. */
  readonly lossFromRounding: number;
}

/** The rounded schedule's value at the problem's prices, and the loss against the planned one. */
export function roundingValue(problem: DayProblem, planned: Schedule, rounded: Schedule): { valueBeforeRounding: number; valueAfterRounding: number; lossFromRounding: number } {
  const valueBeforeRounding = scheduleValue(problem, planned);
  const valueAfterRounding = scheduleValue(problem, rounded);
  return { valueBeforeRounding, valueAfterRounding, lossFromRounding: valueBeforeRounding - valueAfterRounding };
}
