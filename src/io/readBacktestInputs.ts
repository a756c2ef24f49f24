import type { BatterySpec, MarketSpec, PriceHistory } from '../types.js';
import { chooseFallbackSource } from '../settle/fallbackPrices.js';
import { gatherProblems, InputError, throwIfProblems, type InputProblem } from './inputError.js';
import { readPriceHistory } from './readPriceHistory.js';
import { readQuantileForecast, type QuantileForecastFile } from './readQuantileForecast.js';
import { readBatterySpec, readMarketSpec } from './readSpecs.js';

/** Paths of the four input files of a backtest, as the user named them (relative to the working folder). */
export interface BacktestInputPaths {
  readonly market: string;
  readonly battery: string;
  readonly history: string;
  readonly forecast: string;
}

/** The four inputs of a backtest, read and checked; the battery as its spec, so that a sizing can scale it. */
export interface BacktestInputData {
  readonly market: MarketSpec;
  readonly batterySpec: BatterySpec;
  readonly history: PriceHistory;
  readonly forecast: QuantileForecastFile;
}

/**
 * Reads the market and battery specs, the price history and the quantile forecast. Every problem of
 * every file is listed together in one InputError; so is a history without fallback prices when the
 * market spec has no fallback rule either.
 */
export function readBacktestInputs(paths: BacktestInputPaths): BacktestInputData {
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => readMarketSpec(paths.market));
  const batterySpec = gatherProblems(problems, () => readBatterySpec(paths.battery));
  if (market === undefined || batterySpec === undefined) throw new InputError(problems);
  const history = gatherProblems(problems, () => readPriceHistory(paths.history, market));
  const forecast = gatherProblems(problems, () => readQuantileForecast(paths.forecast, market));
  if (history !== undefined && chooseFallbackSource(history, market) === null) {
    problems.push({
      file: paths.history,
      field: 'fallback_price',
      message: 'the history has no fallback_price column and the market spec has no fallback rule',
      fix: `add a fallback_price column to the history, or a "fallback" rule such as {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15} to ${paths.market}`,
    });
  }
  throwIfProblems(problems);
  return { market, batterySpec, history: history as PriceHistory, forecast: forecast as QuantileForecastFile };
}

const cache = new Map<string, BacktestInputData>();

/**
 * readBacktestInputs, remembered per set of paths for the life of this thread: a command reads and
 * checks the inputs before its sweep starts, and a sweep on one thread then reuses them in its task
 * instead of parsing the files again (each worker thread has a cache of its own).
 */
export function readBacktestInputsOnce(paths: BacktestInputPaths): BacktestInputData {
  const key = JSON.stringify([paths.market, paths.battery, paths.history, paths.forecast]);
  const known = cache.get(key);
  if (known !== undefined) return known;
  const data = readBacktestInputs(paths);
  cache.set(key, data);
  return data;
}
