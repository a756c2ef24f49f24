/** Exact special-purpose day solver of the warehouse problem (slope sweep, cycle-cap multiplier, branching on arbitrage periods, dynamic program). */
export { solveWarehouseDay, WAREHOUSE_SOLVER_DEFAULTS, WAREHOUSE_SOLVER_NAME, type WarehouseDayOutcome, type WarehouseSolveContext, type WarehouseSolverOptions } from './solveWarehouseDay.js';
export { coversDay, uncoveredReason } from './coversDay.js';
export { toStoredDay, type StoredDay } from './storedDay.js';
export { DayWorkspace } from './workspace.js';
