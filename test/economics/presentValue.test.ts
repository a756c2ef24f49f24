import { describe, expect, it } from 'vitest';
import { annuityFactor, capitalRecoveryFactor, npv } from '../../src/economics/index.js';
import { ArgumentError } from '../../src/stats/index.js';

describe('npv (numpy-financial convention: CF_0 at t = 0, undiscounted)', () => {
  it('gives npv(0.281, [-100, 39, 59, 55, 20]) = -0.0084785 (numpy-financial convention; numpy 2.4.6, numpyReferenceValues.py)', () => {
    // By hand, 1.281^2 = 1.640961, 1.281^3 = 2.102071041, 1.281^4 = 2.692753003521:
    // 39/1.281 = 30.444965, 59/1.640961 = 35.954541, 55/2.102071 = 26.164672, 20/2.692753 = 7.427343;
    // their sum is 99.991521, so NPV = 99.991521 - 100 = -0.008479.
    const flows = Object.freeze([-100, 39, 59, 55, 20]);
    expect(npv(0.281, flows)).toBeCloseTo(-0.0084785, 6);
    expect(npv(0.281, flows)).toBeCloseTo(-100 + 39 / 1.281 + 59 / 1.281 ** 2 + 55 / 1.281 ** 3 + 20 / 1.281 ** 4, 12);
  });

  it('leaves the first flow undiscounted and sums the flows at rate 0 (closed forms)', () => {
    expect(npv(0.5, [42])).toBe(42);
    expect(npv(0, [-100, 30, 40, 50])).toBe(20);
    expect(npv(0.1, [-100, 110])).toBeCloseTo(0, 12);
    expect(npv(0.1, [-100, 0, 121])).toBeCloseTo(0, 12);
  });

  it('is linear in the flows', () => {
    const a = [-50, 10, 20, 30];
    const b = [-20, 5, -5, 40];
    const sum = a.map((v, i) => v + 3 * (b[i] as number));
    expect(npv(0.07, sum)).toBeCloseTo(npv(0.07, a) + 3 * npv(0.07, b), 12);
  });

  it('rejects a rate <= -1, an empty series and non-finite flows', () => {
    expect(() => npv(-1, [1])).toThrow(ArgumentError);
    expect(() => npv(-1, [1])).toThrow(/invalid argument 'rate'/);
    expect(() => npv(0.1, [])).toThrow(/invalid argument 'cashFlows'/);
    expect(() => npv(0.1, [1, Number.POSITIVE_INFINITY])).toThrow(/invalid argument 'cashFlows\[1\]'/);
  });
});

describe('annuityFactor and capitalRecoveryFactor', () => {
  it('give 7.721735 for 1 per year over 10 years at 5% (the annuity formula (1 - 1.05^-10) / 0.05; numpy 2.4.6 sum of 1.05^-t, numpyReferenceValues.py)', () => {
    expect(annuityFactor(0.05, 10)).toBeCloseTo(7.721735, 6);
    expect(annuityFactor(0.05, 10)).toBeCloseTo((1 - 1.05 ** -10) / 0.05, 13);
    expect(capitalRecoveryFactor(0.05, 10)).toBeCloseTo(0.05 / (1 - 1.05 ** -10), 14);
  });

  it('equal the NPV of 1 per year from year 1, and n (resp. 1/n) at rate 0', () => {
    expect(annuityFactor(0.08, 7)).toBeCloseTo(npv(0.08, [0, 1, 1, 1, 1, 1, 1, 1]), 13);
    expect(annuityFactor(0, 12)).toBe(12);
    expect(annuityFactor(1e-12, 12)).toBeCloseTo(12, 9);
    expect(capitalRecoveryFactor(0, 4)).toBe(0.25);
    expect(annuityFactor(0.05, 0)).toBe(0);
  });

  it('reject a fractional or negative number of years, and zero years for the CRF', () => {
    expect(() => annuityFactor(0.05, 2.5)).toThrow(/invalid argument 'years'/);
    expect(() => annuityFactor(0.05, -1)).toThrow(/invalid argument 'years'/);
    expect(() => capitalRecoveryFactor(0.05, 0)).toThrow(/invalid argument 'years'/);
    expect(() => annuityFactor(-2, 3)).toThrow(/invalid argument 'rate'/);
  });
});
