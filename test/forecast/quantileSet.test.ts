import { describe, expect, it } from 'vitest';
import { LevelOutOfRangeError, priceAtLevel, rearrange } from '../../src/forecast/quantileSet.js';

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
