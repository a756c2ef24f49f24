import { describe, expect, it } from 'vitest';
import type { AutoEntry, DayForecast, ForecastOptions } from '../../src/forecast/forecaster.js';
import { AUTO_CANDIDATES, AUTO_SINGLE_CANDIDATES, DEFAULTS, Forecaster, forecastDay } from '../../src/forecast/forecaster.js';
import { chosenMethodsRecord, choiceLabel, QUANTILE_AVERAGE } from '../../src/forecast/autoChoices.js';
import { ArgumentError } from '../../src/stats/argumentError.js';
import type { HistoryDay, PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

// Behaviour checks of `auto` with a quantile average among its candidates; the numbers compared are
// quantbid's own methods run alone (the average's arithmetic is checked against SciPy in
// quantileAverage.test.ts), so no outside reference applies here.
const SMALL: Partial<ForecastOptions> = { windowsDays: [28, 56], minTrainingDays: 21, calibrationDays: 42, minCalibrationDays: 21, autoValidationDays: 7 };
const LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95];
const history = syntheticHistory({ days: 130, periodMinutes: 60, seed: 11 });
const HS_42 = { method: 'driver-hs', calibrationDays: 42 } as const;
const FHS_42 = { method: 'driver-fhs', calibrationDays: 42 } as const;
const FHS_63 = { method: 'driver-fhs', calibrationDays: 63 } as const;
const AVERAGE_ONLY: Partial<ForecastOptions> = { ...SMALL, autoCandidates: [{ averageOf: [FHS_42, FHS_63] }] };
const MIXED: Partial<ForecastOptions> = { ...SMALL, autoCandidates: [HS_42, FHS_42, FHS_63, { averageOf: [FHS_42, FHS_63] }] };

/** The history with every price from day `from` on replaced, and the exogenous columns after it doubled. */
function changedFrom(h: PriceHistory, from: number): PriceHistory {
  const days: HistoryDay[] = h.days.map((day, d) =>
    d < from ? day : { ...day, pricePerMwh: day.pricePerMwh.map((p, t) => p * 3 + 100 * Math.sin(d + t)), exogenous: d === from ? day.exogenous : Object.fromEntries(Object.entries(day.exogenous).map(([k, v]) => [k, v.map((x) => 2 * x)])) },
  );
  return { ...h, days };
}

describe('auto: a quantile average among its candidates', () => {
  it('by default the four single candidates and the average of driver-fhs over 364 and 728 calibration days; the singles alone are the choice before', () => {
    expect(DEFAULTS.autoCandidates).toBe(AUTO_CANDIDATES);
    expect(AUTO_CANDIDATES.slice(0, 4)).toEqual(AUTO_SINGLE_CANDIDATES);
    expect(AUTO_CANDIDATES[4]).toEqual({ averageOf: [{ method: 'driver-fhs', calibrationDays: 364 }, { method: 'driver-fhs', calibrationDays: 728 }] });
  });

  it('an average serves the level-by-level mean of its members run alone, and says so with members and weights', () => {
    for (const d of [100, 125]) {
      const auto = forecastDay(history, d, LEVELS, 'auto', AVERAGE_ONLY);
      const members = [42, 63].map((calibrationDays) => forecastDay(history, d, LEVELS, 'driver-fhs', { ...SMALL, calibrationDays }));
      auto.quantiles.prices.forEach((row, t) => row.forEach((q, k) => expect(q).toBeCloseTo((members[0]!.quantiles.prices[t]![k]! + members[1]!.quantiles.prices[t]![k]!) / 2, 9)));
      expect(auto.chosen).toMatchObject({ method: QUANTILE_AVERAGE, calibrationDays: 0, averageOf: [{ ...FHS_42, weight: 0.5 }, { ...FHS_63, weight: 0.5 }], validationDays: 7 });
      expect(auto.chosen!.validationLoss).toBeGreaterThan(0);
    }
  });

  it("chooses the average on the days its validation loss is the lowest, and a single member's loss on the same days otherwise", () => {
    const forecaster = new Forecaster(history, MIXED);
    const choices = Array.from({ length: 8 }, (_, i) => forecaster.forecast(110 + i, LEVELS, 'auto').chosen!);
    const losses = (entry: AutoEntry, d: number) => new Forecaster(history, { ...SMALL, autoCandidates: [entry] }).forecast(d, LEVELS, 'auto').chosen!.validationLoss!;
    choices.forEach((c, i) => {
      const entries = MIXED.autoCandidates!;
      const all = entries.map((e) => losses(e, 110 + i));
      expect(c.validationLoss).toBeCloseTo(Math.min(...all), 12);
    });
    expect(choices.some((c) => c.method === QUANTILE_AVERAGE) && choices.some((c) => c.method !== QUANTILE_AVERAGE)).toBe(true);
  });

  it('no look-ahead: changing every price from the delivery day on changes nothing', () => {
    const d = 110;
    const before = forecastDay(history, d, LEVELS, 'auto', MIXED);
    const after = forecastDay(changedFrom(history, d), d, LEVELS, 'auto', MIXED);
    expect(after.quantiles.prices).toEqual(before.quantiles.prices);
    expect(after.chosen).toEqual(before.chosen);
  });

  it('a day forecast fresh, again, or after others is the same forecast (whatever other days are asked)', () => {
    const fresh = forecastDay(history, 118, LEVELS, 'auto', MIXED);
    const used = new Forecaster(history, MIXED);
    for (let d = 125; d >= 112; d -= 3) used.forecast(d, LEVELS, 'auto');
    expect(used.forecast(118, LEVELS, 'auto')).toEqual(fresh);
    expect(new Forecaster(history, AVERAGE_ONLY).forecast(118, LEVELS, 'auto').quantiles.prices).toEqual(forecastDay(history, 118, LEVELS, 'auto', AVERAGE_ONLY).quantiles.prices);
  });

  it("paths: per period the average's sorted values are the members' sorted values averaged rank by rank", () => {
    const paths = { scenarioPaths: 30, pathSeed: 5 };
    const auto = forecastDay(history, 120, LEVELS, 'auto', { ...AVERAGE_ONLY, ...paths });
    const members = [42, 63].map((calibrationDays) => forecastDay(history, 120, LEVELS, 'driver-fhs', { ...SMALL, ...paths, calibrationDays }));
    expect(auto.paths).toHaveLength(30);
    const sortedColumn = (f: DayForecast, t: number) => f.paths.map((p) => p[t]!).sort((a, b) => a - b);
    for (let t = 0; t < auto.paths[0]!.length; t++) {
      const a = sortedColumn(members[0]!, t);
      const b = sortedColumn(members[1]!, t);
      sortedColumn(auto, t).forEach((v, j) => expect(v).toBeCloseTo((a[j]! + b[j]!) / 2, 9));
    }
  });

  it('refuses a malformed average, naming the field', () => {
    const bad = (entry: unknown, field: string) => {
      const make = () => new Forecaster(history, { ...SMALL, autoCandidates: [HS_42, entry as AutoEntry] });
      expect(make).toThrow(ArgumentError);
      expect(make).toThrow(field);
    };
    bad({ averageOf: [FHS_42] }, 'options.autoCandidates[1].averageOf');
    bad({ averageOf: [FHS_42, FHS_42] }, 'options.autoCandidates[1].averageOf');
    bad({ averageOf: [FHS_42, { method: 'auto', calibrationDays: 42 }] }, 'options.autoCandidates[1].averageOf[1].method');
    bad({ averageOf: [FHS_42, { method: 'driver-hs', calibrationDays: 3 }] }, 'options.autoCandidates[1].averageOf[1].calibrationDays');
  });

  it('the record of the choices names an average with its members and weights, and counts it apart from its members', () => {
    const average = { method: QUANTILE_AVERAGE, calibrationDays: 0, averageOf: [{ ...FHS_42, weight: 0.5 }, { ...FHS_63, weight: 0.5 }] };
    const record = chosenMethodsRecord([
      { day: '2030-01-02', ...average },
      { day: '2030-01-01', ...FHS_42 },
      { day: '2030-01-03', ...average },
    ]);
    expect(record!.perDay.map((c) => c.method)).toEqual(['driver-fhs', QUANTILE_AVERAGE, QUANTILE_AVERAGE]);
    expect(record!.counts).toEqual([{ ...average, days: 2 }, { ...FHS_42, days: 1 }]);
    expect(choiceLabel(average)).toBe('quantile average of driver-fhs (42) and driver-fhs (63), weights 0.5, 0.5');
    expect(choiceLabel(FHS_42)).toBe('driver-fhs (42 calibration days)');
  });
});
