import { usesScenarios, type BacktestPolicy } from '../../backtest/backtestPolicy.js';
import type { ScenarioPlanning } from '../../backtest/scenarioPlanning.js';
import type { BacktestInputData } from '../../io/readBacktestInputs.js';
import type { ScenarioPathsFile } from '../../io/readScenarioPaths.js';
import { daysBetween } from '../../market/calendar.js';
import { loadHighsSolver } from '../solver/highsSolver.js';
import { runScenarioPaths } from './quantilePaths.js';
import { requireCurvesOffered, scenarioPlanningOf } from './scenarioPlanningOf.js';
import { scenarioSettingsSchema, type ScenarioSettings } from './scenarioSettings.js';

/** What a grid task (sweep, size) needs to plan the curve and auto policies in its thread: plain data, copied into every worker. */
export interface GridScenarioInput {
  readonly settings: ScenarioSettings;
  /** The paths as the parent read and checked them (or made them from the quantile file), cut to the grid's days. */
  readonly paths: ScenarioPathsFile;
  /** Where the paths came from (runScenarioPaths). */
  readonly source: string;
}

/**
 * The scenario input of a grid whose policy axis holds curve or auto: --paths read and checked once in
 * the parent, or the paths made there from the quantile file and the history (runScenarioPaths), for
 * the days of [from, to]; undefined when no policy of the axis plans on scenarios.
 */
export function gridScenarioInput(
  policies: readonly BacktestPolicy[],
  scenarios: ScenarioSettings | undefined,
  run: { readonly data: BacktestInputData; readonly marketFile: string; readonly from: string; readonly to: string },
): GridScenarioInput | undefined {
  const { market, history, forecast } = run.data;
  requireCurvesOffered(policies, market, run.marketFile);
  const needing = policies.filter(usesScenarios);
  if (needing.length === 0) return undefined;
  const settings = scenarios ?? scenarioSettingsSchema.parse({});
  const made = runScenarioPaths(settings, { market, history, forecastDays: forecast.days, days: daysBetween(run.from, run.to), policies: needing });
  return { settings, ...made };
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
