import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { historicalSimulation } from '../../src/forecast/quantiles/historicalSimulation.js';
import { PoolOrder } from '../../src/forecast/quantiles/poolOrder.js';
import { seededNormal } from './seededRandom.js';

/** The plain reference: gather slot s of every day and sort with Float64Array.prototype.sort (ECMA-262, %TypedArray%.prototype.sort: numeric, -0 before +0). */
function sortedBySort(errors: readonly Float64Array[], s: number): Float64Array {
  return Float64Array.from(errors, (e) => e[s]!).sort();
}

function sameBits(a: Float64Array, b: Float64Array): boolean {
  return a.length === b.length && a.every((x, i) => Object.is(x, b[i]));
}

describe('PoolOrder: error pools sorted from the last order', () => {
  it('sorts each slot as Float64Array.prototype.sort does while a window of days rolls and the errors move a little', () => {
    const normal = seededNormal(41);
    const slots = 6;
    const base = Array.from({ length: 120 }, () => Float64Array.from({ length: slots }, normal));
    const order = new PoolOrder();
    const out = new Float64Array(60);
    for (let end = 60; end <= base.length; end++) {
      // A new scale each day: every error is moved a little, as the asinh scale moves with the window.
      const stretch = 1 + 0.01 * Math.sin(end);
      const ids = Int32Array.from({ length: 60 }, (_, i) => end - 60 + i);
      const errors = Array.from(ids, (d) => Float64Array.from(base[d]!, (e) => Math.round(1e3 * e * stretch) / 1e3));
      order.begin(ids);
      for (let s = 0; s < slots; s++) {
        order.sortSlot(errors, s, out);
        expect(sameBits(out, sortedBySort(errors, s))).toBe(true);
      }
    }
  });

  it('sorts any pools, with ties and signed zeros, whatever days the last call had', () => {
    const value = fc.oneof(fc.constantFrom(0, -0, 1, -1), fc.integer({ min: -5, max: 5 }).map((v) => v / 4));
    const call = fc.tuple(fc.integer({ min: 0, max: 30 }), fc.array(fc.array(value, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 25 }));
    fc.assert(
      fc.property(fc.array(call, { minLength: 1, maxLength: 6 }), (calls) => {
        const order = new PoolOrder();
        for (const [first, rows] of calls) {
          const errors = rows.map((r) => Float64Array.from(r));
          order.begin(Int32Array.from(errors, (_, i) => first + 2 * i));
          const out = new Float64Array(errors.length);
          for (let s = 0; s < 3; s++) {
            order.sortSlot(errors, s, out);
            expect(sameBits(out, sortedBySort(errors, s))).toBe(true);
          }
        }
      }),
      { seed: 43, numRuns: 300 },
    );
  });

  it('leaves the historical-simulation quantiles unchanged, bit for bit', () => {
    const normal = seededNormal(47);
    const point = [10, 20, 30, 40];
    const levels = [0.05, 0.25, 0.5, 0.75, 0.95];
    const days = Array.from({ length: 80 }, () => Float64Array.from({ length: 4 }, normal));
    const order = new PoolOrder();
    for (let end = 30; end <= 80; end += 1) {
      const errors = days.slice(end - 30, end);
      const dayIds = Int32Array.from({ length: 30 }, (_, i) => end - 30 + i);
      const plain = historicalSimulation(point, errors, levels);
      const kept = historicalSimulation(point, errors, levels, { order, dayIds });
      expect(kept.every((row, s) => row.every((q, k) => Object.is(q, plain[s]![k])))).toBe(true);
    }
  });
});
