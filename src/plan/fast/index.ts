/** Exact special-purpose day solver (warehouse-problem sweep, cycle-cap multiplier, branching on arbitrage periods). */
export { solveDayFast, FAST_SOLVER_DEFAULTS, FAST_SOLVER_NAME, type FastDayOutcome, type FastSolverOptions } from './solveDayFast.js';
export { coversDay, fastSolverGap } from './coversDay.js';
export { toStoredDay, type StoredDay } from './storedDay.js';
