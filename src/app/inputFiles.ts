import { readScenario } from '../io/readScenario.js';
import { inputPathsOf, type InputName } from './inputPaths.js';
import type { BacktestInputPaths } from '../io/readBacktestInputs.js';
import type { InputSources, ModelSettings } from './settingSchemas.js';

export { runInputFiles, type InputName } from './inputPaths.js';

/**
 * Input paths from the files named on their own, else from the scenario file (inputPathsOf), the
 * scenario file read and checked here.
 */
export function inputFiles<N extends InputName, O extends InputName = never>(
  sources: InputSources,
  names: readonly N[],
  optional: readonly O[] = [],
): ReturnType<typeof inputPathsOf<N, O>> {
  return inputPathsOf(sources.scenario === undefined ? undefined : readScenario(sources.scenario), sources, names, optional);
}

/** The inputs a summary lists: the files given, and with --model the method in place of a forecast file. */
export function inputsShown(paths: BacktestInputPaths, model: ModelSettings | undefined): Record<string, string> {
  const files = Object.fromEntries(Object.entries(paths).filter((entry): entry is [string, string] => entry[1] !== undefined));
  return model === undefined ? files : { ...files, model: model.method };
}
