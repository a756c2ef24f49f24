import { describe, expect, it } from 'vitest';
import type { ForecastMethod, ForecastOptions } from '../../src/forecast/forecaster.js';
import { DEFAULTS, FORECAST_METHODS, Forecaster, forecastDay } from '../../src/forecast/forecaster.js';
import { ForecastInputError, InsufficientHistoryError } from '../../src/forecast/models/errors.js';
import type { HistoryDay, PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

const SMALL: Partial<ForecastOptions> = {
  windowsDays: [28, 56],
  minTrainingDays: 21,
  calibrationDays: 42,
  minCalibrationDays: 21,
};
const LEVELS = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95];
const history = syntheticHistory({ days: 130, periodMinutes: 60, seed: 7, shortDay: 100, longDay: 120 });

/**
 * The history with every price from day `from` on replaced by `f(price)`, and the exogenous columns
 * of the days after it scaled (those of day `from` itself may be read: known before gate closure).
 */
function changedFrom(h: PriceHistory, from: number, f: (p: number, d: number, t: number) => number): PriceHistory {
  const days: HistoryDay[] = h.days.map((day, d) =>
    d < from
      ? day
      : {
          ...day,
          pricePerMwh: day.pricePerMwh.map((p, t) => f(p, d, t)),
          exogenous: d === from ? day.exogenous : { load_mw: day.exogenous.load_mw!.map((v) => 2 * v) },
        },
  );
  return { ...h, days };
}

/** Every price and exogenous value mapped (for the metamorphic laws). */
function mapAll(h: PriceHistory, price: (p: number) => number): PriceHistory {
  return { ...h, days: h.days.map((day) => ({ ...day, pricePerMwh: day.pricePerMwh.map(price) })) };
}

describe('Forecaster', () => {
  it('exports its methods and defaults', () => {
    expect(FORECAST_METHODS).toEqual(['auto', 'naive-hs', 'arx-hs', 'lasso-hs', 'arx-conformal', 'qra', 'driver-hs', 'driver-fhs', 'driver-qr']);
    expect(DEFAULTS.windowsDays).toEqual([56, 91, 182, 364]);
    expect(DEFAULTS.driverWindowsDays).toEqual([182, 364, 728]);
    expect(DEFAULTS.driverRefitDays).toBe(5);
    expect(Object.isFrozen(DEFAULTS)).toBe(true);
  });

  it('driver-hs: driver windows longer than the history use all of it (the default 182, 364 and 728 days on 130 days of history)', () => {
    const byDefault = forecastDay(history, 110, LEVELS, 'driver-hs', SMALL);
    const longer = forecastDay(history, 110, LEVELS, 'driver-hs', { ...SMALL, driverWindowsDays: [500, 1000, 2000] });
    const shorter = forecastDay(history, 110, LEVELS, 'driver-hs', { ...SMALL, driverWindowsDays: [56, 364, 728] });
    expect(longer.quantiles.prices).toEqual(byDefault.quantiles.prices);
    expect(longer.point).toEqual(byDefault.point);
    expect(shorter.point).not.toEqual(byDefault.point);
  });

  for (const method of FORECAST_METHODS) {
    it(`${method}: one row per period, the levels asked for, non-decreasing rows`, () => {
      const day = forecastDay(history, 110, LEVELS, method, SMALL);
      expect(day.quantiles.day).toBe(history.days[110]!.day);
      expect(day.quantiles.levels).toEqual(LEVELS);
      expect(day.quantiles.periods).toBe(history.days[110]!.periods);
      expect(day.quantiles.prices).toHaveLength(24);
      for (const row of day.quantiles.prices) {
        expect(row).toHaveLength(LEVELS.length);
        row.forEach((q, k) => {
          expect(Number.isFinite(q)).toBe(true);
          if (k > 0) expect(q).toBeGreaterThanOrEqual(row[k - 1]!);
        });
      }
      expect(day.calibrationDays).toBeGreaterThanOrEqual(21);
    });

    it(`${method}: no look-ahead - changing every price from the delivery day on changes nothing`, () => {
      const d = 105;
      const before = forecastDay(history, d, LEVELS, method, SMALL);
      const perturbed = changedFrom(history, d, (p, day, t) => (day === d && t === 3 ? Number.NaN : p * 3 + 100 * Math.sin(day + t)));
      const after = forecastDay(perturbed, d, LEVELS, method, SMALL);
      expect(after.quantiles.prices).toEqual(before.quantiles.prices);
      expect(after.point).toEqual(before.point);
    });
  }

  it('follows the clock on a 23-hour and a 25-hour day (slot grid)', () => {
    const forecaster = new Forecaster(history, SMALL);
    const short = forecaster.forecast(100, LEVELS, 'arx-hs');
    const long = forecaster.forecast(120, LEVELS, 'arx-hs');
    expect(short.quantiles.prices).toHaveLength(23);
    expect(long.quantiles.prices).toHaveLength(25);
    // The long day's two 02:00 periods are the same clock slot: same quantiles.
    expect(long.quantiles.periods[2]!.start).toMatch(/T02:00:00\+02:00$/);
    expect(long.quantiles.periods[3]!.start).toMatch(/T02:00:00\+01:00$/);
    expect(long.quantiles.prices[3]).toEqual(long.quantiles.prices[2]);
  });

  it('gives the same answer for a day whatever was forecast before (memoisation and warm starts only)', () => {
    for (const method of ['qra', 'lasso-hs'] as ForecastMethod[]) {
      const fresh = forecastDay(history, 118, LEVELS, method, SMALL);
      const used = new Forecaster(history, SMALL);
      for (let d = 112; d <= 118; d++) used.forecast(d, [0.1, 0.3, 0.5, 0.7, 0.9], method);
      expect(used.forecast(118, LEVELS, method).quantiles.prices).toEqual(fresh.quantiles.prices);
    }
  });

  it('auto and driver-fhs: a day forecast again, or before and after others, is the fresh forecast (kept calibration arrays reused between days)', () => {
    for (const method of ['auto', 'driver-fhs'] as ForecastMethod[]) {
      const fresh = [115, 118].map((d) => forecastDay(history, d, LEVELS, method, SMALL));
      const used = new Forecaster(history, SMALL);
      const first = used.forecast(115, LEVELS, method);
      const copy = structuredClone(first);
      for (let d = 112; d <= 118; d++) used.forecast(d, LEVELS, method);
      // The forecast handed out earlier is not touched by the days after it.
      expect(first).toEqual(copy);
      expect(first.quantiles.prices).toEqual(fresh[0]!.quantiles.prices);
      expect(used.forecast(115, LEVELS, method).quantiles.prices).toEqual(fresh[0]!.quantiles.prices);
      expect(used.forecast(118, LEVELS, method)).toEqual(fresh[1]);
    }
  });

  it('naive-hs centres on the same slot naiveLagDays back', () => {
    for (const lag of [1, 7]) {
      const day = forecastDay(history, 110, LEVELS, 'naive-hs', { ...SMALL, naiveLagDays: lag });
      expect(day.point).toEqual(history.days[110 - lag]!.pricePerMwh);
    }
  });

  it('returns whole-day scenario paths whose values in every period follow the day\'s quantiles (Schaake shuffle)', () => {
    const day = forecastDay(history, 110, LEVELS, 'arx-hs', { ...SMALL, scenarioPaths: 40 });
    expect(day.paths).toHaveLength(40);
    for (const path of day.paths) expect(path).toHaveLength(24);
    // The r-th smallest of n path values is the quantile at (r + 1/2)/n: below q(tau) lie tau n of them, give or take one.
    day.quantiles.prices.forEach((row, t) => {
      LEVELS.forEach((tau, k) => {
        const below = day.paths.filter((p) => p[t]! < row[k]!).length;
        expect(Math.abs(below - tau * 40)).toBeLessThanOrEqual(1);
      });
    });
    expect(forecastDay(history, 110, LEVELS, 'arx-hs', { ...SMALL, scenarioPaths: 40 }).paths).toEqual(day.paths);
    expect(forecastDay(history, 110, LEVELS, 'arx-hs', { ...SMALL, scenarioPaths: 40, pathSeed: 2 }).paths).not.toEqual(day.paths);
  });

  it('throws typed errors for bad levels, unknown methods and too short a history', () => {
    expect(() => forecastDay(history, 110, [0.5, 0.4], 'arx-hs', SMALL)).toThrow(ForecastInputError);
    expect(() => forecastDay(history, 110, [0, 0.5], 'arx-hs', SMALL)).toThrow(ForecastInputError);
    expect(() => forecastDay(history, 110, LEVELS, 'magic' as ForecastMethod, SMALL)).toThrow(/method/);
    expect(() => forecastDay(history, 30, LEVELS, 'arx-hs', SMALL)).toThrow(InsufficientHistoryError);
    expect(() => forecastDay(history, 500, LEVELS, 'arx-hs', SMALL)).toThrow(ForecastInputError);
    expect(() => new Forecaster(history, { windowsDays: [] })).toThrow(/windowsDays/);
  });

  it('does not change the history it reads', () => {
    const frozen = JSON.parse(JSON.stringify(history)) as PriceHistory;
    const deepFreeze = (o: unknown): void => {
      if (o !== null && typeof o === 'object') {
        Object.freeze(o);
        Object.values(o).forEach(deepFreeze);
      }
    };
    deepFreeze(frozen);
    expect(() => forecastDay(frozen, 110, LEVELS, 'qra', SMALL)).not.toThrow();
  });
});

describe('Forecaster: metamorphic laws (every method is equivariant to the price unit and origin)', () => {
  const d = 112;
  for (const method of FORECAST_METHODS) {
    it(`${method}: prices + 40 moves every quantile by + 40; prices x 2.5 scales them by 2.5`, () => {
      const base = forecastDay(history, d, LEVELS, method, SMALL).quantiles.prices;
      const shifted = forecastDay(mapAll(history, (p) => p + 40), d, LEVELS, method, SMALL).quantiles.prices;
      const scaled = forecastDay(mapAll(history, (p) => p * 2.5), d, LEVELS, method, SMALL).quantiles.prices;
      base.forEach((row, t) =>
        row.forEach((q, k) => {
          expect(shifted[t]![k]).toBeCloseTo(q + 40, 6);
          expect(scaled[t]![k]).toBeCloseTo(q * 2.5, 6);
        }),
      );
    });
  }
});
