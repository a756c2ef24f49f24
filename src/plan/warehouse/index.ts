/** Exact special-purpose day solver (warehouse-problem sweep, cycle-cap multiplier, branching on arbitrage periods). */
export { solveWarehouseDay, WAREHOUSE_SOLVER_DEFAULTS, WAREHOUSE_SOLVER_NAME, type WarehouseDayOutcome, type WarehouseSolverOptions } from './solveWarehouseDay.js';
export { coversDay, uncoveredReason } from './coversDay.js';
export { toStoredDay, type StoredDay } from './storedDay.js';
