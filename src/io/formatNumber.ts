import { smallPValueText } from '../stats/smallPValue.js';
import { DECIMAL_SCALES, EXACT_SCALED_LIMIT, formatByToFixed, roundedUnits, wholeUnits } from './decimalUnits.js';

/**
 * Deterministic decimal text for output files: at most `digits` decimals, trailing zeros dropped,
 * no negative zero, no exponent for ordinary magnitudes. The same value always gives the same text.
 *
 * The text is exactly `value.toFixed(digits)` with trailing zeros (and a bare point) dropped and "-0"
 * written "0"; ordinary magnitudes take an exact arithmetic route (decimalUnits.ts) instead of
 * building and trimming a string per value. NaN and infinities throw a RangeError (a fault).
 */
export function formatNumber(value: number, digits = 6): string {
  if (value === 0) return '0';
  // A non-finite value never reaches a user: it is a fault (every input is range-checked before arithmetic).
  if (!Number.isFinite(value)) throw new RangeError(`formatNumber: ${value} is not a finite number`);
  const scale = DECIMAL_SCALES[digits];
  if (scale === undefined) return formatByToFixed(value, digits);
  const magnitude = value < 0 ? -value : value;
  const scaled = magnitude * scale;
  if (!(scaled < EXACT_SCALED_LIMIT)) return formatByToFixed(value, digits);
  const units = roundedUnits(magnitude, scale, scaled);
  if (units === 0) return '0';
  const whole = wholeUnits(units, scale);
  let fraction = units - whole * scale;
  const sign = value < 0 ? '-' : '';
  if (fraction === 0) return `${sign}${whole}`;
  let width = digits;
  while (fraction % 10 === 0) {
    fraction /= 10;
    width--;
  }
  const shown = `${fraction}`;
  return `${sign}${whole}.${LEADING_ZEROS[width - shown.length] as string}${shown}`;
}

const LEADING_ZEROS: readonly string[] = Array.from({ length: 16 }, (_, n) => '0'.repeat(n));

/** A CSV line from cells; cells are plain (no commas or quotes) by construction of our writers. */
export function csvLine(cells: readonly (string | number)[]): string {
  let line = '';
  for (let k = 0; k < cells.length; k++) {
    const cell = cells[k] as string | number;
    const text = typeof cell === 'number' ? formatNumber(cell) : cell;
    line = k === 0 ? text : `${line},${text}`;
  }
  return line;
}

/**
 * A p-value for reading: 4 decimals from 1e-4 up (`0.0013`, `0.973`), below it two significant digits
 * in scientific notation (`3.2e-7`), never `0`; a p-value that underflowed to 0 is `<1e-300`.
 */
export function formatPValue(p: number): string {
  return smallPValueText(p) ?? formatNumber(p, 4);
}
