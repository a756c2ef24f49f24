import { InputError } from '../../errors/inputError.js';
import { readAheadGzip } from '../../io/readAhead.js';
import { scenarioOf, type Scenario } from '../../io/scenarioOf.js';
import { checkedScenarioFields } from '../../io/scenarioCheck.js';
import { oldFieldNote, readCheckedSpec } from '../../io/specFile.js';
import type { Done } from '../commandResult.js';
import { inputPathsOf } from '../inputPaths.js';
import type { RunHooks } from '../runHooks.js';
import type { CheckedPlanSettings, PlanParts, PlanSummary } from './planRun.js';
import { checkedPlanSettings } from './planSettingsCheck.js';
import type { PlanSettings, PlanTools } from './planUseCase.js';

/**
 * planUseCase as the CLI runs it, without loading the validation library when nothing is wrong: the
 * settings, the scenario file and the two spec files are checked by hand-written checks that accept
 * only what their schemas accept and return what the schemas return (planSettingsCheck.ts,
 * scenarioCheck.ts, planSpecFiles.ts); the report and the history reader are loaded only when this
 * plan needs them. Anything a check leaves to its schema (a problem to word, or scenario planning)
 * runs planUseCase itself, from the start, so its answer and every message are the schema path's. The
 * checks read the files before planUseCase would (nothing is written before): the plan then runs on
 * what they read, and the market's note is given where planUseCase gives it.
 *
 * Once the input paths are known, the forecast file is read and inflated on a thread of the pool
 * (readAhead.ts) while this thread loads the planning code (this module loads only the checks of
 * the settings and the scenario) and checks the spec files; the reader takes what was read ahead when
 * it is still the file's content, and checks it as it checks what it reads itself.
 */
export async function planFastPath(settings: PlanSettings, hooks: RunHooks, tools: PlanTools): Promise<Done<PlanSummary>> {
  const start = checkedPlanStart(settings);
  if (start === undefined) return planOnSchemas(settings, hooks, tools);
  const { s, scenario, paths } = start;
  const forecastReadAhead = readAheadGzip(paths.forecast);
  const [{ checkedPlanSpecs }, { planRun }] = await Promise.all([import('./planSpecFiles.js'), import('./planRun.js')]);
  const specs = checkedPlanSpecs(paths);
  if (specs === undefined) return planOnSchemas(settings, hooks, tools);
  const { market, battery } = specs;
  // The history is read only when the market has no imbalance rule and a history is given.
  const history = market.value.imbalance === undefined && paths.history !== undefined;
  const parts: PlanParts = {
    // Asked for only when the settings name a scenario file, which was then read.
    readScenario: (file) => same(file, s.inputs.scenario, scenario as Scenario),
    readMarketSpec: (path, note) => {
      const said = oldFieldNote(path, same(path, market.path, market.text));
      if (said !== undefined) note(said);
      return market.value;
    },
    readBatterySpec: (path) => same(path, battery.path, battery.value),
    ...(s.report ? { planReport: (await import('../../report/planReport.js')).planReport } : {}),
    ...(history ? { readPriceHistory: (await import('../../io/readPriceHistory.js')).readPriceHistory } : {}),
  };
  const readAhead = await forecastReadAhead;
  return planRun(s, readAhead === undefined ? parts : { ...parts, forecastReadAhead: readAhead }, hooks, tools);
}

/** The plan with the settings and files checked by their schemas (planUseCase), from the start. */
async function planOnSchemas(settings: PlanSettings, hooks: RunHooks, tools: PlanTools): Promise<Done<PlanSummary>> {
  const { planUseCase } = await import('./planUseCase.js');
  return planUseCase(settings, hooks, tools);
}

interface CheckedPlanStart {
  readonly s: CheckedPlanSettings;
  readonly scenario: Scenario | undefined;
  readonly paths: { readonly market: string; readonly battery: string; readonly forecast: string; readonly history?: string };
}

/** The settings, the scenario file and the input paths, when every hand-written check accepts them; else undefined. */
function checkedPlanStart(settings: PlanSettings): CheckedPlanStart | undefined {
  const s = checkedPlanSettings(settings);
  if (s === undefined || s.policy === 'curve' || s.policy === 'auto') return undefined;
  let scenario: Scenario | undefined;
  if (s.inputs.scenario !== undefined) {
    const read = readCheckedSpec(s.inputs.scenario, checkedScenarioFields);
    if (read === undefined) return undefined;
    scenario = scenarioOf(read.value, read.text, s.inputs.scenario);
  }
  try {
    return { s, scenario, paths: inputPathsOf(scenario, s.inputs, ['market', 'battery', 'forecast'], ['history']).paths };
  } catch (err) {
    if (err instanceof InputError) return undefined;
    throw err;
  }
}

/** What was read for `expected`, asked for as `path`: planRun asks for the files the checks read. */
function same<T>(path: string, expected: string | undefined, value: T): T {
  if (path !== expected) throw new Error(`planFastPath: ${path} was asked for, ${expected ?? 'nothing'} was read`);
  return value;
}
