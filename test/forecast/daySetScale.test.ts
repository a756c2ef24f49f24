import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DaySetScale, sortedMad } from '../../src/forecast/models/daySetScale.js';
import { robustScale } from '../../src/forecast/models/robustAsinh.js';
import { farOutFences, sortedSampleBounds } from '../../src/forecast/models/farOutFences.js';
import { seededRandom } from './seededRandom.js';

/**
 * The plain definitions, by full sorts: the sample median (the middle value, or the mean of the two
 * middle values) and the MAD, the median of |x - median| (Hampel 1974, JASA 69(346), 383-393).
 */
function sortMedian(values: ArrayLike<number>): number {
  const s = Float64Array.from(values).sort();
  const h = s.length >> 1;
  return s.length % 2 === 1 ? s[h]! : (s[h - 1]! + s[h]!) / 2;
}

function sortMad(values: ArrayLike<number>): number {
  const m = sortMedian(values);
  return sortMedian(Array.from(values, (x) => Math.abs(x - m)));
}

/** Prices at cents, as a market publishes them, so that ties are common. */
function dayPrices(random: () => number, slots: number, level: number): Float64Array {
  return Float64Array.from({ length: slots }, () => Math.round(100 * (level + 40 * (random() - 0.3) ** 3 * 10)) / 100);
}

function concat(days: readonly Float64Array[]): Float64Array {
  return Float64Array.from(days.flatMap((d) => [...d]));
}

describe('sortedMad: the median absolute deviation of a sorted sample in O(log n)', () => {
  it('is 1 for [1, 2, 3, 4, 100] (median 3, deviations 2, 1, 0, 1, 97) and 1 for [1, 2, 3, 4] (median 2.5)', () => {
    // Worked by hand from the definition (Hampel 1974): sorted deviations [0, 1, 1, 2, 97] and [0.5, 0.5, 1.5, 1.5].
    expect(sortedMad(Float64Array.of(1, 2, 3, 4, 100), 5, 3)).toBe(1);
    expect(sortedMad(Float64Array.of(1, 2, 3, 4), 4, 2.5)).toBe(1);
  });

  it('equals the MAD by two full sorts, bit for bit, on random samples with ties, odd and even sizes', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -300, max: 300 }), { minLength: 1, maxLength: 200 }), fc.integer({ min: 1, max: 8 }), (ints, divisor) => {
        const values = Float64Array.from(ints, (v) => v / divisor).sort();
        const median = sortMedian(values);
        expect(Object.is(sortedMad(values, values.length, median), sortMad(values))).toBe(true);
      }),
      { seed: 17, numRuns: 500 },
    );
  });
});

describe('DaySetScale: robustScale of a moving set of days, kept sorted', () => {
  it('gives robustScale of the days one after the other, bit for bit, as a window rolls a day at a time', () => {
    const random = seededRandom(11);
    const days = Array.from({ length: 160 }, (_, d) => dayPrices(random, 24, 60 + 20 * Math.sin(d / 9)));
    const kept = new DaySetScale();
    for (let end = 40; end <= days.length; end++) {
      const window = days.slice(end - 40, end);
      // Newest first, as the ARX hands its training days, on every other call.
      const asked = end % 2 === 0 ? window : [...window].reverse();
      const got = kept.of(asked);
      const want = robustScale(concat(asked));
      expect(Object.is(got.median, want.median) && Object.is(got.scale, want.scale)).toBe(true);
      expect(got.median).toBe(sortMedian(concat(asked)));
    }
  });

  it('agrees with robustScale for any sequence of sets: jumps, growing and shrinking windows, repeats', () => {
    const random = seededRandom(23);
    const days = Array.from({ length: 60 }, () => dayPrices(random, 8, 50 * random()));
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 59 }), fc.integer({ min: 1, max: 30 })), { minLength: 1, maxLength: 25 }), (sets) => {
        const kept = new DaySetScale();
        for (const [start, size] of sets) {
          const asked = days.slice(start, Math.min(days.length, start + size));
          const got = kept.of(asked);
          const want = robustScale(concat(asked));
          expect([got.median, got.scale]).toEqual([want.median, want.scale]);
          expect(Object.is(got.scale, want.scale)).toBe(true);
        }
      }),
      { seed: 29, numRuns: 200 },
    );
  });

  it("takes robustScale's own answer where it depends on the order: a MAD of 0, a median of 0, a day given twice", () => {
    const kept = new DaySetScale();
    const flat = Float64Array.of(5, 5, 5, 5, 9);
    // MAD 0: the mean absolute deviation about the median, 4/5, times sqrt(pi/2) (see robustAsinh.ts).
    expect(kept.of([flat]).scale).toBeCloseTo((4 / 5) * Math.sqrt(Math.PI / 2), 12);
    const zero = Float64Array.of(-0, 0, -3, 4, 0);
    const atZero = kept.of([zero]);
    expect(atZero.median === 0).toBe(true);
    expect(Object.is(atZero.median, robustScale(zero).median)).toBe(true);
    const twice = kept.of([flat, flat, zero]);
    expect(twice).toEqual(robustScale(concat([flat, flat, zero])));
    expect(kept.of([Float64Array.of(1, 2, 3, 4, 100)])).toEqual(robustScale([1, 2, 3, 4, 100]));
  });

  it('withBounds: robustScale, and Tukey\'s far-out fences and the extremes of the same set read off the kept sorted prices, bit for bit, as sets are asked in turn', () => {
    // [1, 2, 3, 4, 100]: quartiles of definition 7 (Hyndman and Fan 1996) 2 and 4, fences 2 - 6 = -4
    // and 4 + 6 = 10 (Tukey 1977, section 2H), worked by hand.
    expect(new DaySetScale().withBounds([Float64Array.of(1, 2, 3, 4, 100)]).bounds).toEqual({ fences: { low: -4, high: 10 }, quartiles: { q1: 2, q3: 4 }, lowest: 1, highest: 100 });
    const random = seededRandom(31);
    const days = Array.from({ length: 60 }, () => dayPrices(random, 8, 50 * random()));
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 59 }), fc.integer({ min: 1, max: 30 }), fc.boolean()), { minLength: 1, maxLength: 25 }), (sets) => {
        const kept = new DaySetScale();
        for (const [start, size, scaleFirst] of sets) {
          const asked = days.slice(start, Math.min(days.length, start + size));
          if (scaleFirst) kept.of(asked);
          const got = kept.withBounds(asked);
          expect(got.bounds).toEqual({ fences: farOutFences(concat(asked)), quartiles: sortedSampleBounds(concat(asked).sort()).quartiles, lowest: Math.min(...concat(asked)), highest: Math.max(...concat(asked)) });
          const want = robustScale(concat(asked));
          expect(Object.is(got.scale.scale, want.scale) && Object.is(got.scale.median, want.median)).toBe(true);
          expect(kept.of(asked)).toBe(got.scale);
        }
        expect(kept.withBounds([days[0]!, days[0]!]).bounds.fences).toEqual(farOutFences(concat([days[0]!, days[0]!])));
      }),
      { seed: 37, numRuns: 200 },
    );
  });
});
