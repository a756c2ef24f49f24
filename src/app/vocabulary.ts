/**
 * The names, defaults and rules a front end offers its user (the CLI's choices, defaults and value
 * checks), taken from the domain and passed on here so that the CLI imports the app layer alone.
 */
export { BACKTEST_POLICIES, type BacktestPolicy } from '../backtest/backtestPolicy.js';
export { BACKTEST_DEFAULTS } from '../backtest/runBacktest.js';
export { SCENARIO_DEFAULTS } from '../backtest/scenarioPlanning.js';
export { SWEEP_POLICIES, type SweepPolicy } from '../backtest/sweepSettingRow.js';
export { DEFAULTS as FORECAST_OPTION_DEFAULTS, FORECAST_METHODS, type ForecastMethod } from '../forecast/forecaster.js';
export { isValidDay } from '../market/calendar.js';
export { ALPHA_RANGE, ALPHA_RULE, isAlpha, PLAN_POLICIES } from '../plan/alpha.js';
export { UNACCEPTED_RULES, type UnacceptedRule } from '../settle/settleDay.js';
export { SIZE_POLICIES } from '../sizing/sizeSettingRow.js';
export type { PlanPolicy } from '../types.js';
