import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { crpsFromQuantiles } from '../../src/forecast/scoring/crps.js';
import { energyScore } from '../../src/forecast/scoring/energyScore.js';
import { variogramScore } from '../../src/forecast/scoring/variogramScore.js';
import { ArgumentError } from '../../src/stats/argumentError.js';

// Five paths over six periods and a realised day: inputs only (invented numbers); the check values come
// from test/forecast/pathScoresReference.py (SciPy 1.17.1 cdist/pdist, NumPy 2.4.6).
const PATHS = [
  [41.0, 38.5, 55.2, 80.1, 62.0, 47.3],
  [35.2, 33.0, 49.8, 91.4, 70.5, 44.1],
  [44.9, 40.2, 60.7, 72.3, 58.8, 50.6],
  [39.1, 36.7, 52.0, 85.0, 66.1, 45.9],
  [47.5, 43.3, 58.1, 99.9, 75.2, 52.4],
];
const Y = [42.0, 37.0, 57.5, 88.0, 64.0, 48.0];

describe('energy score (Gneiting and Raftery 2007; Gneiting et al. 2008, eq. 6)', () => {
  it('matches SciPy: mean cdist to y minus half the mean pairwise pdist (pathScoresReference.py)', () => {
    expect(energyScore(PATHS, Y)).toBeCloseTo(5.43363351622379, 11);
  });

  it('hand-worked: paths (0, 0) and (2, 0), y = (0, 0) give (0 + 2)/2 - (2 + 2)/8 = 0.5', () => {
    expect(energyScore([[0, 0], [2, 0]], [0, 0])).toBe(0.5);
  });

  it('is the norm of the error for a single path, and never negative (closed form; a law)', () => {
    expect(energyScore([[3, 4]], [0, 0])).toBe(5);
    const finite = fc.double({ min: -100, max: 100, noNaN: true });
    fc.assert(
      fc.property(fc.array(fc.array(finite, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 6 }), fc.array(finite, { minLength: 3, maxLength: 3 }), (paths, y) => energyScore(paths, y) >= -1e-9),
      { seed: 15 },
    );
  });

  it('for one period equals the CRPS of the ensemble: twice the mean pinball loss at the levels (j - 1/2)/n (Laio and Tamea 2007)', () => {
    // For an ensemble sorted x_(1) <= ... <= x_(n), CRPS = (2/n) sum_j rho_{(j - 1/2)/n}(y - x_(j)).
    const ensemble = [1, 4, 6, 10];
    const levels = ensemble.map((_, j) => (j + 0.5) / ensemble.length);
    expect(energyScore(ensemble.map((x) => [x]), [5])).toBeCloseTo(2 * crpsFromQuantiles(5, ensemble, levels), 12);
  });

  it('refuses no paths and paths of the wrong length', () => {
    expect(() => energyScore([], [1])).toThrow(ArgumentError);
    expect(() => energyScore([[1, 2]], [1])).toThrow(ArgumentError);
  });
});

describe('variogram score (Scheuerer and Hamill 2015, eq. 2)', () => {
  it('matches NumPy at p = 0.5 and p = 1 (pathScoresReference.py)', () => {
    expect(variogramScore(PATHS, Y)).toBeCloseTo(3.700273021188942, 10);
    expect(variogramScore(PATHS, Y, 1)).toBeCloseTo(240.6632, 9);
  });

  it('hand-worked: one path (0, 2), y = (0, 1), p = 1: both ordered pairs add (1 - 2)^2, VS = 2', () => {
    expect(variogramScore([[0, 2]], [0, 1], 1)).toBe(2);
  });

  it('is unchanged when every path and the outcome move by the same amount (only differences between periods count)', () => {
    const shifted = PATHS.map((p) => p.map((v) => v + 17));
    expect(variogramScore(shifted, Y.map((v) => v + 17))).toBeCloseTo(variogramScore(PATHS, Y), 9);
  });
});
