import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import type { MarketSpec } from '../../src/types.js';
import { InputError, type InputProblem } from '../../src/errors/inputError.js';
import { parsePriceHistory, readPriceHistory } from '../../src/io/readPriceHistory.js';
import { readMarketSpec } from '../../src/io/readSpecs.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

const market: MarketSpec = Object.freeze({ timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' });
const HEADER = 'period_start,price,imbalance_price,load_forecast_mw';

/** Lines of one day: price 10 + t, imbalance 20 + t, load 1000 + t. */
function dayLines(day: string): string[] {
  return deliveryPeriods(day, market.timeZone, 60).map((p, t) => `${p.start},${10 + t},${20 + t},${1000 + t}`);
}

function text(lines: readonly string[], header = HEADER): string {
  return `${[header, ...lines].join('\n')}\n`;
}

/** The problems of an input that must be rejected. */
function problemsOf(input: string): readonly InputProblem[] {
  try {
    parsePriceHistory(input, 'h.csv', market);
  } catch (err) {
    if (err instanceof InputError) return err.problems;
    throw err;
  }
  throw new Error('expected an InputError');
}

/** Replaces the cells of data line `row` (0-based, after the header) of a two-day file. */
function withRow(row: number, replace: (cells: string[]) => string[]): string {
  const lines = [...dayLines('2027-06-15'), ...dayLines('2027-06-16')];
  lines[row] = replace((lines[row] as string).split(',')).join(',');
  return text(lines);
}

describe('parsePriceHistory', () => {
  it('reads complete days in ascending order, with the imbalance and exogenous columns', () => {
    const history = parsePriceHistory(text([...dayLines('2027-06-16'), ...dayLines('2027-06-15')]), 'h.csv', market);
    expect(history.days.map((d) => d.day)).toEqual(['2027-06-15', '2027-06-16']);
    expect(history.exogenousNames).toEqual(['load_forecast_mw']);
    const day = history.days[0];
    expect(day?.periods).toEqual(deliveryPeriods('2027-06-15', market.timeZone, 60));
    expect(day?.pricePerMwh[5]).toBe(15);
    expect(day?.imbalancePricePerMwh?.[5]).toBe(25);
    expect(day?.exogenous.load_forecast_mw?.[5]).toBe(1005);
    expect(history.incompleteDays).toEqual([]);
  });

  it('accepts a byte order mark and CRLF line endings, with the same result', () => {
    const plain = text(dayLines('2027-06-15'));
    expect(parsePriceHistory(`\ufeff${plain.replaceAll('\n', '\r\n')}`, 'h.csv', market)).toEqual(parsePriceHistory(plain, 'h.csv', market));
  });

  it('needs no imbalance column: imbalancePricePerMwh is then null', () => {
    const lines = deliveryPeriods('2027-06-15', market.timeZone, 60).map((p) => `${p.start},42.5`);
    const history = parsePriceHistory(text(lines, 'period_start,price'), 'h.csv', market);
    expect(history.days[0]?.imbalancePricePerMwh).toBeNull();
    expect(history.days[0]?.pricePerMwh[0]).toBe(42.5);
  });

  it('reads the old column name fallback_price as imbalance_price, with one note asking to rename it', () => {
    const lines = [...dayLines('2027-06-15'), ...dayLines('2027-06-16')];
    const notes: string[] = [];
    const old = parsePriceHistory(text(lines, 'period_start,price,fallback_price,load_forecast_mw'), 'h.csv', market, (note) => notes.push(note));
    expect(old).toEqual(parsePriceHistory(text(lines), 'h.csv', market));
    expect(notes).toEqual(['note: h.csv:1: the column fallback_price is read as imbalance_price; rename the column to imbalance_price\n']);
    const none: string[] = [];
    parsePriceHistory(text(lines), 'h.csv', market, (note) => none.push(note));
    expect(none).toEqual([]);
  });

  it('refuses a history with both imbalance_price and its old name fallback_price', () => {
    const lines = dayLines('2027-06-15').map((line) => `${line},7`);
    expect(problemsOf(text(lines, `${HEADER},fallback_price`))).toEqual([
      { file: 'h.csv', line: 1, field: 'fallback_price', message: 'both imbalance_price and its old name fallback_price are given', fix: 'keep one of them, named imbalance_price' },
    ]);
  });

  it('takes the clock-change days from the calendar: 23 and 25 hours, the doubled hour told apart by its offset', () => {
    const history = parsePriceHistory(text([...dayLines('2027-03-28'), ...dayLines('2027-10-31')]), 'h.csv', market);
    expect(history.days.map((d) => d.periods.length)).toEqual([23, 25]);
    expect(history.days[1]?.periods.slice(2, 4).map((p) => p.start)).toEqual(['2027-10-31T02:00:00+02:00', '2027-10-31T02:00:00+01:00']);
  });

  it('lists a day with a missing or a doubled period as incomplete and leaves it out, never filled', () => {
    const first = dayLines('2027-06-15').filter((_, t) => t !== 3);
    const second = dayLines('2027-06-16');
    const third = dayLines('2027-06-17');
    const history = parsePriceHistory(text([...first, ...second, third[0] as string, ...third]), 'h.csv', market);
    expect(history.days.map((d) => d.day)).toEqual(['2027-06-16']);
    expect(history.incompleteDays).toEqual([
      { day: '2027-06-15', reason: '1 of 24 periods missing (2027-06-15T03:00:00+02:00)' },
      { day: '2027-06-17', reason: '1 period given twice (2027-06-17T00:00:00+02:00 on lines 49 and 50)' },
    ]);
  });

  it('reads .csv.gz files', () => {
    const dir = mkdtempSync(join(tmpdir(), 'quantbid-history-'));
    const path = join(dir, 'history.csv.gz');
    writeFileSync(path, gzipSync(text(dayLines('2027-06-15'))));
    expect(readPriceHistory(path, market).days).toHaveLength(1);
  });
});

describe('parsePriceHistory rejects bad input with file, line and field', () => {
  // Data row r of the two-day file is on line r + 2 (line 1 is the header).
  it.each([
    ['an empty price', withRow(0, (c) => [c[0] as string, '', c[2] as string, c[3] as string]), 2, 'price', /empty value/],
    ['NaN', withRow(1, (c) => [c[0] as string, 'NaN', c[2] as string, c[3] as string]), 3, 'price', /NaN is not a finite number/],
    ['Infinity', withRow(2, (c) => [c[0] as string, c[1] as string, 'Infinity', c[3] as string]), 4, 'imbalance_price', /Infinity is not a finite number/],
    ['a price above the cap', withRow(4, (c) => [c[0] as string, '4000.01', c[2] as string, c[3] as string]), 6, 'price', /4000.01 is outside the market's \[-500, 4000\]/],
    ['a price below the floor', withRow(5, (c) => [c[0] as string, '-600', c[2] as string, c[3] as string]), 7, 'price', /-600 is outside/],
    ['an empty exogenous cell', withRow(6, (c) => [c[0] as string, c[1] as string, c[2] as string, '']), 8, 'load_forecast_mw', /empty value/],
    ['a timestamp without offset', withRow(7, (c) => ['2027-06-15T07:00:00', ...c.slice(1)]), 9, 'period_start', /has no UTC offset/],
    ['an offset that is not the zone\'s', withRow(8, (c) => ['2027-06-15T08:00:00+01:00', ...c.slice(1)]), 10, 'period_start', /does not match Europe\/Berlin|not in delivery day/],
    ['a time that starts no period', withRow(9, (c) => ['2027-06-15T09:30:00+02:00', ...c.slice(1)]), 11, 'period_start', /not the start of a 60-minute delivery period/],
    ['a date that does not exist', withRow(10, (c) => ['2027-02-30T10:00:00+01:00', ...c.slice(1)]), 12, 'period_start', /not a valid date/],
    ['a missing field', withRow(11, (c) => c.slice(0, 3)), 13, 'load_forecast_mw', /3 fields, the header has 4/],
    ['an extra field', withRow(12, (c) => [...c, '7']), 14, 'column 5', /5 fields, the header has 4/],
  ])('%s', (_name, input, line, field, message) => {
    const problems = problemsOf(input);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ file: 'h.csv', line, field });
    expect(problems[0]?.message).toMatch(message);
    expect(problems[0]?.fix.length).toBeGreaterThan(0);
  });

  it.each([
    ['a first column other than period_start', 'time,price', 'time', /expected "period_start"/],
    ['a second column other than price', 'period_start,clearing', 'clearing', /expected "price"/],
    ['a column given twice', 'period_start,price,load_mw,load_mw', 'load_mw', /appears twice/],
    ['a column without a name', 'period_start,price,,load_mw', 'column 3', /has no name/],
  ])('a header with %s', (_name, header, field, message) => {
    const problems = problemsOf(text([], header));
    expect(problems[0]).toMatchObject({ file: 'h.csv', line: 1, field });
    expect(problems[0]?.message).toMatch(message);
  });

  it('a decimal comma splits the row into one field too many, and the fix says so', () => {
    const problems = problemsOf(withRow(3, (c) => [c[0] as string, '42,5', c[2] as string, c[3] as string]));
    expect(problems[0]).toMatchObject({ file: 'h.csv', line: 5, field: 'column 5', message: '5 fields, the header has 4' });
    expect(problems[0]?.fix).toMatch(/decimal comma \(42,5\).*write 42.5/);
  });

  it('lists every problem of the file together, not just the first', () => {
    const lines = dayLines('2027-06-15');
    lines[0] = lines[0]?.replace(',10,', ',NaN,') as string;
    lines[5] = lines[5]?.replace(',15,', ',1e9,') as string;
    const problems = problemsOf(text(lines));
    expect(problems.map((p) => [p.line, p.field])).toEqual([[2, 'price'], [7, 'price']]);
  });

  it('points a semicolon-separated file to the fix', () => {
    expect(problemsOf('period_start;price\n2027-06-15T00:00:00+02:00;1\n')[0]?.message).toMatch(/separated by semicolons/);
  });
});

describe('the demo history', () => {
  it('holds 730 complete days of quarter-hours, 92 and 100 on the clock-change days', () => {
    const demoMarket = readMarketSpec('scenarios/halvorn/market.json');
    const history = readPriceHistory('scenarios/halvorn/history.csv.gz', demoMarket);
    expect(history.days).toHaveLength(730);
    expect(history.incompleteDays).toEqual([]);
    expect(history.exogenousNames).toEqual(['load_forecast_mw', 'renewables_forecast_mw']);
    const lengths = new Map(history.days.map((d) => [d.day, d.periods.length]));
    expect([lengths.get('2025-03-30'), lengths.get('2025-10-26'), lengths.get('2026-06-01')]).toEqual([92, 100, 96]);
    // The first row of the file, as printed in scenarios/halvorn/README.md.
    expect(history.days[0]?.pricePerMwh[0]).toBe(107.63);
    expect(history.days[0]?.imbalancePricePerMwh?.[0]).toBe(109.56);
  });
});
