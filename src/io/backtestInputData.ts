import type { BatterySpec, MarketSpec, PriceHistory } from '../types.js';
import { chooseImbalanceSource } from '../settle/imbalancePrices.js';
import { gatherProblems, InputError, throwIfProblems, type InputProblem } from '../errors/inputError.js';
import { readPriceHistory } from './readPriceHistory.js';
import { parseQuantileForecast, readQuantileForecast, type QuantileForecastFile } from './readQuantileForecast.js';

/** Paths of the four input files of a backtest, as the user named them (relative to the working folder). */
export interface BacktestInputPaths {
  readonly market: string;
  readonly battery: string;
  readonly history: string;
  /** The quantile forecast file; absent when the forecasts are made from the history (--model) and handed over as text. */
  readonly forecast?: string;
}

/**
 * A quantile forecast given as CSV text instead of a file (the forecasts of --model), its name in
 * messages, and, where the giver has parsed it already, the parsed file.
 */
export interface GivenForecast {
  readonly csv: string;
  readonly label: string;
  readonly file?: QuantileForecastFile;
}

/** Makes the forecast from the market and the history once both are read and checked (--model). */
export type MakeForecast = (market: MarketSpec, history: PriceHistory) => GivenForecast;

/** The four inputs of a backtest, read and checked; the battery as its spec, so that a sizing can scale it. */
export interface BacktestInputData {
  readonly market: MarketSpec;
  readonly batterySpec: BatterySpec;
  readonly history: PriceHistory;
  readonly forecast: QuantileForecastFile;
}

/**
 * Reads the market and battery specs, the price history and the quantile forecast: from the file
 * `paths.forecast`, or from `given` text, or made by `given` from the market and history once every
 * file problem is known to be absent. Every problem of every file is listed together in one
 * InputError; so is a history without imbalance prices when the market spec has no imbalance rule either.
 * `note` hears of an old field or column name read under its new one (readers.readMarketSpec, readPriceHistory);
 * `readers` read the two spec files (SpecReaders).
 */
export function readInputDataWith(readers: SpecReaders, paths: BacktestInputPaths, given?: GivenForecast | MakeForecast, note?: (text: string) => void): BacktestInputData {
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => readers.readMarketSpec(paths.market, note));
  const batterySpec = gatherProblems(problems, () => readers.readBatterySpec(paths.battery));
  if (market === undefined || batterySpec === undefined) throw new InputError(problems);
  const history = gatherProblems(problems, () => readPriceHistory(paths.history, market, note));
  const read = (g: GivenForecast): QuantileForecastFile => g.file ?? parseQuantileForecast(g.csv, g.label, market);
  let forecast: QuantileForecastFile | undefined;
  if (given === undefined) forecast = gatherProblems(problems, () => readQuantileForecast(requiredForecastPath(paths), market));
  else if (typeof given !== 'function') forecast = gatherProblems(problems, () => read(given));
  if (history !== undefined && history.days.length === 0) {
    // Without a complete day nothing can be backtested, and whether the imbalance column is there cannot be told from days.
    const first = history.incompleteDays[0];
    problems.push({
      file: paths.history,
      message: `the history holds no complete day${first === undefined ? ' (only a header)' : ` (${history.incompleteDays.length} incomplete, e.g. ${first.day}: ${first.reason})`}`,
      fix: 'give every delivery period of the days to backtest; a day is used only when it is complete',
    });
  } else if (history !== undefined && chooseImbalanceSource(history, market) === null) {
    problems.push({
      file: paths.history,
      field: 'imbalance_price',
      message: 'the history has no imbalance_price column and the market spec has no imbalance rule',
      fix: `add an imbalance_price column to the history, or an "imbalance" rule such as {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15} to ${paths.market}`,
    });
  }
  throwIfProblems(problems);
  if (typeof given === 'function') forecast = read(given(market, history as PriceHistory));
  return { market, batterySpec, history: history as PriceHistory, forecast: forecast as QuantileForecastFile };
}

/**
 * The readers of market.json and battery.json: with their schemas (readSpecs.ts), or of files checked
 * by hand and read before (the backtest's fast path), so that this module loads no validation library.
 */
export interface SpecReaders {
  /** market.json; `note` hears of an old field name read under its new one. */
  readonly readMarketSpec: (path: string, note?: (text: string) => void) => MarketSpec;
  readonly readBatterySpec: (path: string) => BatterySpec;
}

/** The type of readBacktestInputs and of readInputDataWith with its readers given. */
export type ReadInputData = (paths: BacktestInputPaths, given?: GivenForecast | MakeForecast, note?: (text: string) => void) => BacktestInputData;

/** The forecast file of `paths`; a fault when there is none (the forecast must then be given). */
export function requiredForecastPath(paths: BacktestInputPaths): string {
  if (paths.forecast === undefined) throw new Error('readBacktestInputs: neither a forecast file nor a given forecast');
  return paths.forecast;
}
