import { describe, expect, it } from 'vitest';
import { levelText, quantileForecastCsv, scenarioPathsCsv } from '../../src/io/quantileForecastCsv.js';
import { parseQuantileForecast } from '../../src/io/readQuantileForecast.js';
import { deliveryPeriods } from '../../src/market/calendar.js';
import type { MarketSpec, QuantileDay } from '../../src/types.js';

const MARKET: MarketSpec = { timeZone: 'Europe/Berlin', periodMinutes: 15, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' };
const LEVELS = [0.05, 0.1, 0.5, 0.9, 0.95];

/** A day of made-up quantiles (not check values: the check is that they read back unchanged). */
function day(date: string, shift: number): QuantileDay {
  const periods = deliveryPeriods(date, MARKET.timeZone, MARKET.periodMinutes);
  return {
    day: date,
    levels: LEVELS,
    periods,
    prices: periods.map((_, t) => LEVELS.map((tau) => shift + 0.5 * t + 100 * (tau - 0.5) + 1e-5 * t)),
  };
}

describe('levelText', () => {
  it('writes the shortest decimal that reads back as the level, never an exponent', () => {
    expect([0.05, 0.1, 0.15, 0.5, 0.95, 0.025].map(levelText)).toEqual(['0.05', '0.1', '0.15', '0.5', '0.95', '0.025']);
    expect(levelText(1e-7)).toBe('0.0000001');
    expect(levelText(1.5e-7)).toBe('0.00000015');
    for (const level of [1e-7, 1.5e-7, 0.000123, 0.1 + 0.2, 1 / 3, 0.999999]) expect(Number(levelText(level))).toBe(level);
  });
});

describe('quantileForecastCsv', () => {
  // The spring and autumn clock changes of Europe/Berlin in 2027: 92 and 100 quarter-hours.
  const days = [day('2027-03-28', 40), day('2027-10-31', -20)];
  const text = quantileForecastCsv(days);

  it('writes the wide layout that parseQuantileForecast reads back, clock-change days included', () => {
    expect(text.split('\n')[0]).toBe('period_start,q0.05,q0.1,q0.5,q0.9,q0.95');
    expect(text.split('\n')[1]).toBe('2027-03-28T00:00:00+01:00,-5,0,40,80,85');
    const file = parseQuantileForecast(text, 'quantiles.csv', MARKET);
    expect(file.levels).toEqual(LEVELS);
    expect([...file.days.keys()]).toEqual(['2027-03-28', '2027-10-31']);
    expect(file.days.get('2027-03-28')!.prices).toHaveLength(92);
    expect(file.days.get('2027-10-31')!.prices).toHaveLength(100);
    days.forEach((d) => {
      const back = file.days.get(d.day)!;
      back.prices.forEach((row, t) => row.forEach((p, k) => expect(Math.abs(p - d.prices[t]![k]!)).toBeLessThanOrEqual(0.5e-4 + 1e-9)));
    });
  });

  it('rounds to 4 decimals, deterministically', () => {
    expect(text).toMatch(/\n2027-03-28T00:15:00\+01:00,-4\.5,0\.5,40\.5,80\.5,85\.5\n/);
    expect(quantileForecastCsv(days)).toBe(text);
  });

  it('refuses days with other levels', () => {
    expect(() => quantileForecastCsv([days[0]!, { ...days[1]!, levels: [0.1, 0.5, 0.9] }])).toThrow(/levels of 2027-10-31 differ/);
  });
});

describe('scenarioPathsCsv', () => {
  it('writes period_start,path,price: per day path 1 over the periods, then path 2', () => {
    const periods = deliveryPeriods('2027-01-04', MARKET.timeZone, 60);
    const text = scenarioPathsCsv([{ periods, paths: [periods.map(() => 1.23456), periods.map((_, t) => t)] }]);
    const rows = text.trimEnd().split('\n');
    expect(rows[0]).toBe('period_start,path,price');
    expect(rows).toHaveLength(1 + 2 * 24);
    expect(rows[1]).toBe('2027-01-04T00:00:00+01:00,1,1.2346');
    expect(rows[25]).toBe('2027-01-04T00:00:00+01:00,2,0');
    expect(rows[48]).toBe('2027-01-04T23:00:00+01:00,2,23');
  });
});
