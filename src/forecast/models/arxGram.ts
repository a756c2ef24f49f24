import type { StandardisedGram } from '../linalg/standardisedGram.js';
import { standardiseCentredSums } from '../linalg/standardisedGram.js';

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
  private readonly sharedSums: Float64Array[] = [];
  private readonly sharedProducts: Float64Array[] = [];

  constructor(
    private readonly day: ArxDayLevel,
    private readonly counts: readonly number[],
  ) {
    this.n = counts[counts.length - 1] ?? 0;
    const { minMaxLast, weekdays } = day;
    this.shiftB = Float64Array.from({ length: B }, (_, j) => minMaxLast[j] as number);
    this.shiftD = Float64Array.from({ length: D }, (_, w) => ((weekdays[0] as number) === w + 1 ? 1 : 0));
    const m = B + D;
    const sums = new Float64Array(m);
    const products = new Float64Array(m * m);
    const row = new Float64Array(m);
    let i = 0;
    for (const count of counts) {
      for (; i < count; i++) {
        for (let j = 0; j < B; j++) row[j] = (minMaxLast[i * B + j] as number) - (this.shiftB[j] as number);
        for (let w = 0; w < D; w++) row[B + w] = ((weekdays[i] as number) === w + 1 ? 1 : 0) - (this.shiftD[w] as number);
        for (let j = 0; j < m; j++) {
          const rj = row[j] as number;
          sums[j] = (sums[j] as number) + rj;
          for (let l = j; l < m; l++) products[j * m + l] = (products[j * m + l] as number) + rj * (row[l] as number);
        }
      }
      this.sharedSums.push(Float64Array.from(sums));
      this.sharedProducts.push(Float64Array.from(products));
    }
  }

  /**
   * The Grams of one slot, one per count, handed to `use` in order of the counts. The Gram passed is
   * overwritten by the next one: copy what must be kept.
   *
   * @param slotValues n x a, row-major, per training row: lag1, lag2, lag7, the exogenous columns and,
   *   last, the response
   * @param lastSlot true in the last slot of the day, where `last` duplicates lag1 and is left out
   */
  forEachGram(slotValues: Float64Array, a: number, lastSlot: boolean, use: (gram: StandardisedGram, index: number) => void): void {
    const { n, day, counts } = this;
    const work = this.workspace(a);
    const { sumA, prodAA, prodAB, buckets, ra } = work;
    sumA.fill(0);
    prodAA.fill(0);
    prodAB.fill(0);
    buckets.fill(0);
    work.shiftA.set(slotValues.subarray(0, a));
    const shiftA = work.shiftA;
    let i = 0;
    counts.forEach((count, w) => {
      for (; i < count && i < n; i++) {
        const base = i * a;
        for (let p = 0; p < a; p++) ra[p] = (slotValues[base + p] as number) - (shiftA[p] as number);
        const bucket = ((day.weekdays[i] as number) - 1) * a;
        const rb0 = (day.minMaxLast[i * B] as number) - (this.shiftB[0] as number);
        const rb1 = (day.minMaxLast[i * B + 1] as number) - (this.shiftB[1] as number);
        const rb2 = (day.minMaxLast[i * B + 2] as number) - (this.shiftB[2] as number);
        for (let p = 0; p < a; p++) {
          const rp = ra[p] as number;
          sumA[p] = (sumA[p] as number) + rp;
          buckets[bucket + p] = (buckets[bucket + p] as number) + rp;
          prodAB[p * B] = (prodAB[p * B] as number) + rp * rb0;
          prodAB[p * B + 1] = (prodAB[p * B + 1] as number) + rp * rb1;
          prodAB[p * B + 2] = (prodAB[p * B + 2] as number) + rp * rb2;
          for (let q = p; q < a; q++) prodAA[p * a + q] = (prodAA[p * a + q] as number) + rp * (ra[q] as number);
        }
      }
      use(this.assemble(count, w, work, lastSlot), w);
    });
  }

  private work: SlotWork | undefined;

  private workspace(a: number): SlotWork {
    if (this.work === undefined || this.work.a !== a) {
      const k = 12 + a - 4;
      this.work = {
        a,
        k,
        shiftA: new Float64Array(a),
        sumA: new Float64Array(a),
        prodAA: new Float64Array(a * a),
        prodAB: new Float64Array(a * B),
        buckets: new Float64Array(7 * a),
        ra: new Float64Array(a),
        means: new Float64Array(k),
        gram: new Float64Array(k * k),
        cy: new Float64Array(k),
        shift: new Float64Array(k),
        sums: new Float64Array(k),
      };
    }
    return this.work;
  }

  /** Centred sums of all columns at one count, standardised (into the workspace's arrays). */
  private assemble(count: number, w: number, work: SlotWork, lastSlot: boolean): StandardisedGram {
    const { a, k, shiftA, sumA, means, gram, cy, shift, sums } = work;
    const sharedSums = this.sharedSums[w] as Float64Array;
    const y = a - 1;
    // Final column c: lags 0..2 and exogenous 12.. come from the slot (A index c or c - 9); min, max,
    // last (3..5) and the dummies (6..11) from the day-level block (index c - 3).
    for (let c = 0; c < k; c++) {
      const p = sourceA(c);
      shift[c] = p >= 0 ? (shiftA[p] as number) : c < 6 ? (this.shiftB[c - 3] as number) : (this.shiftD[c - 6] as number);
      sums[c] = p >= 0 ? (sumA[p] as number) : (sharedSums[c - 3] as number);
    }
    const sy = sumA[y] as number;
    for (let u = 0; u < k; u++) {
      const dropped = lastSlot && u === 5;
      const su = dropped ? 0 : (sums[u] as number);
      means[u] = dropped ? 0 : (shift[u] as number) + su / count;
      cy[u] = dropped ? 0 : this.productWithA(work, y, u) - (su * sy) / count;
      for (let v = u; v < k; v++) {
        gram[u * k + v] = dropped || (lastSlot && v === 5) ? 0 : this.product(work, w, u, v) - (su * (sums[v] as number)) / count;
      }
    }
    const ySquares = (work.prodAA[y * a + y] as number) - (sy * sy) / count;
    return standardiseCentredSums(count, means, (shiftA[y] as number) + sy / count, gram, cy, ySquares);
  }

  /** Shifted product sum of slot column p with final column c. */
  private productWithA(work: SlotWork, p: number, c: number): number {
    const { a, prodAA, prodAB, buckets, sumA } = work;
    const q = sourceA(c);
    if (q >= 0) return p <= q ? (prodAA[p * a + q] as number) : (prodAA[q * a + p] as number);
    if (c < 6) return prodAB[p * B + (c - 3)] as number;
    const dummy = c - 6;
    return (buckets[dummy * a + p] as number) - (this.shiftD[dummy] as number) * (sumA[p] as number);
  }

  /** Shifted product sum of final columns u and v. */
  private product(work: SlotWork, w: number, u: number, v: number): number {
    const p = sourceA(u);
    if (p >= 0) return this.productWithA(work, p, v);
    const q = sourceA(v);
    if (q >= 0) return this.productWithA(work, q, u);
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

/** Per-slot sums and scratch arrays, reused from slot to slot. */
interface SlotWork {
  readonly a: number;
  readonly k: number;
  readonly shiftA: Float64Array;
  readonly sumA: Float64Array;
  readonly prodAA: Float64Array;
  readonly prodAB: Float64Array;
  readonly buckets: Float64Array;
  readonly ra: Float64Array;
  readonly means: Float64Array;
  readonly gram: Float64Array;
  readonly cy: Float64Array;
  readonly shift: Float64Array;
  readonly sums: Float64Array;
}
