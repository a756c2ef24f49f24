/**
 * The task module of `quantbid sweep` (contract: sweep/workerPool.ts), run from its compiled copy
 * dist/backtest/sweepBacktestTask.js. `loadContext` reads the four input files once per worker thread;
 * `run` backtests one setting `{ alpha, policy, unaccepted }` and returns its row (sweepSettingRow.ts).
 */
import { batteryModel } from '../battery/batterySpec.js';
import { readBacktestInputsOnce, type BacktestInputData, type BacktestInputPaths, type GivenForecast } from '../io/readBacktestInputs.js';
import { UNACCEPTED_RULES } from '../settle/settleDay.js';
import { RunMemo, type PolicyRun } from './policyRun.js';
import type { BacktestInput } from './runBacktest.js';
import { settingNumber, settingWord } from './settingFields.js';
import type { Setting } from './sweep/sweepGrid.js';
import type { SweepRow } from './sweep/taskModule.js';
import { SWEEP_POLICIES, sweepSettingRow } from './sweepSettingRow.js';

/** The sweep's contextInput: plain data, copied into every worker. */
export interface SweepTaskInput {
  readonly paths: BacktestInputPaths;
  /** The inputs already read and checked by the parent, cut to from..to (inputDataSpan.ts); when given, no file is read. */
  readonly data?: BacktestInputData;
  /** The forecasts of --model, made once in the parent (CSV text: cheap to copy, parsed once per worker); else paths.forecast is read. */
  readonly forecast?: GivenForecast;
  /** First and last delivery day, YYYY-MM-DD, both included. */
  readonly from: string;
  readonly to: string;
}

export interface SweepTaskContext {
  readonly input: BacktestInput;
  /** Reference runs (perfect foresight, point) made once per worker. */
  readonly memo: RunMemo<PolicyRun>;
}

export function loadContext(task: SweepTaskInput): SweepTaskContext {
  const data = task.data ?? readBacktestInputsOnce(task.paths, task.forecast);
  const input: BacktestInput = { market: data.market, battery: batteryModel(data.batterySpec), history: data.history, forecast: data.forecast, from: task.from, to: task.to };
  return { input, memo: new RunMemo() };
}

export function run(setting: Setting, context: SweepTaskContext): SweepRow {
  return sweepSettingRow(
    context.input,
    {
      alpha: settingNumber(setting, 'alpha'),
      policy: settingWord(setting, 'policy', SWEEP_POLICIES),
      unaccepted: settingWord(setting, 'unaccepted', UNACCEPTED_RULES),
    },
    context.memo,
  );
}
