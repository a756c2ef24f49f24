import { describe, expect, it } from 'vitest';
import type { MarketSpec } from '../../src/types.js';
import { InputError } from '../../src/errors/inputError.js';
import { parseQuantileForecast } from '../../src/io/readQuantileForecast.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

const market: MarketSpec = Object.freeze({ timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' });

function wide(day: string, row: (t: number) => number[], header = 'period_start,q0.1,q0.5,q0.9'): string {
  const lines = [header];
  deliveryPeriods(day, market.timeZone, 60).forEach((p, t) => lines.push([p.start, ...row(t)].join(',')));
  return `${lines.join('\n')}\n`;
}

function problems(text: string): string[] {
  try {
    parseQuantileForecast(text, 'q.csv', market);
  } catch (err) {
    if (err instanceof InputError) return err.message.split('\n');
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('parseQuantileForecast', () => {
  it('reads the wide layout, with a BOM and CRLF line endings', () => {
    const text = `\ufeff${wide('2027-06-15', (t) => [t, t + 10, t + 20]).replaceAll('\n', '\r\n')}`;
    const file = parseQuantileForecast(text, 'q.csv', market);
    const day = file.days.get('2027-06-15');
    expect(file.levels).toEqual([0.1, 0.5, 0.9]);
    expect(day?.prices).toHaveLength(24);
    expect(day?.prices[3]).toEqual([3, 13, 23]);
  });

  it('reads the long layout into the same values', () => {
    const lines = ['period_start,level,price'];
    for (const p of deliveryPeriods('2027-06-15', market.timeZone, 60)) {
      for (const [level, price] of [[0.9, 30], [0.1, 10], [0.5, 20]] as const) lines.push(`${p.start},${level},${price}`);
    }
    const file = parseQuantileForecast(lines.join('\n'), 'q.csv', market);
    expect(file.levels).toEqual([0.1, 0.5, 0.9]);
    expect(file.days.get('2027-06-15')?.prices[0]).toEqual([10, 20, 30]);
  });

  it('repairs crossing quantiles by sorting and counts them', () => {
    const file = parseQuantileForecast(wide('2027-06-15', (t) => (t === 5 ? [30, 20, 25] : [1, 2, 3])), 'q.csv', market);
    expect(file.repairedPeriods).toBe(1);
    expect(file.repairedExamples).toEqual(['2027-06-15T05:00:00+02:00']);
    expect(file.days.get('2027-06-15')?.prices[5]).toEqual([20, 25, 30]);
  });

  it('lists a day with a missing period as incomplete, never filled', () => {
    const text = wide('2027-06-15', () => [1, 2, 3]).split('\n').filter((_, i) => i !== 4).join('\n');
    const file = parseQuantileForecast(text, 'q.csv', market);
    expect(file.days.has('2027-06-15')).toBe(false);
    expect(file.incompleteDays[0]?.reason).toMatch(/1 of 24 periods missing \(2027-06-15T03:00:00\+02:00\)/);
  });

  it('lists every cell problem with line and column', () => {
    const text = wide('2027-06-15', (t) => [t === 1 ? Number.NaN : 1, 2, t === 2 ? Number.POSITIVE_INFINITY : 3]).replace('2,3\n', '2,3,4\n');
    const lines = problems(text.replace(',1,2,3\n', ',1,2;5,3\n'));
    expect(lines).toContain('q.csv:3: q0.1: NaN is not a finite number; give a finite price; drop the row or the day if the value is unknown');
    expect(lines).toContain('q.csv:4: q0.9: Infinity is not a finite number; give a finite price; drop the row or the day if the value is unknown');
    expect(lines.some((l) => l.startsWith('q.csv:2: column 5: 5 fields, the header has 4'))).toBe(true);
  });

  it('names levels given as percentages, levels out of order, and a semicolon file', () => {
    expect(problems(wide('2027-06-15', () => [1, 2, 3], 'period_start,q10,q50,q90'))[0]).toBe('q.csv:1: q10: level 10 looks like a percentage; write levels as fractions in (0, 1): q0.1 for 10%');
    expect(problems(wide('2027-06-15', () => [1, 2, 3], 'period_start,q0.5,q0.1,q0.9'))[0]).toMatch(/q0.1: level 0.1 does not increase/);
    expect(problems('period_start;q0.5\n2027-06-15T00:00:00+02:00;1,5\n')[0]).toMatch(/separated by semicolons; save the file as comma-separated/);
    expect(problems('')[0]).toMatch(/^q.csv: the file is empty/);
  });

  it('rejects duplicate periods, wrong offsets and prices outside the market limits', () => {
    const base = wide('2027-06-15', () => [1, 2, 3]).trimEnd().split('\n');
    const doubled = [...base, base[5] as string].join('\n');
    expect(problems(doubled)[0]).toMatch(/q.csv:26: period_start: period 2027-06-15T04:00:00\+02:00 appears twice \(first on line 6\)/);
    const offset = base.map((l, i) => (i === 3 ? l.replace('+02:00', '+01:00') : l)).join('\n');
    expect(problems(offset)[0]).toMatch(/q.csv:4: period_start: offset \+01:00 .* does not match Europe\/Berlin/);
    const high = base.map((l, i) => (i === 7 ? l.replace(/,3$/, ',5000') : l)).join('\n');
    expect(problems(high)[0]).toMatch(/q.csv:8: q0.9: price 5000 is outside the market's \[-500, 4000\]/);
  });
});
