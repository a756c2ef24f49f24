import { coveredDays } from '../backtest/coveredDays.js';
import { InputError, throwIfProblems, type InputProblem } from '../errors/inputError.js';
import type { BacktestInputData, BacktestInputPaths, ReadInputData } from '../io/backtestInputData.js';
import type { Scenario } from '../io/scenarioOf.js';
import { forecastLevelProblems, type LevelUse } from './forecastLevels.js';
import { inputPathsOf, type InputName } from './inputPaths.js';
import type { ForecastMaker } from './modelForecast.js';
import type { RunHooks } from './runHooks.js';
import type { InputSources, ModelSettings } from './settingSchemas.js';

/**
 * The reading of a run's inputs (backtest, sweep, size) with the readers handed in: the scenario file
 * read by `readScenario`, the spec files by `read`'s readers. runInputs.ts hands in the schema
 * readers; the backtest's fast path readers of files checked by hand (backtestFastPath.ts), so that
 * this module loads no validation library.
 */

/** The inputs of backtest, sweep and size. */
export const RUN_INPUTS: readonly InputName[] = Object.freeze(['market', 'battery', 'forecast', 'history']);

/**
 * The input paths of a run that may make its forecasts (--model): --model with a forecast file named on
 * its own is a problem; with --model the forecast file is not looked for (a scenario's is not read).
 * `readScenario` reads the scenario file when the sources name one.
 */
export function runInputPathsWith(readScenario: (file: string) => Scenario, inputs: InputSources, model: ModelSettings | undefined): BacktestInputPaths {
  const problems: InputProblem[] = [];
  if (model !== undefined && inputs.forecast !== undefined) {
    problems.push({ file: 'command line', field: '--model', message: `--model ${model.method} and --forecast ${inputs.forecast} were both given`, fix: 'give --forecast FILE to read a forecast file, or --model NAME to make the forecasts from the history, not both' });
  }
  throwIfProblems(problems);
  const scenario = inputs.scenario === undefined ? undefined : readScenario(inputs.scenario);
  return inputPathsOf(scenario, inputs, model === undefined ? RUN_INPUTS : RUN_INPUTS.filter((name) => name !== 'forecast')).paths as BacktestInputPaths;
}

/**
 * Reads and checks the inputs of a run before it starts, with `read` (readBacktestInputs or a reader
 * like it): every file problem, a history without imbalance prices, and levels the run would read
 * outside the forecast's (a quantile is never extrapolated). With `maker` (--model) the forecast is
 * made from the market and history instead of read, and its levels are checked before any fitting. An
 * old column or field name read under its new one is a note through `hooks`.
 */
export function readRunInputsWith(read: ReadInputData, paths: BacktestInputPaths, use: LevelUse, maker: ForecastMaker | undefined, hooks: RunHooks): BacktestInputData {
  if (maker !== undefined) throwIfProblems(forecastLevelProblems(maker.levels, maker.label, use));
  const data = read(paths, maker?.make, (text) => hooks.note(text));
  throwIfProblems(forecastLevelProblems(data.forecast.levels, data.forecast.file, use));
  return data;
}

/**
 * A run over a span without a day that has both a complete history and a complete forecast is bad
 * input (backtest, sweep, size): the message says which days each file has.
 */
export function requireCoveredDay(data: BacktestInputData, paths: BacktestInputPaths, from: string, to: string): void {
  if (coveredDays(data.history, data.forecast, from, to).length === 0) {
    const span = (days: readonly string[]): string => (days.length === 0 ? 'no complete day' : `complete days from ${days[0]} to ${days[days.length - 1]}`);
    const forecastDays = [...data.forecast.days.keys()].sort();
    const has = `the history has ${span(data.history.days.map((d) => d.day))}, the forecast ${span(forecastDays)}`;
    throw new InputError([
      { file: paths.history, field: '--from', message: `no day from ${from} to ${to} has both a complete history and a complete forecast (${has})`, fix: 'choose days that both files cover' },
    ]);
  }
}
