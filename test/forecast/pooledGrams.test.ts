import { describe, expect, it } from 'vitest';
import { choleskyLeastSquares } from '../../src/forecast/linalg/choleskyLeastSquares.js';
import { matrixFromRows } from '../../src/forecast/linalg/matrix.js';
import { standardisedGram } from '../../src/forecast/linalg/standardisedGram.js';
import { neighbourWeights } from '../../src/forecast/models/driverRegression.js';
import { PooledGrams } from '../../src/forecast/models/pooledGrams.js';

// Invented design (inputs only, the same formulas as pooledGramsReference.py): 3 slots, 12 rows, 3 regressors.
const S = 3;
const N = 12;
const K = 3;
const x = (s: number, i: number, j: number): number => Math.sin(1.3 * i + 0.7 * j + 0.4 * s) + 0.1 * j * i;
const y = (s: number, i: number): number => 2 + s + 0.8 * x(s, i, 0) - 0.5 * x(s, i, 1) + 0.3 * x(s, i, 2) + 0.2 * Math.cos(2.1 * i + s);
const slotGram = (s: number, response: (s: number, i: number) => number = y) =>
  standardisedGram(
    matrixFromRows(Array.from({ length: N }, (_, i) => Array.from({ length: K }, (_, j) => x(s, i, j)))),
    Array.from({ length: N }, (_, i) => response(s, i)),
  );

describe('pooled slot Grams: least squares with one level per slot and shared slopes', () => {
  it('matches NumPy: weighted least squares with slot dummies (pooledGramsReference.py, NumPy 2.4.6)', () => {
    const weights = [0.5, 1, 0.25];
    const pooled = new PooledGrams(K, 1, S);
    for (let s = 0; s < S; s++) pooled.add(slotGram(s), 0, weights[s] as number, s);
    const model = choleskyLeastSquares(pooled.gram(0, 1, []));
    const slopes = [0.7547636559380626, -0.47621501169559866, 0.2818251807709002];
    const levels = [2.010639295307986, 3.0116163654103913, 4.011358592413989];
    slopes.forEach((b, j) => expect(model.coefficients[j]).toBeCloseTo(b, 10));
    // The model at the centre slot's means carries the centre's level; withLevel gives every slot's.
    expect(model.intercept).toBeCloseTo(levels[1] as number, 10);
    levels.forEach((level, s) => expect(pooled.withLevel(model, s, 0).intercept).toBeCloseTo(level, 10));
  });

  it('one slot alone is that slot\'s own least-squares fit, whatever its weight', () => {
    const own = choleskyLeastSquares(slotGram(2));
    const pooled = new PooledGrams(K, 1, 1);
    pooled.add(slotGram(2), 0, 0.3, 0);
    const model = choleskyLeastSquares(pooled.gram(0, 0, []));
    expect(model.intercept).toBeCloseTo(own.intercept, 12);
    for (let j = 0; j < K; j++) expect(model.coefficients[j]).toBeCloseTo(own.coefficients[j] as number, 12);
  });

  it('slots whose data differ only by a level share the single slot\'s slopes (a law of the within estimator)', () => {
    const shifted = (s: number, i: number): number => y(0, i) + 5 * s;
    const single = choleskyLeastSquares(slotGram(0, shifted));
    const pooled = new PooledGrams(K, 1, S);
    for (let s = 0; s < S; s++) {
      const rows = matrixFromRows(Array.from({ length: N }, (_, i) => Array.from({ length: K }, (_, j) => x(0, i, j))));
      pooled.add(standardisedGram(rows, Array.from({ length: N }, (_, i) => shifted(s, i))), 0, 1 / (1 + s), s);
    }
    const model = choleskyLeastSquares(pooled.gram(0, 2, []));
    for (let j = 0; j < K; j++) expect(model.coefficients[j]).toBeCloseTo(single.coefficients[j] as number, 10);
    expect(model.intercept).toBeCloseTo(single.intercept + 10, 10);
  });

  it('leaves out the columns it is told to (their coefficient 0)', () => {
    const pooled = new PooledGrams(K, 1, S);
    for (let s = 0; s < S; s++) pooled.add(slotGram(s), 0, 1, s);
    expect(choleskyLeastSquares(pooled.gram(0, 0, [1])).coefficients[1]).toBe(0);
  });
});

describe('neighbour weights of the slots within a clock span', () => {
  it('are the tricube of the distance over (span + one slot) (Cleveland and Devlin 1988): 30 minutes at 15-minute slots', () => {
    // (1 - (15/45)^3)^3 = (26/27)^3 and (1 - (30/45)^3)^3 = (19/27)^3.
    const w = neighbourWeights(96, 30);
    expect(w.length).toBe(3);
    expect(w[0]).toBe(1);
    expect(w[1]).toBeCloseTo((26 / 27) ** 3, 14);
    expect(w[2]).toBeCloseTo((19 / 27) ** 3, 14);
  });

  it('cover the same clock span at 15, 30 and 60 minutes, and no neighbour when the span is shorter than a slot', () => {
    expect(neighbourWeights(96, 60).length).toBe(5);
    expect(neighbourWeights(48, 60).length).toBe(3);
    expect(neighbourWeights(24, 60).length).toBe(2);
    expect(neighbourWeights(24, 30).length).toBe(1);
    expect(neighbourWeights(96, 0).length).toBe(1);
  });
});
