import { describe, expect, it } from 'vitest';
import { choleskyLeastSquares } from '../../src/forecast/linalg/choleskyLeastSquares.js';
import { lassoAt, lassoBic } from '../../src/forecast/linalg/lasso.js';
import { predictLinear } from '../../src/forecast/linalg/linearModel.js';
import { leastSquaresQr } from '../../src/forecast/linalg/leastSquaresQr.js';
import { matrixFromRows } from '../../src/forecast/linalg/matrix.js';
import { nestedStandardisedGrams, standardisedGram } from '../../src/forecast/linalg/standardisedGram.js';
import { seededNormal } from './seededRandom.js';

/** A correlated design (n x k) and a sparse truth, from a seeded generator (behaviour data only). */
function correlatedProblem(seed: number, n: number, k: number): { rows: number[][]; y: number[] } {
  const z = seededNormal(seed);
  const rows = Array.from({ length: n }, () => {
    const common = z();
    return Array.from({ length: k }, (_, j) => 3 * j + (j + 1) * (0.7 * common + z()));
  });
  const y = rows.map((r) => 5 + 2 * (r[0] as number) - 0.5 * (r[2] as number) + z());
  return { rows, y };
}

const soft = (v: number, g: number): number => Math.sign(v) * Math.max(Math.abs(v) - g, 0);

describe('LASSO by coordinate descent', () => {
  it('equals soft thresholding of the least-squares coefficients for an orthonormal design (Tibshirani 1996, eq. 3)', () => {
    // Columns of a 2^3 factorial in -1/+1: mean 0, variance 1, mutually orthogonal.
    const rows: number[][] = [];
    for (let i = 0; i < 8; i++) rows.push([i & 1 ? 1 : -1, i & 2 ? 1 : -1, i & 4 ? 1 : -1, (i & 1 ? 1 : -1) * (i & 2 ? 1 : -1)]);
    const y = [3.1, -1.2, 0.4, 2.2, -0.7, 1.9, 0.05, -2.5];
    const gram = standardisedGram(matrixFromRows(rows), y);
    const ybar = y.reduce((s, v) => s + v, 0) / 8;
    for (const lambda of [0, 0.1, 0.3, 0.6, 2]) {
      const beta = lassoAt(gram, lambda);
      rows[0]!.forEach((_, j) => {
        const ols = rows.reduce((s, r, i) => s + r[j]! * (y[i]! - ybar), 0) / 8;
        expect(beta[j]).toBeCloseTo(soft(ols, lambda), 12);
      });
    }
  });

  it('meets the optimality (KKT) conditions of the lasso on a correlated design', () => {
    const { rows, y } = correlatedProblem(21, 120, 6);
    const gram = standardisedGram(matrixFromRows(rows), y);
    const k = 6;
    for (const lambda of [0.02, 0.1, 0.5]) {
      const beta = lassoAt(gram, lambda, { tolerance: 1e-28, maxSweeps: 100000 });
      for (let j = 0; j < k; j++) {
        let g = gram.zty[j]!;
        for (let l = 0; l < k; l++) g -= gram.gram[j * k + l]! * beta[l]!;
        if (beta[j] === 0) expect(Math.abs(g)).toBeLessThanOrEqual(lambda + 1e-10);
        else expect(g).toBeCloseTo(lambda * Math.sign(beta[j]!), 9);
      }
    }
  });

  it('has all coefficients zero at lambda_max and tends to least squares as lambda -> 0', () => {
    const { rows, y } = correlatedProblem(5, 80, 4);
    const x = matrixFromRows(rows);
    const gram = standardisedGram(x, y);
    const lambdaMax = Math.max(...[...gram.zty].map(Math.abs));
    expect([...lassoAt(gram, lambdaMax)].every((b) => b === 0)).toBe(true);
    expect([...lassoAt(gram, lambdaMax * 0.99)].some((b) => b !== 0)).toBe(true);
    const ls = leastSquaresQr(matrixFromRows(rows.map((r) => [1, ...r])), y).coefficients;
    const nearLs = lassoBic(gram, { minRatio: 1e-9, pathLength: 40, tolerance: 1e-28, maxSweeps: 1000000 }).path.at(-1)!;
    const back = nearLs.beta.map((b, j) => b / gram.scales[j]!);
    back.forEach((b, j) => expect(b).toBeCloseTo(ls[j + 1]!, 5));
  });

  it('chooses the penalty of smallest BIC = n ln(RSS/n) + df ln(n), with RSS from the data', () => {
    const { rows, y } = correlatedProblem(9, 150, 6);
    const x = matrixFromRows(rows);
    const gram = standardisedGram(x, y);
    const fit = lassoBic(gram);
    const n = rows.length;
    const bics = fit.path.map((p) => {
      let intercept = gram.yMean;
      const coefficients = p.beta.map((b, j) => b / gram.scales[j]!);
      coefficients.forEach((b, j) => (intercept -= b * gram.means[j]!));
      const rss = rows.reduce((s, r, i) => s + (y[i]! - predictLinear({ intercept, coefficients }, r)) ** 2, 0);
      return n * Math.log(rss / n) + p.nonZero * Math.log(n);
    });
    bics.forEach((b, m) => expect(fit.path[m]!.bic).toBeCloseTo(b, 6));
    expect(fit.chosen).toBe(bics.indexOf(Math.min(...bics)));
    // The sparse truth uses columns 0 and 2: the chosen model keeps them.
    expect(fit.model.coefficients[0]).not.toBe(0);
    expect(fit.model.coefficients[2]).not.toBe(0);
  });
});

describe('least squares on the normal equations of standardised columns (Cholesky)', () => {
  it('agrees with Householder QR on a correlated design', () => {
    const { rows, y } = correlatedProblem(3, 200, 8);
    const chol = choleskyLeastSquares(standardisedGram(matrixFromRows(rows), y));
    const qr = leastSquaresQr(matrixFromRows(rows.map((r) => [1, ...r])), y).coefficients;
    expect(chol.intercept).toBeCloseTo(qr[0]!, 9);
    chol.coefficients.forEach((b, j) => expect(b).toBeCloseTo(qr[j + 1]!, 9));
  });

  it('writes the coefficients into an array handed in, the same model (Householder QR the reference)', () => {
    const { rows, y } = correlatedProblem(3, 200, 8);
    const gram = standardisedGram(matrixFromRows(rows), y);
    const into = new Float64Array(8).fill(99);
    const chol = choleskyLeastSquares(gram, undefined, into);
    expect(chol.coefficients).toBe(into);
    expect(chol).toEqual(choleskyLeastSquares(gram));
    const qr = leastSquaresQr(matrixFromRows(rows.map((r) => [1, ...r])), y).coefficients;
    into.forEach((b, j) => expect(b).toBeCloseTo(qr[j + 1]!, 9));
  });

  it('leaves out a constant column and a duplicated column (coefficient 0), fitting the same values', () => {
    const { rows, y } = correlatedProblem(4, 60, 3);
    const extended = rows.map((r) => [...r, 7, r[0]!]);
    const chol = choleskyLeastSquares(standardisedGram(matrixFromRows(extended), y));
    expect(chol.coefficients[3]).toBe(0);
    expect(chol.coefficients[4]).toBe(0);
    const plain = choleskyLeastSquares(standardisedGram(matrixFromRows(rows), y));
    rows.forEach((r, i) => expect(predictLinear(chol, extended[i]!)).toBeCloseTo(predictLinear(plain, r), 9));
  });

  it('after a column left out in the middle, still agrees with Householder QR on the columns kept', () => {
    const { rows, y } = correlatedProblem(5, 120, 4);
    // Column 1 repeats column 0 and is dropped; columns 2.. are factored over the kept columns 0, 2, 3, ...
    const extended = rows.map((r) => [r[0]!, r[0]!, ...r.slice(1)]);
    const chol = choleskyLeastSquares(standardisedGram(matrixFromRows(extended), y));
    const qr = leastSquaresQr(matrixFromRows(rows.map((r) => [1, ...r])), y).coefficients;
    expect(chol.coefficients[1]).toBe(0);
    expect(chol.intercept).toBeCloseTo(qr[0]!, 9);
    expect(chol.coefficients[0]).toBeCloseTo(qr[1]!, 9);
    rows[0]!.slice(1).forEach((_, j) => expect(chol.coefficients[j + 2]).toBeCloseTo(qr[j + 2]!, 9));
  });
});

describe('standardised Gram matrices', () => {
  it('one shifted-sums pass over nested prefixes equals the two-pass Gram of each prefix', () => {
    const { rows, y } = correlatedProblem(13, 90, 5);
    // a column far from zero relative to its spread tests the shifted sums
    const shifted = rows.map((r) => [...r, 1e4 + r[0]!]);
    const x = matrixFromRows(shifted);
    const counts = [10, 45, 90];
    const nested = nestedStandardisedGrams(x, y, counts);
    counts.forEach((count, w) => {
      const prefix = standardisedGram(matrixFromRows(shifted.slice(0, count)), y.slice(0, count));
      const g = nested[w]!;
      expect(g.n).toBe(count);
      expect(g.yMean).toBeCloseTo(prefix.yMean, 10);
      expect(g.yVariance).toBeCloseTo(prefix.yVariance, 9);
      g.means.forEach((m, j) => expect(m).toBeCloseTo(prefix.means[j]!, 9));
      g.scales.forEach((m, j) => expect(m).toBeCloseTo(prefix.scales[j]!, 9));
      g.gram.forEach((m, j) => expect(m).toBeCloseTo(prefix.gram[j]!, 10));
      g.zty.forEach((m, j) => expect(m).toBeCloseTo(prefix.zty[j]!, 10));
    });
  });
});
