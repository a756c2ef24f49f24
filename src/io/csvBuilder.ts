import { DECIMAL_SCALES, EXACT_SCALED_LIMIT, formatByToFixed, roundedUnits, wholeUnits } from './decimalUnits.js';

const COMMA = 0x2c;
const NEWLINE = 0x0a;
const MINUS = 0x2d;
const POINT = 0x2e;
const ZERO = 0x30;

/**
 * CSV text written as bytes into one growing buffer and taken as one string: for large outputs (a
 * year's ledger is millions of cells), no string and no array per cell. Numbers get exactly the text
 * of formatNumber. Reuse one builder: `take` empties it and keeps its buffer.
 */
export class CsvBuilder {
  private bytes = new Uint8Array(1 << 16);
  private length = 0;
  /** Whether a character beyond ASCII was written (the bytes are then decoded as UTF-8). */
  private wide = false;

  /** Where the next byte goes: with `copy`, repeats a stretch written before. */
  get position(): number {
    return this.length;
  }

  text(text: string): void {
    const n = text.length;
    this.reserve(3 * n);
    const bytes = this.bytes;
    let at = this.length;
    for (let i = 0; i < n; i++) {
      const code = text.charCodeAt(i);
      if (code >= 0x80) {
        this.length = at;
        this.wideText(text.slice(i));
        return;
      }
      bytes[at++] = code;
    }
    this.length = at;
  }

  comma(): void {
    this.byte(COMMA);
  }

  newline(): void {
    this.byte(NEWLINE);
  }

  /** The text formatNumber(value, digits) gives. */
  number(value: number, digits = 6): void {
    const scale = DECIMAL_SCALES[digits];
    const magnitude = value < 0 ? -value : value;
    const scaled = scale === undefined ? Number.NaN : magnitude * scale;
    if (value !== 0 && (scale === undefined || !(scaled < EXACT_SCALED_LIMIT))) {
      this.text(formatByToFixed(value, digits));
      return;
    }
    // Zero and a value that rounds to zero (dust of a few 1e-9 MWh, met months into a ledger) are
    // written on one path: a path of their own, first taken that late, would throw the compiled
    // writer away.
    const units = value === 0 || scale === undefined ? 0 : roundedUnits(magnitude, scale, scaled);
    if (units === 0 || scale === undefined) {
      this.byte(ZERO);
      return;
    }
    const whole = wholeUnits(units, scale);
    let fraction = units - whole * scale;
    this.reserve(40);
    if (value < 0) this.bytes[this.length++] = MINUS;
    this.digits(whole, digitCount(whole));
    if (fraction === 0) return;
    let width = digits;
    if (fraction < 2147483648) {
      // Small integer arithmetic for the usual few decimals (the same digits as below).
      let small = fraction | 0;
      while (small % 10 === 0) {
        small = (small / 10) | 0;
        width--;
      }
      fraction = small;
    } else {
      while (fraction % 10 === 0) {
        fraction /= 10;
        width--;
      }
    }
    this.bytes[this.length++] = POINT;
    this.digits(fraction, width);
  }

  /** Appends a copy of the bytes written at [from, to). */
  copy(from: number, to: number): void {
    const count = to - from;
    this.reserve(count);
    const bytes = this.bytes;
    let at = this.length;
    // A short stretch (a timestamp, a few prices) is copied faster byte by byte than through a call.
    if (count <= 64) for (let i = from; i < to; i++) bytes[at++] = bytes[i] as number;
    else bytes.copyWithin(at, from, to);
    this.length += count;
  }

  /**
   * The UTF-8 bytes written since the last take, as a view of the builder's buffer: valid until the
   * next write. The builder is empty afterwards.
   */
  takeBytes(): Uint8Array {
    const view = this.bytes.subarray(0, this.length);
    this.length = 0;
    this.wide = false;
    return view;
  }

  /** The text written since the last take; the builder is empty afterwards. */
  take(): string {
    const view = Buffer.from(this.bytes.buffer, this.bytes.byteOffset, this.length);
    // ASCII reads the same as Latin-1, which the engine copies byte for byte.
    const text = view.toString(this.wide ? 'utf8' : 'latin1');
    this.length = 0;
    this.wide = false;
    return text;
  }

  private byte(code: number): void {
    this.reserve(1);
    this.bytes[this.length++] = code;
  }

  /** `count` decimal digits of the integer n (0 <= n < 2^53), leading zeros included. */
  private digits(n: number, count: number): void {
    const bytes = this.bytes;
    let at = this.length + count;
    this.length = at;
    let rest = n;
    while (rest >= 2147483648) {
      const quotient = Math.floor(rest / 10);
      bytes[--at] = ZERO + (rest - quotient * 10);
      rest = quotient;
    }
    let small = rest | 0;
    while (at > this.length - count) {
      const quotient = (small / 10) | 0;
      bytes[--at] = ZERO + (small - quotient * 10);
      small = quotient;
    }
  }

  private wideText(text: string): void {
    const needed = Buffer.byteLength(text, 'utf8');
    this.reserve(needed);
    this.length += Buffer.from(this.bytes.buffer, this.bytes.byteOffset).write(text, this.length, 'utf8');
    this.wide = true;
  }

  private reserve(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    let size = this.bytes.length * 2;
    while (size < this.length + extra) size *= 2;
    const grown = new Uint8Array(size);
    grown.set(this.bytes.subarray(0, this.length));
    this.bytes = grown;
  }
}

/** Number of decimal digits of a positive integer below 2^53. */
function digitCount(n: number): number {
  let count = 1;
  for (let limit = 10; n >= limit && count < 16; limit *= 10) count++;
  return count;
}
