import type { MarketSpec } from '../../types.js';
import { usesScenarios, type BacktestPolicy } from '../../backtest/backtestPolicy.js';
import type { ScenarioPlanning } from '../../backtest/scenarioPlanning.js';
import type { BacktestInputData } from '../../io/readBacktestInputs.js';
import { readScenarioPaths, type ScenarioPathsFile } from '../../io/readScenarioPaths.js';
import { loadHighsSolver } from '../solver/highsSolver.js';
import { requireCurvesOffered, requireScenarioSettings, scenarioPlanningOf } from './scenarioPlanningOf.js';
import type { ScenarioSettings } from './scenarioSettings.js';

/** What a grid task (sweep, size) needs to plan the curve and auto policies in its thread: plain data, copied into every worker. */
export interface GridScenarioInput {
  readonly settings: ScenarioSettings;
  /** The paths file as the parent read and checked it, cut to the grid's days. */
  readonly paths: ScenarioPathsFile;
}

/**
 * The scenario input of a grid whose policy axis holds curve or auto: --paths read and checked once in
 * the parent, its days cut to [from, to]; undefined when no policy of the axis plans on scenarios.
 */
export function gridScenarioInput(
  policies: readonly BacktestPolicy[],
  scenarios: ScenarioSettings | undefined,
  run: { readonly market: MarketSpec; readonly marketFile: string; readonly from: string; readonly to: string; readonly policyOption: string },
): GridScenarioInput | undefined {
  requireScenarioSettings(policies, scenarios, run.policyOption);
  requireCurvesOffered(policies, run.market, run.marketFile);
  if (scenarios === undefined || !policies.some(usesScenarios)) return undefined;
  const file = readScenarioPaths(scenarios.paths, run.market);
  const days = new Map([...file.days].filter(([day]) => day >= run.from && day <= run.to));
  return { settings: scenarios, paths: { file: file.file, days } };
}

/**
 * The scenario planning of a grid task's thread: HiGHS loaded here, once per thread; a task module
 * imports this file only when a policy of its grid plans on scenarios. `data` must hold the history before the span
 * (the imbalance spread of each day is learnt from the 364 days before it).
 */
export async function gridScenarioPlanning(input: GridScenarioInput, data: BacktestInputData): Promise<ScenarioPlanning> {
  const tools = { lpSolver: await loadHighsSolver() };
  return scenarioPlanningOf(input.settings, { market: data.market, history: data.history, forecast: data.forecast, tools, paths: input.paths });
}
