import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DayForecast } from '../../src/forecast/forecaster.js';
import { averageForecast } from '../../src/forecast/quantileAverage.js';
import { crpsFromQuantiles } from '../../src/forecast/scoring/crps.js';

const LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95];

/** A one-day forecast with the given quantile rows and paths (the other fields filled plainly). */
function member(prices: number[][], paths: number[][] = []): DayForecast {
  return {
    quantiles: { day: '2030-01-01', levels: LEVELS, periods: [], prices },
    point: prices.map((row) => row[2]!),
    paths,
    calibrationDays: 364,
    crossedSlots: 0,
    notes: [],
    chosen: null,
  };
}

describe("the quantile average of auto's candidates (Vincentization; Lichtendahl, Grushka-Cockayne and Winkler 2013)", () => {
  it('two normals N(10, 2^2) and N(40, 6^2) average to N(25, 4^2): the location-scale closed form (Lichtendahl et al. 2013, section 3; values from SciPy, test/forecast/quantileAverageReference.py)', () => {
    // Inputs: scipy.stats.norm.ppf(levels, 10, 2) and (levels, 40, 6).
    const a = [6.710292746097054, 8.651020499607837, 10.0, 11.348979500392163, 13.289707253902945];
    const b = [30.130878238291164, 35.95306149882351, 40.0, 44.04693850117649, 49.86912176170883];
    // Check: scipy.stats.norm.ppf(levels, 25, 4).
    const expected = [18.420585492194107, 22.302040999215674, 25.0, 27.697959000784326, 31.57941450780589];
    const made = averageForecast([member([a]), member([b])]);
    made.quantiles.prices[0]!.forEach((q, k) => expect(q).toBeCloseTo(expected[k]!, 12));
    expect(made.point).toEqual([25]);
  });

  it('a normal N(10, 2^2) and a uniform U(0, 30) average to the SciPy values of the reference script', () => {
    const a = [6.710292746097054, 8.651020499607837, 10.0, 11.348979500392163, 13.289707253902945];
    const u = [1.5, 7.5, 15.0, 22.5, 28.5];
    const expected = [4.105146373048527, 8.07551024980392, 12.5, 16.92448975019608, 20.894853626951473];
    averageForecast([member([a]), member([u])]).quantiles.prices[0]!.forEach((q, k) => expect(q).toBeCloseTo(expected[k]!, 12));
  });

  it('law: rows stay non-decreasing, and the pinball loss is never above the mean of the members\' (the pinball loss is convex in q)', () => {
    const value = fc.double({ min: -500, max: 3000, noNaN: true });
    const row = fc.array(value, { minLength: LEVELS.length, maxLength: LEVELS.length }).map((r) => [...r].sort((p, q) => p - q));
    fc.assert(
      fc.property(fc.array(row, { minLength: 2, maxLength: 5 }), value, (rows, y) => {
        const averaged = averageForecast(rows.map((r) => member([r]))).quantiles.prices[0]!;
        const mean = rows.reduce((sum, r) => sum + crpsFromQuantiles(y, r, LEVELS), 0) / rows.length;
        return averaged.every((v, k) => k === 0 || v >= averaged[k - 1]!) && crpsFromQuantiles(y, averaged, LEVELS) <= mean + 1e-9 * (1 + Math.abs(mean));
      }),
      { seed: 20131001, numRuns: 300 },
    );
  });

  it("paths, worked by hand: sorted values averaged rank by rank, laid out in the ranks of the first member's paths", () => {
    const row = [0, 1, 2, 3, 4];
    // Member a's two paths take 1 and 5 in the period, b's 3 and 2: sorted [1, 5] and [2, 3] average to [1.5, 4].
    const a = member([row], [[1], [5]]);
    const b = member([row], [[3], [2]]);
    expect(averageForecast([a, b]).paths).toEqual([[1.5], [4]]);
    expect(averageForecast([b, a]).paths).toEqual([[4], [1.5]]);
  });

  it('refuses fewer than two members', () => {
    expect(() => averageForecast([member([[0, 1, 2, 3, 4]])])).toThrow(/two or more/);
  });
});
