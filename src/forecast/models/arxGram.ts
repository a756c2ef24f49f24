import type { StandardisedGram } from '../linalg/standardisedGram.js';
import { nestedShiftedSums } from '../linalg/nestedShiftedSums.js';
import { standardiseCentredSums } from '../linalg/standardisedGram.js';
import { twoByFourProducts } from '../linalg/twoByFourProducts.js';
import { gramWorkspace, type GramWorkspace } from './gramWorkspace.js';

/** Day-level ARX regressors, the same for every slot of a training day. */
export interface ArxDayLevel {
  /** Per training row (most recent first): min, max and last transformed price of the day before, n x 3. */
  readonly minMaxLast: Float64Array;
  /** Per training row: ISO weekday 1..7 (dummies for 1..6, Sunday the reference). */
  readonly weekdays: Int8Array;
}

const B = 3;
const D = 6;

/**
 * The standardised Gram matrices of the ARX design of one slot for nested windows (the first
 * counts[w] training rows), in the column order of ARX_COLUMNS: [lag1, lag2, lag7, min, max, last,
 * Monday..Saturday, exogenous...].
 *
 * Notes: the same cross products as {@link nestedStandardisedGrams} (shifted sums, shift = the first
 * row; centred products S_uv - S_u S_v / n), computed with the structure of the design: the 9
 * day-level columns (min, max, last and the weekday dummies) are the same for every slot, so their
 * block is summed once per day (built at construction), and the products of a slot column a with a
 * dummy D_w are bucket sums, sum_i (a_i - K_a)(D_wi - K_w) = sum_{i: weekday i = w} (a_i - K_a)
 * - K_w sum_i (a_i - K_a). Per row and slot this costs O(a^2) for a slot columns (three lags, the
 * exogenous columns and the response) instead of O(k^2) for all k columns.
 */
export class ArxGramBuilder {
  private readonly n: number;
  private readonly shiftB: Float64Array;
  private readonly shiftD: Float64Array;
  /** Per count: sums of the 9 shifted day-level columns and their products (9 x 9). */
  private readonly sharedSums: Float64Array[];
  private readonly sharedProducts: Float64Array[];
  /** The shifted min, max and last of every row, column by column: rb[j n + i]. */
  private readonly rb: Float64Array;

  constructor(
    private readonly day: ArxDayLevel,
    private readonly counts: readonly number[],
  ) {
    this.n = counts[counts.length - 1] ?? 0;
    const { minMaxLast, weekdays } = day;
    this.shiftB = Float64Array.from({ length: B }, (_, j) => minMaxLast[j] as number);
    this.shiftD = Float64Array.from({ length: D }, (_, w) => ((weekdays[0] as number) === w + 1 ? 1 : 0));
    const shared = nestedShiftedSums(counts, B + D, (i, row) => {
      for (let j = 0; j < B; j++) row[j] = (minMaxLast[i * B + j] as number) - (this.shiftB[j] as number);
      for (let w = 0; w < D; w++) row[B + w] = ((weekdays[i] as number) === w + 1 ? 1 : 0) - (this.shiftD[w] as number);
    });
    this.sharedSums = shared.sums;
    this.sharedProducts = shared.products;
    this.rb = new Float64Array(B * this.n);
    for (let j = 0; j < B; j++) for (let r = 0; r < this.n; r++) this.rb[j * this.n + r] = (minMaxLast[r * B + j] as number) - (this.shiftB[j] as number);
  }

  /**
   * The Grams of one slot, one per count, handed to `use` in order of the counts. The Gram passed is
   * overwritten by the next one: copy what must be kept.
   *
   * Each sum is taken over the rows in row order, one sum at a time (the shifted slot columns are laid
   * out column by column first), and read off at every count: the same additions in the same order as
   * row by row, so the same bits, with the running sum in a register instead of in memory.
   *
   * @param columns the a slot columns of the n training rows, column by column (columns[p n + i]):
   *   lag1, lag2, lag7, the exogenous columns and, last, the response
   * @param lastSlot true in the last slot of the day, where `last` duplicates lag1 and is left out
   */
  forEachGram(columns: Float64Array, a: number, lastSlot: boolean, use: (gram: StandardisedGram, index: number) => void): void {
    const { n, counts } = this;
    const work = this.workspace(a);
    const { cols, shiftA, prodAA } = work;
    const W = counts.length;
    const zeros = a * n;
    for (let p = 0; p < a; p++) {
      const base = p * n;
      const shift = columns[base] as number;
      shiftA[p] = shift;
      for (let i = 0; i < n; i++) cols[base + i] = (columns[base + i] as number) - shift;
    }
    // Two slot columns p, p + 1 at a time (past the last column, the column of zeros, whose sums are
    // dropped): first their sums, sums by weekday and products with min, max and last, then their
    // products with the columns q >= p, four per pass over the rows.
    for (let p = 0; p < a; p += 2) {
      const two = p + 1 < a;
      const pn = p * n;
      const pn1 = two ? pn + n : zeros;
      this.rowSums(work, p, pn, pn1, two);
      for (let q = p; q < a; q += 4) {
        const q0 = q * n;
        const q1 = q + 1 < a ? q0 + n : zeros;
        const q2 = q + 2 < a ? q0 + 2 * n : zeros;
        const q3 = q + 3 < a ? q0 + 3 * n : zeros;
        const sums = work.blockSums;
        twoByFourProducts(cols, pn, pn1, q0, q1, q2, q3, counts, sums);
        for (let w = 0; w < W; w++) {
          const s00 = sums[8 * w] as number;
          const s01 = sums[8 * w + 1] as number;
          const s02 = sums[8 * w + 2] as number;
          const s03 = sums[8 * w + 3] as number;
          const s10 = sums[8 * w + 4] as number;
          const s11 = sums[8 * w + 5] as number;
          const s12 = sums[8 * w + 6] as number;
          const s13 = sums[8 * w + 7] as number;
          const at = w * a * a + p * a + q;
          prodAA[at] = s00;
          if (q + 1 < a) prodAA[at + 1] = s01;
          if (q + 2 < a) prodAA[at + 2] = s02;
          if (q + 3 < a) prodAA[at + 3] = s03;
          if (two) {
            // Row p + 1 keeps only its columns q' >= p + 1 (s10 is the product with column p, kept in row p).
            const at1 = at + a;
            if (q > p) prodAA[at1] = s10;
            if (q + 1 < a) prodAA[at1 + 1] = s11;
            if (q + 2 < a) prodAA[at1 + 2] = s12;
            if (q + 3 < a) prodAA[at1 + 3] = s13;
          }
        }
      }
    }
    for (let w = 0; w < W; w++) use(this.assemble(counts[w] as number, w, work, lastSlot), w);
  }

  /**
   * The sums, sums by weekday and products with min, max and last of slot columns p and p + 1 (rows at
   * pn and pn1; pn1 the column of zeros when p is the last), read off at every count.
   */
  private rowSums(work: GramWorkspace, p: number, pn: number, pn1: number, two: boolean): void {
    const { n, counts, rb } = this;
    const weekdays = this.day.weekdays;
    const { a, cols, sumA, prodAB, buckets, bucket, bucket1 } = work;
    let sum0 = 0;
    let sum1 = 0;
    let ab00 = 0;
    let ab01 = 0;
    let ab02 = 0;
    let ab10 = 0;
    let ab11 = 0;
    let ab12 = 0;
    bucket.fill(0);
    bucket1.fill(0);
    let i = 0;
    for (let w = 0; w < counts.length; w++) {
      const end = counts[w] as number;
      for (; i < end; i++) {
        const v0 = cols[pn + i] as number;
        const v1 = cols[pn1 + i] as number;
        const d = (weekdays[i] as number) - 1;
        const r0 = rb[i] as number;
        const r1 = rb[n + i] as number;
        const r2 = rb[2 * n + i] as number;
        sum0 += v0;
        sum1 += v1;
        bucket[d] = (bucket[d] as number) + v0;
        bucket1[d] = (bucket1[d] as number) + v1;
        ab00 += v0 * r0;
        ab01 += v0 * r1;
        ab02 += v0 * r2;
        ab10 += v1 * r0;
        ab11 += v1 * r1;
        ab12 += v1 * r2;
      }
      sumA[w * a + p] = sum0;
      for (let d = 0; d < 7; d++) buckets[(w * 7 + d) * a + p] = bucket[d] as number;
      const at = (w * a + p) * B;
      prodAB[at] = ab00;
      prodAB[at + 1] = ab01;
      prodAB[at + 2] = ab02;
      if (two) {
        sumA[w * a + p + 1] = sum1;
        for (let d = 0; d < 7; d++) buckets[(w * 7 + d) * a + p + 1] = bucket1[d] as number;
        prodAB[at + B] = ab10;
        prodAB[at + B + 1] = ab11;
        prodAB[at + B + 2] = ab12;
      }
    }
  }

  private work: GramWorkspace | undefined;

  private workspace(a: number): GramWorkspace {
    if (this.work === undefined || this.work.a !== a) {
      const k = 12 + a - 4;
      const W = this.counts.length;
      this.work = gramWorkspace({ a, k, W, B, C: 7, n: this.n, extraColumns: 0 });
    }
    return this.work;
  }

  /** Centred sums of all columns at count w, standardised (into the workspace's arrays). */
  private assemble(count: number, w: number, work: GramWorkspace, lastSlot: boolean): StandardisedGram {
    const { a, k, shiftA, sumA, means, gram, cy, shift, sums } = work;
    const sharedSums = this.sharedSums[w] as Float64Array;
    const y = a - 1;
    const sumAt = w * a;
    // Final column c: lags 0..2 and exogenous 12.. come from the slot (A index c or c - 9); min, max,
    // last (3..5) and the dummies (6..11) from the day-level block (index c - 3).
    for (let c = 0; c < k; c++) {
      const p = sourceA(c);
      shift[c] = p >= 0 ? (shiftA[p] as number) : c < 6 ? (this.shiftB[c - 3] as number) : (this.shiftD[c - 6] as number);
      sums[c] = p >= 0 ? (sumA[sumAt + p] as number) : (sharedSums[c - 3] as number);
    }
    const sy = sumA[sumAt + y] as number;
    for (let u = 0; u < k; u++) {
      const dropped = lastSlot && u === 5;
      const su = dropped ? 0 : (sums[u] as number);
      means[u] = dropped ? 0 : (shift[u] as number) + su / count;
      cy[u] = dropped ? 0 : this.productWithA(work, w, y, u) - (su * sy) / count;
      for (let v = u; v < k; v++) {
        gram[u * k + v] = dropped || (lastSlot && v === 5) ? 0 : this.product(work, w, u, v) - (su * (sums[v] as number)) / count;
      }
    }
    const ySquares = (work.prodAA[w * a * a + y * a + y] as number) - (sy * sy) / count;
    return standardiseCentredSums(count, means, (shiftA[y] as number) + sy / count, gram, cy, ySquares, work.standardised);
  }

  /** Shifted product sum, at count w, of slot column p with final column c. */
  private productWithA(work: GramWorkspace, w: number, p: number, c: number): number {
    const { a, prodAA, prodAB, buckets, sumA } = work;
    const q = sourceA(c);
    const aa = w * a * a;
    if (q >= 0) return p <= q ? (prodAA[aa + p * a + q] as number) : (prodAA[aa + q * a + p] as number);
    if (c < 6) return prodAB[(w * a + p) * B + (c - 3)] as number;
    const dummy = c - 6;
    return (buckets[(w * 7 + dummy) * a + p] as number) - (this.shiftD[dummy] as number) * (sumA[w * a + p] as number);
  }

  /** Shifted product sum, at count w, of final columns u and v. */
  private product(work: GramWorkspace, w: number, u: number, v: number): number {
    const p = sourceA(u);
    if (p >= 0) return this.productWithA(work, w, p, v);
    const q = sourceA(v);
    if (q >= 0) return this.productWithA(work, w, q, u);
    const m = B + D;
    const su = u - 3;
    const sv = v - 3;
    const products = this.sharedProducts[w] as Float64Array;
    return su <= sv ? (products[su * m + sv] as number) : (products[sv * m + su] as number);
  }
}

/** Index among the slot columns (lag1, lag2, lag7, exogenous...) of final column c, or -1. */
function sourceA(c: number): number {
  return c < 3 ? c : c >= 12 ? c - 9 : -1;
}
