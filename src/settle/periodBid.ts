import type { Order } from '../types.js';

/** One order as settlement reads it (an Order has these fields and more). */
export type PeriodOrder = Pick<Order, 'side' | 'quantityMw' | 'limitPrice'>;

/**
 * What one delivery period carries into the auction (docs/design.md section 5.2):
 * - null: no order;
 * - one order: a buy or a sell of a schedule, at its limit;
 * - a curve: a stack of limit orders (an array, even of one), buys and sells. Whatever the clearing
 *   price pi, the stack sells sum{sells with limit <= pi} - sum{buys with limit >= pi}: a quantity
 *   that never falls as pi rises, so every stack is a monotone bid curve, and a step curve is exactly
 *   such a stack (curves/stepCurve.ts).
 * A curve has no schedule apart from what clears, so it is settled by what cleared under either rule
 * for unaccepted orders (settleDay refuses a curve under follow-plan).
 */
export type PeriodBid = PeriodOrder | readonly PeriodOrder[] | null;

/** Whether a period's bid is a curve (a stack of limit orders). */
export function isCurve(bid: PeriodBid): bid is readonly PeriodOrder[] {
  return Array.isArray(bid);
}

/** The orders of a bid as a list: none, the one order, or the curve's steps. */
export function bidOrders(bid: PeriodBid): readonly PeriodOrder[] {
  if (bid === null) return [];
  return isCurve(bid) ? bid : [bid as PeriodOrder];
}
