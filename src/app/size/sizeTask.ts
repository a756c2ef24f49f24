/**
 * The task module of `quantbid size` (contract: grid/workerPool.ts), run from its compiled copy
 * dist/app/size/sizeTask.js. `loadContext` takes the inputs the parent read (or reads the four input
 * files once per thread); `run` backtests one typed setting `{ energy_mwh, power_mw,
 * round_trip_efficiency, policy }`, checked when the sizing's settings were, and returns its row with
 * the project economics (sizing/sizeSettingRow.ts). With curve or auto on the policy axis, each thread
 * loads HiGHS once (app/scenarios/gridScenarios.ts).
 */
import type { BacktestInputPaths, GivenForecast } from '../../io/readBacktestInputs.js';
import { sharedInputData, type SharedInputs } from '../../io/sharedInputs.js';
import type { UnacceptedRule } from '../../settle/settleDay.js';
import { RunMemo, type PolicyRun } from '../../backtest/policyRun.js';
import type { AlphaMode } from '../../sizing/alphaChoice.js';
import type { SizeCosts } from '../../sizing/sizeEconomics.js';
import { sizeSettingRow, type SizeGridSetting, type SizeRow, type SizeStudy } from '../../sizing/sizeSettingRow.js';
import type { GridScenarioInput } from '../scenarios/gridScenarios.js';

/** The sizing's contextInput: plain data, copied into every worker (the inputs' prices shared, not copied). */
export interface SizeTaskInput {
  readonly paths: BacktestInputPaths;
  /** The inputs already read and checked by the parent, cut to from..to (inputDataSpan.ts), shared with the workers; when given, no file is read. */
  readonly shared?: SharedInputs;
  /** The forecasts of --model, made once in the parent (CSV text: cheap to copy, parsed once per worker); else paths.forecast is read. */
  readonly forecast?: GivenForecast;
  readonly from: string;
  readonly to: string;
  readonly alpha: AlphaMode;
  readonly unaccepted: UnacceptedRule;
  readonly costs: SizeCosts;
  /** Whether the efficiency axis replaces the spec's efficiencies (--efficiency given). */
  readonly efficiencyGiven: boolean;
  /** The paths and settings of curve and auto, when the policy axis holds either. */
  readonly scenarios?: GridScenarioInput;
}

export interface SizeTaskContext {
  readonly study: SizeStudy;
  readonly efficiencyGiven: boolean;
  /** Perfect-foresight runs per size, made once per worker where settings of one size meet. */
  readonly memo: RunMemo<PolicyRun>;
}

export async function loadContext(task: SizeTaskInput): Promise<SizeTaskContext> {
  // The readers (and their schemas) load only where the inputs were not handed over.
  const data = task.shared !== undefined ? sharedInputData(task.shared) : (await import('../../io/readBacktestInputs.js')).readBacktestInputsOnce(task.paths, task.forecast);
  const study: SizeStudy = {
    market: data.market,
    batterySpec: data.batterySpec,
    history: data.history,
    forecast: data.forecast,
    from: task.from,
    to: task.to,
    alpha: task.alpha,
    unaccepted: task.unaccepted,
    costs: task.costs,
    scenarioPlanning: task.scenarios === undefined ? null : await (await import('../scenarios/gridScenarios.js')).gridScenarioPlanning(task.scenarios, data),
  };
  return { study, efficiencyGiven: task.efficiencyGiven, memo: new RunMemo() };
}

export function run(setting: SizeGridSetting, context: SizeTaskContext): SizeRow {
  const size = { energyMwh: setting.energy_mwh, powerMw: setting.power_mw, ...(context.efficiencyGiven ? { roundTripEfficiency: setting.round_trip_efficiency } : {}) };
  return sizeSettingRow(context.study, { ...size, policy: setting.policy }, context.memo);
}
