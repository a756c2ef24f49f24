import { createHash } from 'node:crypto';
import { readInputDataWith, requiredForecastPath, type BacktestInputData, type BacktestInputPaths, type GivenForecast, type MakeForecast } from './backtestInputData.js';
import { readBatterySpec, readMarketSpec } from './readSpecs.js';

export type { BacktestInputData, BacktestInputPaths, GivenForecast, MakeForecast, ReadInputData, SpecReaders } from './backtestInputData.js';

/** readInputDataWith (backtestInputData.ts) with the spec files read and checked by their schemas (readSpecs.ts). */
export function readBacktestInputs(paths: BacktestInputPaths, given?: GivenForecast | MakeForecast, note?: (text: string) => void): BacktestInputData {
  return readInputDataWith({ readMarketSpec, readBatterySpec }, paths, given, note);
}

const cache = new Map<string, BacktestInputData>();

/**
 * readBacktestInputs, remembered for the life of this thread per set of paths and forecast (a given
 * forecast by its text's SHA-256): a command reads and checks the inputs before its sweep starts, and
 * a sweep on one thread then reuses them in its task instead of parsing the files again (each worker
 * thread has a cache of its own). A forecast made by a MakeForecast is remembered under the text it made.
 * `note` hears only what a read tells, not a remembered one.
 */
export function readBacktestInputsOnce(paths: BacktestInputPaths, given?: GivenForecast | MakeForecast, note?: (text: string) => void): BacktestInputData {
  const keyOf = (g: GivenForecast | undefined): string =>
    JSON.stringify([paths.market, paths.battery, paths.history, g === undefined ? { file: requiredForecastPath(paths) } : { label: g.label, sha256: createHash('sha256').update(g.csv).digest('hex') }]);
  if (typeof given === 'function') {
    let made: GivenForecast | undefined;
    const data = readBacktestInputs(paths, (market, history) => (made = given(market, history)), note);
    cache.set(keyOf(made as GivenForecast | undefined), data);
    return data;
  }
  const key = keyOf(given);
  const known = cache.get(key);
  if (known !== undefined) return known;
  const data = readBacktestInputs(paths, given, note);
  cache.set(key, data);
  return data;
}
