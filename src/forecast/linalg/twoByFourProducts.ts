/**
 * The cross products of two columns with four others over leading rows, read off at every count: with
 * the columns laid out in one array (a column's rows contiguous, starting at the offsets given),
 *   out[8 w + 4 r + t] = sum_{i < counts[w]} cols[p_r + i] cols[q_t + i],   r = 0, 1; t = 0..3,
 * each sum added in row order, one at a time, the eight running sums held in registers through one pass
 * over the rows. This is the inner kernel of the Gram builders (arxGram.ts, slotDayGram.ts,
 * standardisedGram.ts): the same additions in the same order as accumulating row by row, so the same
 * bits, with 8 multiply-adds per 6 loads instead of 1 per 2. A caller with fewer columns points the
 * spare offsets at a column of zeros and drops those sums.
 *
 * @param counts increasing row counts (the last at most the rows of every column)
 * @param out at least 8 counts.length long
 */
export function twoByFourProducts(
  cols: Float64Array,
  p0: number,
  p1: number,
  q0: number,
  q1: number,
  q2: number,
  q3: number,
  counts: readonly number[],
  out: Float64Array,
): void {
  let s00 = 0;
  let s01 = 0;
  let s02 = 0;
  let s03 = 0;
  let s10 = 0;
  let s11 = 0;
  let s12 = 0;
  let s13 = 0;
  let i = 0;
  for (let w = 0; w < counts.length; w++) {
    const end = counts[w] as number;
    for (; i < end; i++) {
      const v0 = cols[p0 + i] as number;
      const v1 = cols[p1 + i] as number;
      const c0 = cols[q0 + i] as number;
      const c1 = cols[q1 + i] as number;
      const c2 = cols[q2 + i] as number;
      const c3 = cols[q3 + i] as number;
      s00 += v0 * c0;
      s01 += v0 * c1;
      s02 += v0 * c2;
      s03 += v0 * c3;
      s10 += v1 * c0;
      s11 += v1 * c1;
      s12 += v1 * c2;
      s13 += v1 * c3;
    }
    const at = 8 * w;
    out[at] = s00;
    out[at + 1] = s01;
    out[at + 2] = s02;
    out[at + 3] = s03;
    out[at + 4] = s10;
    out[at + 5] = s11;
    out[at + 6] = s12;
    out[at + 7] = s13;
  }
}
