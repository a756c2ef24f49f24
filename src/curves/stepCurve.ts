import type { BatteryModel, MarketSpec } from '../types.js';
import type { PeriodBid, PeriodOrder } from '../settle/periodBid.js';
import { stepOf } from './pricePoints.js';

/**
 * One period's step bid curve: the net quantity sold y_k [MW] in each step k = 0..m, where step k
 * holds the clearing prices from b_k up to b_{k+1} (b_0 = -infinity, b_{m+1} = +infinity; a price exactly
 * on a breakpoint: see curveStack); y never falls as the price rises. y < 0 is a purchase.
 */
export interface StepCurve {
  /** b_1 < ... < b_m [currency/MWh]. */
  readonly breakpoints: readonly number[];
  /** y_0 <= ... <= y_m [MW]. */
  readonly netSoldMw: readonly number[];
}

/** Quantities below this are numerical dust and give no order [MW] (as plan/scheduleOrders.ts). */
export const MIN_STEP_MW = 1e-9;

/**
 * Net quantity sold at the grid [MW] for a change e of stored energy [MWh] in a period of dt hours:
 * a charge e >= 0 buys e / eta_c MWh, a discharge e < 0 sells -e eta_d MWh (docs/design.md section 4.3),
 * so y = -e / (eta_c dt) or -e eta_d / dt: a decreasing map, 0 at 0.
 */
export function netSoldFromStored(storedMwh: number, battery: BatteryModel, periodHours: number): number {
  if (storedMwh > 0) return -storedMwh / (battery.chargeEfficiency * periodHours);
  return storedMwh < 0 ? (-storedMwh * battery.dischargeEfficiency) / periodHours : 0;
}

/** The inverse of netSoldFromStored: the change of stored energy [MWh] of a net sale of y MW for dt hours. */
export function storedFromNetSold(netSoldMw: number, battery: BatteryModel, periodHours: number): number {
  if (netSoldMw < 0) return -netSoldMw * battery.chargeEfficiency * periodHours;
  return netSoldMw > 0 ? (-netSoldMw * periodHours) / battery.dischargeEfficiency : 0;
}

/**
 * A step curve as a stack of limit orders that the auction settles to the curve (settle/periodBid.ts):
 * - a sell of max(y_0, 0) limited at the price floor and a buy of max(-y_m, 0) limited at the price
 *   cap: the part every price meets;
 * - at each breakpoint b_k, the rise y_k - y_{k-1} split at 0: the part below 0 a buy limited at b_k
 *   (accepted at prices <= b_k, where the curve buys that much more), the part above 0 a sell limited
 *   at b_k (accepted at prices >= b_k).
 * At a clearing price pi inside step j the stack sells max(y_j, 0) and buys max(-y_j, 0), i.e. y_j; only
 * a clearing price exactly on a breakpoint accepts both orders of that breakpoint (the exchange's tie
 * rule), which no planning path has (pricePoints.ts). Buys come first, by falling limit, then sells by
 * rising limit. Parts below MIN_STEP_MW are dropped.
 */
export function curveStack(curve: StepCurve, market: MarketSpec): PeriodOrder[] {
  const y = curve.netSoldMw;
  const m = curve.breakpoints.length;
  const buys: PeriodOrder[] = [];
  const sells: PeriodOrder[] = [];
  const top = y[m] as number;
  const bottom = y[0] as number;
  if (-top >= MIN_STEP_MW) buys.push({ side: 'buy', quantityMw: -top, limitPrice: market.priceCap });
  for (let k = m; k >= 1; k--) {
    const part = Math.min(y[k] as number, 0) - (y[k - 1] as number);
    if (part >= MIN_STEP_MW) buys.push({ side: 'buy', quantityMw: part, limitPrice: curve.breakpoints[k - 1] as number });
  }
  if (bottom >= MIN_STEP_MW) sells.push({ side: 'sell', quantityMw: bottom, limitPrice: market.priceFloor });
  for (let k = 1; k <= m; k++) {
    const part = (y[k] as number) - Math.max(y[k - 1] as number, 0);
    if (part >= MIN_STEP_MW) sells.push({ side: 'sell', quantityMw: part, limitPrice: curve.breakpoints[k - 1] as number });
  }
  return [...buys, ...sells];
}

/** The bid of every period of a day of curves: its stack (an empty curve is an empty stack). */
export function curveBids(curves: readonly StepCurve[], market: MarketSpec): PeriodBid[] {
  return curves.map((curve) => curveStack(curve, market));
}

/** The curve's net quantity sold at a clearing price [MW] (the step the price falls in). */
export function netSoldAt(curve: StepCurve, price: number): number {
  return curve.netSoldMw[stepOf(curve.breakpoints, price)] as number;
}
