import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { matrixFromRows } from '../../src/forecast/linalg/matrix.js';
import { quantileRegression } from '../../src/forecast/linalg/quantileRegression.js';
import { historicalSimulation } from '../../src/forecast/quantiles/historicalSimulation.js';
import { QraWarmStarts, quantileRegressionAveraging } from '../../src/forecast/quantiles/quantileRegressionAveraging.js';
import { rearrangeDay } from '../../src/forecast/quantiles/rearrangeDay.js';
import { conformalHalfWidth, conformalQuantiles, conformalRank } from '../../src/forecast/quantiles/splitConformal.js';
import { highsQuantileRegression } from './highsQuantileRegression.js';
import { seededNormal, seededRandom } from './seededRandom.js';

describe('split conformal', () => {
  it('n = 19, alpha = 0.1 uses the 18th smallest absolute error: ceil((n + 1)(1 - alpha)) (Lei et al. 2018)', () => {
    expect(conformalRank(19, 0.1)).toBe(18);
    const u = seededRandom(1);
    const errors = Array.from({ length: 19 }, (_, i) => (i + 1) * (u() < 0.5 ? -1 : 1));
    const shuffled = errors.map((e) => [u(), e] as const).sort((a, b) => a[0] - b[0]).map(([, e]) => e);
    expect(conformalHalfWidth(shuffled.map(Math.abs), 0.1)).toBe(18);
    expect(conformalRank(9, 0.05)).toBe(10);
    expect(conformalHalfWidth([1, 2, 3, 4, 5, 6, 7, 8, 9], 0.05)).toBe(Infinity);
  });

  it('covers a new exchangeable draw with probability rank / (n + 1) = 0.9 (Lei et al. 2018, Thm 2.2)', () => {
    const z = seededNormal(31);
    const trials = 20000;
    let covered = 0;
    for (let t = 0; t < trials; t++) {
      const calibration = Array.from({ length: 19 }, () => Math.abs(z()));
      if (Math.abs(z()) <= conformalHalfWidth(calibration, 0.1)) covered++;
    }
    expect(Math.abs(covered / trials - 0.9)).toBeLessThan(4 * Math.sqrt((0.9 * 0.1) / trials));
  });

  it('maps levels to interval ends around the point forecast and says when it ran out of ranks', () => {
    const errors = Array.from({ length: 19 }, (_, i) => [i + 1 - 10]);
    const { prices, clamped } = conformalQuantiles([100], errors, [0.05, 0.5, 0.95]);
    // |e| sorted: 0,1,1,2,2,...,9,9; alpha = 0.1: the 18th smallest is 9
    expect(prices[0]).toEqual([91, 100, 109]);
    expect(clamped).toBe(false);
    expect(conformalQuantiles([100], errors, [0.01, 0.99]).clamped).toBe(true);
  });
});

describe('historical simulation', () => {
  it('adds Hyndman and Fan definition-7 quantiles of the slot errors to the point forecast', () => {
    // R: quantile(c(1, 2, 3, 4), c(0.25, 0.5, 0.9)) gives 1.75, 2.5, 3.7 (type 7, R's default).
    const errors = [[3, 0], [1, 0], [4, 0], [2, 0]];
    const q = historicalSimulation([10, 20], errors, [0.25, 0.5, 0.9]);
    q[0]!.forEach((v, k) => expect(v).toBeCloseTo(10 + [1.75, 2.5, 3.7][k]!, 12));
    expect(q[1]).toEqual([20, 20, 20]);
  });
});

describe('monotone rearrangement', () => {
  it('sorts each period and never moves it further from a monotone truth in L1 (Chernozhukov et al. 2010, Prop. 1)', () => {
    // Constructed crossing example: levels 0.1..0.9, truth the N(0,1)-like increasing curve
    const truth = [-1.28, -0.84, -0.52, -0.25, 0, 0.25, 0.52, 0.84, 1.28];
    const crossing = [-1.1, -1.3, -0.2, -0.6, 0.1, -0.05, 0.9, 0.7, 1.5];
    const { prices, crossedRows } = rearrangeDay([crossing, truth]);
    expect(crossedRows).toBe(1);
    expect(prices[0]).toEqual([...crossing].sort((a, b) => a - b));
    expect(prices[1]).toEqual(truth);
    const l1 = (a: readonly number[]): number => a.reduce((s, v, k) => s + Math.abs(v - truth[k]!), 0);
    expect(l1(prices[0]!)).toBeLessThanOrEqual(l1(crossing));
    expect(l1(prices[0]!)).toBeLessThan(l1(crossing));
  });

  it('property: sorted output, L1 distance to any non-decreasing truth not increased', () => {
    const finite = fc.double({ min: -1e3, max: 1e3, noNaN: true });
    fc.assert(
      fc.property(fc.array(fc.tuple(finite, finite), { minLength: 1, maxLength: 12 }), (pairs) => {
        const row = pairs.map(([a]) => a);
        const truth = pairs.map(([, b]) => b).sort((a, b) => a - b);
        const sorted = rearrangeDay([row]).prices[0]!;
        const l1 = (a: readonly number[]): number => a.reduce((s, v, k) => s + Math.abs(v - truth[k]!), 0);
        return sorted.every((v, k) => k === 0 || v >= sorted[k - 1]!) && l1(sorted) <= l1(row) + 1e-9;
      }),
      { seed: 20100501, numRuns: 200 },
    );
  });
});

describe('quantile regression averaging', () => {
  const z = seededNormal(8);
  const days = 120;
  const truth = Array.from({ length: days }, () => [50 + 10 * z(), 40 + 8 * z()]);
  const members = truth.map((t) => [t.map((v) => v + 3 * z()), t.map((v) => 0.9 * v + 4 + 3 * z())]);
  const realised = truth.map((t) => t.map((v) => v + 5 * z()));
  const calibration = { members, realised, dayIds: Int32Array.from({ length: days }, (_, d) => 1000 + d) };
  const target = [
    [52, 41],
    [51, 40],
  ];
  const levels = [0.1, 0.5, 0.9];

  it('is the exact quantile regression of the realised price on [1, forecasts], slot by slot', () => {
    const q = quantileRegressionAveraging(target, calibration, levels);
    for (let s = 0; s < 2; s++) {
      const x = matrixFromRows(members.map((m) => [1, m[0]![s]!, m[1]![s]!]));
      const y = realised.map((r) => r[s]!);
      levels.forEach((tau, k) => {
        const b = quantileRegression(x, y, tau).coefficients;
        expect(q[s]![k]).toBeCloseTo(b[0]! + b[1]! * target[0]![s]! + b[2]! * target[1]![s]!, 9);
      });
    }
  });

  it('leaves out a forecast that duplicates another, and warm starts change nothing', () => {
    const twice = { ...calibration, members: members.map((m) => [m[0]!, m[1]!, m[1]!]) };
    const plain = quantileRegressionAveraging(target, calibration, levels);
    const doubled = quantileRegressionAveraging([target[0]!, target[1]!, target[1]!], twice, levels);
    doubled.forEach((row, s) => row.forEach((v, k) => expect(v).toBeCloseTo(plain[s]![k]!, 9)));
    const warm = new QraWarmStarts();
    quantileRegressionAveraging(target, { ...calibration, members: members.slice(1), realised: realised.slice(1), dayIds: calibration.dayIds.slice(1) }, levels, warm);
    expect(quantileRegressionAveraging(target, calibration, levels, warm)).toEqual(plain);
  });
  /** The QRA quantile of one slot from the HiGHS solution of the quantile-regression LP on `rows`. */
  const highsQuantile = async (rows: number[][], y: number[], tau: number, features: number[]): Promise<number> => {
    const { coefficients } = await highsQuantileRegression(rows, y, tau);
    return coefficients.reduce((sum, b, j) => sum + b * features[j]!, 0);
  };

  it('keeps the intercept when one day\'s forecast is huge (an overflowed back-transform): the LP optimum by HiGHS', async () => {
    // Two slots, three members; on day 17 member 1 is -1.9e14 and member 2 -4e5 in slot 0 (a spike
    // day whose asinh-scale forecast was mapped back through sinh). The rank test used to judge the
    // intercept dependent on that column (its tolerance grew with the largest column) and left it out.
    const w = seededNormal(41);
    const n = 40;
    const truthDays = Array.from({ length: n }, () => [80 + 12 * w(), 60 + 9 * w()]);
    const huge = truthDays.map((t) => [t.map((v) => v + 8 * w()), t.map((v) => v + 6 * w()), t.map((v) => v + 4 * w())]);
    const realisedHuge = truthDays.map((t) => t.map((v) => v + 5 * w()));
    huge[17]![0]![0] = -1.9e14;
    huge[17]![1]![0] = -4.0e5;
    const targetHuge = [
      [92, 61],
      [87, 63],
      [83, 58],
    ];
    const notes: string[] = [];
    const q = quantileRegressionAveraging(targetHuge, { members: huge, realised: realisedHuge, dayIds: Int32Array.from({ length: n }, (_, d) => d) }, levels, undefined, undefined, notes);
    expect(notes).toEqual([]);
    for (let s = 0; s < 2; s++) {
      const rows = huge.map((m) => [1, m[0]![s]!, m[1]![s]!, m[2]![s]!]);
      const y = realisedHuge.map((r) => r[s]!);
      for (const [k, tau] of levels.entries()) {
        const reference = await highsQuantile(rows, y, tau, [1, ...targetHuge.map((t) => t[s]!)]);
        expect(Math.abs(q[s]![k]! - reference)).toBeLessThan(1e-7 * Math.abs(reference));
      }
    }
  });

  it('falls back to fewer forecasts, with a note, when two members agree to 1e-11 (numerically singular)', async () => {
    // Member 2 = member 1 (1 + 1e-11 z): independent by the rank test, but the simplex meets a
    // singular basis. It used to stop with SolverError('singular-design'); now the most nearly
    // dependent column is left out and the slot refitted on the rest.
    const w = seededNormal(1);
    const n = 60;
    const near: number[][][] = [];
    const realisedNear: number[][] = [];
    for (let d = 0; d < n; d++) {
      const t = 80 + 12 * w();
      const a = t + 8 * w();
      near.push([[a], [a * (1 + 1e-11 * w())], [t + 4 * w()]]);
      realisedNear.push([t + 5 * w()]);
    }
    const notes: string[] = [];
    const q = quantileRegressionAveraging([[92], [92], [83]], { members: near, realised: realisedNear, dayIds: Int32Array.from({ length: n }, (_, d) => d) }, levels, undefined, undefined, notes);
    expect(notes).toHaveLength(1);
    expect(notes[0]).toMatch(/slot 1: point forecast [12] left out/);
    // The reference keeps member 1 and member 3; leaving out member 1 instead changes the fit by ~1e-9.
    const rows = near.map((m) => [1, m[0]![0]!, m[2]![0]!]);
    const y = realisedNear.map((r) => r[0]!);
    for (const [k, tau] of levels.entries()) {
      const reference = await highsQuantile(rows, y, tau, [1, 92, 83]);
      expect(Math.abs(q[0]![k]! - reference)).toBeLessThan(1e-7 * Math.abs(reference));
    }
  });
});
