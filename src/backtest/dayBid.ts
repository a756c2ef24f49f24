import type { DeliveryPeriod, Order } from '../types.js';
import { isCurve, type PeriodOrder } from '../settle/periodBid.js';

/**
 * A period's bid in a backtest: a schedule's order (with its period and quantile level, for the
 * ledger), a curve (a stack of limit orders, settle/periodBid.ts), or none.
 */
export type DayBid = Order | readonly PeriodOrder[] | null;

/** The rows of orders.csv for a day's bids: a schedule's orders as they are, each curve step with its period. */
export function dayBidOrders(periods: readonly DeliveryPeriod[], bids: readonly DayBid[]): Order[] {
  const orders: Order[] = [];
  bids.forEach((bid, t) => {
    if (bid === null) return;
    if (!isCurve(bid)) {
      orders.push(bid as Order);
      return;
    }
    const period = periods[t] as DeliveryPeriod;
    for (const step of bid) orders.push({ periodStart: period.start, periodEnd: period.end, side: step.side, quantityMw: step.quantityMw, limitPrice: step.limitPrice, quantileLevel: null });
  });
  return orders;
}
