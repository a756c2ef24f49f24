import type { Done } from '../commandResult.js';
import { checkedInputFiles, checkedReaders, type CheckedInputFiles } from '../checkedInputFiles.js';
import type { RunHooks } from '../runHooks.js';
import { planPolicy, planRun, type CheckedPlanSettings, type PlanParts, type PlanSummary } from './planRun.js';
import { checkedPlanSettings } from './planSettingsCheck.js';
import type { PlanSettings, PlanTools } from './planUseCase.js';

/**
 * planUseCase as the CLI runs it, without loading the validation library when nothing is wrong: the
 * settings, the scenario file and the two spec files are checked by hand-written checks that accept
 * only what their schemas accept and return what the schemas return (planSettingsCheck.ts,
 * scenarioCheck.ts, marketSpecCheck.ts, batterySpecCheck.ts); the report and the history reader are
 * loaded only when this plan needs them. Anything a check leaves to its schema (a problem to word, or
 * scenario planning) runs planUseCase itself, from the start, so its answer and every message are
 * the schema path's. The checks read the files before planUseCase would (nothing is written before):
 * the plan then runs on what they read, and the market's note is given where planUseCase gives it.
 */
export async function planFastPath(settings: PlanSettings, hooks: RunHooks, tools: PlanTools): Promise<Done<PlanSummary>> {
  const checked = checkedPlanInputs(settings);
  if (checked === undefined) {
    const { planUseCase } = await import('./planUseCase.js');
    return planUseCase(settings, hooks, tools);
  }
  const { s, files } = checked;
  const parts: PlanParts = {
    // The scenario is asked for only when the settings name a scenario file, which was then read.
    ...checkedReaders(files),
    ...(s.report ? { planReport: (await import('../../report/planReport.js')).planReport } : {}),
    ...(files.market.value.imbalance === undefined && files.paths.history !== undefined ? { readPriceHistory: (await import('../../io/readPriceHistory.js')).readPriceHistory } : {}),
  };
  return planRun(s, parts, hooks, tools);
}

/** The settings and the files planRun reads first, when every hand-written check accepts them; else undefined. */
function checkedPlanInputs(settings: PlanSettings): { readonly s: CheckedPlanSettings; readonly files: CheckedInputFiles<'market' | 'battery' | 'forecast', 'history'> } | undefined {
  const s = checkedPlanSettings(settings);
  if (s === undefined || onScenarios(s.policy)) return undefined;
  const files = checkedInputFiles(s.inputs, ['market', 'battery', 'forecast'], ['history']);
  // The default policy plans on scenarios when there is a history (no --paths here: `scenarios` is unset).
  if (files === undefined || onScenarios(planPolicy(s.policy, false, files.paths.history !== undefined))) return undefined;
  return { s, files };
}

/** Whether the policy plans on whole-day scenarios (scenarioPlan.ts), which the schema path runs. */
function onScenarios(policy: PlanSettings['policy']): boolean {
  return policy === 'curve' || policy === 'auto';
}
