import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { splitCsv } from '../../src/io/csvText.js';
import { PlainRow, scanDecimal } from '../../src/io/plainRow.js';

/**
 * References: the decimal form the readers document (a dot as the decimal mark, an optional sign and
 * exponent: `[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?`) and the engine's Number (ECMA-262 StringToNumber,
 * correctly rounded) for the value; String.prototype.split and trim for lines and blank lines.
 */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** What scanDecimal must give a cell: Number(cell) when the cell has the decimal form, else NaN. */
function expected(cell: string): number {
  return DECIMAL.test(cell) ? Number(cell) : Number.NaN;
}

const digits = (max: number) => fc.string({ unit: fc.constantFrom(...'0123456789'), maxLength: max });
/** Cells near the decimal form: signs, digits, points and exponents in any order, and numbers as Number writes them. */
const cells = fc.oneof(
  fc.tuple(fc.constantFrom('', '+', '-'), digits(20), fc.constantFrom('', '.'), digits(25), fc.constantFrom('', 'e', 'E', 'e+', 'e-', 'E-'), digits(4)).map((parts) => parts.join('')),
  fc.string({ unit: fc.constantFrom(...'0123456789.+-eE'), maxLength: 12 }),
  fc.double().map(String),
  fc.integer({ min: -1e9, max: 1e9 }).map((n) => (n / 100).toFixed(2)),
  fc.constantFrom('', '.', '-', '+', '-0', '+0', '-0.0', '0.', '.5', '5.', '1e', '1e+', '1.2.3', '1e5e5', 'NaN', 'Infinity', '-Infinity', '0x10', '1_000', ' 5', '5 ', '1,5', '١٢'),
);

describe('scanDecimal', () => {
  it('gives Number(cell) for every cell of the decimal form and NaN for every other cell (-0 kept)', () => {
    fc.assert(
      fc.property(cells, (cell) => {
        expect(Object.is(scanDecimal(`x${cell}y`, 1, 1 + cell.length), expected(cell)), cell).toBe(true);
      }),
      { seed: 170201, numRuns: 100_000 },
    );
  });

  it('reads 15 significant digits and 22 decimals exactly, and hands longer ones to Number', () => {
    for (const cell of ['123456789012345', '0.000000000000000000001', '1234567890.12345', '9007199254740993', '0.1234567890123456789', '00000000000000000000042.50', '-4000.000000000000000000001']) {
      expect(Object.is(scanDecimal(cell, 0, cell.length), Number(cell)), cell).toBe(true);
    }
  });
});

describe('PlainRow', () => {
  const row = new PlainRow(4);
  const read = (line: string) => row.read(line, 0, line.length);

  it('reads a timestamp and numbers in place', () => {
    expect(read('2027-06-15T10:00:00+02:00,42.5,-3,1e2')).toBe(true);
    expect([row.stampFrom, row.stampTo]).toEqual([0, 25]);
    expect([...row.values]).toEqual([42.5, -3, 100]);
  });

  it('random rows: read exactly when split(",") gives four cells, a plain timestamp and three of the decimal form, with their Number values', () => {
    fc.assert(
      fc.property(fc.array(cells, { minLength: 1, maxLength: 5 }), (numbers) => {
        const line = ['2027-06-15T10:00:00+02:00', ...numbers].join(',');
        const parts = line.split(',');
        const plain = parts.length === 4 && parts.slice(1).every((cell) => DECIMAL.test(cell));
        expect(read(line), line).toBe(plain);
        if (plain) parts.slice(1).forEach((cell, k) => expect(Object.is(row.values[k], Number(cell)), line).toBe(true));
      }),
      { seed: 170202, numRuns: 50_000 },
    );
  });

  it('leaves every other row to the general reader: a field too many or too few, an empty, quoted, spaced or junk cell', () => {
    for (const line of [
      '2027-06-15T10:00:00+02:00,42.5,-3',
      '2027-06-15T10:00:00+02:00,42.5,-3,1,2',
      '2027-06-15T10:00:00+02:00,42.5,,1',
      '2027-06-15T10:00:00+02:00,"42.5",-3,1',
      '"2027-06-15T10:00:00+02:00",42.5,-3,1',
      ' 2027-06-15T10:00:00+02:00,42.5,-3,1',
      '2027-06-15T10:00:00+02:00 ,42.5,-3,1',
      '2027-06-15T10:00:00+02:00,42.5 ,-3,1',
      '2027-06-15T10:00:00+02:00,42.5,-3,1e',
      '2027-06-15T10:00:00+02:00,NaN,-3,1',
      ',42.5,-3,1',
      '2027-06-15T10:00:00+02:00\u00a0,42.5,-3,1',
      '',
    ]) {
      expect(read(line), line).toBe(false);
    }
  });
});

describe('CsvTable.lines: the rows of splitCsv, in place', () => {
  /** The data lines by the definition: split at the line break, blank lines (trim) skipped, one carriage return dropped. */
  function reference(text: string): { line: number; text: string }[] {
    const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
    const lines = body.split(body.includes('\n') || !body.includes('\r') ? '\n' : '\r');
    const nonBlank = lines.map((line, k) => ({ line: k + 1, text: line.endsWith('\r') ? line.slice(0, -1) : line })).filter((_, k) => (lines[k] as string).trim() !== '');
    return nonBlank.slice(1);
  }

  it('gives the same lines, numbers and texts for texts with any line breaks, blank lines and white space', () => {
    const piece = fc.oneof(fc.constantFrom('a,1', 'b,2', '', ' ', '\t', '\u00a0', '\u3000', '\ufeff', '\r', '\n', '\r\n', '"q"', 'x'), fc.string({ maxLength: 4 }));
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 30 }), fc.boolean(), (pieces, bom) => {
        const text = `${bom ? '\ufeff' : ''}h,v\n${pieces.join('')}`;
        const split = splitCsv(text, 'f.csv');
        if ('problems' in split) return;
        const cursor = split.table.lines();
        const seen: { line: number; text: string }[] = [];
        while (cursor.next()) seen.push({ line: cursor.line, text: cursor.lineText() });
        expect(seen).toEqual(reference(text));
      }),
      { seed: 170202, numRuns: 5_000 },
    );
  });
});
