/** The backtest of one setting: the day loop, the policies and their metrics (docs/design.md sections 3-6). */
export { BACKTEST_POLICIES, type BacktestPolicy } from './backtestPolicy.js';
export { backtestMetrics, type BacktestMetrics, type MonthRow } from './backtestMetrics.js';
export { dailyProfitStats, WORST_DAY_LEVEL, type DailyProfitStats } from './dailyProfitStats.js';
export { edgeTest, type EdgeTest } from './edgeTest.js';
export { planPolicyDay, type PolicyDayPlan, type PolicyDayRequest } from './planPolicyDay.js';
export { DAYS_PER_YEAR, policyMetrics, type PolicyMetrics } from './policyMetrics.js';
export {
  BACKTEST_DEFAULTS,
  runBacktest,
  type BacktestDay,
  type BacktestInput,
  type BacktestOptions,
  type BacktestResult,
  type ForecastDays,
  type PolicyDay,
} from './runBacktest.js';
