// SciPy 1.17.1 / NumPy 2.4.6 values below are printed by test/stats/scipyReferenceValues.py.
import { describe, expect, it } from 'vitest';
import {
  ArgumentError,
  continuedFraction,
  logGamma,
  NoConvergenceError,
  regularizedBeta,
  regularizedGammaP,
  regularizedGammaQ,
} from '../../src/stats/index.js';

describe('continuedFraction (modified Lentz)', () => {
  it('gives sqrt(2) = 1 + 1/(2 + 1/(2 + ...)) (closed form)', () => {
    expect(continuedFraction(1, () => [1, 2])).toBeCloseTo(Math.SQRT2, 14);
  });

  it('gives the golden ratio (1 + sqrt 5)/2 = 1 + 1/(1 + 1/(1 + ...)) (closed form)', () => {
    expect(continuedFraction(1, () => [1, 1])).toBeCloseTo((1 + Math.sqrt(5)) / 2, 14);
  });

  it('gives tan(1) = 1/(1 - 1/(3 - 1/(5 - ...))) (Lambert, closed form)', () => {
    expect(continuedFraction(0, (j) => [j === 1 ? 1 : -1, 2 * j - 1])).toBeCloseTo(Math.tan(1), 14);
  });

  it('throws NoConvergenceError when the term cap is too small', () => {
    expect(() => continuedFraction(1, () => [1, 1], 1e-16, 3)).toThrow(NoConvergenceError);
  });
});

describe('logGamma (Lanczos)', () => {
  it('matches ln((n-1)!) at integers (closed form)', () => {
    let factorial = 1;
    for (let n = 1; n <= 30; n++) {
      expect(logGamma(n)).toBeCloseTo(Math.log(factorial), 12);
      factorial *= n;
    }
  });

  it('matches ln(sqrt(pi)) at 1/2 and ln(sqrt(pi)/2) at 3/2 (closed form)', () => {
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 14);
    expect(logGamma(1.5)).toBeCloseTo(0.5 * Math.log(Math.PI) - Math.LN2, 14);
  });

  it('matches scipy.special.gammaln (SciPy 1.17.1)', () => {
    expect(logGamma(0.1)).toBeCloseTo(2.252712651734206, 13);
    expect(logGamma(3.7)).toBeCloseTo(1.428072326665388, 13);
    expect(logGamma(100.5)).toBeCloseTo(361.43554046777757, 10);
  });

  it('rejects x <= 0 with an ArgumentError naming x', () => {
    expect(() => logGamma(0)).toThrow(ArgumentError);
    expect(() => logGamma(-1)).toThrow(/invalid argument 'x'/);
  });
});

describe('regularized incomplete gamma', () => {
  it('P(1, x) = 1 - exp(-x) and P(2, x) = 1 - (1 + x) exp(-x) (closed forms)', () => {
    for (const x of [0.01, 0.5, 1, 2, 3.5, 10, 40]) {
      expect(regularizedGammaP(1, x)).toBeCloseTo(-Math.expm1(-x), 14);
      expect(regularizedGammaQ(2, x) / ((1 + x) * Math.exp(-x))).toBeCloseTo(1, 12);
    }
  });

  it('matches scipy.special.gammainc / gammaincc (SciPy 1.17.1)', () => {
    expect(regularizedGammaP(2.5, 1.7)).toBeCloseTo(0.36143007689620493, 13);
    expect(regularizedGammaP(10, 12)).toBeCloseTo(0.7576078383294875, 13);
    // upper tail, relative accuracy: Q(0.5, 30) = 9.485737571073857e-15
    expect(regularizedGammaQ(0.5, 30) / 9.485737571073857e-15).toBeCloseTo(1, 12);
  });

  it('P + Q = 1 and P(a, 0) = 0', () => {
    expect(regularizedGammaP(3, 0)).toBe(0);
    expect(regularizedGammaQ(3, 0)).toBe(1);
    for (const [a, x] of [[0.5, 0.2], [4, 4.9], [4, 5.1], [50, 60]] as const) {
      expect(regularizedGammaP(a, x) + regularizedGammaQ(a, x)).toBeCloseTo(1, 14);
    }
  });

  it('rejects a <= 0 and x < 0', () => {
    expect(() => regularizedGammaP(0, 1)).toThrow(/invalid argument 'a'/);
    expect(() => regularizedGammaQ(1, -1)).toThrow(/invalid argument 'x'/);
  });
});

describe('regularizedBeta', () => {
  it('I_x(1, 1) = x, I_x(a, 1) = x^a, I_x(1, b) = 1 - (1 - x)^b (closed forms)', () => {
    for (const x of [0.05, 0.3, 0.5, 0.77, 0.99]) {
      expect(regularizedBeta(x, 1, 1)).toBeCloseTo(x, 14);
      expect(regularizedBeta(x, 3.5, 1)).toBeCloseTo(x ** 3.5, 14);
      expect(regularizedBeta(x, 1, 2.5)).toBeCloseTo(1 - (1 - x) ** 2.5, 14);
    }
  });

  it('equals the binomial tail: I_p(k, n - k + 1) = P(Bin(n, p) >= k) (closed form)', () => {
    // n = 4, p = 1/2, k = 2: (6 + 4 + 1) / 16 = 11/16
    expect(regularizedBeta(0.5, 2, 3)).toBeCloseTo(11 / 16, 14);
    // n = 5, p = 0.3, k = 4: 5 * 0.3^4 * 0.7 + 0.3^5 = 0.02835 + 0.00243 = 0.03078
    expect(regularizedBeta(0.3, 4, 2)).toBeCloseTo(0.03078, 14);
  });

  it('matches scipy.special.betainc (SciPy 1.17.1)', () => {
    expect(regularizedBeta(0.4, 2.5, 3.5)).toBeCloseTo(0.4869041915261176, 13);
    expect(regularizedBeta(0.1, 0.5, 0.5)).toBeCloseTo(0.20483276469913345, 13);
    expect(regularizedBeta(0.45, 30, 40)).toBeCloseTo(0.6447480085585666, 12);
  });

  it('has the symmetry I_x(a, b) = 1 - I_{1-x}(b, a) and the end values 0 and 1', () => {
    expect(regularizedBeta(0.2, 3, 7) + regularizedBeta(0.8, 7, 3)).toBeCloseTo(1, 14);
    expect(regularizedBeta(0, 2, 3)).toBe(0);
    expect(regularizedBeta(1, 2, 3)).toBe(1);
  });

  it('rejects x outside [0, 1] and non-positive shapes', () => {
    expect(() => regularizedBeta(1.5, 1, 1)).toThrow(/invalid argument 'x'/);
    expect(() => regularizedBeta(0.5, 0, 1)).toThrow(/invalid argument 'a'/);
    expect(() => regularizedBeta(0.5, 1, Number.NaN)).toThrow(/invalid argument 'b'/);
  });
});
