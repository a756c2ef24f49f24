// SciPy 1.17.1 / NumPy 2.4.6 values below are printed by test/stats/scipyReferenceValues.py.
import { describe, expect, it } from 'vitest';
import { dieboldMariano, type DieboldMarianoResult } from '../../src/stats/index.js';

function ok(result: DieboldMarianoResult): Extract<DieboldMarianoResult, { status: 'ok' }> {
  if (result.status !== 'ok') throw new Error(`expected status ok, got ${result.status}`);
  return result;
}

describe('dieboldMariano', () => {
  it('matches the SciPy 1.17 check value for h = 1', () => {
    // SciPy 1.17 (scipy.stats.t.sf), computed for this check: DM = 2.08147, HLN = 1.97466, p = 0.03987.
    // By hand: mean 0.23, squared deviations sum to 1.221, gamma_0 = 0.1221, DM = 0.23 / sqrt(0.01221).
    const d = Object.freeze([0.5, -0.2, 0.8, 0.1, 0.3, -0.4, 0.6, 0.2, 0, 0.4]);
    const r = ok(dieboldMariano(d, 1));
    expect(r.n).toBe(10);
    expect(r.meanDifference).toBeCloseTo(0.23, 14);
    expect(r.longRunVariance).toBeCloseTo(0.1221, 14);
    expect(r.dm).toBeCloseTo(2.08147, 5);
    expect(r.hln).toBeCloseTo(1.97466, 5);
    expect(r.pValueOneSided).toBeCloseTo(0.03987, 5);
    expect(r.pValueTwoSided).toBeCloseTo(2 * 0.03987132526811461, 12);
    expect(r.degreesOfFreedom).toBe(9);
  });

  it('works a short series by hand (h = 1)', () => {
    // d = 1, 2, 3, -2: mean = 4/4 = 1; deviations 0, 1, 2, -3; gamma_0 = (0 + 1 + 4 + 9)/4 = 3.5.
    // DM = 1 / sqrt(3.5 / 4) = sqrt(8/7); HLN factor sqrt((4 + 1 - 2 + 0)/4) = sqrt(3/4), so HLN = sqrt(6/7).
    // p = P(T_3 >= sqrt(6/7)) from the closed form of Abramowitz and Stegun 26.7.3 with 3 df:
    // theta = atan(sqrt(6/7) / sqrt(3)) = atan(sqrt(2/7)), p = (1 - (2/pi)(theta + sin(theta) cos(theta))) / 2
    // = 0.2114131 (SciPy 1.17.1 t.sf gives 0.21141313088605126).
    const r = ok(dieboldMariano([1, 2, 3, -2]));
    const theta = Math.atan(Math.sqrt(2 / 7));
    expect(r.meanDifference).toBe(1);
    expect(r.longRunVariance).toBe(3.5);
    expect(r.dm).toBeCloseTo(Math.sqrt(8 / 7), 14);
    expect(r.hln).toBeCloseTo(Math.sqrt(6 / 7), 14);
    expect(r.pValueOneSided).toBeCloseTo((1 - (2 / Math.PI) * (theta + Math.sin(theta) * Math.cos(theta))) / 2, 14);
    expect(r.pValueOneSided).toBeCloseTo(0.21141313088605126, 14);
  });

  it('adds the lag-1 autocovariance for h = 2 (by hand)', () => {
    // d = 1, 2, 3, 3, 2, 1: mean 2; deviations e = -1, 0, 1, 1, 0, -1.
    // gamma_0 = (1 + 0 + 1 + 1 + 0 + 1)/6 = 4/6.
    // gamma_1 = (e2 e1 + e3 e2 + e4 e3 + e5 e4 + e6 e5)/6 = (0 + 0 + 1 + 0 + 0)/6 = 1/6.
    // V = gamma_0 + 2 gamma_1 = 4/6 + 2/6 = 1; DM = 2 / sqrt(1/6) = 2 sqrt(6) = 4.898979.
    // HLN factor (n + 1 - 2h + h(h-1)/n)/n = (6 + 1 - 4 + 2/6)/6 = 5/9, HLN = 2 sqrt(6) sqrt(5)/3 = 2 sqrt(30)/3.
    // p = P(T_5 >= HLN) by A&S 26.7.3 with 5 df: (1 - (2/pi)(theta + sin(theta)(cos(theta) + (2/3)cos^3(theta))))/2,
    // theta = atan(HLN / sqrt 5); SciPy 1.17.1 t.sf gives 0.007362700503533166.
    const r = ok(dieboldMariano(Object.freeze([1, 2, 3, 3, 2, 1]), 2));
    const hln = (2 * Math.sqrt(30)) / 3;
    const theta = Math.atan(hln / Math.sqrt(5));
    const c = Math.cos(theta);
    expect(r.longRunVariance).toBeCloseTo(1, 14);
    expect(r.dm).toBeCloseTo(2 * Math.sqrt(6), 13);
    expect(r.hln).toBeCloseTo(hln, 13);
    expect(r.pValueOneSided).toBeCloseTo((1 - (2 / Math.PI) * (theta + Math.sin(theta) * (c + (2 / 3) * c ** 3))) / 2, 14);
    expect(r.pValueOneSided).toBeCloseTo(0.007362700503533166, 14);
  });

  it('flips sign when the two forecasts swap, and ignores the loss scale', () => {
    const d = [1, 2, 3, 3, 2, 1];
    const base = ok(dieboldMariano(d, 2));
    const swapped = ok(dieboldMariano(d.map((v) => -v), 2));
    const scaled = ok(dieboldMariano(d.map((v) => 7 * v), 2));
    expect(swapped.hln).toBeCloseTo(-base.hln, 13);
    expect(swapped.pValueOneSided).toBeCloseTo(1 - base.pValueOneSided, 13);
    expect(swapped.pValueTwoSided).toBeCloseTo(base.pValueTwoSided, 13);
    expect(scaled.dm).toBeCloseTo(base.dm, 13);
  });

  it('reports zero variance instead of NaN when every difference is equal', () => {
    expect(dieboldMariano(Object.freeze([0.1, 0.1, 0.1]))).toMatchObject({
      status: 'zero-variance',
      n: 3,
      reason: expect.stringMatching(/same number/),
    });
    expect(dieboldMariano([0, 0, 0, 0]).status).toBe('zero-variance');
  });

  it('reports a non-positive long-run variance when the autocovariances cancel it', () => {
    // d = 2, 0, 1, 3, -1, 1: mean 1, e = 1, -1, 0, 2, -2, 0; gamma_0 = 10/6, gamma_1 = (-1 + 0 + 0 - 4 + 0)/6 = -5/6,
    // so V = 10/6 - 10/6 = 0 with h = 2.
    const r = dieboldMariano([2, 0, 1, 3, -1, 1], 2);
    expect(r.status).toBe('non-positive-variance');
    expect(r.longRunVariance).toBeCloseTo(0, 14);
  });

  it('rejects too few differences and a horizon outside [1, n - 1]', () => {
    expect(() => dieboldMariano([1])).toThrow(/invalid argument 'differences'/);
    expect(() => dieboldMariano([1, 2, 3], 3)).toThrow(/invalid argument 'horizon'/);
    expect(() => dieboldMariano([1, 2, 3], 0)).toThrow(/invalid argument 'horizon'/);
  });
});
