import { relative } from 'node:path';
import { throwIfProblems, type InputProblem } from '../errors/inputError.js';
import { pathKind } from '../io/pathKind.js';
import type { RunInputFile } from '../io/writeOutputs.js';
import type { Scenario } from '../io/scenarioOf.js';
import type { BacktestInputPaths } from '../io/backtestInputData.js';
import type { InputSources, ModelSettings } from './settingSchemas.js';

/** The input files a command may read. */
export type InputName = 'market' | 'battery' | 'forecast' | 'history';

/**
 * Input paths from the files named on their own, else from `scenario` (the scenario file's, read by the
 * caller: inputFiles reads it with its schema). A missing input is a
 * command-line problem (an `optional` one is left out of the paths), a scenario entry naming a file that does not exist a problem of the scenario
 * file; all are listed together. Paths are relative to the working folder.
 */
export function inputPathsOf<N extends InputName, O extends InputName = never>(
  scenario: Scenario | undefined,
  sources: InputSources,
  names: readonly N[],
  optional: readonly O[] = [],
): { paths: Record<N, string> & Partial<Record<O, string>>; demoDay?: string } {
  const paths = {} as Record<N, string> & Partial<Record<O, string>>;
  const problems: InputProblem[] = [];
  for (const name of [...names, ...optional] as (N | O)[]) {
    const named = sources[name] === undefined ? scenario?.[name] : undefined;
    const path = sources[name] ?? (named === undefined ? undefined : relative(process.cwd(), named));
    if (path === undefined && (optional as readonly InputName[]).includes(name)) {
      continue;
    } else if (path === undefined) {
      problems.push({ file: 'command line', field: `--${name}`, message: `no ${name} file given`, fix: `give --${name} FILE, or --scenario FILE with a "${name}" entry` });
    } else if (scenario !== undefined && named !== undefined && pathKind(named) !== 'file') {
      const line = scenario.lines[name];
      const what = pathKind(named) === 'absent' ? 'which does not exist' : 'which is not a file';
      problems.push({ file: scenario.file, ...(line === undefined ? {} : { line }), field: name, message: `names ${path}, ${what}`, fix: `give the ${name} file's path relative to the scenario file, or --${name} FILE` });
    } else (paths as Record<InputName, string>)[name] = path;
  }
  throwIfProblems(problems);
  return scenario?.demoDay === undefined ? { paths } : { paths, demoDay: scenario.demoDay };
}

/** The input files of a run (the scenario file and the files it uses), for the check that no output is one of them. */
export function runInputFiles(sources: InputSources, paths: Partial<Record<InputName, string>>, more: Readonly<Record<string, string | undefined>> = {}): RunInputFile[] {
  const files: RunInputFile[] = [];
  if (sources.scenario !== undefined) files.push({ path: sources.scenario, what: 'the scenario file' });
  for (const [name, path] of Object.entries(paths)) if (path !== undefined) files.push({ path, what: `the ${name} file` });
  for (const [what, path] of Object.entries(more)) if (path !== undefined) files.push({ path, what });
  return files;
}

/** The inputs a summary lists: the files given, and with --model the method in place of a forecast file. */
export function inputsShown(paths: BacktestInputPaths, model: ModelSettings | undefined): Record<string, string> {
  const files = Object.fromEntries(Object.entries(paths).filter((entry): entry is [string, string] => entry[1] !== undefined));
  return model === undefined ? files : { ...files, model: model.method };
}
