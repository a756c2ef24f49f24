/**
 * The rows of a sample in ascending order of their values, ties by row (-0 and +0 count as equal), by a
 * least-significant-digit radix sort of the high halves of the values' IEEE 754 bit patterns, finished
 * by straight insertion. The high 32 bits (sign, exponent and 20 bits of the significand) are made to
 * order as unsigned integers (a negative value's bits all flipped, a positive value's sign bit set) and
 * the rows distributed three times by 11, 11 and 10 of those bits, lowest digit first; every pass is
 * stable (Knuth 1998, section 5.2.5). Values that share their high halves lie within a relative 2^-20
 * of each other and are few among a continuous sample, so the insertion pass by (value, row) that
 * follows moves little: about linear in the rows, where a comparison sort followed by a binary search
 * per row (to find each row's place) is not. NaNs come last.
 *
 * The array handed out is scratch space of this object, overwritten by its next call.
 *
 * Reference: D. E. Knuth (1998), The Art of Computer Programming vol. 3, 2nd ed., sections 5.2.5
 * (radix sorting from the least significant digit) and 5.2.1 (straight insertion, its time in terms
 * of the inversions of the input).
 *
 * @example
 * new AscendingRows().of(Float64Array.from([0.5, -1, 0.5, -0, 0])); // Int32Array [1, 3, 4, 0, 2]
 */
export class AscendingRows {
  private keys = new Uint32Array(0);
  private keysOut = new Uint32Array(0);
  private rows = new Int32Array(0);
  private rowsOut = new Int32Array(0);
  private readonly counts = new Int32Array(3 * RADIX);
  private readonly bits = new Float64Array(1);
  private readonly words = new Uint32Array(this.bits.buffer);

  /** order[j], j < values.length: the row of the j-th smallest value (ties by row). */
  of(values: ArrayLike<number>): Int32Array {
    const n = values.length;
    if (this.rows.length < n) {
      const size = Math.max(n, Math.ceil(1.25 * this.rows.length));
      this.keys = new Uint32Array(size);
      this.keysOut = new Uint32Array(size);
      this.rows = new Int32Array(size);
      this.rowsOut = new Int32Array(size);
    }
    const { counts, bits, words } = this;
    counts.fill(0);
    let keys = this.keys;
    let rows = this.rows;
    // The keys (the high word of a Float64Array's two on a little-endian machine, as every platform Node
    // runs on is) and the three digits' counts in one pass. A Float64Array's words are read in place, but
    // for -0 (high word 0x80000000, as have the negative values below 2^-1042) and an infinity or NaN, which
    // are taken through `bits` as any other array's values: -0 + 0 is +0, so the two zeros share a key.
    const inPlace = values instanceof Float64Array ? new Uint32Array(values.buffer, values.byteOffset, 2 * n) : null;
    for (let row = 0; row < n; row++) {
      let high = inPlace === null ? SPECIAL : (inPlace[2 * row + HIGH] as number);
      if (high === 0x80000000 || (high & 0x7ff00000) === 0x7ff00000) {
        bits[0] = (values[row] as number) + 0;
        high = words[HIGH] as number;
      }
      const key = high >= 0x80000000 ? ~high >>> 0 : (high | 0x80000000) >>> 0;
      keys[row] = key;
      bump(counts, key & 2047);
      bump(counts, RADIX + ((key >>> 11) & 2047));
      bump(counts, 2 * RADIX + (key >>> 22));
    }
    // The rows are 0, 1, ... until the first pass that moves them (which reads them as such).
    let identity = true;
    let keysOut = this.keysOut;
    let rowsOut = this.rowsOut;
    for (let p = 0; p < 3; p++) {
      const shift = 11 * p;
      const mask = p === 2 ? 1023 : 2047;
      const base = p * RADIX;
      // A digit every row shares moves nothing.
      if (n === 0 || counts[base + (((keys[0] as number) >>> shift) & mask)] === n) continue;
      let start = 0;
      for (let b = 0; b <= mask; b++) {
        const c = counts[base + b] as number;
        counts[base + b] = start;
        start += c;
      }
      for (let j = 0; j < n; j++) {
        const key = keys[j] as number;
        const b = base + ((key >>> shift) & mask);
        const at = counts[b] as number;
        counts[b] = at + 1;
        keysOut[at] = key;
        rowsOut[at] = identity ? j : (rows[j] as number);
      }
      identity = false;
      [keys, keysOut] = [keysOut, keys];
      [rows, rowsOut] = [rowsOut, rows];
    }
    if (identity) for (let row = 0; row < n; row++) rows[row] = row;
    // Straight insertion by (value, row) within each run of equal keys (runs are already in order).
    for (let j = 1; j < n; j++) {
      const key = keys[j] as number;
      if (key !== keys[j - 1]) continue;
      const row = rows[j] as number;
      const value = values[row] as number;
      let i = j - 1;
      while (i >= 0 && keys[i] === key && after(values, rows[i] as number, value, row)) {
        rows[i + 1] = rows[i] as number;
        i--;
      }
      rows[i + 1] = row;
    }
    this.keys = keys;
    this.keysOut = keysOut;
    this.rows = rows;
    this.rowsOut = rowsOut;
    return rows.subarray(0, n);
  }
}

/** Whether row `other` comes after (value, row): a larger value, or an equal one (or NaN beside NaN) of a later row. */
function after(values: ArrayLike<number>, other: number, value: number, row: number): boolean {
  const v = values[other] as number;
  return v > value || (!(v < value) && other > row);
}

function bump(counts: Int32Array, at: number): void {
  counts[at] = (counts[at] as number) + 1;
}

const RADIX = 2048;
/** A high word that sends a value through `bits` (that of an infinity or NaN). */
const SPECIAL = 0x7ff00000;
/** Which of a Float64Array's two Uint32 words is the high one (little-endian: the second). */
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;
