import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvLine, formatNumber } from '../../src/io/formatNumber.js';

/**
 * The reference: the engine's Number.prototype.toFixed (ECMA-262, 21.1.3.3: the exact binary value
 * rounded to `digits` decimals, ties to the larger magnitude, String(x) from 1e21 on), trailing zeros
 * and a bare point dropped, "-0" written "0" - the text quantbid's output files have always had.
 */
function byToFixed(value: number, digits: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(digits);
  const trimmed = text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
  return trimmed === '-0' ? '0' : trimmed;
}

/** The double next to `value` towards +infinity (steps > 0) or -infinity, by its bits. */
function nextDouble(value: number, steps: number): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, value);
  const bits = view.getBigInt64(0);
  const up = steps > 0 === value >= 0;
  view.setBigInt64(0, bits + BigInt(up ? Math.abs(steps) : -Math.abs(steps)));
  return view.getFloat64(0);
}

/** A double from 64 random bits: every finite double, NaNs and infinities, with their true frequency. */
const anyBits = fc.bigInt({ min: 0n, max: (1n << 64n) - 1n }).map((bits) => {
  const view = new DataView(new ArrayBuffer(8));
  view.setBigUint64(0, bits);
  return view.getFloat64(0);
});

/**
 * Exact ties at the last kept decimal: m / 2^k with k <= digits + 1 and m odd are the only doubles that
 * lie exactly half-way between two multiples of 10^-digits (10^digits x m / 2^k is an odd multiple of 1/2).
 */
const ties = fc.tuple(fc.integer({ min: 0, max: 6 }), fc.integer({ min: -4_000_000, max: 4_000_000 })).map(([digits, m]) => ({
  digits,
  value: (2 * m + 1) / 2 ** (digits + 1),
}));

const digitsArb = fc.integer({ min: 0, max: 6 });
const seeded = (seed: number, numRuns: number) => ({ seed, numRuns });

describe('formatNumber: the same text as toFixed, trimmed', () => {
  it('edge cases: zeros, values that round to zero, ties, the exact route limit, 1e21 and beyond', () => {
    const values = [
      0, -0, 1, -1, 0.5, -0.5, 1.5, 2.5, -2.5, 0.25, 0.125, 1e-7, -1e-7, 4e-7, -4e-7, 4.999999e-7, 5e-7, -5e-7, 5.000001e-7,
      0.0000005, 0.0000015, 0.0078125, -0.0078125, 1.0078125, 123.4560005, 1.005, 2.675, 0.1 + 0.2, 1 / 3, -2 / 3,
      42.5, 4000, -500, 1e6, 2.25e9, 2 ** 51 / 1e6, nextDouble(2 ** 51 / 1e6, 1), nextDouble(2 ** 51 / 1e6, -1), 4.5e9, 1e15 + 0.125,
      2 ** 53, 2 ** 53 + 2, 1e20, 999999999999999900000, 1e21, -1e21, 1.5e21, 1e22, 1.7976931348623157e308, Number.MIN_VALUE, -Number.MIN_VALUE,
      2.2250738585072014e-308, Number.EPSILON, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY,
    ];
    for (const value of values) {
      for (let digits = 0; digits <= 8; digits++) expect(formatNumber(value, digits), `${value} to ${digits}`).toBe(byToFixed(value, digits));
      expect(formatNumber(value), `${value}`).toBe(byToFixed(value, 6));
    }
  });

  it('every double (random bits), 0 to 6 decimals', () => {
    fc.assert(
      fc.property(anyBits, digitsArb, (value, digits) => formatNumber(value, digits) === byToFixed(value, digits)),
      seeded(170001, 200_000),
    );
  });

  it('ordinary magnitudes of output files (prices, energies, cash), 0 to 15 decimals', () => {
    const magnitudes = fc.oneof(
      fc.double({ min: -1e4, max: 1e4, noNaN: true }),
      fc.double({ min: -1e10, max: 1e10, noNaN: true }),
      fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
      fc.integer({ min: -1e9, max: 1e9 }).map((n) => n / 1e6),
      fc.integer({ min: -1e9, max: 1e9 }).map((n) => n / 100),
    );
    fc.assert(
      fc.property(magnitudes, fc.integer({ min: 0, max: 15 }), (value, digits) => formatNumber(value, digits) === byToFixed(value, digits)),
      seeded(170002, 200_000),
    );
  });

  it('exact ties at the last decimal and their neighbours round as toFixed does (away from zero)', () => {
    fc.assert(
      fc.property(ties, fc.integer({ min: -2, max: 2 }), fc.boolean(), ({ digits, value }, steps, negate) => {
        const near = steps === 0 ? value : nextDouble(value, steps);
        const signed = negate ? -near : near;
        return formatNumber(signed, digits) === byToFixed(signed, digits);
      }),
      seeded(170003, 100_000),
    );
    // A worked case: 1/128 = 0.0078125 exactly, so 7812.5 millionths, rounded up (ECMA-262: the larger n).
    expect(formatNumber(0.0078125)).toBe('0.007813');
    expect(formatNumber(-0.0078125)).toBe('-0.007813');
  });

  it('digits outside 0 to 15 and fractional digits take the toFixed route', () => {
    for (const digits of [16, 20, 2.5]) expect(formatNumber(Math.PI, digits)).toBe(byToFixed(Math.PI, digits));
    expect(() => formatNumber(1, -1)).toThrow(RangeError);
  });
});

describe('csvLine', () => {
  it('joins text cells and formatted numbers with commas', () => {
    expect(csvLine(['2027-01-01', 'quantile', -0, 1.23456789, '', 1e21])).toBe('2027-01-01,quantile,0,1.234568,,1e+21');
    expect(csvLine([])).toBe('');
    expect(csvLine([''])).toBe('');
  });
});
