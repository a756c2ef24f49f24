/** Settlement of one delivery day's orders against realised prices (docs/design.md section 5). */
export { isAccepted } from './acceptance.js';
export { chooseFallbackSource, dayFallbackPrices, NoFallbackPriceError, type FallbackPrices, type FallbackSource } from './fallbackPrices.js';
export { ordersByPeriod } from './ordersByPeriod.js';
export { settleDay, SETTLE_TOLERANCE, UNACCEPTED_RULES, type PeriodOrder, type SettleDayInput, type SettledDay, type SettledPeriod, type UnacceptedRule } from './settleDay.js';
export { addTotals, ZERO_TOTALS, type SettlementTotals } from './settlementTotals.js';
