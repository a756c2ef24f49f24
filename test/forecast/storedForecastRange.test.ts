import { describe, expect, it } from 'vitest';
import { dayForecastKey, historyDigests, type DayForecastSetup } from '../../src/forecast/dayForecastKey.js';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { DEFAULTS } from '../../src/forecast/forecaster.js';
import { forecastRange, type ForecastRangeRequest } from '../../src/forecast/forecastRange.js';
import { NO_STORE, storedForecastRange, type DayForecastStore, type StoredDayForecast } from '../../src/forecast/storedForecastRange.js';
import type { HistoryDay, PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

// Behaviour of the forecast store layer on a seeded synthetic history (inputs only, never check
// values): its answers must equal forecastRange's (delegation: "vector equals loop"), its keys must
// follow what the forecaster may read at gate closure, and its fit count must show the store at work.

const SMALL: Partial<ForecastOptions> = { windowsDays: [28, 56], minTrainingDays: 21, calibrationDays: 42, minCalibrationDays: 21 };
const LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95];
const history = syntheticHistory({ days: 80, periodMinutes: 60, seed: 11 });
const day = (i: number): string => history.days[i]!.day;
const SETUP = { market: { timeZone: 'Etc/GMT-1', periodMinutes: 60, priceFloor: -500, priceCap: 4000 }, softwareVersion: 'test' } as const;
const request = (over: Partial<ForecastRangeRequest> = {}): ForecastRangeRequest => ({
  from: day(60),
  to: day(66),
  method: 'arx-hs',
  levels: LEVELS,
  priceFloor: -500,
  priceCap: 4000,
  periodsOf: () => [],
  ...over,
});

/** An in-memory store that counts what it is asked (the injected fit counter of these tests). */
class MemoryStore implements DayForecastStore {
  readonly entries = new Map<string, StoredDayForecast>();
  recalls = 0;
  keeps = 0;
  recall(key: string): StoredDayForecast | undefined {
    this.recalls++;
    return this.entries.get(key);
  }
  keep(key: string, _day: string, value: StoredDayForecast): void {
    this.keeps++;
    this.entries.set(key, structuredClone(value));
  }
}

/** The keys storedForecastRange uses for the history's days, as its store sees them. */
function keysOf(h: PriceHistory, setup: DayForecastSetup): string[] {
  const digests = historyDigests(h);
  return h.days.map((d, i) => dayForecastKey(setup, d.day, digests.before[i]!, digests.target[i]!));
}

const fullSetup: DayForecastSetup = { ...SETUP, method: 'arx-hs', levels: LEVELS, options: { ...DEFAULTS, ...SMALL } };

describe('storedForecastRange', () => {
  it("gives forecastRange's forecasts and skipped days for the same days (delegation), with no store", () => {
    // Days 45..52: an ARX point forecast needs 7 lag + 21 training days (first: day 28) and a quantile
    // forecast 21 calibration days with point forecasts (days 28..48), so days 45..48 are skipped.
    const req = request({ from: day(45), to: day(52) });
    const direct = forecastRange(history, req, SMALL);
    const stored = storedForecastRange(history, req, SETUP, SMALL, NO_STORE);
    expect(stored.forecasts).toEqual(direct.forecasts.map((f) => f.quantiles));
    expect(stored.skipped).toEqual(direct.skipped);
    expect(stored.skipped.map((s) => s.day)).toEqual([45, 46, 47, 48].map(day));
    expect(stored.forecasts.map((f) => f.day)).toEqual([49, 50, 51, 52].map(day));
    expect(stored.daysFitted).toBe(8);
    expect(stored.daysFromStore).toBe(0);
  });

  it('fits each day once: a second run takes every day from the store and gives the same forecasts', () => {
    const store = new MemoryStore();
    const first = storedForecastRange(history, request(), SETUP, SMALL, store);
    expect(first).toMatchObject({ daysFitted: 7, daysFromStore: 0 });
    expect(store.keeps).toBe(7);
    const second = storedForecastRange(history, request(), SETUP, SMALL, store);
    expect(second).toMatchObject({ daysFitted: 0, daysFromStore: 7 });
    expect(store.keeps).toBe(7);
    expect(second.forecasts).toEqual(first.forecasts);
  });

  it.each(['arx-hs', 'qra'] as const)('%s: fits only the days the store lacks or cannot use, and the answer is unchanged', (method) => {
    const store = new MemoryStore();
    const first = storedForecastRange(history, request({ method }), SETUP, SMALL, store);
    const keys = keysOf(history, { ...fullSetup, method });
    store.entries.delete(keys[63]!);
    // A wrong shape (a row short of a level) under a right key is made again too.
    const entry = store.entries.get(keys[65]!) as Extract<StoredDayForecast, { outcome: 'forecast' }>;
    store.entries.set(keys[65]!, { outcome: 'forecast', prices: entry.prices.map((row) => row.slice(1)) });
    // Days 63 and 65 are made by two separate forecastRange calls, each from a fresh Forecaster.
    const again = storedForecastRange(history, request({ method }), SETUP, SMALL, store);
    expect(again).toMatchObject({ daysFitted: 2, daysFromStore: 5 });
    expect(again.forecasts).toEqual(first.forecasts);
  });

  it("auto's choice of a quantile average is stored with its members and weights and given back from the store; a malformed one is made again", () => {
    const options: Partial<ForecastOptions> = { ...SMALL, autoValidationDays: 5, autoCandidates: [{ averageOf: [{ method: 'driver-hs', calibrationDays: 42 }, { method: 'driver-fhs', calibrationDays: 42 }] }] };
    const req = request({ method: 'auto', from: day(70), to: day(72) });
    const store = new MemoryStore();
    const first = storedForecastRange(history, req, SETUP, options, store);
    expect(first.chosen.map((c) => c.averageOf?.map((m) => m.weight))).toEqual([[0.5, 0.5], [0.5, 0.5], [0.5, 0.5]]);
    const [key] = [...store.entries.keys()];
    const entry = store.entries.get(key!) as Extract<StoredDayForecast, { outcome: 'forecast' }>;
    store.entries.set(key!, { ...entry, chosen: { ...entry.chosen!, averageOf: [{ method: 'driver-hs', calibrationDays: 42 } as never] } });
    const second = storedForecastRange(history, req, SETUP, options, store);
    expect(second).toMatchObject({ daysFitted: 1, daysFromStore: 2 });
    expect(second.chosen).toEqual(first.chosen);
    expect(second.forecasts).toEqual(first.forecasts);
  });

  it('stores skipped days with their reason and gives them back from the store', () => {
    const store = new MemoryStore();
    const req = request({ from: day(40), to: day(50) });
    const first = storedForecastRange(history, req, SETUP, SMALL, store);
    const second = storedForecastRange(history, req, SETUP, SMALL, store);
    expect(second.daysFitted).toBe(0);
    expect(second.skipped).toEqual(first.skipped);
    expect(first.skipped[0]?.reason).toMatch(/calibration needs at least 21 days/);
  });

  it('leaves out days that are not complete days of the history', () => {
    const gap: PriceHistory = { ...history, days: history.days.filter((_, i) => i !== 62) };
    const run = storedForecastRange(gap, request(), SETUP, SMALL, NO_STORE);
    expect(run.forecasts.map((f) => f.day)).toEqual([60, 61, 63, 64, 65, 66].map(day));
  });
});

describe('dayForecastKey and historyDigests', () => {
  /** The history with day k's prices (and, with `exogenous`, its load column) changed. */
  function changedDay(k: number, exogenous = false): PriceHistory {
    const days: HistoryDay[] = history.days.map((d, i) =>
      i !== k ? d : { ...d, pricePerMwh: d.pricePerMwh.map((p) => p + 1), exogenous: exogenous ? { load_mw: d.exogenous.load_mw!.map((v) => v + 1) } : d.exogenous },
    );
    return { ...history, days };
  }
  const base = keysOf(history, fullSetup);

  it("a day's key covers the days before it, never its own prices or later days (what gate closure knows)", () => {
    const changed = keysOf(changedDay(50), fullSetup);
    for (let i = 0; i <= 50; i++) expect(changed[i]).toBe(base[i]);
    for (let i = 51; i < history.days.length; i++) expect(changed[i]).not.toBe(base[i]);
  });

  it("a day's key covers its own exogenous columns (known before gate closure)", () => {
    const changed = keysOf(changedDay(50, true), fullSetup);
    expect(changed[49]).toBe(base[49]);
    expect(changed[50]).not.toBe(base[50]);
  });

  it('days added after the end of the history leave the keys of the earlier days unchanged', () => {
    const shorter: PriceHistory = { ...history, days: history.days.slice(0, 70) };
    expect(keysOf(shorter, fullSetup)).toEqual(base.slice(0, 70));
  });

  it.each([
    ['method', { method: 'naive-hs' }],
    ['levels', { levels: [0.1, 0.5, 0.9] }],
    ['options', { options: { ...DEFAULTS, ...SMALL, calibrationDays: 43 } }],
    ['price cap (the clamp)', { market: { ...SETUP.market, priceCap: 3000 } }],
    ['period length', { market: { ...SETUP.market, periodMinutes: 30 } }],
    ['software version', { softwareVersion: 'other' }],
  ])('every key changes with the %s', (_name, change) => {
    const other = keysOf(history, { ...fullSetup, ...change } as DayForecastSetup);
    other.forEach((key, i) => expect(key).not.toBe(base[i]));
  });

  it('keys do not depend on the key order of the options object', () => {
    const reversed = Object.fromEntries(Object.entries(fullSetup.options as Record<string, unknown>).reverse());
    expect(keysOf(history, { ...fullSetup, options: reversed })).toEqual(base);
  });
});
