import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { hasOpenQuote } from '../../src/io/csvText.js';
import { jsonDuplicateKeys } from '../../src/io/jsonDuplicateKeys.js';
import { firstBadUtf8Byte } from '../../src/io/readInputFile.js';

describe('jsonDuplicateKeys', () => {
  it('finds a key given twice in one object, with both lines, at any depth; equal keys of different objects are fine', () => {
    const text = '{\n  "a": 1,\n  "b": {"x": 1, "y": [ {"x": 2}, {"x": 3, "x": 4} ]},\n  "c": "a",\n  "a": 2\n}';
    expect(jsonDuplicateKeys(text)).toEqual([
      { path: 'b.y.x', firstLine: 3, line: 3 },
      { path: 'a', firstLine: 2, line: 5 },
    ]);
  });

  it('reads keys as JSON does: escapes decoded, a colon inside a string is no key', () => {
    expect(jsonDuplicateKeys('{"\\u0061": 1, "a": 2}')).toEqual([{ path: 'a', firstLine: 1, line: 1 }]);
    expect(jsonDuplicateKeys('{"a": "x:y", "b": "a", "c": ["a", "a"]}')).toEqual([]);
    expect(jsonDuplicateKeys('{"a\\"": 1, "a": 2}')).toEqual([]);
  });

  it('agrees with JSON.parse on which objects lose a value (seeded)', () => {
    // A key repeated in one object is exactly when JSON.parse keeps fewer keys than the text names.
    const key = fc.constantFrom('a', 'b', 'c');
    const object = fc.array(fc.tuple(key, fc.integer({ min: 0, max: 9 })), { maxLength: 4 });
    fc.assert(
      fc.property(object, (pairs) => {
        const text = `{${pairs.map(([k, v]) => `"${k}": ${v}`).join(', ')}}`;
        const kept = Object.keys(JSON.parse(text) as object).length;
        expect(jsonDuplicateKeys(text).length).toBe(pairs.length - kept);
      }),
      { seed: 1812, numRuns: 300 },
    );
  });
});

describe('hasOpenQuote', () => {
  it('is true when a quoted cell is not closed on the line, false when every quote closes or none opens a cell', () => {
    expect(hasOpenQuote('2027-06-15T00:00:00+02:00,"4')).toBe(true);
    expect(hasOpenQuote('a,"b,c')).toBe(true);
    expect(hasOpenQuote('a,"b "" c"')).toBe(false);
    expect(hasOpenQuote('a,"b",c')).toBe(false);
    expect(hasOpenQuote('a,4"5,c')).toBe(false);
    expect(hasOpenQuote('plain,cells')).toBe(false);
  });
});

describe('firstBadUtf8Byte', () => {
  const valid = (bytes: Uint8Array): boolean => {
    try {
      new TextDecoder('utf-8', { fatal: true }).decode(bytes);
      return true;
    } catch {
      return false;
    }
  };

  it('points at the first byte where the WHATWG decoder (fatal) fails: the text before it decodes, with it it does not (seeded)', () => {
    // Bytes drawn mostly from the ranges that make and break UTF-8 sequences.
    const byte = fc.oneof(fc.integer({ min: 0x20, max: 0x7e }), fc.integer({ min: 0x80, max: 0xbf }), fc.integer({ min: 0xc0, max: 0xff }));
    fc.assert(
      fc.property(fc.array(byte, { maxLength: 12 }), (list) => {
        const bytes = Buffer.from(list);
        const at = firstBadUtf8Byte(bytes);
        if (valid(bytes)) expect(at).toBe(bytes.length);
        else {
          expect(valid(bytes.subarray(0, at))).toBe(true);
          expect(valid(bytes.subarray(0, at + 4))).toBe(false);
        }
      }),
      { seed: 3629, numRuns: 2000 },
    );
  });

  it('knows the edges of the table of well-formed sequences (Unicode 15, table 3-7)', () => {
    expect(firstBadUtf8Byte(Buffer.from([0xe0, 0x9f, 0x80]))).toBe(0); // overlong
    expect(firstBadUtf8Byte(Buffer.from([0xed, 0xa0, 0x80]))).toBe(0); // a surrogate
    expect(firstBadUtf8Byte(Buffer.from([0xf4, 0x90, 0x80, 0x80]))).toBe(0); // beyond U+10FFFF
    expect(firstBadUtf8Byte(Buffer.from([0x41, 0xc3, 0xa9, 0xe9]))).toBe(3);
    expect(firstBadUtf8Byte(Buffer.from('Größe €', 'utf8'))).toBe(Buffer.byteLength('Größe €'));
  });
});
