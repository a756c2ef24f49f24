import type { DeliveryPeriod, Order } from '../types.js';

/**
 * Lays a day's orders out by period: entry t is the order of period t, or null. A day has at most one
 * order per period (the planner never buys and sells in the same period).
 *
 * @throws RangeError for an order outside the day's periods or a second order in one period.
 */
export function ordersByPeriod(periods: readonly DeliveryPeriod[], orders: readonly Order[]): (Order | null)[] {
  const laid: (Order | null)[] = new Array<Order | null>(periods.length).fill(null);
  // Orders come in period order as a rule: each is looked for from the period after the last one found.
  let index: Map<string, number> | undefined;
  let from = 0;
  for (const order of orders) {
    let t: number | undefined = from;
    while (t < periods.length && (periods[t] as DeliveryPeriod).start !== order.periodStart) t++;
    if (t === periods.length) {
      index ??= new Map(periods.map((p, k) => [p.start, k]));
      t = index.get(order.periodStart);
    }
    if (t === undefined) throw new RangeError(`order for ${order.periodStart} is not in the day's periods`);
    if (laid[t] !== null) throw new RangeError(`two orders for ${order.periodStart}; at most one per period`);
    laid[t] = order;
    from = t + 1;
  }
  return laid;
}
