import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvLine, formatNumber } from '../../src/io/formatNumber.js';
import { anyBits, byToFixed, EDGE_VALUES, nextDouble, ordinaryValues, ties } from './toFixedReference.js';

const seeded = (seed: number, numRuns: number) => ({ seed, numRuns });

describe('formatNumber: the same text as toFixed, trimmed (ECMA-262 Number.prototype.toFixed)', () => {
  it('edge cases: zeros, values that round to zero, ties, the exact route limit, 1e21 and beyond', () => {
    for (const value of EDGE_VALUES.filter(Number.isFinite)) {
      for (let digits = 0; digits <= 8; digits++) expect(formatNumber(value, digits), `${value} to ${digits}`).toBe(byToFixed(value, digits));
      expect(formatNumber(value), `${value}`).toBe(byToFixed(value, 6));
    }
  });

  it('every double (random bits), 0 to 6 decimals', () => {
    fc.assert(
      fc.property(anyBits.filter(Number.isFinite), fc.integer({ min: 0, max: 6 }), (value, digits) => formatNumber(value, digits) === byToFixed(value, digits)),
      seeded(170001, 200_000),
    );
  });

  it('refuses NaN and the infinities: a non-finite value is a fault, never a printed "NaN" or "Infinity"', () => {
    for (const value of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) expect(() => formatNumber(value), `${value}`).toThrow(RangeError);
    expect(() => csvLine(['a', Number.NaN])).toThrow(RangeError);
  });

  it('ordinary magnitudes of output files (prices, energies, cash), 0 to 15 decimals', () => {
    fc.assert(
      fc.property(ordinaryValues, fc.integer({ min: 0, max: 15 }), (value, digits) => formatNumber(value, digits) === byToFixed(value, digits)),
      seeded(170002, 200_000),
    );
  });

  it('exact ties at the last decimal and their neighbours round as toFixed does (away from zero)', () => {
    fc.assert(
      fc.property(ties, fc.integer({ min: -2, max: 2 }), fc.boolean(), ({ digits, value }, steps, negate) => {
        const near = nextDouble(value, steps);
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
