import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { alignedTicks, linearScale, niceTicks, tickLabel, tickLabels } from '../../src/report/index.js';
import { ticksOnFixedEnds } from '../../src/report/niceTicks.js';

/*
 * The rule under test (src/report/niceTicks.ts): step = smallest m x 10^k, m in {1, 2, 5}, with
 * step >= (max - min) / target; ticks from floor(min / step) x step to ceil(max / step) x step.
 * Expected values are worked by hand from that rule.
 */
describe('niceTicks: the 1-2-5 ladder', () => {
  it.each([
    // [min, max, target, step, ticks]; the reasoning in the comment
    [0, 97, 5, 20, [0, 20, 40, 60, 80, 100]], // 97 / 5 = 19.4 -> 20
    [0, 1, 5, 0.2, [0, 0.2, 0.4, 0.6, 0.8, 1]], // 0.2 is on the ladder
    [-500, 4000, 5, 1000, [-1000, 0, 1000, 2000, 3000, 4000]], // 900 -> 1000
    [0.3, 0.7, 4, 0.1, [0.3, 0.4, 0.5, 0.6, 0.7]], // 0.1 exactly; no 0.30000000000000004
    [3, 3, 5, 0.2, [2.6, 2.8, 3, 3.2, 3.4]], // empty range widened to 3 -/+ 0.3: 0.12 -> 0.2
    [0, 0, 5, 0.5, [-1, -0.5, 0, 0.5, 1]], // [0, 0] widened to [-1, 1]: 0.4 -> 0.5
    [-0.0123, 0.0456, 5, 0.02, [-0.02, 0, 0.02, 0.04, 0.06]], // 0.01158 -> 0.02
    [12, 7_650_000, 4, 2_000_000, [0, 2_000_000, 4_000_000, 6_000_000, 8_000_000]], // 1.9 M -> 2 M
  ])('[%d, %d] with target %d: step %d', (min, max, target, step, ticks) => {
    const nice = niceTicks(min, max, target);
    expect(nice.step).toBe(step);
    expect(nice.values).toEqual(ticks);
  });

  // "Cover" up to 1e-9 of a step: the rule's floor and ceil forgive binary rounding of that size.
  it('laws: ticks cover the data, the step is on the ladder, at most target + 2 intervals (fast-check, seed 7)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 0, max: 1e6, noNaN: true }), fc.integer({ min: 1, max: 12 }), (min, width, target) => {
        const max = min + width;
        const nice = niceTicks(min, max, target);
        expect(nice.min).toBeLessThanOrEqual(min + 1e-9 * nice.step);
        expect(nice.max).toBeGreaterThanOrEqual(max - 1e-9 * nice.step);
        const exponent = Math.floor(Math.log10(nice.step) + 1e-9);
        const mantissa = nice.step / 10 ** exponent;
        expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
        expect(nice.values.length - 1).toBeLessThanOrEqual(target + 2);
      }),
      { seed: 7, numRuns: 500 },
    );
  });

  it('rejects reversed or non-finite ranges', () => {
    expect(() => niceTicks(2, 1)).toThrow(RangeError);
    expect(() => niceTicks(Number.NaN, 1)).toThrow(RangeError);
  });
});

describe('alignedTicks: a secondary axis on the same grid', () => {
  it('[0, 37] in 6 ticks is 0..50 by 10 (37 / 5 = 7.4 -> 10)', () => {
    expect(alignedTicks(0, 37, 6).values).toEqual([0, 10, 20, 30, 40, 50]);
  });
  it('[-3, 12] in 4 ticks: step 5 gives -5..10, short of 12, so step 10 gives -10..20', () => {
    expect(alignedTicks(-3, 12, 4).values).toEqual([-10, 0, 10, 20]);
  });
});

describe('ticksOnFixedEnds', () => {
  it('[-5, 5]: step 2 misses both ends, step 5 hits them', () => {
    expect(ticksOnFixedEnds(-5, 5, 2, 5)?.values).toEqual([-5, 0, 5]);
  });
  it('[0, 12.5]: no ladder step hits 12.5 within 1.5 x target intervals', () => {
    expect(ticksOnFixedEnds(0, 12.5, 2, 5)).toBeNull();
  });
});

describe('linearScale', () => {
  it('maps the nice domain onto the range, y upwards', () => {
    const y = linearScale([0, 97], [300, 100]);
    expect(y.domain).toEqual([0, 100]);
    expect(y.at(0)).toBe(300);
    expect(y.at(100)).toBe(100);
    expect(y.at(25)).toBe(250);
    expect(y.labels).toEqual(['0', '20', '40', '60', '80', '100']);
  });
  it('keeps fixed ends and includes zero on request; ignores nulls', () => {
    expect(linearScale([3, null, 7], [0, 1], { includeZero: true }).domain).toEqual([0, 8]);
    expect(linearScale([3, 7], [0, 1], { min: -5, max: 5 }).ticks).toEqual([-5, 0, 5]);
  });
});

describe('tick labels', () => {
  it('typographic minus U+2212, fixed decimals, no "-0"', () => {
    expect(tickLabel(-20, 0)).toBe('\u221220');
    expect(tickLabel(0.25, 2)).toBe('0.25');
    expect(tickLabel(-0.0001, 2)).toBe('0.00');
  });
  it('k and M for large steps', () => {
    expect(tickLabels([0, 20000, 40000], 20000, 0)).toEqual(['0', '20k', '40k']);
    expect(tickLabels([0, 2500, 5000, 7500, 10000, 12500], 2500, 0)).toEqual(['0', '2.5k', '5.0k', '7.5k', '10.0k', '12.5k']);
    expect(tickLabels([0, 2e7, 4e7], 2e7, 0)).toEqual(['0', '20M', '40M']);
    expect(tickLabels([-1000, 0, 1000], 1000, 0)).toEqual(['\u22121000', '0', '1000']);
  });
});
