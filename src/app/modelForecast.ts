import { InputError } from '../errors/inputError.js';
import { chosenMethodsRecord } from '../forecast/autoChoices.js';
import { DEFAULTS, type ForecastMethod } from '../forecast/forecaster.js';
import { NO_STORE, storedForecastRange } from '../forecast/storedForecastRange.js';
import { ForecastCache } from '../io/forecastCache.js';
import { quantileForecastCsv } from '../io/quantileForecastCsv.js';
import type { BacktestInputPaths, MakeForecast } from '../io/readBacktestInputs.js';
import { parseQuantileForecast, type QuantileForecastFile } from '../io/readQuantileForecast.js';
import { DayCalendar } from '../market/dayCalendar.js';
import type { MarketSpec, PriceHistory } from '../types.js';
import { packageVersion } from './packageInfo.js';
import { DEFAULT_LEVELS_TEXT, MODEL_DEFAULTS } from './commandDefaults.js';
import type { RunHooks } from './runHooks.js';
import { levelsFromText } from './settingRules.js';
import type { ModelSettings } from './settingSchemas.js';

export { DEFAULT_LEVELS_TEXT, MODEL_DEFAULTS } from './commandDefaults.js';

/** DEFAULT_LEVELS_TEXT as numbers. */
export function defaultLevels(): number[] {
  const parsed = levelsFromText(DEFAULT_LEVELS_TEXT);
  if ('problem' in parsed) throw new Error(`DEFAULT_LEVELS_TEXT: ${parsed.problem}`);
  return parsed.levels;
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
  /** What the forecasts depend on besides the history file, for a grid's resume fingerprint. */
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
  /** With --model auto: the method and calibration window chosen each day, and how often each; else null. */
  readonly chosenMethods: ReturnType<typeof chosenMethodsRecord>;
}

/** The levels --model forecasts: the settings', else the default. */
export function modelLevels(model: ModelSettings): readonly number[] {
  return model.levels ?? defaultLevels();
}

/** The name of the --model forecast in messages. */
export function modelLabel(model: ModelSettings): string {
  return `--model ${model.method}`;
}

/**
 * Forecasts the history days from `from` to `to` with --model (storedForecastRange through the
 * cache unless it is switched off), with a progress display, and reads them back through the forecast
 * file parser. No day forecast is an input error (exit code 2).
 */
export function makeModelForecast(model: ModelSettings, market: MarketSpec, history: PriceHistory, historyFile: string, span: { readonly from: string; readonly to: string }, hooks: RunHooks): ModelForecast {
  const { method } = model;
  const { from, to } = span;
  const levels = modelLevels(model);
  const cache = model.cache === false ? undefined : new ForecastCache(model.cache ?? MODEL_DEFAULTS.cacheDir, (message) => hooks.note(message));
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const label = modelLabel(model);
  const progress = hooks.progress('forecast', history.days.filter((d) => d.day >= from && d.day <= to).length);
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
    summary: { method, levels: [...levels], options: DEFAULTS, daysForecast: result.forecasts.length, skippedDays: result.skipped, chosenMethods: chosenMethodsRecord(result.chosen) },
    identity: { method, levels: [...levels], options: DEFAULTS, version: packageVersion() },
    note: `forecasts: ${method} at ${levels.length} levels, ${count(result.forecasts.length, 'day')} forecast, ${result.skipped.length} skipped; ${count(result.daysFitted, 'day')} fitted, ${cacheText}\n`,
  };
}

/** --model for a run that reads its inputs with readBacktestInputs: how to make the forecasts, and the forecasts once made. */
export interface ForecastMaker {
  readonly levels: readonly number[];
  readonly label: string;
  readonly make: MakeForecast;
  /** The forecasts `make` made (call after reading the inputs). */
  made(): ModelForecast;
}

/** The ForecastMaker of --model, or undefined without it. */
export function forecastMaker(model: ModelSettings | undefined, historyFile: string, span: { readonly from: string; readonly to: string }, hooks: RunHooks): ForecastMaker | undefined {
  if (model === undefined) return undefined;
  let made: ModelForecast | undefined;
  return {
    levels: modelLevels(model),
    label: modelLabel(model),
    make: (market, history) => {
      made = makeModelForecast(model, market, history, historyFile, span, hooks);
      return made;
    },
    made: () => {
      if (made === undefined) throw new Error('forecastMaker: made() before the forecasts were made');
      return made;
    },
  };
}

