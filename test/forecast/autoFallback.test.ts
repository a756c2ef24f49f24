import { describe, expect, it } from 'vitest';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { AUTO_CANDIDATES, AUTO_FALLBACK, DEFAULTS, Forecaster, forecastDay } from '../../src/forecast/forecaster.js';
import { entryMembers } from '../../src/forecast/forecastMethods.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

// Behaviour checks of quantbid's own rule for `auto` (which candidate serves which history); the numbers
// compared are quantbid's own methods run alone, so no outside reference applies.
const SMALL: Partial<ForecastOptions> = { windowsDays: [28, 56], minTrainingDays: 21, calibrationDays: 42, minCalibrationDays: 21 };
const LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95];
const withDrivers = syntheticHistory({ days: 130, periodMinutes: 60, seed: 11 });
/** The same prices without any exogenous column: nothing for a residual load. */
const pricesOnly: PriceHistory = { ...withDrivers, exogenousNames: [], days: withDrivers.days.map((d) => ({ ...d, exogenous: {} })) };

describe('auto: candidates and fallback', () => {
  it('the default candidates all read the drivers; the fallback reads prices alone', () => {
    expect(AUTO_CANDIDATES.flatMap(entryMembers).every((c) => c.method.startsWith('driver-'))).toBe(true);
    expect(AUTO_FALLBACK).toEqual({ method: 'arx-hs', calibrationDays: 364 });
    expect(DEFAULTS.autoFallback).toBe(AUTO_FALLBACK);
  });

  it('a history without load and renewables columns is forecast by the fallback, the same numbers as that method alone', () => {
    for (const day of [100, 120]) {
      const auto = forecastDay(pricesOnly, day, LEVELS, 'auto', { ...SMALL, autoFallback: { method: 'arx-hs', calibrationDays: 42 } });
      const alone = forecastDay(pricesOnly, day, LEVELS, 'arx-hs', SMALL);
      expect(auto.chosen).toMatchObject({ method: 'arx-hs', calibrationDays: 42 });
      expect(auto.quantiles.prices).toEqual(alone.quantiles.prices);
    }
  });

  it('with the drivers known, the fallback is not among the choices', () => {
    const forecaster = new Forecaster(withDrivers, { ...SMALL, autoCandidates: [{ method: 'driver-hs', calibrationDays: 42 }, { method: 'driver-fhs', calibrationDays: 42 }] });
    for (let day = 100; day < 110; day++) expect(forecaster.forecast(day, LEVELS, 'auto').chosen?.method).toMatch(/^driver-/);
  });

  it('a price-only candidate given by the caller serves a price-only history itself', () => {
    const auto = forecastDay(pricesOnly, 110, LEVELS, 'auto', { ...SMALL, autoCandidates: [{ method: 'driver-hs', calibrationDays: 42 }, { method: 'naive-hs', calibrationDays: 42 }] });
    expect(auto.chosen?.method).toBe('naive-hs');
  });

  it('a fallback that needs the drivers is refused, naming the option', () => {
    expect(() => new Forecaster(withDrivers, { ...SMALL, autoFallback: { method: 'driver-hs', calibrationDays: 42 } })).toThrow(/options\.autoFallback\.method/);
  });
});
