/**
 * quantbid as a library: the public API, one import away (`import { planDay } from 'quantbid'`).
 * Everything here is what the commands use; see README.md (Library) for an example and
 * docs/design.md for the method. Inputs are read and checked once (readers throw InputError with every
 * problem, `file:line: field: what is wrong; what to do`); the planning, settlement, backtest,
 * forecast, scoring and sizing functions are pure and synchronous.
 */

// ---- vocabulary: specs, periods, forecasts, histories, day problems, schedules, orders ----
export type * from './types.js';

// ---- bad input: every problem with file, line, field, what is wrong and what to do ----
export { formatProblem, InputError, type InputProblem } from './errors/inputError.js';

// ---- read specs and files (they check everything and throw InputError) ----
export { batteryModel, BATTERY_DEFAULTS, parseBatterySpec, roundTripEfficiency } from './battery/batterySpec.js';
export { equivalentFullCycles } from './battery/equivalentFullCycles.js';
export { parseMarketSpec } from './market/marketSpec.js';
export { daysBetween, deliveryPeriods, isValidDay } from './market/calendar.js';
export { readBatterySpec, readMarketSpec } from './io/readSpecs.js';
export { parsePriceHistory, readPriceHistory } from './io/readPriceHistory.js';
export { parseQuantileForecast, readQuantileForecast, type QuantileForecastFile } from './io/readQuantileForecast.js';
export { parseScenario, readScenario, type Scenario } from './io/readScenario.js';

// ---- write what the commands write ----
export { jsonText, ordersCsv, scheduleCsv } from './io/planOutputs.js';
export { daysCsv, ledgerCsv } from './io/backtestOutputs.js';
export { quantileForecastCsv } from './io/quantileForecastCsv.js';
export { formatNumber } from './io/formatNumber.js';
export { writeOutputs, type OutputFile } from './io/writeOutputs.js';

// ---- plan a day: policy prices -> the day problem -> an exact schedule -> orders ----
export { isAlpha, PLAN_POLICIES } from './plan/alpha.js';
export { planDay, type PlanRequest, type PlanResult } from './plan/planDay.js';
export { policyPrices, type PolicyPrices } from './plan/policyPrices.js';
export { type DaySolverChoice, NodeLimitError, SOLVE_DAY_DEFAULTS, solveDay, type SolveDayOptions, UncoveredDayError } from './plan/solveDay.js';
export { DayWorkspace } from './plan/warehouse/workspace.js';
export { scheduleValue } from './plan/scheduleValue.js';
export { exchangeSteps, roundLimit, roundSchedule, type ExchangeRounding, type ExchangeSteps, type RoundedSchedule } from './plan/exchangeRounding.js';
export { expectedPlanValue, losingPairs, valueIfFilledAtLimits, type ExpectedPlanValue, type ImbalanceExpectation, type LosingPairs } from './plan/planValues.js';
export { imbalanceExpectation } from './plan/imbalanceExpectation.js';
export { solveDayWithRecovery, windowRecovery, type WindowRecovery } from './plan/windowRecovery.js';

// ---- settle a day's orders against realised prices ----
export { chooseImbalanceSource, dayImbalancePrices, type ImbalancePrices, type ImbalanceSource } from './settle/imbalancePrices.js';
export { settleDay, UNACCEPTED_RULES, type SettleDayInput, type SettledDay, type SettledPeriod, type UnacceptedRule } from './settle/settleDay.js';
export type { SettlementTotals } from './settle/settlementTotals.js';

// ---- backtest policies over history ----
export { BACKTEST_POLICIES, type BacktestPolicy } from './backtest/backtestPolicy.js';
export { backtestMetrics, STRONGEST_BASELINE_RULE, type BacktestMetrics, type BaselineComparison } from './backtest/backtestMetrics.js';
export { BACKTEST_DEFAULTS, runBacktest, type BacktestDay, type BacktestInput, type BacktestOptions, type BacktestResult, type ForecastDays, type PolicyDay } from './backtest/runBacktest.js';
export { policyMetrics, type PolicyMetrics } from './backtest/policyMetrics.js';
export { edgeTest, type EdgeTest } from './backtest/edgeTest.js';

// ---- forecast prices from history, and score forecasts ----
export { DEFAULT_METHOD, DEFAULTS as FORECAST_DEFAULTS, FORECAST_METHODS, type ForecastMethod, type ForecastOptions } from './forecast/forecaster.js';
export { forecastRange, type ForecastRangeRequest, type ForecastRangeResult } from './forecast/forecastRange.js';
export { priceAtLevel, rearrange } from './forecast/quantileSet.js';
export { meanPrice, orderExpectation, type OrderExpectation } from './forecast/quantileDistribution.js';
export { compareForecasts, type ForecastComparison } from './forecast/scoring/compareForecasts.js';
export { pinballLoss } from './forecast/scoring/pinball.js';
export { scoreForecasts, type ScoreTable, type ScoredDay } from './forecast/scoring/scoreForecasts.js';
export { energyScore } from './forecast/scoring/energyScore.js';
export { variogramScore } from './forecast/scoring/variogramScore.js';
export { scenarioPaths, type ScenarioPathsRequest } from './forecast/paths/scenarioPaths.js';
export { forecastFileScenarioPaths, naiveErrorTemplate, pitTemplate, type ForecastFilePathsRequest, type PastForecastDay } from './forecast/paths/dependenceTemplate.js';

// ---- size a battery: scaled batteries, alpha chosen out of sample, project economics ----
export { alphaSplit, chooseAlpha, type AlphaMode } from './sizing/alphaChoice.js';
export { scaledBatterySpec, type BatterySize } from './sizing/scaledBattery.js';
export { sizeEconomics, type SizeCosts, type SizeEconomics } from './sizing/sizeEconomics.js';
export { irr, npv, projectCashFlows, type ProjectCashFlows, extrapolationWarning, yearCoverage, type YearCoverage } from './economics/index.js';

// ---- whole commands, as the CLI runs them: settings in, files written, summary out ----
export { QUIET_HOOKS, type ProgressDisplay, type RunHooks } from './app/runHooks.js';
export type { Done, Interrupted } from './app/commandResult.js';
export { planUseCase, type PlanSettings, type PlanSummary, type PlanTools } from './app/plan/planUseCase.js';
// The LP solver the default plan policy (auto) and curve need: planUseCase(settings, hooks, { lpSolver: await loadHighsSolver() }).
export { loadHighsSolver } from './app/solver/highsSolver.js';
export { backtestUseCase, type BacktestSettings, type BacktestSummary } from './app/backtest/backtestUseCase.js';
export { sweepUseCase, type SweepSettings, type SweepSummary } from './app/sweep/sweepUseCase.js';
export { sizeUseCase, type SizeSettings, type SizeSummary } from './app/size/sizeUseCase.js';
export { forecastUseCase, type ForecastSettings, type ForecastSummary } from './app/forecast/forecastUseCase.js';
export { scoreUseCase, type ScoreSettings, type ScoreSummary } from './app/score/scoreUseCase.js';
