import { describe, expect, it } from 'vitest';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { forecastDay } from '../../src/forecast/forecaster.js';
import { farOutFences } from '../../src/forecast/models/farOutFences.js';
import { driverColumns } from '../../src/forecast/models/driverRegression.js';
import { ArgumentError } from '../../src/stats/argumentError.js';
import type { HistoryDay, PriceHistory } from '../../src/types.js';
import { seededRandom } from './seededRandom.js';
import { syntheticHistory } from './syntheticHistory.js';

const DAYS = 140;
const S = 24;
/** The knot of slot s: its residual load's median over any long window (below). */
const knotOf = (s: number): number => 1.5 + (2 * s) / (S - 1);
/** ISO weekday 1..7 (7 Sunday) of a YYYY-MM-DD day. */
const isoWeekday = (day: string): number => ((new Date(`${day}T00:00:00Z`).getUTCDay() + 6) % 7) + 1;

/**
 * A noise-free history whose prices follow the driver regression's own columns exactly (price scale,
 * one knot), with the hinge times yesterday's mean price (`hingeTimesLevel`) or the step at the knot
 * times it (`stepTimesLevel`):
 *   P(d,s) = 30 + 4 x + 2 h + 0.4 mean P(d-1) - 20 mean x(d-1) + 0.1 P(d-1,s) + 0.05 P(d-7,s) + 2 D_Mon(d)
 *            + 0.05 v mean P(d-1),   h = max(0, x - k_s), v = h or 1[x > k_s], k_s = 1.5 + 2 s / 23.
 * The residual load x(d,s) (invented, seeded) is k_s on 40% of the days, else uniform on [k_s - 1, k_s)
 * or (k_s, k_s + 1] (below with probability 0.25 or 0.75, a coin per day), so the slot's median over any long window, the one knot of the fit, is exactly k_s
 * (a knot that differs by slot keeps a day's prices spread, so that no far-out fence clips them).
 * The first 7 days have prices 100 + s.
 */
function exactHistory(term: 'hinge' | 'step'): { history: PriceHistory; priceOf: (d: number, s: number) => number } {
  const base = syntheticHistory({ days: DAYS, periodMinutes: 60, seed: 3 });
  const u = seededRandom(17);
  const x = base.days.map(() => {
    // A day tilted up or down, so that the day's mean residual load, and through it tomorrow's level, varies.
    const below = u() < 0.5 ? 0.25 : 0.75;
    return Array.from({ length: S }, (_, s) => {
      const knot = knotOf(s);
      if (u() < 0.4) return knot;
      return u() < below ? knot - u() : knot + (1 - u());
    });
  });
  const prices: number[][] = [];
  const mean = (v: readonly number[]): number => v.reduce((a, b) => a + b, 0) / v.length;
  const priceOf = (d: number, s: number): number => {
    const day = base.days[d] as HistoryDay;
    const xs = (x[d] as number[])[s] as number;
    const h = Math.max(0, xs - knotOf(s));
    const v = term === 'hinge' ? h : h > 0 ? 1 : 0;
    const meanP = mean(prices[d - 1] as number[]);
    return (
      30 + 4 * xs + 2 * h + 0.4 * meanP - 20 * mean(x[d - 1] as number[]) + 0.1 * ((prices[d - 1] as number[])[s] as number) +
      0.05 * ((prices[d - 7] as number[])[s] as number) + (isoWeekday(day.day) === 1 ? 2 : 0) + 0.05 * v * meanP
    );
  };
  for (let d = 0; d < DAYS; d++) prices.push(Array.from({ length: S }, (_, s) => (d < 7 ? 100 + s : priceOf(d, s))));
  const days = base.days.map((day, d) => ({ ...day, pricePerMwh: prices[d] as number[], exogenous: { load_mw: x[d] as number[] } }));
  return { history: { ...base, days, exogenousNames: ['load_mw'] }, priceOf };
}

const OPTIONS: Partial<ForecastOptions> = {
  minTrainingDays: 21,
  calibrationDays: 28,
  minCalibrationDays: 21,
  driverWindowsDays: [100],
  driverKnots: 1,
  driverScale: 'price',
};

describe('driver regression: the hinges times yesterday\'s level (driverLevelSlope)', () => {
  const d = DAYS - 1;

  it.each([
    ['hinge', 'level'],
    ['step', 'level-step'],
  ] as const)('closed form: on prices exactly linear in the columns (%s times the level) the point forecast is that linear function', (term, option) => {
    // Least squares on a consistent noise-free system has zero residuals, so it returns the generating
    // coefficients, and Huber's step (clipping zero residuals) changes nothing: the forecast of the
    // next day is the formula's value (to rounding).
    const { history, priceOf } = exactHistory(term);
    // The lags read prices clipped at each day's far-out fences: none may be clipped for the system to be exact.
    expect(history.days.every((hd) => {
      const { low, high } = farOutFences(hd.pricePerMwh);
      return hd.pricePerMwh.every((p) => p >= low && p <= high);
    })).toBe(true);
    const day = forecastDay(history, d, [0.5], 'driver-hs', { ...OPTIONS, driverLevelSlope: option });
    day.point.forEach((p, s) => expect(p).toBeCloseTo(priceOf(d, s), 6));
  });

  it('without the columns the same history is not fitted exactly (the columns carry the term)', () => {
    const { history, priceOf } = exactHistory('hinge');
    const day = forecastDay(history, d, [0.5], 'driver-hs', OPTIONS);
    const worst = Math.max(...day.point.map((p, s) => Math.abs(p - priceOf(d, s))));
    expect(worst).toBeGreaterThan(0.05);
  });

  it('names the columns after the lags and before the day-level columns', () => {
    expect(driverColumns(1)).toHaveLength(12);
    expect(driverColumns(1, 'level').slice(4, 6)).toEqual(['max(0, residual load(d,s) - knot 1) * mean price(d-1)', 'mean price(d-1)']);
  });

  it('rejects an unknown value with an ArgumentError that names the option', () => {
    const { history } = exactHistory('hinge');
    expect(() => forecastDay(history, d, [0.5], 'driver-hs', { ...OPTIONS, driverLevelSlope: 'season' as 'level' })).toThrow(ArgumentError);
    expect(() => forecastDay(history, d, [0.5], 'driver-hs', { ...OPTIONS, driverLevelSlope: 'season' as 'level' })).toThrow(/driverLevelSlope/);
  });
});
