import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { worstTailMean } from '../../src/stats/worstTailMean.js';
import { ArgumentError } from '../../src/stats/argumentError.js';

// CVaR of a profit sample: the mean of its worst beta share with a fractional boundary term
// (Acerbi and Tasche 2002, eq. 4.2 on profits), checked against hand-worked samples and against
// Rockafellar and Uryasev's definition max_eta { eta - (1/(beta n)) sum (eta - X_i)^+ } (2000, Theorem 1)
// evaluated independently below.

/** Rockafellar-Uryasev on equally weighted outcomes: a concave piecewise-linear function of eta whose
 * maximum sits at a sample point, so the maximum over the sample points is the definition's value. */
function rockafellarUryasev(values: readonly number[], beta: number): number {
  let best = -Infinity;
  for (const eta of values) {
    let shortfall = 0;
    for (const x of values) shortfall += Math.max(0, eta - x);
    best = Math.max(best, eta - shortfall / (beta * values.length));
  }
  return best;
}

describe('worstTailMean (CVaR of profits)', () => {
  it('hand-worked: five profits, beta 0.3, a tail of 1.5 values', () => {
    // sorted -10, -3, 0, 5, 20; w = 0.3 x 5 = 1.5: (-10 + 0.5 x (-3)) / 1.5 = -11.5 / 1.5 = -7.666...
    expect(worstTailMean([5, -10, 20, 0, -3], 0.3)).toBeCloseTo(-23 / 3, 12);
  });

  it('hand-worked: 20 equal-weight profits at 5 % is the single worst one; 40 at 5 % the mean of the worst two', () => {
    const twenty = Array.from({ length: 20 }, (_, i) => 100 - 7 * i); // worst -33
    expect(worstTailMean(twenty, 0.05)).toBe(-33);
    const forty = Array.from({ length: 40 }, (_, i) => i * 2 - 10); // worst -10, -8
    expect(worstTailMean(forty, 0.05)).toBe(-9);
  });

  it('hand-worked: 30 profits at 5 %, w = 1.5: (X(1) + 0.5 X(2)) / 1.5', () => {
    const values = Array.from({ length: 30 }, (_, i) => (i === 0 ? -90 : i === 1 ? -30 : i));
    expect(worstTailMean(values, 0.05)).toBeCloseTo((-90 + 0.5 * -30) / 1.5, 12);
  });

  it('equals the Rockafellar-Uryasev definition on random samples, never exceeds the mean, and is the mean at beta 1', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1000, max: 1000, noNaN: true }), { minLength: 1, maxLength: 60 }),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        (values, beta) => {
          const cvar = worstTailMean(values, beta);
          const scale = Math.max(1, ...values.map(Math.abs));
          expect(Math.abs(cvar - rockafellarUryasev(values, beta))).toBeLessThanOrEqual(1e-9 * scale);
          const mean = values.reduce((a, b) => a + b, 0) / values.length;
          expect(cvar).toBeLessThanOrEqual(mean + 1e-9 * scale);
          expect(Math.abs(worstTailMean(values, 1) - mean)).toBeLessThanOrEqual(1e-9 * scale);
        },
      ),
      { seed: 16, numRuns: 400 },
    );
  });

  it('refuses an empty sample, a share outside (0, 1] and non-finite values', () => {
    expect(() => worstTailMean([], 0.05)).toThrow(ArgumentError);
    expect(() => worstTailMean([1], 0)).toThrow(ArgumentError);
    expect(() => worstTailMean([1], 1.5)).toThrow(ArgumentError);
    expect(() => worstTailMean([1, Number.NaN], 0.5)).toThrow(ArgumentError);
  });
});
