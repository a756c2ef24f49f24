import { checkedInputPaths, type CheckedFiles, type CheckedInputPaths } from './checkedInputPaths.js';
import { checkedSpecFiles } from './checkedSpecFiles.js';
import type { InputName } from './inputPaths.js';
import type { InputSources } from './settingSchemas.js';

export { checkedReaders } from './checkedInputPaths.js';

/**
 * The scenario file and the two spec files of a run, read and checked by the hand-written checks that
 * accept only what their schemas accept and return what the schemas return (scenarioCheck.ts,
 * marketSpecCheck.ts, batterySpecCheck.ts), for the fast paths of plan and backtest: undefined when a
 * check leaves a file to its schema, or the paths have a problem (the schema path then words it).
 */
export type CheckedInputFiles<N extends InputName, O extends InputName> = CheckedInputPaths<N, O> & CheckedFiles;

/** The files of `sources` (inputPathsOf's `names`, which hold market and battery, and `optional`) when every check accepts them; else undefined. */
export function checkedInputFiles<N extends InputName, O extends InputName = never>(sources: InputSources, names: readonly N[], optional: readonly O[] = []): CheckedInputFiles<N, O> | undefined {
  const start = checkedInputPaths(sources, names, optional);
  if (start === undefined) return undefined;
  const specs = start.paths as Partial<Record<InputName, string>>;
  if (specs.market === undefined || specs.battery === undefined) throw new Error('checkedInputFiles: the names must hold market and battery');
  const files = checkedSpecFiles({ market: specs.market, battery: specs.battery });
  return files === undefined ? undefined : { ...start, ...files };
}
