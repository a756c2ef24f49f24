import { describe, expect, it } from 'vitest';
import { pairedDifference } from '../../src/stats/pairedDifference.js';

describe('pairedDifference', () => {
  it('hand-worked: differences 1, 3, 2, 6: mean 3, s_d = sqrt(14/3), standard error s_d / 2', () => {
    // d = (1, 3, 2, 6), mean 3, squared deviations 4 + 0 + 1 + 9 = 14, s_d^2 = 14 / 3 (paired t-test,
    // Montgomery and Runger, section 10-4).
    const d = pairedDifference([11, 13, 12, 16], [10, 10, 10, 10]);
    expect(d.mean).toBe(3);
    expect(d.standardError).toBeCloseTo(Math.sqrt(14 / 3) / 2, 14);
    expect(d.count).toBe(4);
  });

  it('one pair has no standard error; unequal lengths are refused', () => {
    expect(pairedDifference([5], [2])).toEqual({ count: 1, mean: 3, standardError: 0 });
    expect(() => pairedDifference([1, 2], [1])).toThrow();
  });
});
