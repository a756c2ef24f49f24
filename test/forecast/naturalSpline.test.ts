import { describe, expect, it } from 'vitest';
import { NATURAL_SPLINE_KNOT_LEVELS, naturalSplineColumns } from '../../src/forecast/models/naturalSplineBasis.js';

// Invented knots and values (shared with test/forecast/naturalSplineReference.py); the check values come from
// that script: SciPy 1.17.1 CubicSpline(knots, y, bc_type='natural') inside the outer knots, and that spline
// continued by its tangent at the outer knots beyond them (NumPy 2.4.6, SciPy 1.17.1).
const CASES: { knots: number[]; y: number[]; points: [number, number][] }[] = [
  {
    knots: [-2.0, 0.5, 3.0],
    y: [1.0, -0.5, 4.0],
    points: [
      [-1.85, 0.820324], [-1.15, 0.03895600000000002], [-0.44999999999999996, -0.5025079999999997], [0.5, -0.5],
      [1.3000000000000003, 0.3916480000000004], [2.0, 1.6960000000000004], [2.8499999999999996, 3.640324],
      [-2.4, 1.48], [-4.5, 4.0], [3.3, 4.72], [6.0, 11.200000000000003],
    ],
  },
  {
    knots: [10.0, 11.5, 14.0, 14.75],
    y: [3.0, 2.0, 5.5, 4.0],
    points: [
      [10.1425, 2.8034494307377047], [10.807500000000001, 2.049259408667273], [11.4725, 1.9798624514420158],
      [12.375, 3.458249658469945], [13.135, 5.03129189409836], [13.8, 5.606661420765026], [14.6075, 4.357881111065574],
      [9.6, 3.554316939890711], [7.5, 6.46448087431694], [15.05, 3.2408196721311455], [17.75, -3.591803278688524],
    ],
  },
  {
    knots: [-1.3, 0.2, 0.9, 2.5, 4.0],
    y: [0.7, 2.1, 1.4, -0.8, 0.3],
    points: [
      [-1.141, 0.9463890615446819], [-0.399, 1.8998958353416768], [0.34299999999999997, 2.0308245637667577],
      [1.3499999999999999, 0.6635565419727416], [2.1980000000000004, -0.583764872984628], [2.9400000000000004, -0.7788325668819214],
      [3.841, 0.09407768021648877], [-1.7000000000000002, 0.077352004748799], [-3.8, -3.191549970320005],
      [4.3, 0.690447830662134], [7.0, 4.204478306621339],
    ],
  },
];

/** The row 1, x, N_3(x)..N_K(x) of the basis. */
function basisRow(x: number, knots: number[]): number[] {
  const columns = new Float64Array(knots.length - 2);
  naturalSplineColumns(x, knots, columns);
  return [1, x, ...columns];
}

/** Solves the square system A b = y by Gaussian elimination with partial pivoting (A's rows are copied). */
function solve(rows: number[][], y: number[]): number[] {
  const m = rows.map((r, i) => [...r, y[i] as number]);
  const n = m.length;
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[p]![c]!)) p = r;
    [m[c], m[p]] = [m[p]!, m[c]!];
    for (let r = c + 1; r < n; r++) {
      const f = m[r]![c]! / m[c]![c]!;
      for (let q = c; q <= n; q++) m[r]![q] = m[r]![q]! - f * m[c]![q]!;
    }
  }
  const b = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let v = m[r]![n]!;
    for (let q = r + 1; q < n; q++) v -= m[r]![q]! * b[q]!;
    b[r] = v / m[r]![r]!;
  }
  return b;
}

const dot = (a: number[], b: number[]) => a.reduce((sum, v, i) => sum + v * (b[i] as number), 0);

describe('naturalSplineColumns (natural cubic spline basis, Hastie, Tibshirani and Friedman 2009, section 5.2.1, eqs. 5.4-5.5)', () => {
  it.each(CASES)('through K = $knots.length knots, the least-squares fit in the basis is SciPy\'s natural cubic spline, inside and (continued by its tangent) beyond the outer knots (naturalSplineReference.py)', ({ knots, y, points }) => {
    // K functions, K points: least squares interpolates; the natural cubic splines with these knots are a K-dimensional space.
    const b = solve(knots.map((x) => basisRow(x, knots)), y);
    for (const [x, expected] of points) expect(dot(basisRow(x, knots), b)).toBeCloseTo(expected, 9);
  });

  it('every column is 0 at and below the first knot and exactly linear beyond the last (second differences 0), but curved between the knots (closed form of eqs. 5.4-5.5)', () => {
    const knots = CASES[2]!.knots;
    const at = (x: number) => basisRow(x, knots).slice(2);
    for (const x of [knots[0]!, knots[0]! - 0.5, -50]) expect(at(x)).toEqual([0, 0, 0]);
    const h = 0.75;
    for (const x of [4.0 + h, 6, 40]) {
      const [lo, mid, hi] = [at(x - h), at(x), at(x + h)];
      mid.forEach((v, k) => expect(Math.abs(lo[k]! - 2 * v + hi[k]!)).toBeLessThan(1e-10 * Math.max(1, Math.abs(v))));
    }
    // Between the knots each column's second difference is not 0 (a basis of straight lines would pass the test above).
    const [lo, mid, hi] = [at(1.0 - h), at(1.0), at(1.0 + h)];
    mid.forEach((v, k) => expect(Math.abs(lo[k]! - 2 * v + hi[k]!)).toBeGreaterThan(1e-3));
  });

  it("places K = 3, 4, 5 knots at Harrell's quantiles (F. E. Harrell 2001, Regression Modeling Strategies, section 2.4.6)", () => {
    expect(NATURAL_SPLINE_KNOT_LEVELS[3]).toEqual([0.1, 0.5, 0.9]);
    expect(NATURAL_SPLINE_KNOT_LEVELS[4]).toEqual([0.05, 0.35, 0.65, 0.95]);
    expect(NATURAL_SPLINE_KNOT_LEVELS[5]).toEqual([0.05, 0.275, 0.5, 0.725, 0.95]);
  });
});
