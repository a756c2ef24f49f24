import { readScenario } from '../io/readScenario.js';
import { inputPathsOf, type InputName } from './inputPaths.js';
import type { InputSources } from './settingSchemas.js';

export { inputsShown, runInputFiles, type InputName } from './inputPaths.js';

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
