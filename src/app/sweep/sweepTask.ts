/**
 * The task module of `quantbid sweep` (contract: grid/workerPool.ts), run from its compiled copy
 * dist/app/sweep/sweepTask.js. `loadContext` takes the inputs the parent read (or reads the four
 * input files once per thread); `run` backtests one typed setting `{ alpha, policy, unaccepted }`,
 * checked when the sweep's settings were, and returns its row (backtest/sweepSettingRow.ts), or, for a
 * reference setting `{ alpha: null, policy: 'point', unaccepted }`, the reference's row. With curve
 * or auto on the policy axis, each thread loads HiGHS once (app/scenarios/gridScenarios.ts).
 */
import { batteryModel } from '../../battery/batteryModel.js';
import { RunMemo, type PolicyRun } from '../../backtest/policyRun.js';
import type { BacktestInput } from '../../backtest/runBacktest.js';
import type { ScenarioPlanning } from '../../backtest/scenarioPlanning.js';
import { sweepReferenceRow, sweepSettingRow, type SweepReferenceSetting, type SweepRow, type SweepSetting } from '../../backtest/sweepSettingRow.js';
import type { BacktestInputPaths, GivenForecast } from '../../io/readBacktestInputs.js';
import { sharedInputData, type SharedInputs } from '../../io/sharedInputs.js';
import type { GridScenarioInput } from '../scenarios/gridScenarios.js';

/** The sweep's contextInput: plain data, copied into every worker (the inputs' prices shared, not copied). */
export interface SweepTaskInput {
  readonly paths: BacktestInputPaths;
  /** The inputs already read and checked by the parent, cut to from..to (inputDataSpan.ts), shared with the workers; when given, no file is read. */
  readonly shared?: SharedInputs;
  /** The forecasts of --model, made once in the parent (CSV text: cheap to copy, parsed once per worker); else paths.forecast is read. */
  readonly forecast?: GivenForecast;
  /** First and last delivery day, YYYY-MM-DD, both included. */
  readonly from: string;
  readonly to: string;
  /** The paths and settings of curve and auto, when the policy axis holds either. */
  readonly scenarios?: GridScenarioInput;
}

export interface SweepTaskContext {
  readonly input: BacktestInput;
  /** Reference runs (perfect foresight, point, price-taking) made once per thread and rule. */
  readonly memo: RunMemo<PolicyRun>;
  readonly scenarioPlanning: ScenarioPlanning | null;
}

export async function loadContext(task: SweepTaskInput): Promise<SweepTaskContext> {
  // The readers (and their schemas) load only where the inputs were not handed over.
  const data = task.shared !== undefined ? sharedInputData(task.shared) : (await import('../../io/readBacktestInputs.js')).readBacktestInputsOnce(task.paths, task.forecast);
  const input: BacktestInput = { market: data.market, battery: batteryModel(data.batterySpec), history: data.history, forecast: data.forecast, from: task.from, to: task.to };
  return { input, memo: new RunMemo(), scenarioPlanning: task.scenarios === undefined ? null : await (await import('../scenarios/gridScenarios.js')).gridScenarioPlanning(task.scenarios, data) };
}

export function run(setting: SweepSetting | SweepReferenceSetting, context: SweepTaskContext): SweepRow {
  if (setting.alpha === null) return sweepReferenceRow(context.input, setting as SweepReferenceSetting, context.memo);
  return sweepSettingRow(context.input, setting as SweepSetting, context.memo, context.scenarioPlanning);
}
