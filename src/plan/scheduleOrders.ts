import type { DeliveryPeriod, Order, Schedule } from '../types.js';
import type { PolicyPrices } from './policyPrices.js';

/**
 * Orders from a schedule: a buy of chargeMw where the battery charges, a sell of dischargeMw where it
 * discharges, at the policy's limit prices. A period never has both (the planner removes it).
 * Quantities keep full precision (the settlement and the schedule must agree to the last MWh); flows
 * below MIN_ORDER_MW are numerical dust and dropped. Rounding to an exchange's tick is left to the
 * operator's submission step, since the tick differs between markets.
 */
/** Smallest order quantity written [MW]. */
export const MIN_ORDER_MW = 1e-9;

export function scheduleOrders(periods: readonly DeliveryPeriod[], schedule: Schedule, prices: PolicyPrices): Order[] {
  const orders: Order[] = [];
  periods.forEach((period, t) => {
    const charge = schedule.chargeMw[t] as number;
    const discharge = schedule.dischargeMw[t] as number;
    if (charge >= MIN_ORDER_MW) {
      orders.push({ periodStart: period.start, periodEnd: period.end, side: 'buy', quantityMw: charge, limitPrice: prices.buyLimitPerMwh[t] as number, quantileLevel: prices.buyLevel });
    }
    if (discharge >= MIN_ORDER_MW) {
      orders.push({ periodStart: period.start, periodEnd: period.end, side: 'sell', quantityMw: discharge, limitPrice: prices.sellLimitPerMwh[t] as number, quantileLevel: prices.sellLevel });
    }
  });
  return orders;
}
