// SciPy 1.17.1 / NumPy 2.4.6 values below are printed by test/stats/scipyReferenceValues.py.
import { describe, expect, it } from 'vitest';
import { chiSquareCdf, chiSquareSurvival, normalCdf, normalQuantile, studentTCdf } from '../../src/stats/index.js';

const GRID = [-50, -7.5, -3, -1.2, -0.4, 0, 0.25, 1, 2.2, 6, 40] as const;

describe('normalCdf', () => {
  it('matches Abramowitz and Stegun (1964) table 26.1 (values from memory)', () => {
    expect(normalCdf(1)).toBeCloseTo(0.8413447461, 10);
    expect(normalCdf(2)).toBeCloseTo(0.9772498681, 10);
    expect(normalCdf(0)).toBe(0.5);
  });

  it('matches scipy.stats.norm.cdf (SciPy 1.17.1), lower tail to relative accuracy', () => {
    expect(normalCdf(-1)).toBeCloseTo(0.15865525393145707, 15);
    expect(normalCdf(1.2345)).toBeCloseTo(0.8914916766373298, 15);
    expect(normalCdf(-8) / 6.22096057427174e-16).toBeCloseTo(1, 12);
  });

  it('is symmetric: Phi(x) + Phi(-x) = 1, and has the limits 0 and 1', () => {
    for (const x of GRID) expect(normalCdf(x) + normalCdf(-x)).toBeCloseTo(1, 15);
    expect(normalCdf(-Infinity)).toBe(0);
    expect(normalCdf(Infinity)).toBe(1);
  });

  it('rejects NaN', () => {
    expect(() => normalCdf(Number.NaN)).toThrow(/invalid argument 'x'/);
  });
});

describe('normalQuantile', () => {
  it('gives 1.959963985 at 0.975 (Abramowitz and Stegun 1964, table 26.5: 1.959964)', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963985, 9);
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
  });

  it('matches scipy.stats.norm.ppf (SciPy 1.17.1) to full precision after the refinement step', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 14);
    expect(normalQuantile(0.3)).toBeCloseTo(-0.5244005127080409, 14);
    expect(normalQuantile(1e-10)).toBeCloseTo(-6.361340902404056, 13);
    expect(normalQuantile(0.999999)).toBeCloseTo(4.753424308817087, 9); // 1 - p carries ~1e-11 relative error
  });

  it('inverts normalCdf, is odd about 1/2 and has the limits -Infinity and Infinity', () => {
    for (const p of [1e-300, 1e-20, 0.001, 0.02425, 0.1, 0.5, 0.7, 0.97575, 0.999]) {
      expect(normalCdf(normalQuantile(p)) / p).toBeCloseTo(1, 13);
    }
    for (const p of [1e-9, 0.001, 0.1, 0.3, 0.5]) {
      expect(normalQuantile(p) + normalQuantile(1 - p)).toBeCloseTo(0, 6);
    }
    // smallest double, where the refinement step would overflow: SciPy 1.17.1 norm.ppf(5e-324)
    expect(normalQuantile(Number.MIN_VALUE)).toBeCloseTo(-38.467405617144344, 6);
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
  });

  it('rejects probabilities outside [0, 1]', () => {
    expect(() => normalQuantile(1.1)).toThrow(/invalid argument 'p'/);
    expect(() => normalQuantile(Number.NaN)).toThrow(/invalid argument 'p'/);
  });
});

describe('studentTCdf', () => {
  it('with 1 df is the Cauchy cdf 0.5 + atan(x)/pi (closed form)', () => {
    for (const x of GRID) expect(studentTCdf(x, 1)).toBeCloseTo(0.5 + Math.atan(x) / Math.PI, 14);
  });

  it('with 2 df is 0.5 + x / (2 sqrt(2 + x^2)) (closed form)', () => {
    for (const x of GRID) expect(studentTCdf(x, 2)).toBeCloseTo(0.5 + x / (2 * Math.sqrt(2 + x * x)), 14);
  });

  it('with 3 and 5 df follows Abramowitz and Stegun (1964) 26.7.3 (closed form for odd df)', () => {
    // theta = atan(t / sqrt(nu)); A(t|3) = (2/pi)(theta + sin cos), A(t|5) = (2/pi)(theta + sin (cos + 2/3 cos^3))
    for (const x of GRID) {
      const theta3 = Math.atan(x / Math.sqrt(3));
      const a3 = (2 / Math.PI) * (theta3 + Math.sin(theta3) * Math.cos(theta3));
      expect(studentTCdf(x, 3)).toBeCloseTo((1 + a3) / 2, 14);
      const theta5 = Math.atan(x / Math.sqrt(5));
      const c5 = Math.cos(theta5);
      const a5 = (2 / Math.PI) * (theta5 + Math.sin(theta5) * (c5 + (2 / 3) * c5 ** 3));
      expect(studentTCdf(x, 5)).toBeCloseTo((1 + a5) / 2, 14);
    }
  });

  it('matches scipy.stats.t.cdf / t.sf (SciPy 1.17.1), including non-integer df', () => {
    expect(studentTCdf(1.5, 5)).toBeCloseTo(0.9030481598787634, 14);
    expect(studentTCdf(-2.3, 7.5)).toBeCloseTo(0.026286448052184542, 14);
    expect(studentTCdf(0.3, 30)).toBeCloseTo(0.6168769473578236, 14);
    expect(studentTCdf(-4, 3)).toBeCloseTo(0.014004228005073076, 14);
    expect(studentTCdf(2, 1000)).toBeCloseTo(0.9771148267533741, 13);
  });

  it('tends to the normal cdf as df grows', () => {
    expect(studentTCdf(1.3, 1e7)).toBeCloseTo(normalCdf(1.3), 7);
  });

  it('rejects NaN t and non-positive df', () => {
    expect(() => studentTCdf(Number.NaN, 3)).toThrow(/invalid argument 't'/);
    expect(() => studentTCdf(1, 0)).toThrow(/invalid argument 'degreesOfFreedom'/);
  });
});

describe('chi-square', () => {
  it('with 2 df the cdf is 1 - exp(-x/2) (closed form)', () => {
    for (const x of [0, 0.1, 1, 2, 5.991, 13.8, 60]) {
      expect(chiSquareCdf(x, 2)).toBeCloseTo(-Math.expm1(-x / 2), 14);
      expect(chiSquareSurvival(x, 2) / Math.exp(-x / 2)).toBeCloseTo(1, 13);
    }
  });

  it('matches scipy.stats.chi2.cdf / chi2.sf (SciPy 1.17.1)', () => {
    expect(chiSquareCdf(3.84, 1)).toBeCloseTo(0.9499564787512949, 14);
    expect(chiSquareCdf(5, 3)).toBeCloseTo(0.8282028557032665, 14);
    expect(chiSquareCdf(20, 10.5)).toBeCloseTo(0.9633566960957702, 14);
    expect(chiSquareSurvival(50, 4) / 3.610865404890647e-10).toBeCloseTo(1, 12);
  });

  it('with 1 df equals 2 Phi(sqrt x) - 1 (closed form in terms of the normal cdf)', () => {
    for (const x of [0.2, 1, 3.84, 9]) expect(chiSquareCdf(x, 1)).toBeCloseTo(2 * normalCdf(Math.sqrt(x)) - 1, 14);
  });

  it('rejects negative x and non-positive df', () => {
    expect(() => chiSquareCdf(-1, 2)).toThrow(/invalid argument 'x'/);
    expect(() => chiSquareSurvival(1, -2)).toThrow(/invalid argument 'degreesOfFreedom'/);
  });
});
