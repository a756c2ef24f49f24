import { existsSync, statSync } from 'node:fs';
import { relative } from 'node:path';
import type { Command } from 'commander';
import { throwIfProblems, type InputProblem } from '../errors/inputError.js';
import { readScenario } from '../io/readScenario.js';
import { parsePathArg } from './argParsers.js';

/** The input-file options every command shares. */
export interface InputFlags {
  readonly scenario?: string;
  readonly market?: string;
  readonly battery?: string;
  readonly forecast?: string;
  readonly history?: string;
}

export type InputName = 'market' | 'battery' | 'forecast' | 'history';

export function addInputOptions(command: Command, names: readonly InputName[]): Command {
  command.option('--scenario <file>', 'scenario JSON naming the input files (paths relative to it)', parsePathArg);
  const help: Record<InputName, string> = {
    market: 'market spec JSON (time zone, period length, price floor and cap)',
    battery: 'battery spec JSON (energy, power, efficiency, state-of-charge window)',
    forecast: 'quantile forecast CSV, wide or long layout (.csv or .csv.gz)',
    history: 'price history CSV: period_start,price[,fallback_price,...] (.csv or .csv.gz)',
  };
  for (const name of names) command.option(`--${name} <file>`, `${help[name]}; overrides the scenario's`, parsePathArg);
  return command;
}

/**
 * Input paths from explicit flags, else from the scenario file. A missing input is a command-line
 * problem, a scenario entry naming a file that does not exist a problem of the scenario file; all are
 * listed together.
 */
export function resolveInputs<N extends InputName>(flags: InputFlags, names: readonly N[]): { paths: Record<N, string>; demoDay?: string } {
  const scenario = flags.scenario === undefined ? undefined : readScenario(flags.scenario);
  const paths = {} as Record<N, string>;
  const problems: InputProblem[] = [];
  for (const name of names) {
    const named = flags[name] === undefined ? scenario?.[name] : undefined;
    const path = flags[name] ?? (named === undefined ? undefined : relative(process.cwd(), named));
    if (path === undefined) {
      problems.push({ file: 'command line', field: `--${name}`, message: `no ${name} file given`, fix: `give --${name} FILE, or --scenario FILE with a "${name}" entry` });
    } else if (scenario !== undefined && named !== undefined && !isFile(named)) {
      const line = scenario.lines[name];
      const what = existsSync(named) ? 'which is not a file' : 'which does not exist';
      problems.push({ file: scenario.file, ...(line === undefined ? {} : { line }), field: name, message: `names ${path}, ${what}`, fix: `give the ${name} file's path relative to the scenario file, or --${name} FILE` });
    } else paths[name] = path;
  }
  throwIfProblems(problems);
  return scenario?.demoDay === undefined ? { paths } : { paths, demoDay: scenario.demoDay };
}

function isFile(path: string): boolean {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}
