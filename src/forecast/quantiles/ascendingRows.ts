/**
 * The rows of a sample in ascending order of their values, ties by row (-0 and +0 count as equal), by a
 * least-significant-digit radix sort of the values' IEEE 754 bit patterns: each value's 64 bits are
 * made to order as unsigned integers (a negative value's bits all flipped, a positive value's sign bit
 * set), then the rows are distributed six times by 11 (or 10) of those bits, lowest digit first. Every
 * pass is stable, so equal values keep the order of their rows (Knuth 1998, section 5.2.5). Linear in
 * the rows: it replaces a comparison sort followed by a binary search per row to find each row's place.
 * A NaN comes after +Infinity.
 *
 * The arrays handed out are scratch space of this object, overwritten by its next call.
 *
 * Reference: D. E. Knuth (1998), The Art of Computer Programming vol. 3, 2nd ed., section 5.2.5
 * (sorting by distribution, radix sorting from the least significant digit).
 *
 * @example
 * new AscendingRows().of(Float64Array.from([0.5, -1, 0.5, -0, 0])); // Int32Array [1, 3, 4, 0, 2]
 */
export class AscendingRows {
  private keys = new Uint32Array(0);
  private keysOut = new Uint32Array(0);
  private rows = new Int32Array(0);
  private rowsOut = new Int32Array(0);
  private readonly counts = new Int32Array(DIGITS.length * RADIX);
  private readonly bits = new Float64Array(1);
  private readonly words = new Uint32Array(this.bits.buffer);

  /** order[j], j < values.length: the row of the j-th smallest value (ties by row). */
  of(values: ArrayLike<number>): Int32Array {
    const n = values.length;
    if (this.rows.length < n) {
      const size = Math.max(n, Math.ceil(1.25 * this.rows.length));
      this.keys = new Uint32Array(2 * size);
      this.keysOut = new Uint32Array(2 * size);
      this.rows = new Int32Array(size);
      this.rowsOut = new Int32Array(size);
    }
    const { counts, bits, words } = this;
    counts.fill(0);
    let keys = this.keys;
    let rows = this.rows;
    // The keys, low word then high word per row (the words of a Float64Array on a little-endian machine,
    // as every platform Node runs on is), and every digit's counts in the same pass.
    for (let row = 0; row < n; row++) {
      bits[0] = (values[row] as number) + 0; // -0 + 0 is +0: the two zeros share a key
      let low = words[LOW] as number;
      let high = words[HIGH] as number;
      if (high >= 0x80000000) {
        low = ~low >>> 0;
        high = ~high >>> 0;
      } else {
        high = (high | 0x80000000) >>> 0;
      }
      keys[2 * row] = low;
      keys[2 * row + 1] = high;
      rows[row] = row;
      // The six digits of DIGITS, written out.
      bump(counts, low & 2047);
      bump(counts, RADIX + ((low >>> 11) & 2047));
      bump(counts, 2 * RADIX + (low >>> 22));
      bump(counts, 3 * RADIX + (high & 2047));
      bump(counts, 4 * RADIX + ((high >>> 11) & 2047));
      bump(counts, 5 * RADIX + (high >>> 22));
    }
    let keysOut = this.keysOut;
    let rowsOut = this.rowsOut;
    for (let p = 0; p < DIGITS.length; p++) {
      const { word, shift, mask } = DIGITS[p] as { word: number; shift: number; mask: number };
      const base = p * RADIX;
      // A digit every row shares moves nothing.
      if (n === 0 || counts[base + ((((keys[word] as number) >>> shift) & mask))] === n) continue;
      let start = 0;
      for (let b = 0; b <= mask; b++) {
        const c = counts[base + b] as number;
        counts[base + b] = start;
        start += c;
      }
      for (let j = 0; j < n; j++) {
        const low = keys[2 * j] as number;
        const high = keys[2 * j + 1] as number;
        const b = base + (((word === 0 ? low : high) >>> shift) & mask);
        const at = counts[b] as number;
        counts[b] = at + 1;
        keysOut[2 * at] = low;
        keysOut[2 * at + 1] = high;
        rowsOut[at] = rows[j] as number;
      }
      [keys, keysOut] = [keysOut, keys];
      [rows, rowsOut] = [rowsOut, rows];
    }
    this.keys = keys;
    this.keysOut = keysOut;
    this.rows = rows;
    this.rowsOut = rowsOut;
    return rows.subarray(0, n);
  }
}

function bump(counts: Int32Array, at: number): void {
  counts[at] = (counts[at] as number) + 1;
}

const RADIX = 2048;
/** The six digits, lowest first: bits 0-10, 11-21 and 22-31 of the low word, then of the high word. */
const DIGITS = Object.freeze([
  { word: 0, shift: 0, mask: 2047 },
  { word: 0, shift: 11, mask: 2047 },
  { word: 0, shift: 22, mask: 1023 },
  { word: 1, shift: 0, mask: 2047 },
  { word: 1, shift: 11, mask: 2047 },
  { word: 1, shift: 22, mask: 1023 },
]);
/** Which of a Float64Array's two Uint32 words is the low one (little-endian: the first). */
const LOW = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 0 : 1;
const HIGH = 1 - LOW;
