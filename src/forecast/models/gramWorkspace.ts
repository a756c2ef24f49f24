/**
 * Per-slot sums (one set per count of rows) and scratch arrays of a Gram builder whose design has
 * slot columns, continuous day-level columns and category dummies (arxGram.ts, slotDayGram.ts), reused
 * from slot to slot.
 */
export interface GramWorkspace {
  /** Slot columns a (the response last) and columns k of the Gram. */
  readonly a: number;
  readonly k: number;
  /** The shifted columns, column by column (cols[p n + i]): the slot columns, any others, then zeros. */
  readonly cols: Float64Array;
  /** Where the column of zeros starts in `cols`. */
  readonly zeros: number;
  readonly shiftA: Float64Array;
  /** Per count w: sums of the shifted slot columns, sumA[w a + p]. */
  readonly sumA: Float64Array;
  /** Per count w: products of slot columns, prodAA[w a^2 + p a + q], q >= p. */
  readonly prodAA: Float64Array;
  /** Per count w: products of slot columns with the B continuous day-level columns, prodAB[(w a + p) B + j]. */
  readonly prodAB: Float64Array;
  /** Per count w: sums of the shifted slot columns by category, buckets[(w C + category - 1) a + p]. */
  readonly buckets: Float64Array;
  /** The running sums by category of one column, and of the next. */
  readonly bucket: Float64Array;
  readonly bucket1: Float64Array;
  /** The eight sums of one block of products per count (twoByFourProducts). */
  readonly blockSums: Float64Array;
  readonly means: Float64Array;
  readonly gram: Float64Array;
  readonly cy: Float64Array;
  readonly shift: Float64Array;
  readonly sums: Float64Array;
  /** The scales and zty of the Gram handed out (overwritten by the next, as its gram is). */
  readonly standardised: { readonly scales: Float64Array; readonly zty: Float64Array };
}

/**
 * A fresh workspace for a slot columns, k Gram columns, W counts, B continuous day-level columns, C
 * categories and n rows, with room in `cols` for `extraColumns` columns after the slot columns.
 */
export function gramWorkspace(shape: { a: number; k: number; W: number; B: number; C: number; n: number; extraColumns: number }): GramWorkspace {
  const { a, k, W, B, C, n, extraColumns } = shape;
  return {
    a,
    k,
    cols: new Float64Array((a + extraColumns + 1) * n),
    zeros: (a + extraColumns) * n,
    shiftA: new Float64Array(a),
    sumA: new Float64Array(W * a),
    prodAA: new Float64Array(W * a * a),
    prodAB: new Float64Array(W * a * B),
    buckets: new Float64Array(W * C * a),
    bucket: new Float64Array(C),
    bucket1: new Float64Array(C),
    blockSums: new Float64Array(8 * W),
    means: new Float64Array(k),
    gram: new Float64Array(k * k),
    cy: new Float64Array(k),
    shift: new Float64Array(k),
    sums: new Float64Array(k),
    standardised: { scales: new Float64Array(k), zty: new Float64Array(k) },
  };
}
