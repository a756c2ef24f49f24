import fc from 'fast-check';

/**
 * The reference for quantbid's decimal text: the engine's Number.prototype.toFixed (ECMA-262,
 * 21.1.3.3: the exact binary value rounded to `digits` decimals, ties to the larger magnitude,
 * String(x) from 1e21 on), trailing zeros and a bare point dropped, "-0" written "0".
 */
export function byToFixed(value: number, digits: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(digits);
  const trimmed = text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
  return trimmed === '-0' ? '0' : trimmed;
}

/** The double `steps` places from `value` away from zero (steps > 0) or towards it, by its bits. */
export function nextDouble(value: number, steps: number): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, value);
  view.setBigInt64(0, view.getBigInt64(0) + BigInt(steps));
  return view.getFloat64(0);
}

/** A double from 64 random bits: every finite double, NaNs and infinities, with their true frequency. */
export const anyBits = fc.bigInt({ min: 0n, max: (1n << 64n) - 1n }).map((bits) => {
  const view = new DataView(new ArrayBuffer(8));
  view.setBigUint64(0, bits);
  return view.getFloat64(0);
});

/** Magnitudes of output files (prices, energies, cash) and decimal-looking values. */
export const ordinaryValues = fc.oneof(
  fc.double({ min: -1e4, max: 1e4, noNaN: true }),
  fc.double({ min: -1e10, max: 1e10, noNaN: true }),
  fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
  fc.integer({ min: -1e9, max: 1e9 }).map((n) => n / 1e6),
  fc.integer({ min: -1e9, max: 1e9 }).map((n) => n / 100),
);

/**
 * Exact ties at the last kept decimal: m / 2^k with k <= digits + 1 and m odd are the only doubles that
 * lie exactly half-way between two multiples of 10^-digits (10^digits x m / 2^k is an odd multiple of 1/2).
 */
export const ties = fc.tuple(fc.integer({ min: 0, max: 6 }), fc.integer({ min: -4_000_000, max: 4_000_000 })).map(([digits, m]) => ({
  digits,
  value: (2 * m + 1) / 2 ** (digits + 1),
}));

/**
 * Hand-picked values: zeros, values that round to zero, exact ties (1/128 = 7812.5 millionths), values
 * that show binary error (1.005), the end of the exact route (2^51 / 10^6), 2^53, 1e21 and beyond
 * (toFixed switches to an exponent), the largest and smallest doubles, NaN and the infinities.
 */
export const EDGE_VALUES: readonly number[] = [
  0, -0, 1, -1, 0.5, -0.5, 1.5, 2.5, -2.5, 0.25, 0.125, 1e-7, -1e-7, 4e-7, -4e-7, 4.999999e-7, 5e-7, -5e-7, 5.000001e-7,
  0.0000015, 0.0078125, -0.0078125, 1.0078125, 123.4560005, 1.005, 2.675, 0.1 + 0.2, 1 / 3, -2 / 3,
  42.5, 4000, -500, 1e6, 2.25e9, 2 ** 51 / 1e6, nextDouble(2 ** 51 / 1e6, 1), nextDouble(2 ** 51 / 1e6, -1), 4.5e9, 1e15 + 0.125,
  2 ** 53, 2 ** 53 + 2, 1e20, 999999999999999900000, 1e21, -1e21, 1.5e21, 1e22, 1.7976931348623157e308, Number.MIN_VALUE, -Number.MIN_VALUE,
  2.2250738585072014e-308, Number.EPSILON, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY,
];
