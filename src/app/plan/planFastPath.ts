import { checkedBatterySpec } from '../../battery/batterySpecCheck.js';
import { InputError } from '../../errors/inputError.js';
import { scenarioOf, type Scenario } from '../../io/scenarioOf.js';
import { checkedScenarioFields } from '../../io/scenarioCheck.js';
import { oldFieldNote, readCheckedSpec } from '../../io/specFile.js';
import { checkedMarketSpec } from '../../market/marketSpecCheck.js';
import type { BatterySpec, MarketSpec } from '../../types.js';
import type { Done } from '../commandResult.js';
import { inputPathsOf } from '../inputPaths.js';
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
  const { s, scenario, market, battery, history } = checked;
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
  return planRun(s, parts, hooks, tools);
}

interface CheckedPlanInputs {
  readonly s: CheckedPlanSettings;
  readonly scenario: Scenario | undefined;
  readonly market: { readonly path: string; readonly value: MarketSpec; readonly text: string };
  readonly battery: { readonly path: string; readonly value: BatterySpec };
  /** Whether the plan reads the history: the market has no imbalance rule and a history is given. */
  readonly history: boolean;
}

/** The settings and the files planRun reads first, when every hand-written check accepts them; else undefined. */
function checkedPlanInputs(settings: PlanSettings): CheckedPlanInputs | undefined {
  const s = checkedPlanSettings(settings);
  if (s === undefined || onScenarios(s.policy)) return undefined;
  let scenario: Scenario | undefined;
  if (s.inputs.scenario !== undefined) {
    const read = readCheckedSpec(s.inputs.scenario, checkedScenarioFields);
    if (read === undefined) return undefined;
    scenario = scenarioOf(read.value, read.text, s.inputs.scenario);
  }
  let paths;
  try {
    paths = inputPathsOf(scenario, s.inputs, ['market', 'battery', 'forecast'], ['history']).paths;
  } catch (err) {
    if (err instanceof InputError) return undefined;
    throw err;
  }
  // The default policy plans on scenarios when there is a history (no --paths here: `scenarios` is unset).
  if (onScenarios(planPolicy(s.policy, false, paths.history !== undefined))) return undefined;
  const market = readCheckedSpec(paths.market, checkedMarketSpec);
  const battery = readCheckedSpec(paths.battery, checkedBatterySpec);
  if (market === undefined || battery === undefined) return undefined;
  return {
    s,
    scenario,
    market: { path: paths.market, ...market },
    battery: { path: paths.battery, value: battery.value },
    history: market.value.imbalance === undefined && paths.history !== undefined,
  };
}

/** Whether the policy plans on whole-day scenarios (scenarioPlan.ts), which the schema path runs. */
function onScenarios(policy: PlanSettings['policy']): boolean {
  return policy === 'curve' || policy === 'auto';
}

/** What was read for `expected`, asked for as `path`: planRun asks for the files the checks read. */
function same<T>(path: string, expected: string | undefined, value: T): T {
  if (path !== expected) throw new Error(`planFastPath: ${path} was asked for, ${expected ?? 'nothing'} was read`);
  return value;
}
