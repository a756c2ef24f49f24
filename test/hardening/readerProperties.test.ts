import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { MarketSpec } from '../../src/types.js';
import { BATTERY_FIELD_FIXES, parseBatterySpec } from '../../src/battery/batterySpec.js';
import { formatProblem } from '../../src/errors/inputError.js';
import { jsonSyntaxError } from '../../src/io/jsonSyntaxError.js';
import { parsePriceHistory } from '../../src/io/readPriceHistory.js';
import { parseQuantileForecast, type QuantileForecastFile } from '../../src/io/readQuantileForecast.js';
import { parseScenario } from '../../src/io/readScenario.js';
import { parseJsonSpec } from '../../src/io/readSpecs.js';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { MARKET_FIELD_FIXES, parseMarketSpec } from '../../src/market/marketSpec.js';
import { FIXTURES } from './corpusRunner.js';
import { applyMutations, junkArbitrary, mutationsArbitrary, readOrProblems, seedOf } from './mutations.js';

/**
 * Laws of the readers on any input (fast-check, seeds derived from the property names): every input
 * either parses to valid values or gives an InputError whose problems name the file and say what to do;
 * never another exception. Valid files are mutated line by line and cell by cell, and arbitrary text
 * and bytes are fed in as well.
 */
const fixture = (name: string) => readFileSync(join(FIXTURES, name), 'utf8');
const valid = {
  market: fixture('base/market.json'),
  battery: fixture('base/battery.json'),
  scenario: fixture('base/scenario.json'),
  wide: fixture('base/quantilesWide.csv'),
  long: fixture('base/quantilesLong.csv'),
  history: fixture('history/valid.csv'),
};
const market = Object.freeze(JSON.parse(valid.market) as MarketSpec);

/** Arbitrary text: unicode strings, decoded random bytes, JSON texts, and mutations of a valid file. */
function anyText(validText: string): fc.Arbitrary<string> {
  return fc.oneof(
    fc.string({ maxLength: 200 }),
    fc.uint8Array({ maxLength: 300 }).map((bytes) => Buffer.from(bytes).toString('utf8')),
    fc.json({ maxDepth: 3 }),
    mutationsArbitrary.map((m) => applyMutations(validText, m)),
    mutationsArbitrary.map((m) => applyMutations(validText, m)),
  );
}

const runs = (name: string, numRuns: number) => ({ seed: seedOf(name), numRuns });

/** A formatted problem is one line, whatever the input held. */
function expectOneLineEach(problems: readonly Parameters<typeof formatProblem>[0][]): void {
  for (const p of problems) expect(formatProblem(p)).not.toMatch(/[\n\r\u0000\u2028]/);
}

/** What a parsed forecast file must hold: complete days cut by the calendar, sorted quantiles inside the limits. */
function expectValidForecast(file: QuantileForecastFile): void {
  const levels = file.levels;
  levels.forEach((level, k) => {
    expect(level > 0 && level < 1).toBe(true);
    if (k > 0) expect(level).toBeGreaterThan(levels[k - 1] as number);
  });
  for (const [day, forecast] of file.days) {
    expect(forecast.periods.map((p) => p.start)).toEqual(deliveryPeriods(day, market.timeZone, market.periodMinutes).map((p) => p.start));
    for (const row of forecast.prices) {
      expect(row).toHaveLength(levels.length);
      row.forEach((price, k) => {
        expect(Number.isFinite(price) && price >= market.priceFloor && price <= market.priceCap).toBe(true);
        if (k > 0) expect(price).toBeGreaterThanOrEqual(row[k - 1] as number);
      });
    }
  }
}

describe('JSON readers on any text', () => {
  it.each([
    ['market spec', valid.market, (text: string) => parseJsonSpec(text, 'market.json', parseMarketSpec, MARKET_FIELD_FIXES), 'market.json'],
    ['battery spec', valid.battery, (text: string) => parseJsonSpec(text, 'battery.json', parseBatterySpec, BATTERY_FIELD_FIXES), 'battery.json'],
    ['scenario', valid.scenario, (text: string) => parseScenario(text, 'scenario.json'), 'scenario.json'],
  ] as const)('the %s reader returns a value or an InputError', (name, base, read, file) => {
    fc.assert(
      fc.property(anyText(base), (text) => {
        const result = readOrProblems(file, () => read(text));
        if ('error' in result) expectOneLineEach(result.error.problems);
      }),
      runs(`json ${name}`, 400),
    );
  });

  it('a market spec that parses has floor below cap and a zone the calendar can cut', () => {
    fc.assert(
      fc.property(anyText(valid.market), (text) => {
        const result = readOrProblems('market.json', () => parseJsonSpec(text, 'market.json', parseMarketSpec, MARKET_FIELD_FIXES));
        if ('value' in result) {
          expect(result.value.priceFloor).toBeLessThan(result.value.priceCap);
          expect(deliveryPeriods('2027-03-28', result.value.timeZone, result.value.periodMinutes).length).toBeGreaterThan(0);
        }
      }),
      runs('market values', 300),
    );
  });

  it('a battery spec that parses has an ordered window holding its starting state', () => {
    fc.assert(
      fc.property(anyText(valid.battery), (text) => {
        const result = readOrProblems('battery.json', () => parseJsonSpec(text, 'battery.json', parseBatterySpec, BATTERY_FIELD_FIXES));
        if ('value' in result) {
          const b = result.value;
          expect(b.socMinFraction).toBeLessThan(b.socMaxFraction);
          expect(b.socInitialFraction >= b.socMinFraction && b.socInitialFraction <= b.socMaxFraction).toBe(true);
          expect(b.energyMwh > 0 && b.chargeMw > 0 && b.dischargeMw > 0).toBe(true);
        }
      }),
      runs('battery values', 300),
    );
  });

  it('the JSON syntax scanner finds an error exactly when JSON.parse does, at an offset inside the text', () => {
    fc.assert(
      fc.property(anyText(valid.battery), (text) => {
        let parses = true;
        try {
          JSON.parse(text);
        } catch {
          parses = false;
        }
        const found = jsonSyntaxError(text);
        expect(found === null).toBe(parses);
        if (found !== null) expect(found.offset >= 0 && found.offset <= text.length).toBe(true);
      }),
      runs('json scanner', 1000),
    );
  });

  it('the JSON syntax scanner survives deep nesting and long texts', () => {
    expect(jsonSyntaxError('['.repeat(200_000))?.message).toMatch(/the file ends/);
    expect(jsonSyntaxError(`{"a": "${'x'.repeat(2_000_000)}"}`)).toBeNull();
    expect(jsonSyntaxError(`${'['.repeat(100_000)}${']'.repeat(100_000)}`)).toBeNull();
  });
});

describe('the quantile forecast reader on any text', () => {
  it.each([
    ['wide', valid.wide],
    ['long', valid.long],
  ])('the %s layout, mutated: valid days or an InputError', (layout, base) => {
    fc.assert(
      fc.property(anyText(base), (text) => {
        const result = readOrProblems('q.csv', () => parseQuantileForecast(text, 'q.csv', market));
        if ('value' in result) expectValidForecast(result.value);
        else expectOneLineEach(result.error.problems);
      }),
      runs(`quantiles ${layout}`, 300),
    );
  });

  it('rows in any order give the same forecast (each period once is the rule, not the order)', () => {
    const [header, ...rows] = valid.wide.trimEnd().split('\n');
    const expected = parseQuantileForecast(valid.wide, 'q.csv', market);
    fc.assert(
      fc.property(fc.shuffledSubarray(rows, { minLength: rows.length, maxLength: rows.length }), (shuffled) => {
        const file = parseQuantileForecast([header, ...shuffled].join('\n'), 'q.csv', market);
        expect([...file.days.entries()]).toEqual([...expected.days.entries()]);
      }),
      runs('quantiles order', 50),
    );
  });

  it('a corrupted cell is named with its line and column', () => {
    const rows = valid.wide.trimEnd().split('\n');
    fc.assert(
      fc.property(fc.integer({ min: 1, max: rows.length - 1 }), fc.integer({ min: 1, max: 5 }), fc.constantFrom('NaN', 'x', '', '4,5', '1e999', '9999'), (row, column, junk) => {
        const broken = rows.map((line, k) => (k === row ? line.split(',').map((c, j) => (j === column ? junk : c)).join(',') : line)).join('\n');
        const result = readOrProblems('q.csv', () => parseQuantileForecast(broken, 'q.csv', market));
        expect('error' in result).toBe(true);
        if ('error' in result) {
          const header = (rows[0] as string).split(',');
          // A decimal comma adds a field: then the row is named with its first extra column.
          const field = junk === '4,5' ? 'column 7' : header[column];
          expect(result.error.problems.some((p) => p.line === row + 1 && p.field === field)).toBe(true);
        }
      }),
      runs('quantiles cell', 100),
    );
  });

  it('arbitrary junk in any cell never escapes as another exception', () => {
    const rows = valid.wide.trimEnd().split('\n');
    fc.assert(
      fc.property(fc.nat(), fc.nat(), junkArbitrary, (row, column, junk) => {
        const r = row % rows.length;
        const broken = rows.map((line, k) => (k === r ? line.split(',').map((c, j) => (j === column % 6 ? junk : c)).join(',') : line)).join('\n');
        readOrProblems('q.csv', () => parseQuantileForecast(broken, 'q.csv', market));
      }),
      runs('quantiles junk', 300),
    );
  });
});

describe('the price-history reader on any text', () => {
  it('mutated histories: days or an InputError', () => {
    fc.assert(
      fc.property(anyText(valid.history), (text) => {
        const result = readOrProblems('h.csv', () => parsePriceHistory(text, 'h.csv', market));
        if ('value' in result) {
          for (const day of result.value.days) {
            expect(day.pricePerMwh.every((p) => Number.isFinite(p) && p >= market.priceFloor && p <= market.priceCap)).toBe(true);
            expect(day.pricePerMwh).toHaveLength(day.periods.length);
          }
        } else expectOneLineEach(result.error.problems);
      }),
      runs('history', 300),
    );
  });
});
