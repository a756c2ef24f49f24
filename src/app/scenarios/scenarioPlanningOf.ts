import type { MarketSpec, PriceHistory, QuantileDay } from '../../types.js';
import type { BacktestPolicy } from '../../backtest/backtestPolicy.js';
import { SCENARIO_DEFAULTS, type ScenarioPlanning } from '../../backtest/scenarioPlanning.js';
import type { SparseLpSolver } from '../../curves/linearProgram.js';
import { InputError } from '../../errors/inputError.js';
import { exchangeSteps } from '../../plan/exchangeRounding.js';
import type { ScenarioPathsFile } from '../../io/readScenarioPaths.js';
import { pathScenarioSource } from './pathScenarios.js';
import { autoAlphas, curveSteps, type ScenarioSettings } from './scenarioSettings.js';

/** What a run of the curve or auto policy needs besides its settings: the LP solver (app/solver/highsSolver.ts). */
export interface ScenarioTools {
  readonly lpSolver?: SparseLpSolver;
}

/**
 * The curve policy needs a market without order steps: a curve's quantities and limit prices are not
 * rounded to them (on such a market `auto` leaves the curve out of its candidates).
 */
export function requireCurvesOffered(policies: readonly BacktestPolicy[], market: MarketSpec, marketFile: string): void {
  if (!policies.includes('curve') || exchangeSteps(market) === null) return;
  throw new InputError([{ file: marketFile, field: 'quantityStepMw', message: 'the curve policy is not offered on a market with order steps (quantityStepMw, minimumQuantityMw or priceTickPerMwh): its curves are not rounded to them', fix: 'use auto (it leaves curves out there) or another policy' }]);
}

/**
 * Scenario planning for a run: the run's paths (runScenarioPaths: the --paths file or paths made from the quantile file), each day's planning and fresh paths with their
 * imbalance prices (pathScenarioSource), the curve steps from the market's bidCurves, auto's alphas within
 * the forecast's levels, the defaults of SCENARIO_DEFAULTS, and the solver handed in.
 */
export function scenarioPlanningOf(
  settings: ScenarioSettings,
  run: { readonly market: MarketSpec; readonly history: PriceHistory | null; readonly forecast: { readonly days: ReadonlyMap<string, QuantileDay>; readonly levels?: readonly number[] }; readonly tools: ScenarioTools; readonly paths: ScenarioPathsFile },
): ScenarioPlanning {
  const { market, history, forecast, tools } = run;
  if (tools.lpSolver === undefined) throw new Error('scenarioPlanningOf: the curve and auto policies need tools.lpSolver (loadHighsSolver)');
  const { paths } = run;
  const levels = forecast.levels ?? [...forecast.days.values()][0]?.levels ?? [];
  return {
    scenarios: pathScenarioSource({ paths, market, history, forecastDays: forecast.days, planningPaths: settings.planningPaths }),
    solver: tools.lpSolver,
    curveSteps: curveSteps(market.bidCurves?.maxOrdersPerPeriod),
    riskWeight: settings.riskWeight,
    alphas: autoAlphas(levels),
    switchStandardErrors: SCENARIO_DEFAULTS.switchStandardErrors,
  };
}
