import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CsvBuilder } from '../../src/io/csvBuilder.js';
import { formatNumber } from '../../src/io/formatNumber.js';
import { anyBits, byToFixed, EDGE_VALUES, nextDouble, ordinaryValues, ties } from './toFixedReference.js';

const seeded = (seed: number, numRuns: number) => ({ seed, numRuns });

/** The builder's text of one number. */
function built(builder: CsvBuilder, value: number, digits: number): string {
  builder.number(value, digits);
  return builder.take();
}

describe('CsvBuilder.number: the same text as toFixed, trimmed (ECMA-262 Number.prototype.toFixed)', () => {
  const builder = new CsvBuilder();

  it('edge cases: zeros, values that round to zero, ties, the exact route limit, 1e21 and beyond', () => {
    for (const value of EDGE_VALUES) {
      for (let digits = 0; digits <= 16; digits++) expect(built(builder, value, digits), `${value} to ${digits}`).toBe(byToFixed(value, digits));
    }
  });

  it('every double (random bits) and ordinary magnitudes, 0 to 15 decimals', () => {
    fc.assert(
      fc.property(fc.oneof(anyBits, ordinaryValues), fc.integer({ min: 0, max: 15 }), (value, digits) => built(builder, value, digits) === byToFixed(value, digits)),
      seeded(170011, 200_000),
    );
  });

  it('near a half unit at large magnitudes, where the product is rounded by up to a quarter unit', () => {
    // (k + 1/2) / 10^digits for k up to 2^51 is rarely a tie but lands within a few ulps of one, where
    // the rounding error of value x 10^digits decides the digit (decimalUnits.ts roundedUnits).
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 9 }), fc.double({ min: 1, max: 2 ** 51, noNaN: true }), fc.integer({ min: -3, max: 3 }), fc.boolean(), (digits, k, steps, negate) => {
        const near = (negate ? -1 : 1) * nextDouble((Math.floor(k) + 0.5) / 10 ** digits, steps);
        return built(builder, near, digits) === byToFixed(near, digits) && formatNumber(near, digits) === byToFixed(near, digits);
      }),
      seeded(170013, 100_000),
    );
  });

  it('exact ties and their neighbours', () => {
    fc.assert(
      fc.property(ties, fc.integer({ min: -2, max: 2 }), fc.boolean(), ({ digits, value }, steps, negate) => {
        const near = (negate ? -1 : 1) * nextDouble(value, steps);
        return built(builder, near, digits) === byToFixed(near, digits);
      }),
      seeded(170012, 50_000),
    );
  });
});

describe('CsvBuilder', () => {
  it('writes text, separators and numbers as one line per row, and starts empty after take', () => {
    const builder = new CsvBuilder();
    builder.text('2027-03-28T03:00:00+02:00');
    builder.comma();
    builder.number(-12.3456789);
    builder.comma();
    builder.text('');
    builder.newline();
    expect(builder.take()).toBe('2027-03-28T03:00:00+02:00,-12.345679,\n');
    expect(builder.take()).toBe('');
  });

  it('keeps characters beyond ASCII (UTF-8) and goes back to plain bytes after take', () => {
    const builder = new CsvBuilder();
    builder.text('Halvørn ✓ 𝄞');
    builder.comma();
    builder.number(1.5);
    expect(builder.take()).toBe('Halvørn ✓ 𝄞,1.5');
    builder.text('plain');
    expect(builder.take()).toBe('plain');
    builder.text('Halvørn ✓');
    builder.comma();
    expect(Buffer.from(builder.takeBytes()).toString('utf8')).toBe('Halvørn ✓,');
    builder.number(-2.25);
    expect([...builder.takeBytes()]).toEqual([...Buffer.from('-2.25')]);
  });

  it('copies a stretch written before, and grows past its first buffer', () => {
    const builder = new CsvBuilder();
    const from = builder.position;
    builder.number(42.125);
    builder.comma();
    builder.number(-7);
    const to = builder.position;
    const expected: string[] = ['42.125,-7'];
    for (let i = 0; i < 20_000; i++) {
      builder.newline();
      builder.copy(from, to);
      expected.push('42.125,-7');
    }
    builder.newline();
    builder.text('x'.repeat(300_000));
    expect(builder.take()).toBe(`${expected.join('\n')}\n${'x'.repeat(300_000)}`);
  });
});
