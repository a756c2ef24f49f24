import { usesScenarios } from '../../backtest/backtestPolicy.js';
import type { Done } from '../commandResult.js';
import { checkedInputFiles, checkedReaders } from '../checkedInputFiles.js';
import type { RunHooks } from '../runHooks.js';
import { RUN_INPUTS } from '../runInputsWith.js';
import type { ScenarioTools } from '../scenarios/scenarioPlanningOf.js';
import { backtestRun, type BacktestParts, type BacktestSummary } from './backtestRun.js';
import { checkedBacktestSettings } from './backtestSettingsCheck.js';
import type { BacktestSettings } from './backtestUseCase.js';

/**
 * backtestUseCase as the CLI runs it, without loading the validation library when nothing is wrong
 * (some 100 ms of a year's backtest: the library's modules and its first checks): the settings, the
 * scenario file and the two spec files are checked by hand-written checks that accept only what their
 * schemas accept and return what the schemas return (backtestSettingsCheck.ts, checkedInputFiles.ts).
 * Anything a check leaves to its schema (a problem to word, --model, or the scenario policies curve and
 * auto) runs backtestUseCase itself, from the start, so its answer and every message are the schema
 * path's. The checks read the spec files before backtestUseCase would (nothing is written before):
 * the backtest then runs on what they read.
 */
export async function backtestFastPath(settings: BacktestSettings, hooks: RunHooks, tools: ScenarioTools): Promise<Done<BacktestSummary>> {
  const s = checkedBacktestSettings(settings);
  const files = s === undefined || s.policies.some(usesScenarios) ? undefined : checkedInputFiles(s.inputs, RUN_INPUTS);
  if (s === undefined || files === undefined) {
    const { backtestUseCase } = await import('./backtestUseCase.js');
    return backtestUseCase(settings, hooks, tools);
  }
  const parts: BacktestParts = {
    ...checkedReaders(files),
    defaultScenarioSettings: () => {
      throw new Error('backtestFastPath: a backtest without curve or auto asked for scenario settings');
    },
  };
  return backtestRun(s, parts, hooks, tools);
}
