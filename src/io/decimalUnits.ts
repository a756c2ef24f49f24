/**
 * The arithmetic behind quantbid's decimal text (formatNumber, CsvBuilder): a value rounded to
 * `digits` decimals as an integer count of 10^-digits units, exactly as Number.prototype.toFixed rounds
 * it (ECMA-262: the exact binary value, ties to the larger magnitude), without building a string.
 */

/** 10^digits for the digits the exact route serves, 0 to 15 (all exact doubles). */
export const DECIMAL_SCALES: readonly number[] = Array.from({ length: 16 }, (_, digits) => 10 ** digits);

/**
 * Below this, magnitude x 10^digits has a unit in the last place of at most 1/4, so that the rounded
 * product is within 1/4 of the exact one and the integer arithmetic on units stays exact. Above it (and
 * for NaN and the infinities) callers take toFixed's own route.
 */
export const EXACT_SCALED_LIMIT = 2 ** 51;

/**
 * round(magnitude x scale), the exact product rounded half up, for 0 <= magnitude and
 * scaled = magnitude x scale (rounded) below EXACT_SCALED_LIMIT. The exact product is scaled + error
 * (Dekker's product error), so it reaches floor(scaled) + 1/2 exactly when
 * (scaled - floor(scaled) - 1/2) + error >= 0: both terms are exact, and a sum of two doubles rounds to
 * the sign of its exact value.
 */
export function roundedUnits(magnitude: number, scale: number, scaled: number): number {
  // Exact product below 1/4 (1 + 2^-52): it rounds to 0.
  if (scaled < 0.25) return 0;
  const floor = Math.floor(scaled);
  const fromHalf = scaled - floor - 0.5;
  // The product's rounding error is at most 2^-53 x scaled (round to nearest, scaled normal): beyond
  // that distance from the half the sign of fromHalf decides, and the exact error is not needed.
  const errorBound = scaled * HALF_ULP_OF_ONE;
  if (fromHalf > errorBound) return floor + 1;
  if (fromHalf < -errorBound) return floor;
  return fromHalf + productError(magnitude, scale, scaled) >= 0 ? floor + 1 : floor;
}

/** 2^-53: the largest relative rounding error of one operation on doubles (round to nearest). */
const HALF_ULP_OF_ONE = 2 ** -53;

/** Veltkamp's splitting constant 2^27 + 1 (Dekker 1971). */
const SPLITTER = 134217729;

/**
 * a x b - product exactly, for product the rounded a x b (Dekker 1971, "A floating-point technique for
 * extending the available precision", Numer. Math. 18: the product of two doubles is the sum of two
 * doubles, here without a fused multiply-add). Exact barring overflow and underflow, which the
 * magnitudes of roundedUnits exclude.
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

/**
 * Whole part of units / scale, for units < 2^51: the quotient is rounded, the split then settled
 * exactly (units - whole x scale is the fraction, 0 <= fraction < scale).
 */
export function wholeUnits(units: number, scale: number): number {
  const whole = Math.floor(units / scale);
  const fraction = units - whole * scale;
  return fraction < 0 ? whole - 1 : fraction >= scale ? whole + 1 : whole;
}

/** The toFixed route: toFixed, then trailing zeros and a bare point dropped; "-0" written "0". */
export function formatByToFixed(value: number, digits: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(digits);
  const trimmed = text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
  return trimmed === '-0' ? '0' : trimmed;
}
