import type { StandardisedGram } from '../linalg/standardisedGram.js';
import { nestedShiftedSums } from '../linalg/nestedShiftedSums.js';
import { standardiseCentredSums } from '../linalg/standardisedGram.js';
import { twoByFourProducts } from '../linalg/twoByFourProducts.js';
import { gramWorkspace, type GramWorkspace } from './gramWorkspace.js';

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
 * number of columns of each kind: each sum is taken over the rows in row order, one sum at a time (the
 * shifted columns laid out column by column, two slot columns against four others per pass over the
 * rows), and read off at every count, which are the same additions in the same order as row by row.
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
  private work: SlotWork | undefined;

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

  /**
   * The Grams of one slot, one per count, handed to `use` in the order of the counts. The Gram passed is
   * overwritten by the next one: copy what must be kept.
   *
   * With `newResponseOnly`, the slot columns must be those of the previous call and only the response
   * (the last column) new: the sums of the slot columns are then kept from that call and only the
   * response's are formed, O(a + B) per row instead of O(a (a + B)) (a refit on modified responses).
   * With `longestOnly`, only the last count's Gram is handed to `use` (the sums of every count are
   * still formed, for a later pass with a new response).
   *
   * @param columns the a slot columns of the n training rows, column by column (columns[q n + i]): the
   *   a - 1 slot regressors and, last, the response
   */
  forEachGram(
    columns: Float64Array,
    a: number,
    use: (gram: StandardisedGram, index: number) => void,
    options: { readonly newResponseOnly?: boolean; readonly longestOnly?: boolean } = {},
  ): void {
    const { n } = this;
    const newResponseOnly = options.newResponseOnly ?? false;
    const work = this.workspace(a);
    const y = a - 1;
    const reuse = newResponseOnly && work.filled;
    const cols = work.cols;
    for (let q = reuse ? y : 0; q < a; q++) {
      const base = q * n;
      const shift = columns[base] as number;
      work.shiftA[q] = shift;
      for (let i = 0; i < n; i++) cols[base + i] = (columns[base + i] as number) - shift;
    }
    if (reuse) {
      // The response's sums, and its products with every column (stored where the full pass keeps the
      // product of column q <= y with the response; x y = y x exactly, so the same bits).
      this.columnSums(work, y, false);
      for (let q = 0; q < a + this.day.width; q += 4) this.products(work, y, false, q);
    } else {
      for (let p = 0; p < a; p += 2) {
        const two = p + 1 < a;
        this.columnSums(work, p, two);
        for (let q = p; q < a + this.day.width; q += 4) this.products(work, p, two, q);
      }
      work.filled = true;
    }
    const W = this.counts.length;
    for (let w = options.longestOnly === true ? W - 1 : 0; w < W; w++) use(this.assemble(work, this.counts[w] as number, w), w);
  }

  /** Sums and sums by category of slot columns p and p + 1 (when `two`), read off at every count. */
  private columnSums(work: SlotWork, p: number, two: boolean): void {
    const { n, counts } = this;
    const categories = this.day.categories;
    const { a, cols, sumA, buckets, bucket, bucket1 } = work;
    const C = this.day.dummies + 1;
    const pn = p * n;
    const pn1 = two ? pn + n : work.zeros;
    let sum0 = 0;
    let sum1 = 0;
    bucket.fill(0);
    bucket1.fill(0);
    let i = 0;
    for (let w = 0; w < counts.length; w++) {
      const end = counts[w] as number;
      for (; i < end; i++) {
        const v0 = cols[pn + i] as number;
        const v1 = cols[pn1 + i] as number;
        const c = (categories[i] as number) - 1;
        sum0 += v0;
        sum1 += v1;
        bucket[c] = (bucket[c] as number) + v0;
        bucket1[c] = (bucket1[c] as number) + v1;
      }
      sumA[w * a + p] = sum0;
      for (let c = 0; c < C; c++) buckets[(w * C + c) * a + p] = bucket[c] as number;
      if (two) {
        sumA[w * a + p + 1] = sum1;
        for (let c = 0; c < C; c++) buckets[(w * C + c) * a + p + 1] = bucket1[c] as number;
      }
    }
  }

  /**
   * Products of slot columns p and p + 1 (when `two`) with columns q..q + 3 of the workspace (slot
   * columns, then the continuous day-level columns; past the last, the column of zeros, whose sums are
   * dropped), read off at every count.
   */
  private products(work: SlotWork, p: number, two: boolean, q: number): void {
    const { n, counts } = this;
    const { a, cols, zeros } = work;
    const B = this.day.width;
    const end = a + B;
    const pn = p * n;
    const pn1 = two ? pn + n : zeros;
    const q0 = q * n;
    const q1 = q + 1 < end ? q0 + n : zeros;
    const q2 = q + 2 < end ? q0 + 2 * n : zeros;
    const q3 = q + 3 < end ? q0 + 3 * n : zeros;
    const sums = work.blockSums;
    twoByFourProducts(cols, pn, pn1, q0, q1, q2, q3, counts, sums);
    for (let w = 0; w < counts.length; w++) {
      for (let r = 0; r < (two ? 2 : 1); r++) {
        for (let t = 0; t < 4; t++) store(work, B, w, p + r, q + t, sums[8 * w + 4 * r + t] as number);
      }
    }
  }

  private workspace(a: number): SlotWork {
    if (this.work === undefined || this.work.a !== a) {
      const { n, day } = this;
      const { width: B, dummies: D } = day;
      const k = a - 1 + B + D;
      const W = this.counts.length;
      const work = { ...gramWorkspace({ a, k, W, B, C: D + 1, n, extraColumns: B }), filled: false };
      // The continuous day-level columns after the slot columns (shifted, the same for every slot).
      for (let j = 0; j < B; j++) {
        const shift = this.shiftDay[j] as number;
        for (let i = 0; i < n; i++) work.cols[(a + j) * n + i] = (day.continuous[i * B + j] as number) - shift;
      }
      this.work = work;
    }
    return this.work;
  }

  /** Centred sums of all columns at count w, standardised (into the workspace's arrays). */
  private assemble(work: SlotWork, count: number, w: number): StandardisedGram {
    const { a, k, shiftA, sumA, means, gram, cy, shift, sums } = work;
    const p = a - 1;
    const sharedSums = this.sharedSums[w] as Float64Array;
    for (let c = 0; c < k; c++) {
      shift[c] = c < p ? (shiftA[c] as number) : (this.shiftDay[c - p] as number);
      sums[c] = c < p ? (sumA[w * a + c] as number) : (sharedSums[c - p] as number);
    }
    const sy = sumA[w * a + p] as number;
    for (let u = 0; u < k; u++) {
      const su = sums[u] as number;
      means[u] = (shift[u] as number) + su / count;
      cy[u] = this.productWithSlot(work, w, p, u) - (su * sy) / count;
      for (let v = u; v < k; v++) gram[u * k + v] = this.product(work, w, u, v) - (su * (sums[v] as number)) / count;
    }
    const ySquares = (work.prodAA[w * a * a + p * a + p] as number) - (sy * sy) / count;
    return standardiseCentredSums(count, means, (shiftA[p] as number) + sy / count, gram, cy, ySquares, work.standardised);
  }

  /** Shifted product sum, at count w, of slot column q (0..a-1) with final column c. */
  private productWithSlot(work: SlotWork, w: number, q: number, c: number): number {
    const { a, prodAA, prodAB, buckets, sumA } = work;
    const p = a - 1;
    const B = this.day.width;
    if (c < p) return q <= c ? (prodAA[w * a * a + q * a + c] as number) : (prodAA[w * a * a + c * a + q] as number);
    const d = c - p;
    if (d < B) return prodAB[(w * a + q) * B + d] as number;
    const dummy = d - B;
    const C = this.day.dummies + 1;
    return (buckets[(w * C + dummy) * a + q] as number) - (this.shiftDay[B + dummy] as number) * (sumA[w * a + q] as number);
  }

  /** Shifted product sum, at count w, of final columns u <= v. */
  private product(work: SlotWork, w: number, u: number, v: number): number {
    const p = work.a - 1;
    if (u < p) return this.productWithSlot(work, w, u, v);
    if (v < p) return this.productWithSlot(work, w, v, u);
    const su = u - p;
    const sv = v - p;
    const products = this.sharedProducts[w] as Float64Array;
    return su <= sv ? (products[su * this.m + sv] as number) : (products[sv * this.m + su] as number);
  }
}

/**
 * Keeps the product, at count w, of slot column `row` with workspace column `column` (nothing past the
 * last): a slot column's at (min, max) of the two (x y = y x exactly, so either order gives the same
 * bits), a continuous day-level column's in prodAB.
 */
function store(work: SlotWork, B: number, w: number, row: number, column: number, value: number): void {
  const a = work.a;
  if (column >= a + B) return;
  if (column < a) {
    const lo = column < row ? column : row;
    const hi = column < row ? row : column;
    work.prodAA[w * a * a + lo * a + hi] = value;
  } else {
    work.prodAB[(w * a + row) * B + (column - a)] = value;
  }
}

/** The workspace, and whether a full pass has filled the sums of the slot columns. */
interface SlotWork extends GramWorkspace {
  filled: boolean;
}
