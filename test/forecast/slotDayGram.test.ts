import { describe, expect, it } from 'vitest';
import type { StandardisedGram } from '../../src/forecast/linalg/standardisedGram.js';
import { standardiseCentredSums } from '../../src/forecast/linalg/standardisedGram.js';
import type { DayLevelColumns } from '../../src/forecast/models/slotDayGram.js';
import { SlotDayGramBuilder } from '../../src/forecast/models/slotDayGram.js';
import { seededNormal, seededRandom } from './seededRandom.js';

const N = 60;
const A = 4; // 3 slot columns and the response
const COUNTS = [20, 45, 60];

function design(seed: number, n = N, a = A, width = 2, dummies = 2) {
  const normal = seededNormal(seed);
  const uniform = seededRandom(seed + 1);
  const continuous = Float64Array.from({ length: n * width }, () => 50 + 10 * normal());
  const categories = Int8Array.from({ length: n }, () => 1 + Math.floor(uniform() * (dummies + 1)));
  const rows = Float64Array.from({ length: n * a }, () => 30 + 5 * normal());
  return { day: { continuous, width, categories, dummies }, rows };
}

/** Row-major n x a to column by column (columns[q n + i]), as the builder takes them. */
function byColumn(rows: Float64Array, n: number, a: number): Float64Array {
  return Float64Array.from({ length: n * a }, (_, c) => rows[(c % n) * a + Math.floor(c / n)] as number);
}

function gramsOf(builder: SlotDayGramBuilder, rows: Float64Array, n: number, a: number, newResponseOnly = false): StandardisedGram[] {
  const out: StandardisedGram[] = [];
  builder.forEachGram(byColumn(rows, n, a), a, (gram) => out.push(structuredClone(gram)), { newResponseOnly });
  return out;
}

/**
 * The plain reference: the same shifted sums (shift = the first row) added row by row, one row at a
 * time, into every sum, and the same centred products (a dummy's product with a slot column as the
 * category's bucket sum minus the dummy's shift times the column's sum).
 */
function referenceGrams(day: DayLevelColumns, counts: readonly number[], rows: Float64Array, a: number): StandardisedGram[] {
  const { width: B, dummies: D, continuous, categories } = day;
  const m = B + D;
  const p = a - 1;
  const k = p + m;
  const dayRow = (i: number) => [
    ...Array.from({ length: B }, (_, j) => continuous[i * B + j] as number),
    ...Array.from({ length: D }, (_, c) => ((categories[i] as number) === c + 1 ? 1 : 0)),
  ];
  const shiftDay = dayRow(0);
  const shiftA = Array.from({ length: a }, (_, q) => rows[q] as number);
  const sumD = new Float64Array(m);
  const prodDD = new Float64Array(m * m);
  const sumA = new Float64Array(a);
  const prodAA = new Float64Array(a * a);
  const prodAB = new Float64Array(a * B);
  const buckets = new Float64Array((D + 1) * a);
  const out: StandardisedGram[] = [];
  let i = 0;
  for (const count of counts) {
    for (; i < count; i++) {
      const rd = dayRow(i).map((v, j) => v - (shiftDay[j] as number));
      const ra = Array.from({ length: a }, (_, q) => (rows[i * a + q] as number) - (shiftA[q] as number));
      for (let j = 0; j < m; j++) {
        sumD[j] = (sumD[j] as number) + (rd[j] as number);
        for (let l = j; l < m; l++) prodDD[j * m + l] = (prodDD[j * m + l] as number) + (rd[j] as number) * (rd[l] as number);
      }
      const bucket = ((categories[i] as number) - 1) * a;
      for (let q = 0; q < a; q++) {
        const rq = ra[q] as number;
        sumA[q] = (sumA[q] as number) + rq;
        buckets[bucket + q] = (buckets[bucket + q] as number) + rq;
        for (let j = 0; j < B; j++) prodAB[q * B + j] = (prodAB[q * B + j] as number) + rq * (rd[j] as number);
        for (let r = q; r < a; r++) prodAA[q * a + r] = (prodAA[q * a + r] as number) + rq * (ra[r] as number);
      }
    }
    const sumOf = (c: number) => (c < p ? (sumA[c] as number) : (sumD[c - p] as number));
    const withSlot = (q: number, c: number): number => {
      if (c < p) return q <= c ? (prodAA[q * a + c] as number) : (prodAA[c * a + q] as number);
      const d = c - p;
      if (d < B) return prodAB[q * B + d] as number;
      return (buckets[(d - B) * a + q] as number) - (shiftDay[d] as number) * (sumA[q] as number);
    };
    const product = (u: number, v: number): number => {
      if (u < p) return withSlot(u, v);
      if (v < p) return withSlot(v, u);
      return prodDD[Math.min(u - p, v - p) * m + Math.max(u - p, v - p)] as number;
    };
    const means = new Float64Array(k);
    const gram = new Float64Array(k * k);
    const cy = new Float64Array(k);
    const sy = sumA[p] as number;
    for (let u = 0; u < k; u++) {
      const su = sumOf(u);
      means[u] = (u < p ? (shiftA[u] as number) : (shiftDay[u - p] as number)) + su / count;
      cy[u] = withSlot(p, u) - (su * sy) / count;
      for (let v = u; v < k; v++) gram[u * k + v] = product(u, v) - (su * sumOf(v)) / count;
    }
    out.push(standardiseCentredSums(count, means, (shiftA[p] as number) + sy / count, gram, cy, (prodAA[p * a + p] as number) - (sy * sy) / count));
  }
  return out;
}

/** Every number of two lists of Grams the same, bit for bit (Object.is: also the sign of a zero). */
function expectSameBits(got: StandardisedGram[], want: StandardisedGram[]): void {
  expect(got.length).toBe(want.length);
  got.forEach((g, w) => {
    const r = want[w] as StandardisedGram;
    expect([g.n, g.k]).toEqual([r.n, r.k]);
    expect(Object.is(g.yMean, r.yMean) && Object.is(g.yVariance, r.yVariance)).toBe(true);
    for (const field of ['means', 'scales', 'gram', 'zty'] as const) {
      const mismatch = Array.from(g[field]).findIndex((v, j) => !Object.is(v, r[field][j]));
      expect(mismatch, `${field} of window ${w}`).toBe(-1);
    }
  });
}

describe('SlotDayGramBuilder', () => {
  // Odd and even numbers of slot columns (taken two at a time), with and without day-level columns.
  it.each([
    [1, 2, 2],
    [2, 2, 6],
    [3, 0, 2],
    [4, 1, 0],
    [5, 2, 6],
    [7, 2, 6],
    [8, 3, 1],
  ])('gives the plain row-by-row sums bit for bit, a = %i slot columns, %i continuous and %i dummy day-level columns', (a, width, dummies) => {
    const n = 75;
    const counts = [30, 52, 75];
    const { day, rows } = design(100 + a, n, a, width, dummies);
    const builder = new SlotDayGramBuilder(day, counts);
    expectSameBits(gramsOf(builder, rows, n, a), referenceGrams(day, counts, rows, a));
    // Another slot through the same builder (the workspace reused), then one with only a new response.
    const next = design(200 + a, n, a, width, dummies).rows;
    expectSameBits(gramsOf(builder, next, n, a), referenceGrams(day, counts, next, a));
    const normal = seededNormal(300 + a);
    for (let i = 0; i < n; i++) next[i * a + a - 1] = 40 + 8 * normal();
    expectSameBits(gramsOf(builder, next, n, a, true), referenceGrams(day, counts, next, a));
  });

  it('hands out only the longest window\'s Gram when asked, and keeps every window\'s sums for a new response', () => {
    const { day, rows } = design(9);
    const builder = new SlotDayGramBuilder(day, COUNTS);
    const longest: [StandardisedGram, number][] = [];
    builder.forEachGram(byColumn(rows, N, A), A, (gram, w) => longest.push([structuredClone(gram), w]), { longestOnly: true });
    const reference = referenceGrams(day, COUNTS, rows, A);
    expect(longest.map(([, w]) => w)).toEqual([COUNTS.length - 1]);
    expectSameBits([longest[0]![0]], [reference[COUNTS.length - 1]!]);
    const next = Float64Array.from(rows);
    const normal = seededNormal(13);
    for (let i = 0; i < N; i++) next[i * A + A - 1] = 35 + 6 * normal();
    expectSameBits(gramsOf(builder, next, N, A, true), referenceGrams(day, COUNTS, next, A));
  });

  it('a first pass asked with only a new response forms every sum (nothing to keep yet)', () => {
    const { day, rows } = design(5);
    expectSameBits(gramsOf(new SlotDayGramBuilder(day, COUNTS), rows, N, A, true), referenceGrams(day, COUNTS, rows, A));
  });

  it('a pass with only a new response gives the same Grams, bit for bit, as a full pass on it', () => {
    const { day, rows } = design(7);
    const reused = new SlotDayGramBuilder(day, COUNTS);
    gramsOf(reused, rows, N, A);
    const changed = Float64Array.from(rows);
    const normal = seededNormal(11);
    for (let i = 0; i < N; i++) changed[i * A + A - 1] = 40 + 8 * normal();
    const fresh = gramsOf(new SlotDayGramBuilder(day, COUNTS), changed, N, A);
    expect(gramsOf(reused, changed, N, A, true)).toEqual(fresh);
  });

  it('equals the centred, standardised cross-products of the explicit design (their definition)', () => {
    // Definition: columns z_j = (x_j - mean_j) / sd_j with population sd; gram = Z'Z / n, zty = Z'(y - ybar) / n.
    const { day, rows } = design(3);
    const grams = gramsOf(new SlotDayGramBuilder(day, COUNTS), rows, N, A);
    COUNTS.forEach((n, w) => {
      const explicit = Array.from({ length: n }, (_, i) => [
        ...Array.from({ length: A - 1 }, (_, q) => rows[i * A + q] as number),
        day.continuous[i * 2] as number,
        day.continuous[i * 2 + 1] as number,
        day.categories[i] === 1 ? 1 : 0,
        day.categories[i] === 2 ? 1 : 0,
      ]);
      const y = Array.from({ length: n }, (_, i) => rows[i * A + A - 1] as number);
      const k = explicit[0]?.length as number;
      const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
      const cols = Array.from({ length: k }, (_, j) => explicit.map((r) => r[j] as number));
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
