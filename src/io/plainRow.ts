/**
 * The usual row of a history or wide forecast file read straight from the file's text by character
 * codes: a timestamp cell, then numbers, nothing else - no quotes, no spaces, no empty cells, no junk.
 * Such a row needs no string per cell; any other row (and any row with a problem) is left to the
 * readers' general path (splitCsvLine, parseDecimal), which words every problem.
 */
export class PlainRow {
  /** Where the first cell (the timestamp) stands in the text: [stampFrom, stampTo). */
  stampFrom = 0;
  stampTo = 0;
  /** The numbers of cells 1 to width - 1. */
  readonly values: Float64Array;

  constructor(readonly width: number) {
    this.values = new Float64Array(Math.max(0, width - 1));
  }

  /**
   * Reads text[from, to) (one line, line break and carriage return excluded); false when it is not a
   * plain row of `width` cells. Every number is the value parseDecimal (Number) gives its cell.
   */
  read(text: string, from: number, to: number): boolean {
    let at = from;
    while (at < to && text.charCodeAt(at) !== COMMA) at++;
    if (at === to || !plainCell(text, from, at)) return false;
    this.stampFrom = from;
    this.stampTo = at;
    const values = this.values;
    for (let k = 0; k < values.length; k++) {
      // One pass over the cell: its number, and where it ends (cellEnd).
      const value = scanCell(text, at + 1, to);
      at = cellEnd;
      // The last cell ends the line; every other cell ends at a comma.
      if ((at === to) !== (k === values.length - 1)) return false;
      if (Number.isNaN(value)) return false;
      values[k] = value;
    }
    return true;
  }
}

const COMMA = 0x2c;
const QUOTE = 0x22;
const PLUS = 0x2b;
const MINUS = 0x2d;
const POINT = 0x2e;
const ZERO = 0x30;

/**
 * Whether text[from, to) is a cell splitCsvLine would give unchanged: not empty, no quote, no white
 * space or control character at either end (it trims those).
 */
function plainCell(text: string, from: number, to: number): boolean {
  if (to <= from || !visibleAscii(text.charCodeAt(from)) || !visibleAscii(text.charCodeAt(to - 1))) return false;
  for (let i = from; i < to; i++) if (text.charCodeAt(i) === QUOTE) return false;
  return true;
}

function visibleAscii(code: number): boolean {
  return code > 0x20 && code < 0x7f;
}

/** 10^k for k = 0 to 22: every one an exact double. */
const POWERS_OF_TEN: readonly number[] = Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Significant digits an integer may have and stay below 2^53 whatever they are. */
const EXACT_DIGITS = 15;

/**
 * The number in text[from, to) when the cell is a decimal with a dot, `[+-]?(\d+\.?\d*|\.\d+)`, with an
 * optional exponent `[eE][+-]?\d+` (the form parseDecimal accepts); NaN for anything else (then the
 * general path reads the cell).
 *
 * The value is Number(cell): for up to 15 significant digits and 22 decimals, the digits as an integer
 * m and the division m / 10^k, both exact before the one rounding, give the correctly rounded value
 * (Clinger 1990, "How to read floating point numbers accurately", PLDI: the exact-operands case);
 * longer digit strings and exponents are passed to Number itself.
 */
export function scanDecimal(text: string, from: number, to: number): number {
  const value = scanCell(text, from, to);
  return cellEnd === to ? value : Number.NaN;
}

/** Where the cell scanCell read last ends: the comma after it, or `to`. */
let cellEnd = 0;

/**
 * The number of the cell that starts at `from` and ends at the first comma or at `to` (cellEnd is
 * set to that end), as scanDecimal reads it; NaN when the cell is not of the decimal form (cellEnd is
 * then where reading stopped, not necessarily the cell's end).
 */
function scanCell(text: string, from: number, to: number): number {
  const first = text.charCodeAt(from);
  const negative = first === MINUS;
  // The sign is stepped over and applied by arithmetic rather than in branches: a file's first negative
  // price may come months in, and a branch first taken then throws the compiled reader away.
  let at = from + (negative || first === PLUS ? 1 : 0);
  let mantissa = 0;
  let significant = 0;
  let decimals = 0;
  let digits = 0;
  let point = false;
  let code = 0;
  for (; at < to; at++) {
    code = text.charCodeAt(at);
    const digit = code - ZERO;
    if (digit >= 0 && digit <= 9) {
      digits++;
      if (point) decimals++;
      if (mantissa !== 0 || digit !== 0) {
        significant++;
        mantissa = mantissa * 10 + digit;
      }
    } else if (code === POINT && !point) point = true;
    else break;
  }
  cellEnd = at;
  if (digits === 0) return Number.NaN;
  if (at < to && code !== COMMA) {
    // What is left of the cell must be an exponent; Number reads such a cell.
    if (code !== 0x65 && code !== 0x45) return Number.NaN;
    at++;
    const sign = text.charCodeAt(at);
    if (sign === PLUS || sign === MINUS) at++;
    const exponentFrom = at;
    for (; at < to; at++) {
      const c = text.charCodeAt(at);
      if (c === COMMA) break;
      if (c < ZERO || c > ZERO + 9) {
        cellEnd = at;
        return Number.NaN;
      }
    }
    cellEnd = at;
    if (at === exponentFrom) return Number.NaN;
    return Number(text.slice(from, at));
  }
  if (significant > EXACT_DIGITS || decimals >= POWERS_OF_TEN.length) return Number(text.slice(from, at));
  const magnitude = decimals === 0 ? mantissa : mantissa / (POWERS_OF_TEN[decimals] as number);
  // x (-1) is exact: the same value as -magnitude, -0 included.
  return magnitude * (negative ? -1 : 1);
}
