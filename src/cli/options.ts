/**
 * The options several commands share, each defined once: its flag, its value parser (commander's
 * InvalidArgumentError: exit code 2, `command line: --x: "v" is not accepted: ...`) and, where the
 * words are the same for every command, its help text. A command adds them in the order its help
 * lists them; the rules behind the parsers are the app's (app/settingRules.ts, app/vocabulary.ts).
 */
import { InvalidArgumentError, Option, type Command } from 'commander';
import { InputError, throwIfProblems, type InputProblem } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';
import type { InputName } from '../app/inputFiles.js';
import { FORECAST_DEFAULTS, MODEL_DEFAULTS } from '../app/commandDefaults.js';
import { decimalOf, levelsFromText, outFolderProblem, pathProblem, rangeProblem, RUN_LIMITS, spanProblem } from '../app/settingRules.js';
import type { InputSources, ModelSettings } from '../app/settingSchemas.js';
import type { ScenarioSettingsInput } from '../app/scenarios/scenarioSettings.js';
import { ALPHA_RULE, FORECAST_METHODS, isAlpha, isValidDay, SCENARIO_DEFAULTS, UNACCEPTED_RULES, type ForecastMethod, type UnacceptedRule } from '../app/vocabulary.js';

// ---- value parsers ----

export function dayArg(value: string): string {
  if (!isValidDay(value)) throw new InvalidArgumentError(`"${shownText(value)}" is not a day; write it as YYYY-MM-DD, e.g. 2027-03-28`);
  return value;
}

export function alphaArg(value: string): number {
  const alpha = decimalOf(value);
  if (!isAlpha(alpha)) {
    throw new InvalidArgumentError(`alpha ${shownText(value)} must be ${ALPHA_RULE}: the tail level, buys limited at q(1 - alpha) and sells at q(alpha), e.g. 0.1`);
  }
  return alpha;
}

/**
 * A number in [lo, hi] (a whole number when `whole`), e.g. `--life-years 15` or `--capex-per-mwh
 * 180000`; the ranges are the app's (RUN_LIMITS), so the flags and the settings refuse the same values.
 */
export function rangeArg(limits: readonly [number, number], example: string, whole = false): (value: string) => number {
  return (value) => {
    const x = decimalOf(value);
    const problem = rangeProblem(x, limits, whole);
    if (problem !== null) throw new InvalidArgumentError(`"${shownText(value)}" ${problem}, e.g. ${example}`);
    return x;
  };
}

export function oneOf<T extends string>(allowed: readonly T[]): (value: string) => T {
  return (value: string) => {
    if (!(allowed as readonly string[]).includes(value)) throw new InvalidArgumentError(`"${shownText(value)}" must be one of ${allowed.join(', ')}`);
    return value as T;
  };
}

/** A file or folder path: anything but empty (an unset shell variable gives an empty argument). */
export function pathArg(value: string): string {
  const problem = pathProblem(value);
  if (problem !== null) throw new InvalidArgumentError(problem);
  return value;
}

/** `--levels`: a range start:end:step or a list, each level in LEVEL_RANGE_TEXT, increasing. */
export function levelsArg(value: string): number[] {
  const parsed = levelsFromText(value);
  if ('problem' in parsed) throw new InvalidArgumentError(parsed.problem);
  return parsed.levels;
}

// ---- options ----

/**
 * `--out`, the folder a command writes into, for every command: an empty path and the root folder are
 * refused here, an existing file where the folder belongs when the folder is checked (exit code 2
 * either way). With `folder-or-csv-file`, `--out` may also name the CSV file itself (forecast).
 */
export function outOption(description: string, form: 'folder' | 'folder-or-csv-file' = 'folder'): Option {
  const flags = form === 'folder' ? '--out <dir>' : '--out <dir|file.csv>';
  return new Option(flags, description).argParser((value: string) => {
    const problem = outFolderProblem(value, form);
    if (problem !== null) throw new InvalidArgumentError(problem);
    return value;
  });
}

export function forceOption(description = 'overwrite existing outputs'): Option {
  return new Option('--force', description);
}

export function jsonOption(description = 'print the summary as JSON on stdout'): Option {
  return new Option('--json', description);
}

export function reportOption(description: string): Option {
  return new Option('--report', description);
}

export function quietOption(): Option {
  return new Option('--quiet', 'no progress bar and no notes on stderr, even on a terminal');
}

/** `--from` and `--to` of a command that runs over a span of delivery days. */
export function spanOptions(): [Option, Option] {
  return [new Option('--from <YYYY-MM-DD>', 'first delivery day (required)').argParser(dayArg), new Option('--to <YYYY-MM-DD>', 'last delivery day, included (required)').argParser(dayArg)];
}

export function alphaOption(description: string, defaultAlpha: number): Option {
  return new Option('--alpha <a>', description).argParser(alphaArg).default(defaultAlpha);
}

/** `--unaccepted <rule>`: one rule for unaccepted orders. */
export function unacceptedOption(description: string, defaultRule: UnacceptedRule): Option {
  return new Option('--unaccepted <rule>', description).argParser(oneOf<UnacceptedRule>(UNACCEPTED_RULES)).default(defaultRule);
}

/** Adds the options the grid commands share, in this order: the span, --threads, --restart, --quiet, --out, --force, --json. */
export function addGridOptions(command: Command, table: string): Command {
  const [from, to] = spanOptions();
  return command
    .addOption(from)
    .addOption(to)
    .addOption(new Option('--threads <n>', 'threads running settings, this one included; 1 runs without workers (default: the number of CPUs)').argParser(rangeArg(RUN_LIMITS.threads, '2', true)))
    .option('--restart', `discard the journal of an interrupted run in --out and start over (default: resume it)`)
    .addOption(quietOption())
    .addOption(outOption(`folder for ${table} and summary.json (required)`))
    .addOption(forceOption())
    .addOption(jsonOption('print summary.json on stdout'));
}

/** The input-file options every command shares. */
export interface InputFlags {
  readonly scenario?: string;
  readonly market?: string;
  readonly battery?: string;
  readonly forecast?: string;
  readonly history?: string;
}

const INPUT_HELP: Readonly<Record<InputName, string>> = {
  market: 'market spec JSON (time zone, period length, price floor and cap)',
  battery: 'battery spec JSON (energy, power, efficiency, state-of-charge window)',
  forecast: 'quantile forecast CSV, wide or long layout (.csv or .csv.gz)',
  history: 'price history CSV: period_start,price[,imbalance_price,...] (.csv or .csv.gz)',
};

/** Adds --scenario and the input files `names`, in that order. */
export function addInputOptions(command: Command, names: readonly InputName[]): Command {
  command.option('--scenario <file>', 'scenario JSON naming the input files (paths relative to it)', pathArg);
  for (const name of names) command.option(`--${name} <file>`, `${INPUT_HELP[name]}; overrides the scenario's`, pathArg);
  return command;
}

/** The input files of the flags, for a use case's settings. */
export function inputSources(flags: InputFlags): InputSources {
  const sources: Record<string, string> = {};
  for (const name of ['scenario', 'market', 'battery', 'forecast', 'history'] as const) {
    const value = flags[name];
    if (value !== undefined) sources[name] = value;
  }
  return sources;
}

/** The options of backtest, sweep and size that make the forecasts from the history instead of reading a file. */
export interface ModelFlags {
  /** `--model NAME`: a forecast method of `quantbid forecast`. */
  readonly model?: ForecastMethod;
  /** `--levels`: the levels to forecast; default MODEL_DEFAULTS.levels. */
  readonly levels?: readonly number[];
  /** `--forecast-cache DIR` (a string), `--no-forecast-cache` (false), or neither (undefined: the default folder). */
  readonly forecastCache?: string | false;
}

/** Adds --model, --levels, --forecast-cache DIR and --no-forecast-cache. */
export function addModelOptions(command: Command): Command {
  return command
    .option('--model <name>', `make the forecasts from the history, day by day, each from what is known at gate closure the day before, instead of reading --forecast: ${FORECAST_METHODS.join(' | ')}`, oneOf<ForecastMethod>(FORECAST_METHODS))
    .addOption(new Option('--levels <list>', `with --model: quantile levels, a range start:end:step or a list (default ${MODEL_DEFAULTS.levels})`).argParser(levelsArg))
    .option('--forecast-cache <dir>', `with --model: folder of the cache of forecast days, so that a day is fitted once (default ${MODEL_DEFAULTS.cacheDir})`, pathArg)
    .option('--no-forecast-cache', 'with --model: neither read nor write the forecast cache');
}

/**
 * The model settings of the flags. The model's options without --model are a problem; so is --model
 * with --forecast, which the use case finds (it knows a scenario's forecast is then not read).
 */
export function modelSettings(flags: ModelFlags): ModelSettings | undefined {
  const problems: InputProblem[] = [];
  if (flags.model === undefined) {
    if (flags.levels !== undefined) problems.push({ file: 'command line', field: '--levels', message: 'is used only with --model', fix: 'add --model NAME, or leave --levels out (a forecast file brings its own levels)' });
    if (flags.forecastCache !== undefined) problems.push({ file: 'command line', field: flags.forecastCache === false ? '--no-forecast-cache' : '--forecast-cache', message: 'is used only with --model', fix: 'add --model NAME, or leave the option out' });
  }
  throwIfProblems(problems);
  if (flags.model === undefined) return undefined;
  return { method: flags.model, ...(flags.levels === undefined ? {} : { levels: [...flags.levels] }), ...(flags.forecastCache === undefined ? {} : { cache: flags.forecastCache }) };
}

/**
 * --from, --to (not before --from) and --out of any command that runs over a span of days; every
 * missing one is listed together. `days` names the days ("delivery day to forecast"), `outFolder`
 * what the --out folder receives.
 */
export function requireSpanAndOut(
  flags: { readonly from?: string; readonly to?: string; readonly out?: string },
  texts: { readonly days: string; readonly outFolder: string },
): { from: string; to: string; out: string } {
  const problems: InputProblem[] = [];
  const need = (value: string | undefined, option: string, fix: string): string => {
    if (value === undefined) problems.push({ file: 'command line', field: option, message: `no ${option} given`, fix });
    return value ?? '';
  };
  const from = need(flags.from, '--from', `give --from YYYY-MM-DD, the first ${texts.days}`);
  const to = need(flags.to, '--to', `give --to YYYY-MM-DD, the last ${texts.days}`);
  const out = need(flags.out, '--out', `give --out DIR, the folder for ${texts.outFolder}`);
  const span = problems.length === 0 ? spanProblem(from, to) : null;
  if (span !== null) problems.push({ file: 'command line', field: '--to', message: span, fix: from > to ? 'give a --to on or after --from' : 'give --from and --to within the data and closer together' });
  if (problems.length > 0) throw new InputError(problems);
  return { from, to, out };
}

/** `--path-seed N`: a whole number from 0 to 2^32 - 1. */
export function parseSeedArg(value: string): number {
  const seed = Number(value);
  if (!/^\d+$/.test(value.trim()) || seed > 2 ** 32 - 1) throw new InvalidArgumentError(`"${shownText(value)}" must be a whole number from 0 to 4294967295`);
  return seed;
}

/** The options of the curve and auto policies. */
export interface ScenarioFlags {
  /** `--paths FILE`: whole-day price paths per day. */
  readonly paths?: string;
  /** `--planning-paths N`. */
  readonly planningPaths?: number;
  /** `--risk-weight X`. */
  readonly riskWeight?: number;
  /** `--path-seed N`: seed of the paths made from the quantile file (without --paths). */
  readonly pathSeed?: number;
}

/** Adds --paths, --path-seed, --planning-paths and --risk-weight (the policies curve and auto). */
export function addScenarioOptions(command: Command): Command {
  return command
    .option('--paths <file>', 'with --policy curve or auto: whole-day price paths per day, period_start,path,price (quantbid forecast --paths 364 writes them); without it they are made from the quantile file and the history (Schaake shuffle)', pathArg)
    .option('--path-seed <N>', `without --paths: seed of the paths made from the quantile file; the same seed and inputs give the same paths (default ${FORECAST_DEFAULTS.pathSeed})`, parseSeedArg)
    .option('--planning-paths <n>', `paths the curves are planned on; the day's other paths, half and half, check the curves and score every candidate (default ${SCENARIO_DEFAULTS.planningPaths}; made from the quantile file: three times as many per day)`, rangeArg(RUN_LIMITS.planningPaths, '100', true))
    .option('--risk-weight <x>', `lambda >= 0: choose by mean profit + lambda x CVaR 5 % (the mean of the worst 5 % of paths) (default ${SCENARIO_DEFAULTS.riskWeight})`, rangeArg(RUN_LIMITS.riskWeight, '0.5'));
}

/** The scenario settings of the flags, undefined when none is given; --path-seed with --paths is a problem (a paths file is not drawn here). */
export function scenarioSettings(flags: ScenarioFlags): ScenarioSettingsInput | undefined {
  if (flags.paths !== undefined && flags.pathSeed !== undefined) {
    throw new InputError([{ file: 'command line', field: '--path-seed', message: 'is used only without --paths (it seeds the paths made from the quantile file)', fix: 'leave out --path-seed, or --paths' }]);
  }
  if (flags.paths === undefined && flags.pathSeed === undefined && flags.planningPaths === undefined && flags.riskWeight === undefined) return undefined;
  return {
    ...(flags.paths === undefined ? {} : { paths: flags.paths }),
    ...(flags.pathSeed === undefined ? {} : { pathSeed: flags.pathSeed }),
    ...(flags.planningPaths === undefined ? {} : { planningPaths: flags.planningPaths }),
    ...(flags.riskWeight === undefined ? {} : { riskWeight: flags.riskWeight }),
  };
}
