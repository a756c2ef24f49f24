import loadHighs from 'highs';
import { describe, expect, it } from 'vitest';
import { matrixFromRows } from '../../src/forecast/linalg/matrix.js';
import type { Matrix } from '../../src/forecast/linalg/matrix.js';
import { quantileRegression } from '../../src/forecast/linalg/quantileRegression.js';
import { SolverError } from '../../src/forecast/linalg/errors.js';
import { readFixtureCsv } from './fixtures.js';
import { highsQuantileRegression } from './highsQuantileRegression.js';
import { seededRandom } from './seededRandom.js';

function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

function checkObjective(x: Matrix, y: readonly number[], tau: number, b: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < x.rows; i++) {
    let fit = 0;
    for (let j = 0; j < x.cols; j++) fit += (x.data[i * x.cols + j] as number) * (b[j] as number);
    const u = (y[i] as number) - fit;
    sum += u * (tau - (u < 0 ? 1 : 0));
  }
  return sum;
}

describe('quantileRegression on the Engel food-expenditure data', () => {
  // Data: Engel (1857) household income and food expenditure, n = 235, as used by Koenker and Bassett
  // (1982), public domain, from Debian's python3-statsmodels 0.13.5+dfsg-7
  // (statsmodels/datasets/engel/engel.csv), copied to test/fixtures/engel.csv.
  // Check values: the regression quantiles of foodexp on income for this data set, median 81.4822 and
  // 0.560181 with minimum 8779.966, tau 0.1 110.1416 and 0.401766, tau 0.9 67.3509 and 0.686299, as
  // the statsmodels example "Quantile regression" (examples/notebooks/quantile_regression.ipynb)
  // tabulates them for the Engel data (from memory). They are confirmed below by solving the same
  // linear program with HiGHS, and the median's agree with the Stata 12 results kept in statsmodels
  // (81.48233, 0.5601805; see the tau 0.75 test).
  const { header, rows } = readFixtureCsv('engel.csv');
  const x = matrixFromRows(rows.map((r) => [1, r[0] as number]));
  const y = rows.map((r) => r[1] as number);
  const cases = [
    { tau: 0.5, intercept: 81.4822, slope: 0.560181 },
    { tau: 0.1, intercept: 110.1416, slope: 0.401766 },
    { tau: 0.9, intercept: 67.3509, slope: 0.686299 },
  ];

  it('has the expected layout', () => {
    expect(header).toEqual(['income', 'foodexp']);
    expect(rows).toHaveLength(235);
  });

  for (const c of cases) {
    it(`tau ${c.tau}: intercept ${c.intercept}, slope ${c.slope} to 1e-4 relative`, () => {
      const fit = quantileRegression(x, y, c.tau);
      expect(rel(fit.coefficients[0] as number, c.intercept)).toBeLessThan(1e-4);
      expect(rel(fit.coefficients[1] as number, c.slope)).toBeLessThan(1e-4);
    });
  }

  it('tau 0.75 matches the Stata 12 qreg results kept in statsmodels 0.13.5', () => {
    // Source: statsmodels/regression/tests/results/results_quantile_regression.py in Debian's
    // python3-statsmodels 0.13.5+dfsg-7 (epanechnikov_hsheather_q75: coefficients 0.6440143 and
    // 62.39648, "sum_adev" 13058.50008841318 = 2 sum rho_0.75 for this data, the median's
    // 17559.93220318131 being 2 x 8779.966). Stata prints 7 significant digits.
    const fit = quantileRegression(x, y, 0.75);
    expect(rel(fit.coefficients[0] as number, 62.39648)).toBeLessThan(1e-5);
    expect(rel(fit.coefficients[1] as number, 0.6440143)).toBeLessThan(1e-6);
    expect(rel(2 * fit.objective, 13058.50008841318)).toBeLessThan(1e-6);
    expect(rel(2 * quantileRegression(x, y, 0.5).objective, 17559.93220318131)).toBeLessThan(1e-6);
  });

  it('the check values are the optimum of the quantile-regression LP solved by HiGHS (npm highs 1.15.3)', async () => {
    // min sum_i tau u_i + (1 - tau) v_i s.t. b0 + b1 income_i + u_i - v_i = foodexp_i, u, v >= 0, b free
    // (Koenker and Bassett 1978, the linear program of a regression quantile).
    const highs = await loadHighs();
    for (const c of cases) {
      const n = rows.length;
      const objective = Array.from({ length: n }, (_, i) => `${c.tau} u${i} + ${1 - c.tau} v${i}`).join(' + ');
      const rowsText = rows.map((r, i) => ` r${i}: b0 + ${r[0]} b1 + u${i} - v${i} = ${r[1]}`).join('\n');
      const lp = `Minimize\n obj: ${objective}\nSubject To\n${rowsText}\nBounds\n b0 free\n b1 free\nEnd\n`;
      const result = highs.solve(lp, { output_flag: false, primal_feasibility_tolerance: 1e-10, dual_feasibility_tolerance: 1e-10 });
      expect(result.Status).toBe('Optimal');
      const primal = (name: string): number => (result.Columns[name] as { Primal: number }).Primal;
      const b0 = primal('b0');
      const b1 = primal('b1');
      expect(rel(b0, c.intercept)).toBeLessThan(1e-4);
      expect(rel(b1, c.slope)).toBeLessThan(1e-4);
      expect(rel(quantileRegression(x, y, c.tau).objective, result.ObjectiveValue)).toBeLessThan(1e-9);
    }
  });

  it('median objective sum rho_0.5 = 8779.966 (published minimum, to 1e-4 relative)', () => {
    const fit = quantileRegression(x, y, 0.5);
    expect(rel(fit.objective, 8779.966)).toBeLessThan(1e-4);
    expect(checkObjective(x, y, 0.5, fit.coefficients)).toBeCloseTo(fit.objective, 6);
  });
});

/** Solves the k x k system X_h b = y_h by Gaussian elimination; null when singular. */
function solveSquare(a: number[][], rhs: number[]): number[] | null {
  const k = rhs.length;
  const m = a.map((row, i) => [...row, rhs[i] as number]);
  for (let c = 0; c < k; c++) {
    let p = c;
    for (let i = c + 1; i < k; i++) if (Math.abs(m[i]![c]!) > Math.abs(m[p]![c]!)) p = i;
    if (Math.abs(m[p]![c]!) < 1e-12) return null;
    [m[c], m[p]] = [m[p]!, m[c]!];
    for (let i = 0; i < k; i++) {
      if (i === c) continue;
      const f = m[i]![c]! / m[c]![c]!;
      for (let j = c; j <= k; j++) m[i]![j]! -= f * m[c]![j]!;
    }
  }
  return m.map((row, i) => row[k]! / row[i]!);
}

/** All k-subsets of 0..n-1. */
function* subsets(n: number, k: number, start = 0, prefix: number[] = []): Generator<number[]> {
  if (prefix.length === k) {
    yield prefix;
    return;
  }
  for (let i = start; i < n; i++) yield* subsets(n, k, i + 1, [...prefix, i]);
}

/**
 * Minimum of sum rho_tau over all basic solutions: by Koenker and Bassett (1978), Theorem 3.1, a
 * minimiser exists among the fits through k observations, so this enumeration is the exact optimum.
 */
function bruteForce(rows: number[][], y: number[], tau: number): number {
  const x = matrixFromRows(rows);
  let best = Infinity;
  for (const h of subsets(rows.length, rows[0]!.length)) {
    const b = solveSquare(h.map((i) => rows[i]!), h.map((i) => y[i]!));
    if (b !== null) best = Math.min(best, checkObjective(x, y, tau, b));
  }
  return best;
}

function randomProblem(seed: number, n: number, k: number, integer: boolean): { rows: number[][]; y: number[] } {
  const u = seededRandom(seed);
  const draw = (): number => (integer ? Math.floor(u() * 3) : u() * 10 - 5);
  const rows = Array.from({ length: n }, () => [1, ...Array.from({ length: k - 1 }, draw)]);
  const y = rows.map((r) => r.reduce((s, v) => s + v, 0) + (integer ? Math.floor(u() * 4) : 3 * u() ** 3));
  return { rows, y };
}

describe('quantileRegression: optimality', () => {
  const taus = [0.05, 0.25, 0.5, 0.8, 0.95];

  it('matches the minimum over all basic solutions (Koenker and Bassett 1978, Thm 3.1), continuous data', () => {
    for (let seed = 1; seed <= 12; seed++) {
      const { rows, y } = randomProblem(seed, 11, 3, false);
      for (const tau of taus) {
        const fit = quantileRegression(matrixFromRows(rows), y, tau);
        expect(fit.objective).toBeCloseTo(bruteForce(rows, y, tau), 9);
      }
    }
  });

  it('matches the minimum over all basic solutions on tied, degenerate integer data', () => {
    for (let seed = 100; seed <= 130; seed++) {
      const { rows, y } = randomProblem(seed, 12, 3, true);
      const x = matrixFromRows(rows);
      try {
        for (const tau of taus) {
          const fit = quantileRegression(x, y, tau);
          expect(fit.objective).toBeCloseTo(bruteForce(rows, y, tau), 9);
        }
      } catch (e) {
        // an integer design from {0, 1, 2} may be of deficient rank; nothing else may throw
        expect(e).toBeInstanceOf(SolverError);
        expect((e as SolverError).reason).toBe('singular-design');
      }
    }
  });

  it('returns a dual certificate: a in [0,1], X\'a = (1 - tau) X\'1, objective = y\'a - (1 - tau) sum y', () => {
    const { rows, y } = randomProblem(7, 200, 4, false);
    const x = matrixFromRows(rows);
    for (const tau of taus) {
      const fit = quantileRegression(x, y, tau, { dual: true });
      const k = rows[0]!.length;
      const dual = fit.dual!;
      expect(dual).toHaveLength(200);
      for (const a of dual) {
        expect(a).toBeGreaterThanOrEqual(-1e-9);
        expect(a).toBeLessThanOrEqual(1 + 1e-9);
      }
      for (let j = 0; j < k; j++) {
        let lhs = 0;
        let rhs = 0;
        rows.forEach((r, i) => {
          lhs += r[j]! * dual[i]!;
          rhs += (1 - tau) * r[j]!;
        });
        expect(lhs).toBeCloseTo(rhs, 8);
      }
      const dualObjective = y.reduce((s, v, i) => s + v * dual[i]! - (1 - tau) * v, 0);
      expect(fit.objective).toBeCloseTo(dualObjective, 8);
    }
  });

  it('intercept-only fit is the order statistic y_(ceil(n tau)) when n tau is not an integer', () => {
    const u = seededRandom(3);
    const y = Array.from({ length: 41 }, () => u() * 100);
    const sorted = [...y].sort((p, q) => p - q);
    const x = matrixFromRows(y.map(() => [1]));
    for (const tau of [0.1, 0.33, 0.5, 0.9]) {
      expect(quantileRegression(x, y, tau).coefficients[0]).toBe(sorted[Math.ceil(41 * tau) - 1]);
    }
  });

  it('gives the same optimum from a warm start at another level and leaves its inputs alone', () => {
    const { rows, y } = randomProblem(11, 365, 6, false);
    // Object.freeze leaves a typed array's elements writable: the data is compared with a copy after the fits.
    const x = Object.freeze(matrixFromRows(rows));
    const dataBefore = Float64Array.from(x.data);
    const frozenY = Object.freeze([...y]);
    let previous: Int32Array | undefined;
    for (const tau of taus) {
      const cold = quantileRegression(x, frozenY, tau);
      const warm = quantileRegression(x, frozenY, tau, previous === undefined ? {} : { initialBasis: previous });
      expect(warm.objective).toBeCloseTo(cold.objective, 8);
      expect([...warm.coefficients]).toEqual([...cold.coefficients]);
      const near = quantileRegression(x, frozenY, tau, { initialCoefficients: cold.coefficients.map((b) => b * 1.01) });
      expect([...near.coefficients]).toEqual([...cold.coefficients]);
      previous = warm.basis;
    }
    expect(x.data).toEqual(dataBefore);
  });

  it('throws a typed error for a rank-deficient design', () => {
    const x = matrixFromRows([
      [1, 2],
      [1, 2],
      [1, 2],
    ]);
    expect(() => quantileRegression(x, [1, 2, 3], 0.5)).toThrow(SolverError);
  });
});

describe('quantileRegression: columns of very different scales', () => {
  // A full-rank design [1, x] whose x is ordinary on every row but one, where it is -1.9e14 (a point
  // forecast whose back-transform overflowed on one spike day). Every basis through that row used to
  // be judged singular (the pivot test was relative to the largest entry of the whole basis), so the
  // simplex stopped with SolverError('singular-design') on a valid problem.
  const z = seededRandom(2027);
  const n = 30;
  const outlier = 17;
  const rows = Array.from({ length: n }, () => {
    const level = 80 + 36 * (z() - 0.5);
    return [1, level + 8 * (z() - 0.5), level + 5 * (z() - 0.5)];
  });
  rows[outlier]![1] = -1.9e14;
  const x = matrixFromRows(rows.map((r) => [r[0]!, r[1]!]));
  const y = rows.map((r) => r[2]!);
  const others = y.filter((_, i) => i !== outlier).sort((a, b) => a - b);

  for (const tau of [0.1, 0.5, 0.9]) {
    it(`tau ${tau}: the optimum of the LP solved by HiGHS, and the sample quantile of the other rows`, async () => {
      const fit = quantileRegression(x, y, tau);
      const reference = await highsQuantileRegression(rows.map((r) => [r[0]!, r[1]!]), y, tau);
      expect(rel(fit.objective, reference.objective)).toBeLessThan(1e-9);
      expect(rel(fit.coefficients[0]!, reference.coefficients[0]!)).toBeLessThan(1e-9);
      // Closed form: the huge row is fitted exactly by a slope of order 1e-13, which moves the other
      // rows by less than 1e-10, so the intercept is the tau-quantile of the other 29 responses, the
      // order statistic y_(ceil(29 tau)) as 29 tau is not an integer (Koenker and Bassett 1978,
      // section 2: the intercept-only regression quantile is the sample quantile).
      expect(fit.coefficients[0]).toBeCloseTo(others[Math.ceil(29 * tau) - 1]!, 8);
      expect(Math.abs(fit.coefficients[1]!)).toBeLessThan(1e-11);
    });
  }
});
