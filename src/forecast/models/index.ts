/** Point models of day-ahead prices on the clock-slot grid, and the view that bounds what they read. */
export { ARX_COLUMNS, arxForecast } from './arx.js';
export type { ArxEstimator, ArxSettings } from './arx.js';
export { ForecastInputError, InsufficientHistoryError } from './errors.js';
export { GridCache, HistoryView, dayNumberOf, weekdayOf } from './historyView.js';
export type { GriddedDay, TargetDay } from './historyView.js';
export { averageMembers } from './pointForecast.js';
export type { PointForecast } from './pointForecast.js';
export { fromAsinhScale, robustScale, toAsinhScale } from './robustAsinh.js';
export type { RobustScale } from './robustAsinh.js';
export { seasonalNaive } from './seasonalNaive.js';
export { fromSlotGrid, localMinuteOfDay, slotLayout, toSlotGrid } from './slotGrid.js';
export type { SlotLayout } from './slotGrid.js';
