import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DayForecast } from '../../src/forecast/forecaster.js';
import { InsufficientHistoryError } from '../../src/forecast/models/errors.js';
import { averageForecast } from '../../src/forecast/quantileAverage.js';
import { crpsFromQuantiles } from '../../src/forecast/scoring/crps.js';

const LEVELS = [0.1, 0.5, 0.9];

/** A one-day forecast with the given quantile rows and paths (the other fields filled plainly). */
function member(prices: number[][], paths: number[][] = []): DayForecast {
  return {
    quantiles: { day: '2030-01-01', levels: LEVELS, periods: [], prices },
    point: prices.map((row) => row[1]!),
    paths,
    calibrationDays: 364,
    crossedSlots: 0,
    notes: [],
    chosen: null,
  };
}

describe("the quantile average of auto's candidates (Lichtendahl, Grushka-Cockayne and Winkler 2013)", () => {
  it('hand-worked: [1, 2, 3] and [3, 4, 7] average to [2, 3, 5] level by level', () => {
    const made = averageForecast([member([[1, 2, 3]]), member([[3, 4, 7]])], null) as DayForecast;
    expect(made.quantiles.prices).toEqual([[2, 3, 5]]);
    expect(made.point).toEqual([3]);
  });

  it('law: its pinball loss is never above the mean of the members\' losses (the pinball loss is convex in q)', () => {
    const value = fc.double({ min: -500, max: 3000, noNaN: true });
    const row = fc.tuple(value, value, value).map((r) => [...r].sort((a, b) => a - b));
    fc.assert(
      fc.property(fc.array(row, { minLength: 2, maxLength: 5 }), value, (rows, y) => {
        const made = averageForecast(rows.map((r) => member([r])), null) as DayForecast;
        const mean = rows.reduce((sum, r) => sum + crpsFromQuantiles(y, r, LEVELS), 0) / rows.length;
        const averaged = made.quantiles.prices[0]!;
        return averaged.every((v, k) => k === 0 || v >= averaged[k - 1]!) && crpsFromQuantiles(y, averaged, LEVELS) <= mean + 1e-9 * (1 + Math.abs(mean));
      }),
      { seed: 20131001, numRuns: 300 },
    );
  });

  it('hand-worked paths: sorted values averaged rank by rank, laid out in the ranks of the template', () => {
    // Member a's paths take 1 and 5, member b's 3 and 2: sorted [1, 5] and [2, 3] average to [1.5, 4].
    const a = member([[0, 1, 2]], [[1], [5]]);
    const b = member([[0, 1, 2]], [[3], [2]]);
    expect((averageForecast([a, b], a) as DayForecast).paths).toEqual([[1.5], [4]]);
    expect((averageForecast([a, b], b) as DayForecast).paths).toEqual([[4], [1.5]]);
  });

  it('gives the reason of a member that cannot forecast the day', () => {
    const reason = new InsufficientHistoryError('2030-01-01', 'the drivers point forecast', 35, 3);
    expect(averageForecast([member([[1, 2, 3]]), reason], null)).toBe(reason);
  });
});
