import { describe, expect, it } from 'vitest';
import { exactDecimalText, parseDecimalRange, parseExactDecimal } from '../../src/grid/decimalRange.js';

function rangeTexts(spec: string): string[] {
  const range = parseDecimalRange(spec);
  if (range.status !== 'ok') throw new Error(range.message);
  return Array.from({ length: Number(range.count) }, (_, i) => range.valueText(i));
}

describe('parseDecimalRange', () => {
  it('0.02:0.48:0.02 gives the 24 decimals 0.02 .. 0.48 exactly, where repeated float addition drifts', () => {
    const texts = rangeTexts('0.02:0.48:0.02');
    // Value i is the decimal 2(i+1)/100; n/100 with integer n is the double nearest that decimal.
    expect(texts.map(Number)).toEqual(Array.from({ length: 24 }, (_, i) => (2 * (i + 1)) / 100));
    expect(texts.slice(0, 3)).toEqual(['0.02', '0.04', '0.06']);
    expect(texts.at(-1)).toBe('0.48');
    // The drift this avoids (IEEE 754 doubles): adding 0.02 to itself 23 times ends at 0.48000000000000015.
    let sum = 0.02;
    for (let i = 1; i < 24; i++) sum += 0.02;
    expect(String(sum)).toBe('0.48000000000000015');
  });

  it('includes the end when it is on the grid, stops below it otherwise', () => {
    expect(rangeTexts('1:1:1')).toEqual(['1']);
    expect(rangeTexts('5:40:5')).toEqual(['5', '10', '15', '20', '25', '30', '35', '40']);
    expect(rangeTexts('0:1:0.3')).toEqual(['0', '0.3', '0.6', '0.9']);
    expect(rangeTexts('0.1:0.3:0.1')).toEqual(['0.1', '0.2', '0.3']);
  });

  it('prints the shortest decimal: mixed scales, negatives, no -0, no trailing zeros', () => {
    expect(rangeTexts('2.5:20:2.5').slice(0, 4)).toEqual(['2.5', '5', '7.5', '10']);
    expect(rangeTexts('-1:1:0.5')).toEqual(['-1', '-0.5', '0', '0.5', '1']);
    expect(rangeTexts('0.050:0.150:0.050')).toEqual(['0.05', '0.1', '0.15']);
  });

  it('counts a huge range without building it', () => {
    const range = parseDecimalRange('0:1000000000:0.001');
    expect(range.status === 'ok' && range.count).toBe(1_000_000_000_001n);
  });

  it.each([
    ['0.1:0.2', 'is not a range start:end:step'],
    ['0.1:0.2:0.1:0.1', 'is not a range start:end:step'],
    ['0.1:0.2:0', 'step of "0.1:0.2:0" is not positive'],
    ['0.1:0.2:-0.1', 'is not positive'],
    ['0.3:0.2:0.1', 'start of "0.3:0.2:0.1" is above its end'],
    ['1e-2:0.2:0.1', 'not a plain decimal'],
    ['a:b:c', 'not a plain decimal'],
    ['0.1::0.1', 'not a plain decimal'],
  ])('refuses %s', (spec, message) => {
    const range = parseDecimalRange(spec);
    expect(range.status).toBe('bad');
    expect(range.status === 'bad' && range.message).toContain(message);
  });
});

describe('parseExactDecimal and exactDecimalText', () => {
  it.each([
    ['0.02', 2n, 2, '0.02'],
    ['.5', 5n, 1, '0.5'],
    ['-12.50', -1250n, 2, '-12.5'],
    ['-0.0', 0n, 1, '0'],
    ['7', 7n, 0, '7'],
  ])('%s is %s / 10^%s, printed %s', (text, mantissa, scale, printed) => {
    const decimal = parseExactDecimal(text);
    expect(decimal).toEqual({ mantissa, scale });
    expect(exactDecimalText(decimal as NonNullable<typeof decimal>)).toBe(printed);
  });

  it.each(['', '.', '-', '1e3', '0x10', '1,5', 'Infinity', '1.2.3'])('refuses %j', (text) => {
    expect(parseExactDecimal(text)).toBeUndefined();
  });
});
