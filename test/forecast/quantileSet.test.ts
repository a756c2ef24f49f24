import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { LevelOutOfRangeError, priceAtLevel, pricesAtLevel, rearrange } from '../../src/forecast/quantileSet.js';

describe('priceAtLevel', () => {
  const levels = Object.freeze([0.1, 0.5, 0.9]);
  const prices = Object.freeze([10, 20, 40]);

  it('interpolates linearly between neighbouring levels and is exact at given levels', () => {
    // Linear interpolation: 0.3 is halfway from 0.1 to 0.5, so 10 + 0.5 (20 - 10) = 15.
    expect(priceAtLevel(levels, prices, 0.3)).toBeCloseTo(15, 12);
    expect(priceAtLevel(levels, prices, 0.7)).toBeCloseTo(30, 12);
    expect(priceAtLevel(levels, prices, 0.5)).toBe(20);
    expect(priceAtLevel(levels, prices, 1 - 0.9)).toBe(10);
  });

  it('refuses levels outside the outermost given levels', () => {
    expect(() => priceAtLevel(levels, prices, 0.05)).toThrow(LevelOutOfRangeError);
    expect(() => priceAtLevel(levels, prices, 0.95)).toThrow(/outside the forecast's levels \[0.1, 0.9\]/);
  });
});

/**
 * Linear interpolation of the quantile function between neighbouring levels, one row at a time, written
 * out here as the reference (the textbook formula P(lo) (1 - w) + P(hi) w with w = (tau - tau_lo) /
 * (tau_hi - tau_lo), levels within 1e-9 taken as equal): the library finds the neighbours once per
 * forecast, and must give the same bits.
 */
function interpolated(levels: readonly number[], prices: readonly number[], tau: number): number {
  const eps = 1e-9;
  const last = levels.length - 1;
  if (tau < (levels[0] as number) - eps || tau > (levels[last] as number) + eps) throw new LevelOutOfRangeError(tau, levels[0] as number, levels[last] as number);
  if (tau <= (levels[0] as number)) return prices[0] as number;
  if (tau >= (levels[last] as number)) return prices[last] as number;
  const hi = levels.findIndex((level) => level >= tau);
  if (Math.abs(tau - (levels[hi] as number)) <= eps) return prices[hi] as number;
  if (Math.abs(tau - (levels[hi - 1] as number)) <= eps) return prices[hi - 1] as number;
  const w = (tau - (levels[hi - 1] as number)) / ((levels[hi] as number) - (levels[hi - 1] as number));
  return (prices[hi - 1] as number) * (1 - w) + (prices[hi] as number) * w;
}

describe('pricesAtLevel', () => {
  it('gives every row the interpolated price, to the last bit, as priceAtLevel does (seeded random levels, rows and levels asked)', () => {
    const levelsArb = fc.uniqueArray(fc.integer({ min: 1, max: 99 }), { minLength: 1, maxLength: 19 }).map((ks) => ks.sort((a, b) => a - b).map((k) => k / 100));
    const draw = levelsArb.chain((levels) =>
      fc.record({
        levels: fc.constant(levels),
        rows: fc.array(fc.array(fc.double({ min: -500, max: 3000, noNaN: true }), { minLength: levels.length, maxLength: levels.length }), { maxLength: 8 }),
        // Asked levels: given ones, computed ones one ulp off (1 - 0.9), and any in between or outside.
        tau: fc.oneof(fc.constantFrom(...levels), fc.constantFrom(...levels).map((l) => 1 - (1 - l)), fc.double({ min: 0, max: 1, noNaN: true })),
      }),
    );
    fc.assert(
      fc.property(draw, ({ levels, rows, tau }) => {
        let expected: number[] | Error;
        try {
          expected = rows.map((row) => interpolated(levels, row, tau));
        } catch (err) {
          expected = err as Error;
        }
        if (expected instanceof Error) {
          expect(() => pricesAtLevel(levels, rows, tau)).toThrow(expected.message);
          for (const row of rows) expect(() => priceAtLevel(levels, row, tau)).toThrow(expected.message);
        } else {
          expect(pricesAtLevel(levels, rows, tau)).toEqual(expected);
          expect(rows.map((row) => priceAtLevel(levels, row, tau))).toEqual(expected);
        }
      }),
      { seed: 20261205, numRuns: 500 },
    );
  });
});

describe('rearrange', () => {
  it('sorts crossing quantiles and reports the repair', () => {
    expect(rearrange(Object.freeze([3, 1, 2]))).toEqual({ prices: [1, 2, 3], repaired: true });
    expect(rearrange([1, 1, 2])).toEqual({ prices: [1, 1, 2], repaired: false });
  });

  it('never moves the curve further from a monotone truth (Chernozhukov, Fernandez-Val and Galichon 2010, Prop. 1)', () => {
    // For any non-decreasing truth and any estimate, sorting does not increase the L1 distance.
    const truth = [0, 1, 2, 3, 4, 5];
    for (const estimate of [[0, 3, 1, 2, 5, 4], [5, 4, 3, 2, 1, 0], [1, 0, 2, 2, 6, 3]]) {
      const l1 = (x: number[]) => x.reduce((s, v, k) => s + Math.abs(v - (truth[k] as number)), 0);
      expect(l1(rearrange(estimate).prices)).toBeLessThanOrEqual(l1(estimate));
    }
  });
});
