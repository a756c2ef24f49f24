import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AscendingRows } from '../../src/forecast/quantiles/ascendingRows.js';

// The reference: Array.prototype.sort with a comparator by value, then row. ECMAScript 2019 (ECMA-262 10th
// edition, section 22.1.3.27) requires that sort to be stable, and the comparator breaks every tie by row
// anyway; -0 and +0 compare equal under < and >, as they do in the 'level' pool's order.
function reference(values: ArrayLike<number>): number[] {
  const rows = Array.from({ length: values.length }, (_, i) => i);
  const v = (i: number) => values[i] as number;
  return rows.sort((a, b) => (v(a) < v(b) ? -1 : v(a) > v(b) ? 1 : a - b));
}

describe('AscendingRows', () => {
  it('puts the rows in ascending order of value, ties by row, -0 beside +0 (worked by hand)', () => {
    // Values 0.5, -1, 0.5, -0, 0: -1 (row 1), then the zeros by row (3, 4), then the two 0.5 by row (0, 2).
    expect(Array.from(new AscendingRows().of(Float64Array.from([0.5, -1, 0.5, -0, 0])))).toEqual([1, 3, 4, 0, 2]);
  });

  it('orders values that differ only in the low half of their bits (the insertion pass): 1 + k 2^-52 given in reverse', () => {
    const values = Float64Array.from({ length: 50 }, (_, k) => 1 + (49 - k) * 2 ** -52);
    expect(Array.from(new AscendingRows().of(values))).toEqual(Array.from({ length: 50 }, (_, k) => 49 - k));
    // Negative ones as well, and one value that every row shares (no digit moves anything).
    const negative = Float64Array.from({ length: 50 }, (_, k) => -1 - k * 2 ** -52);
    expect(Array.from(new AscendingRows().of(negative))).toEqual(Array.from({ length: 50 }, (_, k) => 49 - k));
    expect(Array.from(new AscendingRows().of(new Float64Array(7).fill(-2.5)))).toEqual([0, 1, 2, 3, 4, 5, 6]);
  });

  it('agrees with a stable comparison sort on any finite or infinite values, many of them equal, one object reused (fast-check)', () => {
    const sorter = new AscendingRows();
    const value = fc.oneof(
      fc.double({ noNaN: true }),
      fc.constantFrom(0, -0, 1, -1, 1 + 2 ** -52, Infinity, -Infinity, Number.MIN_VALUE, -Number.MIN_VALUE),
      fc.integer({ min: -3, max: 3 }),
    );
    fc.assert(
      fc.property(fc.array(value, { maxLength: 300 }), (values) => {
        expect(Array.from(sorter.of(Float64Array.from(values)))).toEqual(reference(values));
      }),
      { seed: 41, numRuns: 400 },
    );
  });

  it('reads a Float64Array view in place as it reads a plain array of the same numbers: -0, tiny negatives, infinities, NaN, a view at an offset (fast-check)', () => {
    const sorter = new AscendingRows();
    const value = fc.oneof(
      fc.double({ noNaN: true }),
      fc.constantFrom(0, -0, -Number.MIN_VALUE, -(2 ** -1043), -(2 ** -1042), Infinity, -Infinity, NaN),
      fc.integer({ min: -3, max: 3 }),
    );
    fc.assert(
      fc.property(fc.array(value, { maxLength: 200 }), fc.integer({ min: 0, max: 5 }), (values, offset) => {
        const holder = new Float64Array(offset + values.length + 2).fill(7);
        holder.set(values, offset);
        const view = holder.subarray(offset, offset + values.length);
        const plain = Array.from(sorter.of(Array.from(view)));
        expect(Array.from(sorter.of(view))).toEqual(plain);
      }),
      { seed: 42, numRuns: 400 },
    );
  });

  it('sorts 35,000 continuous values as the comparison sort does (the size of a 364-day pool at 15 minutes)', () => {
    let seed = 12345;
    const next = () => (seed = (seed * 48271) % 2147483647) / 2147483647;
    const values = Float64Array.from({ length: 35000 }, () => Math.tan(Math.PI * (next() - 0.5)));
    expect(Array.from(new AscendingRows().of(values))).toEqual(reference(values));
  });
});
