import { describe, expect, it } from 'vitest';
import type { FitStopwatch } from '../../src/forecast/fitStopwatch.js';
import { forecastSettings, type ForecastMethod, type ForecastOptions } from '../../src/forecast/forecaster.js';
import { forecastRange, type ForecastRangeRequest, type ForecastRangeResult } from '../../src/forecast/forecastRange.js';
import { storedForecastRange, type DayForecastStore, type StoredDayForecast } from '../../src/forecast/storedForecastRange.js';
import { readPriceHistory } from '../../src/io/readPriceHistory.js';
import { readMarketSpec } from '../../src/io/readSpecs.js';

// The fit stopwatch on a short range of the fictional demo market (invented data, inputs only): it
// must count the models fitted and the time spent on them, and never change a forecast. The counts
// follow from the models' definitions: the ARX and LASSO point forecasts fit one model per clock slot
// and calibration window (src/forecast/models/arx.ts, averaging over windows as in Hubicka, Marcjasz
// and Weron 2019), QRA one quantile regression per slot and level (Nowotarski and Weron 2015).

const market = readMarketSpec('scenarios/halvorn/market.json');
const history = readPriceHistory('scenarios/halvorn/history.csv.gz', market);
const SLOTS = 96; // quarter-hours of a clock day (the demo's clock-change days still use the 96 slots)
const SMALL: Partial<ForecastOptions> = { windowsDays: [28, 56], minTrainingDays: 21, calibrationDays: 42, minCalibrationDays: 21, scenarioPaths: 3 };
const LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95];
// Three days around the spring clock change of the demo (2026-03-29 has 92 quarter-hours).
const request = (method: ForecastMethod): ForecastRangeRequest => ({
  from: '2026-03-28',
  to: '2026-03-30',
  method,
  levels: LEVELS,
  priceFloor: market.priceFloor,
  priceCap: market.priceCap,
  periodsOf: () => [],
});
const DAYS = 3;

/** Every number of the run as float64 bytes, in a fixed order: equal bytes mean byte-identical forecasts. */
function bytesOf(run: ForecastRangeResult): Buffer {
  const numbers = run.forecasts.flatMap((f) => [...f.quantiles.prices.flat(), ...f.point, ...f.paths.flat(), f.calibrationDays, f.crossedSlots]);
  return Buffer.from(Float64Array.from([...numbers, run.clampedValues]).buffer);
}

/** A clock that moves on by 1 ms at every reading: the time it reports is the number of timed stretches. */
function tickingStopwatch(): FitStopwatch {
  let ms = 0;
  return { now: () => ++ms, spentMs: 0, calls: 0 };
}

describe('the fit stopwatch', () => {
  const plain = new Map<ForecastMethod, ForecastRangeResult>();
  const runWithout = (method: ForecastMethod): ForecastRangeResult => {
    let run = plain.get(method);
    if (run === undefined) {
      run = forecastRange(history, request(method), SMALL);
      plain.set(method, run);
    }
    return run;
  };

  it.each(['arx-hs', 'lasso-hs'] as const)('%s: counts one fit per slot and window of every point forecast made, forecasts unchanged', (method) => {
    const watch = tickingStopwatch();
    const timed = forecastRange(history, request(method), { ...SMALL, stopwatch: watch });
    const plainRun = runWithout(method);
    expect(timed.forecasts).toHaveLength(DAYS);
    // A fresh forecaster fits the 42 calibration days of the first day, then each delivery day once.
    const calibration = timed.forecasts[0]!.calibrationDays;
    expect(calibration).toBe(42);
    const pointForecasts = calibration + DAYS;
    expect(watch.calls).toBe(pointForecasts * SLOTS * 2);
    // Timed stretches: per point forecast, the shared day-level block once and each slot's windows once.
    expect(watch.spentMs).toBe(pointForecasts * (1 + SLOTS));
    expect(timed).toEqual(plainRun);
    expect(bytesOf(timed).equals(bytesOf(plainRun))).toBe(true);
  });

  it('qra: adds one quantile regression per slot and level of each delivery day to the ARX fits, for the quantiles and for the paths', () => {
    const watch = tickingStopwatch();
    const timed = forecastRange(history, request('qra'), { ...SMALL, stopwatch: watch });
    const plainRun = runWithout('qra');
    const pointForecasts = timed.forecasts[0]!.calibrationDays + DAYS;
    // The paths' marginals are the method's quantiles at the asked levels and 12 tail levels (forecaster.ts).
    const pathLevels = LEVELS.length + 12;
    expect(watch.calls).toBe(pointForecasts * SLOTS * 2 + DAYS * SLOTS * (LEVELS.length + pathLevels));
    expect(watch.spentMs).toBe(pointForecasts * (1 + SLOTS) + 2 * DAYS * SLOTS);
    expect(timed).toEqual(plainRun);
    expect(bytesOf(timed).equals(bytesOf(plainRun))).toBe(true);
  });

  it('naive-hs fits nothing', () => {
    const watch = tickingStopwatch();
    const timed = forecastRange(history, request('naive-hs'), { ...SMALL, stopwatch: watch });
    expect(timed.forecasts).toHaveLength(DAYS);
    expect(watch).toMatchObject({ spentMs: 0, calls: 0 });
    expect(bytesOf(timed).equals(bytesOf(runWithout('naive-hs')))).toBe(true);
  });

  it('with the real clock: fits counted, their time within the wall time of the run', () => {
    const watch: FitStopwatch = { now: () => performance.now(), spentMs: 0, calls: 0 };
    const started = performance.now();
    const timed = forecastRange(history, request('arx-hs'), { ...SMALL, stopwatch: watch });
    const wallMs = performance.now() - started;
    expect(watch.calls).toBeGreaterThan(0);
    expect(watch.spentMs).toBeGreaterThanOrEqual(0);
    expect(watch.spentMs).toBeLessThanOrEqual(wallMs);
    expect(bytesOf(timed).equals(bytesOf(runWithout('arx-hs')))).toBe(true);
  });

  it('is no part of a stored forecast’s key: a run with a stopwatch fills the store a run without reads', () => {
    const entries = new Map<string, StoredDayForecast>();
    const store: DayForecastStore = { recall: (key) => entries.get(key), keep: (key, _day, value) => void entries.set(key, value) };
    const setup = { market: { timeZone: market.timeZone, periodMinutes: market.periodMinutes, priceFloor: market.priceFloor, priceCap: market.priceCap }, softwareVersion: 'test' };
    const watch = tickingStopwatch();
    const first = storedForecastRange(history, request('arx-hs'), setup, { ...SMALL, stopwatch: watch }, store);
    expect(first.daysFitted).toBe(DAYS);
    expect(watch.calls).toBeGreaterThan(0);
    const second = storedForecastRange(history, request('arx-hs'), setup, SMALL, store);
    expect(second.daysFromStore).toBe(DAYS);
    expect(second.forecasts).toEqual(first.forecasts);
    expect(forecastSettings({ ...SMALL, stopwatch: watch })).toEqual(SMALL);
  });
});
