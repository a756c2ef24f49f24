/**
 * The names, defaults and rules a front end offers its user (the CLI's choices, defaults and value
 * checks), taken from the domain and passed on here so that the CLI imports the app layer alone. Each
 * comes from a light module of its own, so that a command's help loads no use case.
 */
export { BACKTEST_POLICIES, SWEEP_POLICIES, type BacktestPolicy, type SweepPolicy } from '../backtest/backtestPolicy.js';
export { BACKTEST_DEFAULTS } from '../backtest/backtestOptions.js';
export { AUTO_CANDIDATES, AUTO_FALLBACK, AUTO_VALIDATION_DAYS, entryMembers, FORECAST_METHODS, MAX_PATHS, type ForecastMethod } from '../forecast/forecastMethods.js';
export { isValidDay } from '../market/civilDays.js';
export { LEVEL_RANGE_TEXT } from '../forecast/quantiles/levels.js';
export { SCENARIO_DEFAULTS } from '../backtest/scenarioPlanning.js';
export { ALPHA_RANGE, ALPHA_RULE, isAlpha, PLAN_POLICIES } from '../plan/alpha.js';
export { UNACCEPTED_RULES, type UnacceptedRule } from '../settle/unacceptedRule.js';
export { SIZE_POLICIES } from '../sizing/sizePolicy.js';
export type { PlanPolicy } from '../types.js';
