// SciPy 1.17.1 / NumPy 2.4.6 values below are printed by test/stats/scipyReferenceValues.py.
import { describe, expect, it } from 'vitest';
import { ArgumentError, autocovariance, mean, quantileSorted, sampleVariance } from '../../src/stats/index.js';

// Seven values sorted by hand: 0.4, 1.2, 2.2, 3.1, 4.0, 5.5, 8.9.
const DATA = Object.freeze([3.1, 1.2, 5.5, 4.0, 2.2, 8.9, 0.4]);
const SORTED = Object.freeze([0.4, 1.2, 2.2, 3.1, 4.0, 5.5, 8.9]);

describe('mean and sampleVariance', () => {
  it('give 5 and 32/7 on 2, 4, 4, 4, 5, 5, 7, 9 (by hand: squared deviations 9+1+1+1+0+0+4+16 = 32)', () => {
    const values = Object.freeze([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(mean(values)).toBe(5);
    expect(sampleVariance(values)).toBeCloseTo(32 / 7, 15);
  });

  it('match numpy.mean and numpy.var(ddof=1) (NumPy 2.4.6)', () => {
    expect(mean(DATA)).toBeCloseTo(3.614285714285714, 14);
    expect(sampleVariance(DATA)).toBeCloseTo(8.344761904761905, 14);
  });

  it('keep precision under a large offset (variance is shift invariant)', () => {
    const shifted = DATA.map((v) => v + 1e9);
    expect(sampleVariance(shifted)).toBeCloseTo(8.344761904761905, 6);
  });

  it('reject empty, too short or non-finite input with an ArgumentError naming it', () => {
    expect(() => mean([])).toThrow(ArgumentError);
    expect(() => sampleVariance([1])).toThrow(/invalid argument 'values'/);
    expect(() => mean([1, Number.NaN])).toThrow(/invalid argument 'values\[1\]'/);
  });
});

describe('quantileSorted (Hyndman-Fan definition 7)', () => {
  it('matches numpy.quantile with its default linear method (NumPy 2.4.6)', () => {
    const cases = [
      [0, 0.4],
      [0.1, 0.88],
      [0.25, 1.7],
      [0.5, 3.1],
      [0.9, 6.86],
      [1, 8.9],
    ] as const;
    for (const [p, expected] of cases) expect(quantileSorted(SORTED, p)).toBeCloseTo(expected, 14);
  });

  it('gives the usual median of an even sample and 1.75 at p = 0.25 of 1..4 (h = 0.75 by hand)', () => {
    expect(quantileSorted([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(quantileSorted([1, 2, 3, 4], 0.25)).toBe(1.75);
    expect(quantileSorted([7], 0.3)).toBe(7);
  });

  it('rejects unsorted data and p outside [0, 1]', () => {
    expect(() => quantileSorted(DATA, 0.5)).toThrow(/invalid argument 'sorted'/);
    expect(() => quantileSorted(SORTED, 1.5)).toThrow(/invalid argument 'p'/);
  });
});

describe('autocovariance (divisor n)', () => {
  it('of 1, -1, 1, -1 is 1, -3/4, 1/2, -1/4 at lags 0..3 (by hand: mean 0, products all +1 or -1)', () => {
    const values = Object.freeze([1, -1, 1, -1]);
    expect([0, 1, 2, 3].map((k) => autocovariance(values, k))).toEqual([1, -0.75, 0.5, -0.25]);
  });

  it('matches sum(e[k:] * e[:n-k]) / n computed with NumPy 2.4.6', () => {
    const expected = [7.15265306122449, -3.9420699708454814, 0.2881049562682216, 1.7062390670553937];
    expected.forEach((value, k) => expect(autocovariance(DATA, k)).toBeCloseTo(value, 13));
  });

  it('at lag 0 is (n - 1)/n times the sample variance', () => {
    expect(autocovariance(DATA, 0)).toBeCloseTo((sampleVariance(DATA) * 6) / 7, 14);
  });

  it('rejects a lag outside [0, n - 1]', () => {
    expect(() => autocovariance(DATA, 7)).toThrow(/invalid argument 'lag'/);
    expect(() => autocovariance(DATA, 1.5)).toThrow(/invalid argument 'lag'/);
  });
});
