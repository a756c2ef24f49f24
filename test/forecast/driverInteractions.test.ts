import { describe, expect, it } from 'vitest';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { forecastDay } from '../../src/forecast/forecaster.js';
import { driverColumns } from '../../src/forecast/models/driverRegression.js';
import { ArgumentError } from '../../src/stats/argumentError.js';
import type { HistoryDay, PriceHistory } from '../../src/types.js';
import { seededNormal } from './seededRandom.js';
import { syntheticHistory } from './syntheticHistory.js';

const DAYS = 140;
const S = 24;
/** ISO weekday 1..7 (7 Sunday) of a YYYY-MM-DD day. */
const isoWeekday = (day: string): number => ((new Date(`${day}T00:00:00Z`).getUTCDay() + 6) % 7) + 1;

/**
 * A noise-free history whose prices follow the driver regression's own columns exactly (price scale,
 * no knots), with both interactions:
 *   P(d,s) = 30 + 4 x + 0.4 mean P(d-1) - 2 mean x(d-1) + 0.1 P(d-1,s) + 0.05 P(d-7,s) + 2 D_Mon(d)
 *            + 1.5 x D_weekend(d) + 0.05 x mean P(d-1),   x = x(d,s) in [2, 3] (invented, seeded).
 * The first 7 days have prices 100 + s.
 */
function exactHistory(): { history: PriceHistory; priceOf: (d: number, s: number) => number } {
  const base = syntheticHistory({ days: DAYS, periodMinutes: 60, seed: 3 });
  const z = seededNormal(11);
  const x = base.days.map(() => Array.from({ length: S }, () => 2.5 + 0.5 * Math.tanh(z())));
  const prices: number[][] = [];
  const mean = (v: readonly number[]): number => v.reduce((a, b) => a + b, 0) / v.length;
  const priceOf = (d: number, s: number): number => {
    const day = base.days[d] as HistoryDay;
    const w = isoWeekday(day.day);
    const xs = (x[d] as number[])[s] as number;
    const meanP = mean(prices[d - 1] as number[]);
    return (
      30 + 4 * xs + 0.4 * meanP - 2 * mean(x[d - 1] as number[]) + 0.1 * ((prices[d - 1] as number[])[s] as number) +
      0.05 * ((prices[d - 7] as number[])[s] as number) + (w === 1 ? 2 : 0) + (w >= 6 ? 1.5 * xs : 0) + 0.05 * xs * meanP
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
  driverKnots: 0,
  driverScale: 'price',
};

describe('driver regression: interaction columns of the residual load (driverInteractions)', () => {
  const { history, priceOf } = exactHistory();
  const d = DAYS - 1;

  it('closed form: on prices that are exactly linear in the columns (with both interactions) the point forecast is that linear function', () => {
    // Least squares on a consistent noise-free system has zero residuals, so it returns the generating
    // coefficients, and Huber's step (clipping zero residuals) changes nothing: the forecast of the next
    // day is the formula's value (to rounding).
    const day = forecastDay(history, d, [0.5], 'driver-hs', { ...OPTIONS, driverInteractions: ['level', 'weekend'] });
    day.point.forEach((p, s) => expect(p).toBeCloseTo(priceOf(d, s), 6));
  });

  it('without the interactions the same history is not fitted exactly (the columns carry the terms)', () => {
    const day = forecastDay(history, d, [0.5], 'driver-hs', OPTIONS);
    const worst = Math.max(...day.point.map((p, s) => Math.abs(p - priceOf(d, s))));
    expect(worst).toBeGreaterThan(0.01);
  });

  it('names the interaction columns after the lags and before the weekday dummies, in a fixed order, whatever the order asked', () => {
    expect(driverColumns(1, ['weekend', 'level']).slice(6, 8)).toEqual(['residual load(d,s) x mean price(d-1)', 'residual load(d,s) x weekend(d)']);
    expect(driverColumns(1)).toHaveLength(12);
    expect(driverColumns(1, ['level', 'weekend'])).toHaveLength(14);
  });

  it('rejects an unknown interaction with an ArgumentError that names the option', () => {
    expect(() => forecastDay(history, d, [0.5], 'driver-hs', { ...OPTIONS, driverInteractions: ['season' as 'level'] })).toThrow(ArgumentError);
    expect(() => forecastDay(history, d, [0.5], 'driver-hs', { ...OPTIONS, driverInteractions: ['season' as 'level'] })).toThrow(/driverInteractions\[0\]/);
  });
});
