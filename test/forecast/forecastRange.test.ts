import { describe, expect, it } from 'vitest';
import { forecastRange, type ForecastRangeRequest } from '../../src/forecast/forecastRange.js';
import { forecastDay } from '../../src/forecast/forecaster.js';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { syntheticHistory } from './syntheticHistory.js';

const SMALL: Partial<ForecastOptions> = { windowsDays: [28, 56], minTrainingDays: 21, calibrationDays: 42, minCalibrationDays: 21 };
const LEVELS = [0.05, 0.5, 0.95];
const history = syntheticHistory({ days: 90, periodMinutes: 60, seed: 3 });
const day = (i: number) => history.days[i]!.day;
const request = (over: Partial<ForecastRangeRequest>): ForecastRangeRequest => ({
  from: day(80),
  to: day(84),
  method: 'naive-hs',
  levels: LEVELS,
  priceFloor: -500,
  priceCap: 4000,
  periodsOf: () => [],
  ...over,
});

describe('forecastRange', () => {
  it("gives each day the Forecaster's answer for that day (delegation)", () => {
    const run = forecastRange(history, request({ method: 'arx-hs' }), SMALL);
    expect(run.forecasts.map((f) => f.quantiles.day)).toEqual([80, 81, 82, 83, 84].map(day));
    expect(run.forecasts[2]!.quantiles).toEqual(forecastDay(history, 82, LEVELS, 'arx-hs', SMALL).quantiles);
    expect(run.skipped).toEqual([]);
    expect(run.clampedValues).toBe(0);
  });

  it('clamps quantiles and paths into [floor, cap] and counts what it moved', () => {
    const free = forecastRange(history, request({}), { ...SMALL, scenarioPaths: 3 });
    const all = free.forecasts.flatMap((f) => [...f.quantiles.prices.flat(), ...f.paths.flat()]);
    const cap = [...all].sort((a, b) => a - b)[Math.floor(all.length / 2)]!; // the median value: half lie above
    const capped = forecastRange(history, request({ priceCap: cap, priceFloor: cap - 20 }), { ...SMALL, scenarioPaths: 3 });
    const values = capped.forecasts.flatMap((f) => [...f.quantiles.prices.flat(), ...f.paths.flat()]);
    expect(Math.max(...values)).toBe(cap);
    expect(Math.min(...values)).toBe(cap - 20);
    expect(capped.clampedValues).toBe(all.filter((v) => v > cap || v < cap - 20).length);
    for (const row of capped.forecasts.flatMap((f) => f.quantiles.prices)) row.forEach((q, k) => k > 0 && expect(q).toBeGreaterThanOrEqual(row[k - 1]!));
  });

  it('lists the days it cannot forecast with the reason, in day order', () => {
    // Day 82 is missing from the history, day 83 was left out by the reader as incomplete.
    const gappy = { ...history, days: history.days.filter((_, i) => i !== 82 && i !== 83), incompleteDays: [{ day: day(83), reason: '1 of 24 periods missing' }] };
    const run = forecastRange(gappy, request({ from: day(2), to: day(84) }), SMALL);
    expect(run.skipped.find((s) => s.day === day(82))?.reason).toBe('not in the history');
    expect(run.skipped.find((s) => s.day === day(83))?.reason).toBe('incomplete in the history: 1 of 24 periods missing');
    expect(run.skipped.find((s) => s.day === day(2))?.reason).toMatch(/history before .* needs at least \d+ days/);
    expect(run.skipped.map((s) => s.day)).toEqual([...run.skipped.map((s) => s.day)].sort());
    expect(run.forecasts.length + run.skipped.length).toBe(83);
  });
});
