import { readAheadGzip } from '../../io/readAhead.js';
import { planPolicy } from '../commandDefaults.js';
import type { Done } from '../commandResult.js';
import { checkedInputPaths, checkedReaders } from '../checkedInputPaths.js';
import type { RunHooks } from '../runHooks.js';
import type { PlanParts, PlanSummary } from './planRun.js';
import { checkedPlanSettings } from './planSettingsCheck.js';
import type { PlanSettings, PlanTools } from './planUseCase.js';

/**
 * planUseCase as the CLI runs it, without loading the validation library when nothing is wrong: the
 * settings, the scenario file and the two spec files are checked by hand-written checks that accept
 * only what their schemas accept and return what the schemas return (planSettingsCheck.ts,
 * checkedInputPaths.ts, checkedSpecFiles.ts); the report and the history reader are loaded only when
 * this plan needs them. Anything a check leaves to its schema (a problem to word, or scenario planning,
 * the default policy's too) runs planUseCase itself, from the start, so its answer and every message
 * are the schema path's. The checks read the files before planUseCase would (nothing is written
 * before): the plan then runs on what they read, and the market's note is given where planUseCase
 * gives it.
 *
 * Once the input paths are known, the forecast file is read and inflated on a thread of the pool
 * (readAhead.ts) while this thread loads the planning code (this module loads only the checks of
 * the settings and the scenario) and checks the spec files; the reader takes what was read ahead when
 * it is still the file's content, and checks it as it checks what it reads itself.
 *
 * `scenarioTools` loads what a plan on scenarios needs (the LP solver): it is called only on the way to
 * planUseCase with a policy that may plan on scenarios (curve, auto, or the default).
 */
export async function planFastPath(settings: PlanSettings, hooks: RunHooks, scenarioTools: () => Promise<PlanTools>): Promise<Done<PlanSummary>> {
  const s = checkedPlanSettings(settings);
  if (s === undefined || onScenarios(s.policy)) return planOnSchemas(settings, hooks, scenarioTools);
  const start = checkedInputPaths(s.inputs, ['market', 'battery', 'forecast'], ['history']);
  // The default policy plans on scenarios when there is a history (no --paths here: `scenarios` is unset).
  if (start === undefined || onScenarios(planPolicy(s.policy, false, start.paths.history !== undefined))) return planOnSchemas(settings, hooks, scenarioTools);
  const { paths } = start;
  const forecastReadAhead = readAheadGzip(paths.forecast);
  const [{ checkedSpecFiles }, { planRun }] = await Promise.all([import('../checkedSpecFiles.js'), import('./planRun.js')]);
  const specs = checkedSpecFiles(paths);
  if (specs === undefined) return planOnSchemas(settings, hooks, scenarioTools);
  // The history is read only when the market has no imbalance rule and a history is given.
  const history = specs.market.value.imbalance === undefined && paths.history !== undefined;
  const parts: PlanParts = {
    // The scenario is asked for only when the settings name a scenario file, which was then read.
    ...checkedReaders({ scenario: start.scenario, ...specs }),
    ...(s.report ? { planReport: (await import('../../report/planReport.js')).planReport } : {}),
    ...(history ? { readPriceHistory: (await import('../../io/readPriceHistory.js')).readPriceHistory } : {}),
  };
  const readAhead = await forecastReadAhead;
  // A schedule policy here (scenario plans went to the schemas above): no tools.
  return planRun(s, readAhead === undefined ? parts : { ...parts, forecastReadAhead: readAhead }, hooks, {});
}

/** The plan with the settings and files checked by their schemas (planUseCase), from the start; the tools only for a policy that may plan on scenarios. */
async function planOnSchemas(settings: PlanSettings, hooks: RunHooks, scenarioTools: () => Promise<PlanTools>): Promise<Done<PlanSummary>> {
  const { planUseCase } = await import('./planUseCase.js');
  const tools = settings.policy === undefined || onScenarios(settings.policy) ? await scenarioTools() : {};
  return planUseCase(settings, hooks, tools);
}

/** Whether the policy plans on whole-day scenarios (scenarioPlan.ts), which the schema path runs. */
function onScenarios(policy: PlanSettings['policy']): boolean {
  return policy === 'curve' || policy === 'auto';
}
