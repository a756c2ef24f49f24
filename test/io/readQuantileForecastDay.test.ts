import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import type { MarketSpec } from '../../src/types.js';
import { InputError } from '../../src/errors/inputError.js';
import { readQuantileForecast } from '../../src/io/readQuantileForecast.js';
import { readQuantileForecastDay } from '../../src/io/readQuantileForecastDay.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

// The day reader against the file's own numbers (what the test wrote is what the day must hold) and
// against the whole-file reader: on every file whose planned day is sound the two give the same day,
// and on every file whose planned day is not they report the same problems.
const market: MarketSpec = Object.freeze({ timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' });
const DAYS = ['2027-03-27', '2027-03-28', '2027-03-29'] as const; // the middle one: the spring clock change, 23 hours
const folder = mkdtempSync(join(tmpdir(), 'quantbid-forecast-day-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** Prices of period t of day d (index in DAYS): distinct for every day and period, increasing in the level. */
const prices = (d: number, t: number): number[] => [100 * d + t, 100 * d + t + 0.5, 100 * d + t + 1.25];

/** Wide rows `period_start,q0.1,q0.5,q0.9` of every day in DAYS, in time order. */
function wideRows(): string[] {
  return DAYS.flatMap((day, d) => deliveryPeriods(day, market.timeZone, 60).map((p, t) => [p.start, ...prices(d, t)].join(',')));
}

let files = 0;
function write(text: string | Buffer, name = `f${files++}.csv`): string {
  const path = join(folder, name);
  writeFileSync(path, text);
  return path;
}

/** The problems of a read as the CLI prints them, or null when it reads. */
function problemsOf(read: () => unknown): string[] | null {
  try {
    read();
    return null;
  } catch (err) {
    if (err instanceof InputError) return err.message.split('\n');
    throw err;
  }
}

describe('readQuantileForecastDay', () => {
  it('reads the day from rows in any order, with a byte order mark and CRLF: the prices written, as the whole-file reader reads them', () => {
    const rows = wideRows().reverse();
    const path = write(`\ufeffperiod_start,q0.1,q0.5,q0.9\r\n${rows.join('\r\n')}\r\n`);
    const read = readQuantileForecastDay(path, market, '2027-03-28');
    expect(read.rowsChecked).toBe('day');
    expect([...read.days.keys()]).toEqual(['2027-03-28']);
    const day = read.days.get('2027-03-28');
    expect(day?.periods).toHaveLength(23);
    expect(day?.prices).toEqual(deliveryPeriods('2027-03-28', market.timeZone, 60).map((_, t) => prices(1, t)));
    expect(day).toEqual(readQuantileForecast(path, market).days.get('2027-03-28'));
  });

  it('reads the long layout, old Mac line ends (CR only), quoted and spaced stamps, and gzip', () => {
    const lines = ['period_start,level,price'];
    DAYS.forEach((day, d) =>
      deliveryPeriods(day, market.timeZone, 60).forEach((p, t) => [0.9, 0.1, 0.5].forEach((level) => lines.push(`${t % 2 === 0 ? ` "${p.start}"` : p.start},${level},${prices(d, t)[[0.1, 0.5, 0.9].indexOf(level)]}`))),
    );
    for (const [text, name] of [[lines.join('\r'), 'long-cr.csv'], [gzipSync(lines.join('\n')), 'long.csv.gz']] as const) {
      const path = write(text, name);
      const read = readQuantileForecastDay(path, market, '2027-03-29');
      expect(read.rowsChecked, name).toBe('day');
      expect(read.levels).toEqual([0.1, 0.5, 0.9]);
      expect(read.days.get('2027-03-29')?.prices).toEqual(deliveryPeriods('2027-03-29', market.timeZone, 60).map((_, t) => prices(2, t)));
    }
  });

  it('counts and names the repairs of the day only', () => {
    const rows = wideRows();
    // Crossing quantiles at hour 2 of the first day and hour 5 of the planned day.
    const cross = (line: string) => line.replace(/,([\d.]+),([\d.]+),([\d.]+)$/, ',$3,$2,$1');
    rows[2] = cross(rows[2] as string);
    rows[24 + 5] = cross(rows[24 + 5] as string);
    const read = readQuantileForecastDay(write(`period_start,q0.1,q0.5,q0.9\n${rows.join('\n')}\n`), market, '2027-03-28');
    expect(read.repairedPeriods).toBe(1);
    expect(read.repairedExamples).toEqual(['2027-03-28T06:00:00+02:00']);
    expect(read.repairedByDay.get('2027-03-28')?.periods).toBe(1);
    expect(read.days.get('2027-03-28')?.prices[5]).toEqual(prices(1, 5));
  });

  it('does not parse the rows of other days: a bad cell there stops the whole-file reader, not the day reader', () => {
    const rows = wideRows();
    rows[3] = (rows[3] as string).replace(/,[\d.]+$/, ',12,5');
    const path = write(`period_start,q0.1,q0.5,q0.9\n${rows.join('\n')}\n`);
    expect(problemsOf(() => readQuantileForecast(path, market))).toEqual([`${path}:5: column 5: 5 fields, the header has 4; give one value per column on every line; a decimal comma (42,5) splits a number in two: use a dot (42.5)`]);
    expect(readQuantileForecastDay(path, market, '2027-03-28').rowsChecked).toBe('day');
  });

  it('a problem of the day, a period of the day given twice (even quoted), a missing day: the whole file read, the same problems and days as the whole-file reader', () => {
    const rows = wideRows();
    const badCell = rows.map((row, i) => (i === 30 ? row.replace(/,([\d.]+),/, ',1e999,') : row));
    const quotedTwice = [...rows, `"${(rows[24] as string).split(',')[0]}",1,2,3`];
    const wrongOffset = rows.map((row, i) => (i === 26 ? row.replace('+02:00', '+01:00') : row));
    const withoutDay = rows.filter((row) => !row.startsWith('2027-03-28'));
    for (const variant of [badCell, quotedTwice, wrongOffset]) {
      const path = write(`period_start,q0.1,q0.5,q0.9\n${variant.join('\n')}\n`);
      const whole = problemsOf(() => readQuantileForecast(path, market));
      expect(whole).not.toBeNull();
      expect(problemsOf(() => readQuantileForecastDay(path, market, '2027-03-28'))).toEqual(whole);
    }
    const path = write(`period_start,q0.1,q0.5,q0.9\n${withoutDay.join('\n')}\n`);
    const read = readQuantileForecastDay(path, market, '2027-03-28');
    expect(read.rowsChecked).toBe('file');
    expect([...read.days.keys()]).toEqual(['2027-03-27', '2027-03-29']);
  });

  it('any order of the rows, any planned day, any one row spoiled: the same day or the same problems as the whole-file reader (fast-check, seed 17)', () => {
    const rows = wideRows();
    const spoilers = [
      (row: string) => row.replace(/,([\d.]+)$/, ',x'), // a cell that is no number
      (row: string) => row.replace(/,([\d.]+)$/, ',5000'), // above the cap
      (row: string) => row.replace(/:00\+0/, ':30+0'), // not a period start
      (row: string) => `${row},1`, // a field too many
    ];
    fc.assert(
      fc.property(
        fc.shuffledSubarray(rows.map((_, i) => i), { minLength: rows.length, maxLength: rows.length }),
        fc.constantFrom(...DAYS),
        fc.option(fc.record({ row: fc.nat(rows.length - 1), spoil: fc.nat(spoilers.length - 1) }), { nil: undefined }),
        (order, day, spoiled) => {
          const lines = order.map((i) => (spoiled !== undefined && spoiled.row === i ? (spoilers[spoiled.spoil] as (row: string) => string)(rows[i] as string) : (rows[i] as string)));
          const path = write(`period_start,q0.1,q0.5,q0.9\n${lines.join('\n')}\n`, 'property.csv');
          const whole = problemsOf(() => readQuantileForecast(path, market));
          const ofDay = problemsOf(() => readQuantileForecastDay(path, market, day));
          const spoiledDay = spoiled === undefined ? null : (rows[spoiled.row] as string).slice(0, 10);
          if (spoiledDay === day || whole === null) expect(ofDay).toEqual(whole);
          else expect(ofDay).toBeNull();
          if (ofDay === null) {
            const read = readQuantileForecastDay(path, market, day);
            expect(read.rowsChecked).toBe('day');
            expect(read.days.get(day)?.prices).toEqual(deliveryPeriods(day, market.timeZone, 60).map((_, t) => prices(DAYS.indexOf(day), t)));
          }
        },
      ),
      { seed: 17, numRuns: 150 },
    );
  });
});
