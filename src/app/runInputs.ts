import { readBacktestInputs, readBacktestInputsOnce, type BacktestInputData, type BacktestInputPaths } from '../io/readBacktestInputs.js';
import { readScenario } from '../io/readScenario.js';
import type { LevelUse } from './forecastLevels.js';
import type { ForecastMaker } from './modelForecast.js';
import type { RunHooks } from './runHooks.js';
import { readRunInputsWith, runInputPathsWith } from './runInputsWith.js';
import type { InputSources, ModelSettings } from './settingSchemas.js';

export { RUN_INPUTS, requireCoveredDay } from './runInputsWith.js';

/** runInputPathsWith with the scenario file read and checked by its schema (readScenario). */
export function runInputPaths(inputs: InputSources, model: ModelSettings | undefined): BacktestInputPaths {
  return runInputPathsWith(readScenario, inputs, model);
}

/**
 * readRunInputsWith with the files read and checked by their schemas (readBacktestInputs); `once`
 * remembers the inputs for the life of this thread (a one-thread grid's task then reads nothing again).
 */
export function readRunInputs(paths: BacktestInputPaths, use: LevelUse, maker: ForecastMaker | undefined, hooks: RunHooks, once = false): BacktestInputData {
  return readRunInputsWith(once ? readBacktestInputsOnce : readBacktestInputs, paths, use, maker, hooks);
}
