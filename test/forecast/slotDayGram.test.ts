import { describe, expect, it } from 'vitest';
import type { StandardisedGram } from '../../src/forecast/linalg/standardisedGram.js';
import { SlotDayGramBuilder } from '../../src/forecast/models/slotDayGram.js';
import { seededNormal, seededRandom } from './seededRandom.js';

const N = 60;
const A = 4; // 3 slot columns and the response
const COUNTS = [20, 45, 60];

function design(seed: number) {
  const normal = seededNormal(seed);
  const uniform = seededRandom(seed + 1);
  const continuous = Float64Array.from({ length: N * 2 }, () => 50 + 10 * normal());
  const categories = Int8Array.from({ length: N }, () => 1 + Math.floor(uniform() * 3));
  const slotValues = Float64Array.from({ length: N * A }, () => 30 + 5 * normal());
  return { day: { continuous, width: 2, categories, dummies: 2 }, slotValues };
}

function gramsOf(builder: SlotDayGramBuilder, slotValues: Float64Array, newResponseOnly = false): StandardisedGram[] {
  const out: StandardisedGram[] = [];
  builder.forEachGram(slotValues, A, (gram) => out.push(structuredClone(gram)), newResponseOnly);
  return out;
}

describe('SlotDayGramBuilder', () => {
  it('a pass with only a new response gives the same Grams, bit for bit, as a full pass on it', () => {
    const { day, slotValues } = design(7);
    const reused = new SlotDayGramBuilder(day, COUNTS);
    gramsOf(reused, slotValues);
    const changed = Float64Array.from(slotValues);
    const normal = seededNormal(11);
    for (let i = 0; i < N; i++) changed[i * A + A - 1] = 40 + 8 * normal();
    const fresh = gramsOf(new SlotDayGramBuilder(day, COUNTS), changed);
    expect(gramsOf(reused, changed, true)).toEqual(fresh);
  });

  it('equals the centred, standardised cross-products of the explicit design (their definition)', () => {
    // Definition: columns z_j = (x_j - mean_j) / sd_j with population sd; gram = Z'Z / n, zty = Z'(y - ybar) / n.
    const { day, slotValues } = design(3);
    const grams = gramsOf(new SlotDayGramBuilder(day, COUNTS), slotValues);
    COUNTS.forEach((n, w) => {
      const rows = Array.from({ length: n }, (_, i) => [
        ...Array.from({ length: A - 1 }, (_, q) => slotValues[i * A + q] as number),
        day.continuous[i * 2] as number,
        day.continuous[i * 2 + 1] as number,
        day.categories[i] === 1 ? 1 : 0,
        day.categories[i] === 2 ? 1 : 0,
      ]);
      const y = Array.from({ length: n }, (_, i) => slotValues[i * A + A - 1] as number);
      const k = rows[0]?.length as number;
      const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
      const cols = Array.from({ length: k }, (_, j) => rows.map((r) => r[j] as number));
      const means = cols.map(mean);
      const sds = cols.map((c, j) => Math.sqrt(mean(c.map((x) => (x - (means[j] as number)) ** 2))));
      const yMean = mean(y);
      const gram = grams[w] as StandardisedGram;
      expect(gram.n).toBe(n);
      expect(gram.yMean).toBeCloseTo(yMean, 9);
      for (let u = 0; u < k; u++) {
        expect(gram.means[u]).toBeCloseTo(means[u] as number, 9);
        expect(gram.scales[u]).toBeCloseTo(sds[u] as number, 9);
        const zu = (cols[u] as number[]).map((x) => (x - (means[u] as number)) / (sds[u] as number));
        expect(gram.zty[u]).toBeCloseTo(mean(zu.map((z, i) => z * ((y[i] as number) - yMean))), 8);
        for (let v = u; v < k; v++) {
          const zv = (cols[v] as number[]).map((x) => (x - (means[v] as number)) / (sds[v] as number));
          expect(gram.gram[u * k + v]).toBeCloseTo(mean(zu.map((z, i) => z * (zv[i] as number))), 9);
        }
      }
    });
  });
});
