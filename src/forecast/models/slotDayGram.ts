import type { StandardisedGram } from '../linalg/standardisedGram.js';
import { nestedShiftedSums } from '../linalg/nestedShiftedSums.js';
import { standardiseCentredSums } from '../linalg/standardisedGram.js';

/** Day-level regressors of a per-slot design: the same in every slot of a training day. */
export interface DayLevelColumns {
  /** n x B row-major: continuous day-level columns per training row. */
  readonly continuous: Float64Array;
  /** B, the number of continuous day-level columns. */
  readonly width: number;
  /** Per training row: a category 1..D + 1; categories 1..D get a dummy column, D + 1 is the reference. */
  readonly categories: Int8Array;
  /** D, the number of dummy columns. */
  readonly dummies: number;
}

/**
 * The standardised Gram matrices of a per-slot regression whose design mixes slot columns (different in
 * every slot) with day-level columns (the same in every slot of a day: continuous ones and category
 * dummies), for nested windows (the first counts[w] rows). Column order of the Grams: the slot columns,
 * then the continuous day-level columns, then the dummies.
 *
 * Notes: shifted sums (Chan, Golub and LeVeque 1983; shift = the first row) and centred products
 * S_uv - S_u S_v / n, as nestedStandardisedGrams computes them, but with the design's structure: the
 * block of the day-level columns is summed once for all slots (at construction), the products of a slot
 * column with a dummy are bucket sums, sum_i (a_i - K_a)(D_ci - K_c) = sum_{i: category i = c}
 * (a_i - K_a) - K_c sum_i (a_i - K_a), so that a row of a slot costs O(a (a + B)) instead of
 * O((a + B + D)^2) for a slot columns. The same method as the ARX's Gram builder (arxGram.ts), for any
 * number of columns of each kind.
 *
 * Reference: T. F. Chan, G. H. Golub and R. J. LeVeque (1983), Algorithms for computing the sample
 * variance, The American Statistician 37(3), 242-247, doi:10.1080/00031305.1983.10483115.
 */
export class SlotDayGramBuilder {
  private readonly n: number;
  private readonly m: number;
  private readonly shiftDay: Float64Array;
  private readonly sharedSums: Float64Array[];
  private readonly sharedProducts: Float64Array[];

  constructor(
    private readonly day: DayLevelColumns,
    private readonly counts: readonly number[],
  ) {
    this.n = counts[counts.length - 1] ?? 0;
    const { width: B, dummies: D } = day;
    this.m = B + D;
    const m = this.m;
    const rowOf = (i: number, out: Float64Array): void => {
      for (let j = 0; j < B; j++) out[j] = day.continuous[i * B + j] as number;
      for (let c = 0; c < D; c++) out[B + c] = (day.categories[i] as number) === c + 1 ? 1 : 0;
    };
    this.shiftDay = new Float64Array(m);
    if (this.n > 0) rowOf(0, this.shiftDay);
    const shared = nestedShiftedSums(counts, m, (i, row) => {
      rowOf(i, row);
      for (let j = 0; j < m; j++) row[j] = (row[j] as number) - (this.shiftDay[j] as number);
    });
    this.sharedSums = shared.sums;
    this.sharedProducts = shared.products;
  }

  /** Per count, the slot's sums of the last full pass (for a pass with a new response only). */
  private snapshots: { sumA: Float64Array; prodAA: Float64Array; prodAB: Float64Array; buckets: Float64Array }[] = [];
  private lastShift: Float64Array = new Float64Array(0);

  /**
   * The Grams of one slot, one per count, handed to `use` in the order of the counts. The Gram passed is
   * overwritten by the next one: copy what must be kept.
   *
   * With `newResponseOnly`, the slot columns must be those of the previous call and only the response
   * (the last value of each row) new: the sums of the slot columns are then taken from that call and
   * only the response's are formed, O(a) per row instead of O(a^2) (a refit on modified responses).
   *
   * @param slotValues n x a row-major: per training row the a - 1 slot columns and, last, the response
   */
  forEachGram(slotValues: Float64Array, a: number, use: (gram: StandardisedGram, index: number) => void, newResponseOnly = false): void {
    const { n, counts, day } = this;
    const { width: B, dummies: D } = day;
    const p = a - 1;
    const k = p + B + D;
    const reuse = newResponseOnly && this.lastShift.length === a && this.snapshots.length === counts.length;
    const shiftA = reuse ? Float64Array.from(this.lastShift) : slotValues.slice(0, a);
    shiftA[p] = slotValues[p] as number;
    let sumA = new Float64Array(a);
    let prodAA = new Float64Array(a * a);
    let prodAB = new Float64Array(a * B);
    let buckets = new Float64Array((D + 1) * a);
    const response = { sum: 0, withSlot: new Float64Array(a), withDay: new Float64Array(B), buckets: new Float64Array(D + 1) };
    const ra = new Float64Array(a);
    const rb = new Float64Array(B);
    if (!reuse) {
      this.snapshots = [];
      this.lastShift = shiftA;
    }
    let from = 0;
    counts.forEach((count, w) => {
      const to = Math.min(count, n);
      if (reuse) {
        accumulateResponse(slotValues, a, from, to, shiftA, day, this.shiftDay, response, ra, rb);
        const snapshot = this.snapshots[w] as (typeof this.snapshots)[number];
        sumA = Float64Array.from(snapshot.sumA);
        prodAA = Float64Array.from(snapshot.prodAA);
        prodAB = Float64Array.from(snapshot.prodAB);
        buckets = Float64Array.from(snapshot.buckets);
        sumA[p] = response.sum;
        for (let q = 0; q <= p; q++) prodAA[q * a + p] = response.withSlot[q] as number;
        for (let j = 0; j < B; j++) prodAB[p * B + j] = response.withDay[j] as number;
        for (let c = 0; c <= D; c++) buckets[c * a + p] = response.buckets[c] as number;
      } else {
        accumulate(slotValues, a, from, to, shiftA, day, this.shiftDay, { sumA, prodAA, prodAB, buckets, ra, rb });
        this.snapshots.push({ sumA: Float64Array.from(sumA), prodAA: Float64Array.from(prodAA), prodAB: Float64Array.from(prodAB), buckets: Float64Array.from(buckets) });
      }
      from = to;
      const sharedSums = this.sharedSums[w] as Float64Array;
      const sharedProducts = this.sharedProducts[w] as Float64Array;
      /** Shifted sum of final column c. */
      const sumOf = (c: number): number => (c < p ? (sumA[c] as number) : (sharedSums[c - p] as number));
      /** Shifted product of slot value q (0..a-1) with final column c. */
      const productWithSlot = (q: number, c: number): number => {
        if (c < p) return q <= c ? (prodAA[q * a + c] as number) : (prodAA[c * a + q] as number);
        const d = c - p;
        if (d < B) return prodAB[q * B + d] as number;
        const dummy = d - B;
        return (buckets[dummy * a + q] as number) - (this.shiftDay[B + dummy] as number) * (sumA[q] as number);
      };
      const product = (u: number, v: number): number => {
        if (u < p) return productWithSlot(u, v);
        if (v < p) return productWithSlot(v, u);
        const su = u - p;
        const sv = v - p;
        return su <= sv ? (sharedProducts[su * this.m + sv] as number) : (sharedProducts[sv * this.m + su] as number);
      };
      const means = new Float64Array(k);
      const gram = new Float64Array(k * k);
      const cy = new Float64Array(k);
      const sy = sumA[p] as number;
      for (let u = 0; u < k; u++) {
        const su = sumOf(u);
        const shift = u < p ? (shiftA[u] as number) : (this.shiftDay[u - p] as number);
        means[u] = shift + su / count;
        cy[u] = productWithSlot(p, u) - (su * sy) / count;
        for (let v = u; v < k; v++) gram[u * k + v] = product(u, v) - (su * sumOf(v)) / count;
      }
      const ySquares = (prodAA[p * a + p] as number) - (sy * sy) / count;
      use(standardiseCentredSums(count, means, (shiftA[p] as number) + sy / count, gram, cy, ySquares), w);
    });
  }
}

/** Running shifted sums of one slot (see {@link SlotDayGramBuilder.forEachGram}). */
interface SlotSums {
  readonly sumA: Float64Array;
  readonly prodAA: Float64Array;
  readonly prodAB: Float64Array;
  readonly buckets: Float64Array;
  readonly ra: Float64Array;
  readonly rb: Float64Array;
}

/** Adds rows from..to-1 of one slot to its shifted sums, products and bucket sums. */
function accumulate(slotValues: Float64Array, a: number, from: number, to: number, shiftA: Float64Array, day: DayLevelColumns, shiftDay: Float64Array, sums: SlotSums): void {
  const { sumA, prodAA, prodAB, buckets, ra, rb } = sums;
  const B = day.width;
  const continuous = day.continuous;
  const categories = day.categories;
  for (let i = from; i < to; i++) {
    const base = i * a;
    for (let q = 0; q < a; q++) ra[q] = (slotValues[base + q] as number) - (shiftA[q] as number);
    for (let j = 0; j < B; j++) rb[j] = (continuous[i * B + j] as number) - (shiftDay[j] as number);
    const bucket = ((categories[i] as number) - 1) * a;
    for (let q = 0; q < a; q++) {
      const rq = ra[q] as number;
      sumA[q] = (sumA[q] as number) + rq;
      buckets[bucket + q] = (buckets[bucket + q] as number) + rq;
      for (let j = 0; j < B; j++) prodAB[q * B + j] = (prodAB[q * B + j] as number) + rq * (rb[j] as number);
      const row = q * a;
      for (let r = q; r < a; r++) prodAA[row + r] = (prodAA[row + r] as number) + rq * (ra[r] as number);
    }
  }
}

/** Running shifted sums of the response with itself, the slot columns, the day-level columns and the categories. */
interface ResponseSums {
  sum: number;
  readonly withSlot: Float64Array;
  readonly withDay: Float64Array;
  readonly buckets: Float64Array;
}

/** Adds rows from..to-1 of one slot to the response's shifted sums only (the slot columns' sums are kept). */
function accumulateResponse(slotValues: Float64Array, a: number, from: number, to: number, shiftA: Float64Array, day: DayLevelColumns, shiftDay: Float64Array, sums: ResponseSums, ra: Float64Array, rb: Float64Array): void {
  const B = day.width;
  const p = a - 1;
  for (let i = from; i < to; i++) {
    const base = i * a;
    for (let q = 0; q < a; q++) ra[q] = (slotValues[base + q] as number) - (shiftA[q] as number);
    for (let j = 0; j < B; j++) rb[j] = (day.continuous[i * B + j] as number) - (shiftDay[j] as number);
    const ry = ra[p] as number;
    sums.sum += ry;
    const category = (day.categories[i] as number) - 1;
    sums.buckets[category] = (sums.buckets[category] as number) + ry;
    for (let q = 0; q < a; q++) sums.withSlot[q] = (sums.withSlot[q] as number) + ry * (ra[q] as number);
    for (let j = 0; j < B; j++) sums.withDay[j] = (sums.withDay[j] as number) + ry * (rb[j] as number);
  }
}
