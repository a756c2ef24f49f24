import { describe, expect, it } from 'vitest';
import { leastSquaresQr } from '../../src/forecast/linalg/leastSquaresQr.js';
import { matrixFromRows } from '../../src/forecast/linalg/matrix.js';
import { readFixtureCsv } from './fixtures.js';

/** Relative error |a - b| / |b|. */
function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('leastSquaresQr', () => {
  // Data: Longley (1967), as shipped in Debian's python3-statsmodels 0.13.5
  // (statsmodels/datasets/longley/longley.csv), copied to test/fixtures/longley.csv.
  // Certified values: NIST Statistical Reference Datasets, linear regression, "Longley" (higher
  // difficulty), quoted from memory of the NIST StRD page and found identical, digit for digit, in the
  // copy that statsmodels 0.13.5 keeps in statsmodels/regression/tests/results/results_regression.py.
  const { rows } = readFixtureCsv('longley.csv');
  const x = matrixFromRows(rows.map((r) => [1, ...r.slice(2, 8)]));
  const y = rows.map((r) => r[1] as number);
  const certified = [
    -3482258.63459582, 15.0618722713733, -0.358191792925910e-1, -2.02022980381683, -1.03322686717359,
    -0.511041056535807e-1, 1829.15146461355,
  ];
  const certifiedResidualSd = 304.854073561965;

  it('reproduces the NIST StRD certified Longley coefficients to 1e-8 relative', () => {
    expect(rows).toHaveLength(16);
    const fit = leastSquaresQr(x, y);
    expect(fit.rank).toBe(7);
    certified.forEach((c, j) => expect(rel(fit.coefficients[j] as number, c)).toBeLessThan(1e-8));
    expect(rel(Math.sqrt(fit.rss / (16 - 7)), certifiedResidualSd)).toBeLessThan(1e-8);
  });

  it('does not change its inputs', () => {
    // Object.freeze does not freeze the elements of a typed array (ECMA-262, IntegerIndexedElementSet
    // ignores the object's extensibility), so the matrix's data is compared with a copy taken before.
    const m = matrixFromRows(rows.map((r) => [1, ...r.slice(2, 8)]));
    const dataBefore = Float64Array.from(m.data);
    const yBefore = [...y];
    leastSquaresQr(m, y);
    expect(m.data).toEqual(dataBefore);
    expect(y).toEqual(yBefore);
  });

  it('gives a basic solution with the dependent column at zero when X is rank deficient', () => {
    // Third column = first + second: rank 2. The fitted values are still the projection of y.
    const m = matrixFromRows([
      [1, 0, 1],
      [1, 1, 2],
      [1, 2, 3],
      [1, 3, 4],
    ]);
    const fit = leastSquaresQr(m, [1, 3, 5, 7.5]);
    expect(fit.rank).toBe(2);
    expect([...fit.coefficients].filter((b) => b === 0)).toHaveLength(1);
    // Closed form of the straight line through (0,1),(1,3),(2,5),(3,7.5): slope Sxy/Sxx = 10.75/5
    // = 2.15, intercept 4.125 - 2.15 * 1.5 = 0.9.
    const line = [0, 1, 2, 3].map((t) => 0.9 + 2.15 * t);
    const residualsFromLine = [1, 3, 5, 7.5].map((v, i) => v - (line[i] as number));
    residualsFromLine.forEach((r, i) => expect(fit.residuals[i]).toBeCloseTo(r, 12));
  });
});
