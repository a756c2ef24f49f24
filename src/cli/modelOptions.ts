import { Option, type Command } from 'commander';
import { DEFAULTS, FORECAST_METHODS, type ForecastMethod } from '../forecast/forecaster.js';
import { NO_STORE, storedForecastRange } from '../forecast/storedForecastRange.js';
import { DayCalendar } from '../market/dayCalendar.js';
import { DEFAULT_FORECAST_CACHE_DIR, ForecastCache } from '../io/forecastCache.js';
import { InputError, throwIfProblems, type InputProblem } from '../errors/inputError.js';
import { quantileForecastCsv } from '../io/quantileForecastCsv.js';
import type { BacktestInputPaths, MakeForecast } from '../io/readBacktestInputs.js';
import { parseQuantileForecast, type QuantileForecastFile } from '../io/readQuantileForecast.js';
import type { MarketSpec, PriceHistory } from '../types.js';
import { oneOf, parsePathArg } from './argParsers.js';
import type { CliIo } from './cliIo.js';
import { FORECAST_COMMAND_DEFAULTS } from './forecastCommand.js';
import { resolveInputs, type InputFlags, type InputName } from './inputOptions.js';
import { parseLevelsArg } from './levelsArg.js';
import { createProgress } from './progress.js';
import { packageVersion } from './version.js';

/** The options of backtest, sweep and size that make the forecasts from the history instead of reading a file. */
export interface ModelFlags {
  /** `--model NAME`: a forecast method of `quantbid forecast`. */
  readonly model?: ForecastMethod;
  /** `--levels`: the levels to forecast; default MODEL_DEFAULTS.levels. */
  readonly levels?: readonly number[];
  /** `--forecast-cache DIR` (a string), `--no-forecast-cache` (false), or neither (undefined: the default folder). */
  readonly forecastCache?: string | false;
  /** `--forecast FILE`, which --model replaces. */
  readonly forecast?: string;
  /** `--quiet`: no progress bar. */
  readonly quiet?: boolean;
}

/** Defaults: the levels of `quantbid forecast`, the cache in `.quantbid-cache/forecasts` of the working folder. */
export const MODEL_DEFAULTS = Object.freeze({ levels: FORECAST_COMMAND_DEFAULTS.levels, cacheDir: DEFAULT_FORECAST_CACHE_DIR });

/** Adds --model, --levels, --forecast-cache DIR and --no-forecast-cache. */
export function addModelOptions(command: Command): Command {
  return command
    .option('--model <name>', `make the forecasts from the history, day by day, each from what is known at gate closure the day before, instead of reading --forecast: ${FORECAST_METHODS.join(' | ')}`, oneOf<ForecastMethod>(FORECAST_METHODS))
    .addOption(new Option('--levels <list>', `with --model: quantile levels, a range start:end:step or a list (default ${MODEL_DEFAULTS.levels})`).argParser(parseLevelsArg))
    .option('--forecast-cache <dir>', `with --model: folder of the cache of forecast days, so that a day is fitted once (default ${MODEL_DEFAULTS.cacheDir})`, parsePathArg)
    .option('--no-forecast-cache', 'with --model: neither read nor write the forecast cache');
}

/** Problems of the model options: --model with --forecast, and the model's options without --model. */
export function modelFlagProblems(flags: ModelFlags): InputProblem[] {
  const problems: InputProblem[] = [];
  if (flags.model !== undefined && flags.forecast !== undefined) {
    problems.push({ file: 'command line', field: '--model', message: `--model ${flags.model} and --forecast ${flags.forecast} were both given`, fix: 'give --forecast FILE to read a forecast file, or --model NAME to make the forecasts from the history, not both' });
  }
  if (flags.model === undefined) {
    if (flags.levels !== undefined) problems.push({ file: 'command line', field: '--levels', message: 'is used only with --model', fix: 'add --model NAME, or leave --levels out (a forecast file brings its own levels)' });
    if (flags.forecastCache !== undefined) problems.push({ file: 'command line', field: flags.forecastCache === false ? '--no-forecast-cache' : '--forecast-cache', message: 'is used only with --model', fix: 'add --model NAME, or leave the option out' });
  }
  return problems;
}

/** Forecasts made by --model for a run, in every form the commands need. */
export interface ModelForecast {
  /** The wide quantile CSV, byte for byte what `quantbid forecast` writes for these days. */
  readonly csv: string;
  /** Name of the forecast in messages, e.g. `--model arx-hs`. */
  readonly label: string;
  /** The CSV read back as a forecast file is read: a backtest sees exactly what it would see from the file. */
  readonly file: QuantileForecastFile;
  /** For summary.json: method, levels, options, days forecast and skipped (the same in every run). */
  readonly summary: ModelForecastSummary;
  /** What the forecasts depend on besides the history file, for a sweep's resume fingerprint. */
  readonly identity: { readonly method: ForecastMethod; readonly levels: readonly number[]; readonly options: unknown; readonly version: string };
  /** One line for the human summary: days fitted, taken from the cache, cache entries refitted. */
  readonly note: string;
}

export interface ModelForecastSummary {
  readonly method: ForecastMethod;
  readonly levels: readonly number[];
  readonly options: typeof DEFAULTS;
  readonly daysForecast: number;
  readonly skippedDays: readonly { readonly day: string; readonly reason: string }[];
}

/**
 * Forecasts the history days from `from` to `to` with --model (storedForecastRange through the
 * cache unless --no-forecast-cache), with a progress bar on stderr, and reads them back through the
 * forecast file parser. No day forecast is an input error (exit code 2).
 */
export function makeModelForecast(flags: ModelFlags & { readonly model: ForecastMethod }, market: MarketSpec, history: PriceHistory, historyFile: string, from: string, to: string, io: CliIo): ModelForecast {
  const method = flags.model;
  const levels = modelLevels(flags);
  const cache = flags.forecastCache === false ? undefined : new ForecastCache(flags.forecastCache ?? MODEL_DEFAULTS.cacheDir, (message) => {
    if (flags.quiet !== true) io.stderr(message);
  });
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const label = `--model ${method}`;
  const progress = createProgress(io, { total: history.days.filter((d) => d.day >= from && d.day <= to).length, label: 'forecast', quiet: flags.quiet === true });
  const result = storedForecastRange(
    history,
    { from, to, method, levels, priceFloor: market.priceFloor, priceCap: market.priceCap, periodsOf: (day) => calendar.periods(day) },
    { market: { timeZone: market.timeZone, periodMinutes: market.periodMinutes, priceFloor: market.priceFloor, priceCap: market.priceCap }, softwareVersion: packageVersion() },
    {},
    cache ?? NO_STORE,
    (done) => progress.update(done),
  );
  progress.finish();
  if (result.forecasts.length === 0) {
    const first = result.skipped[0];
    throw new InputError([
      {
        file: historyFile,
        field: '--model',
        message: `${method} could forecast no day from ${from} to ${to} (${result.skipped.length} history days skipped${first === undefined ? '' : `; ${first.day}: ${first.reason}`})`,
        fix: 'choose days the history covers, after enough history for the method',
      },
    ]);
  }
  const csv = quantileForecastCsv(result.forecasts);
  const count = (n: number, what: string): string => `${n} ${what}${n === 1 ? '' : 's'}`;
  const damaged = cache === undefined || cache.rejected === 0 ? '' : `, ${cache.rejected} damaged cache ${cache.rejected === 1 ? 'entry' : 'entries'} made again`;
  const cacheText = cache === undefined ? 'no cache' : `${result.daysFromStore} from the cache ${cache.dir}${damaged}`;
  return {
    csv,
    label,
    file: parseQuantileForecast(csv, label, market),
    summary: { method, levels: [...levels], options: DEFAULTS, daysForecast: result.forecasts.length, skippedDays: result.skipped },
    identity: { method, levels: [...levels], options: DEFAULTS, version: packageVersion() },
    note: `forecasts: ${method} at ${levels.length} levels, ${count(result.forecasts.length, 'day')} forecast, ${result.skipped.length} skipped; ${count(result.daysFitted, 'day')} fitted, ${cacheText}\n`,
  };
}

/** The levels --model forecasts: --levels, else the default. */
export function modelLevels(flags: ModelFlags): readonly number[] {
  return flags.levels ?? parseLevelsArg(MODEL_DEFAULTS.levels);
}

/**
 * resolveInputs for backtest, sweep and size: the model options' problems first (--model with
 * --forecast is exit code 2), then the input paths, without the forecast file when --model is given
 * (a scenario's forecast is then not read).
 */
export function resolveBacktestInputs(flags: InputFlags & ModelFlags, names: readonly InputName[]): { paths: BacktestInputPaths } {
  throwIfProblems(modelFlagProblems(flags));
  const { paths } = resolveInputs(flags, flags.model === undefined ? names : names.filter((name) => name !== 'forecast'));
  return { paths };
}

/** The inputs a summary lists: the files given, and with --model the method in place of a forecast file. */
export function inputsShown(paths: BacktestInputPaths, model: ForecastMethod | undefined): Record<string, string> {
  const files = Object.fromEntries(Object.entries(paths).filter((entry): entry is [string, string] => entry[1] !== undefined));
  return model === undefined ? files : { ...files, model };
}

/** --model for sweep and size: what readGridInputs needs to make the forecasts, and the forecasts once made. */
export interface GridModel {
  readonly levels: readonly number[];
  readonly label: string;
  readonly make: MakeForecast;
  /** The forecasts make made (call after readGridInputs). */
  made(): ModelForecast;
}

/** The GridModel of --model, or undefined without it. */
export function gridModel(flags: ModelFlags, historyFile: string, from: string, to: string, io: CliIo): GridModel | undefined {
  const method = flags.model;
  if (method === undefined) return undefined;
  let made: ModelForecast | undefined;
  return {
    levels: modelLevels(flags),
    label: `--model ${method}`,
    make: (market, history) => {
      made = makeModelForecast({ ...flags, model: method }, market, history, historyFile, from, to, io);
      return made;
    },
    made: () => {
      if (made === undefined) throw new Error('gridModel: made() before the forecasts were made');
      return made;
    },
  };
}

/** The input files a grid's resume fingerprint covers: the forecast file only when one is read. */
export function gridInputFiles(paths: BacktestInputPaths): string[] {
  return [paths.market, paths.battery, paths.history, ...(paths.forecast === undefined ? [] : [paths.forecast])];
}
