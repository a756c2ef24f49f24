/** Settlement of one delivery day's orders against realised prices (docs/design.md section 5). */
export { isAccepted } from './acceptance.js';
export { chooseImbalanceSource, dayImbalancePrices, NoImbalancePriceError, type ImbalancePrices, type ImbalanceSource } from './imbalancePrices.js';
export { ordersByPeriod } from './ordersByPeriod.js';
export { settleDay, SETTLE_TOLERANCE, UNACCEPTED_RULES, type PeriodOrder, type SettleDayInput, type SettledDay, type SettledPeriod, type UnacceptedRule } from './settleDay.js';
export { addTotals, ZERO_TOTALS, type SettlementTotals } from './settlementTotals.js';
