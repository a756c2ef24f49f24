import { describe, expect, it } from 'vitest';
import { SlotSortedValues } from '../../src/forecast/models/slotSortedValues.js';
import { medianBySelection } from '../../src/forecast/quantiles/driverSpread.js';
import { sortedQuantile } from '../../src/forecast/quantiles/sortedQuantile.js';
import { seededRandom } from './seededRandom.js';

/** Invented samples with many ties (values on a grid of 1/4), odd and even sizes. */
function samples(seed: number): Float64Array[] {
  const u = seededRandom(seed);
  return [1, 2, 3, 10, 11, 200, 201, 729].map((n) => Float64Array.from({ length: n }, () => Math.round(40 * u() - 10) / 4));
}

describe('order statistics without sorting afresh, against the sorted sample', () => {
  it('medianBySelection equals sortedQuantile(sorted, 0.5) (Hyndman and Fan 1996, definition 7) bit for bit', () => {
    for (const values of samples(2)) {
      const want = sortedQuantile(Float64Array.from(values).sort(), 0.5);
      expect(Object.is(medianBySelection(Float64Array.from(values)), want), `n = ${values.length}`).toBe(true);
    }
    // A worked value: the median of 1, 2, 3, 4 is 2.5 (as R's median(1:4)).
    expect(medianBySelection(Float64Array.of(4, 1, 3, 2))).toBe(2.5);
  });

  it('SlotSortedValues keeps each slot\'s values in the order of sorting them afresh, bit for bit, as the set of days moves, grows and jumps', () => {
    const u = seededRandom(3);
    const S = 5;
    // Invented days of S values with ties (a grid of 1/4), some -0 and +0.
    const days = Array.from({ length: 120 }, (_, d) => Float64Array.from({ length: S }, (_, s) => (d % 17 === 0 && s === 2 ? (d % 2 === 0 ? -0 : 0) : Math.round(40 * u() - 10) / 4)));
    const kept = new SlotSortedValues();
    const windows: [number, number][] = [[0, 30], [1, 31], [1, 33], [3, 33], [3, 34], [50, 110], [51, 111], [0, 120], [10, 12], [10, 13]];
    for (const [from, to] of windows) {
      const set = days.slice(from, to).reverse();
      const sorted = kept.of(set);
      for (let s = 0; s < S; s++) {
        const fresh = Float64Array.from(set, (day) => day[s] as number).sort();
        // Values equal as numbers (a kept -0 and +0 may trade places), and the quantiles of definition 7 the same bits.
        expect(sorted[s]!.length).toBe(fresh.length);
        expect(Array.from(sorted[s]!).every((v, i) => v === fresh[i])).toBe(true);
        for (const tau of [0.25, 0.5, 0.75]) expect(sortedQuantile(sorted[s]!, tau) === sortedQuantile(fresh, tau)).toBe(true);
      }
    }
  });
});
