import { describe, expect, it } from 'vitest';
import { slotQuantiles } from '../../src/forecast/models/driverRegression.js';
import { selectInPlace } from '../../src/forecast/models/robustAsinh.js';
import { medianBySelection } from '../../src/forecast/quantiles/driverSpread.js';
import { sortedQuantile } from '../../src/forecast/quantiles/sortedQuantile.js';
import { seededRandom } from './seededRandom.js';

/** Invented samples with many ties (values on a grid of 1/4), odd and even sizes. */
function samples(seed: number): Float64Array[] {
  const u = seededRandom(seed);
  return [1, 2, 3, 10, 11, 200, 201, 729].map((n) => Float64Array.from({ length: n }, () => Math.round(40 * u() - 10) / 4));
}

describe('order statistics by selection (Hoare 1961) against the sorted sample', () => {
  it('selectInPlace from a position: the k-th smallest of the whole sample once the values before are its smallest', () => {
    for (const values of samples(1)) {
      const sorted = Float64Array.from(values).sort();
      const work = Float64Array.from(values);
      const first = Math.floor(values.length / 3);
      selectInPlace(work, first);
      for (const k of [first, Math.floor((2 * values.length) / 3), values.length - 1]) {
        if (k < first) continue;
        expect(selectInPlace(work, k, first)).toBe(sorted[k]);
      }
    }
  });

  it('medianBySelection equals sortedQuantile(sorted, 0.5) (Hyndman and Fan 1996, definition 7) bit for bit', () => {
    for (const values of samples(2)) {
      const want = sortedQuantile(Float64Array.from(values).sort(), 0.5);
      expect(Object.is(medianBySelection(Float64Array.from(values)), want), `n = ${values.length}`).toBe(true);
    }
    // A worked value: the median of 1, 2, 3, 4 is 2.5 (as R's median(1:4)).
    expect(medianBySelection(Float64Array.of(4, 1, 3, 2))).toBe(2.5);
  });

  it('slotQuantiles gives the j/(J+1) quantiles of definition 7 of the sorted sample, bit for bit', () => {
    for (const values of samples(3)) {
      for (const J of [1, 2, 3, 5]) {
        const sorted = Float64Array.from(values).sort();
        const out = new Float64Array(J);
        slotQuantiles(Float64Array.from(values), J, out);
        const want = Array.from({ length: J }, (_, j) => sortedQuantile(sorted, (j + 1) / (J + 1)));
        expect(Array.from(out).every((v, j) => Object.is(v, want[j])), `n = ${values.length}, J = ${J}`).toBe(true);
      }
    }
    // A worked value: the quartiles of 1..5 by definition 7 are 2, 3 and 4 (R: quantile(1:5, c(.25, .5, .75))).
    const out = new Float64Array(3);
    slotQuantiles(Float64Array.of(5, 3, 1, 4, 2), 3, out);
    expect([...out]).toEqual([2, 3, 4]);
  });
});
