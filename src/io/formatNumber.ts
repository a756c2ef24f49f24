/**
 * Deterministic decimal text for output files: at most `digits` decimals, trailing zeros dropped,
 * no negative zero, no exponent for ordinary magnitudes. The same value always gives the same text.
 *
 * The text is exactly `value.toFixed(digits)` with trailing zeros (and a bare point) dropped and "-0"
 * written "0". toFixed rounds the exact binary value of `value` to `digits` decimals, ties away from
 * zero (ECMA-262, Number.prototype.toFixed); so does the arithmetic route below, without building
 * and trimming a string per value: a ledger of a year holds millions of numbers.
 */
export function formatNumber(value: number, digits = 6): string {
  if (value === 0) return '0';
  const scale = DECIMAL_SCALES[digits];
  if (scale === undefined) return formatByToFixed(value, digits);
  const magnitude = value < 0 ? -value : value;
  const scaled = magnitude * scale;
  // NaN, the infinities and large magnitudes (where toFixed may switch to an exponent) go the slow way.
  if (!(scaled < EXACT_SCALED_LIMIT)) return formatByToFixed(value, digits);
  const units = roundedUnits(magnitude, scale, scaled);
  if (units === 0) return '0';
  let whole = Math.floor(units / scale);
  let fraction = units - whole * scale;
  // units / scale is rounded; settle the integer split exactly.
  if (fraction < 0) {
    whole -= 1;
    fraction += scale;
  } else if (fraction >= scale) {
    whole += 1;
    fraction -= scale;
  }
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

/** The reference route: toFixed, then trailing zeros and a bare point dropped; "-0" written "0". */
function formatByToFixed(value: number, digits: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(digits);
  const trimmed = text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
  return trimmed === '-0' ? '0' : trimmed;
}

/** 10^digits for the digits the exact route serves (all exact doubles). */
const DECIMAL_SCALES: readonly number[] = Array.from({ length: 16 }, (_, digits) => 10 ** digits);
const LEADING_ZEROS: readonly string[] = Array.from({ length: 16 }, (_, n) => '0'.repeat(n));

/**
 * Below this, magnitude x 10^digits has a unit in the last place of at most 1/4, so that the rounded
 * product is within 1/4 of the exact one and the integer arithmetic below stays exact.
 */
const EXACT_SCALED_LIMIT = 2 ** 51;

/**
 * round(magnitude x scale), the exact product rounded half up, for 0 < magnitude x scale < 2^51, where
 * `scaled` is the rounded product. The exact product is scaled + error (Dekker's product error), so it
 * reaches floor(scaled) + 1/2 exactly when (scaled - floor(scaled) - 1/2) + error >= 0: both terms are
 * exact, and a sum of two doubles rounds to the sign of its exact value.
 */
function roundedUnits(magnitude: number, scale: number, scaled: number): number {
  // Exact product below 1/4 (1 + 2^-52): it rounds to 0.
  if (scaled < 0.25) return 0;
  const floor = Math.floor(scaled);
  return scaled - floor - 0.5 + productError(magnitude, scale, scaled) >= 0 ? floor + 1 : floor;
}

/** Veltkamp's splitting constant 2^27 + 1 (Dekker 1971). */
const SPLITTER = 134217729;

/**
 * a x b - product exactly, for product the rounded a x b (Dekker 1971, "A floating-point technique for
 * extending the available precision", Numer. Math. 18: the product of two doubles is the sum of two
 * doubles, here without a fused multiply-add). Exact barring overflow and underflow, which the
 * magnitudes above exclude.
 */
function productError(a: number, b: number, product: number): number {
  const aSplit = SPLITTER * a;
  const aHigh = aSplit - (aSplit - a);
  const aLow = a - aHigh;
  const bSplit = SPLITTER * b;
  const bHigh = bSplit - (bSplit - b);
  const bLow = b - bHigh;
  return aHigh * bHigh - product + aHigh * bLow + aLow * bHigh + aLow * bLow;
}

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
