import fc from 'fast-check';
import { IANAZone } from 'luxon';
import { describe, expect, it } from 'vitest';
import { formattedOffset, offsetMinutes } from '../../src/market/steadyDays.js';

/**
 * The calendar reads a zone's UTC offset from the engine's formatted offset (`GMT+02:00`) instead of
 * through the zone library. Reference: luxon's IANAZone.offset (npm `luxon`), which reads the same
 * IANA tz database through the engine as a local date and time; the two must agree to the bit, local
 * mean time's offsets in seconds included. Zones: one-hour and two-hour shifts, negative daylight
 * saving time (Dublin), shifts at midnight (Santiago, Havana), 30 and 45 minutes (Lord Howe, Chatham,
 * Kathmandu), a skipped day (Apia), Ramadan (Casablanca), west of UTC (New York), UTC.
 */
const ZONES = [
  'Europe/Berlin', 'Europe/Dublin', 'Europe/Lisbon', 'America/New_York', 'America/Santiago', 'America/Havana', 'America/Sao_Paulo',
  'Australia/Lord_Howe', 'Pacific/Chatham', 'Asia/Kathmandu', 'Asia/Kolkata', 'Pacific/Apia', 'Antarctica/Troll', 'Africa/Casablanca',
  'Africa/Monrovia', 'UTC',
];
const YEAR_MS = 365.2425 * 86_400_000;

describe('offsetMinutes against luxon', () => {
  it('random instants from the year 1000 to 2200 in every zone: the same offset, to the bit', () => {
    fc.assert(
      fc.property(fc.constantFrom(...ZONES), fc.integer({ min: Math.round(-970 * YEAR_MS), max: Math.round(230 * YEAR_MS) }), (zone, ms) => {
        expect(Object.is(offsetMinutes(ms, zone), IANAZone.create(zone).offset(ms)), `${zone} ${new Date(ms).toISOString()}`).toBe(true);
      }),
      { seed: 20261207, numRuns: 20_000 },
    );
  });

  it('every hour around each clock change of 2026 (and the Kathmandu change of 1986), to the millisecond before and after', () => {
    const failures: string[] = [];
    for (const zone of ZONES) {
      const luxon = IANAZone.create(zone);
      for (const year of [1986, 2026]) {
        const from = Date.UTC(year, 0, 1);
        for (let ms = from; ms < from + 366 * 86_400_000; ms += 3_600_000) {
          for (const at of [ms - 1, ms, ms + 1]) if (!Object.is(offsetMinutes(at, zone), luxon.offset(at))) failures.push(`${zone} ${at}`);
        }
      }
    }
    expect(failures.slice(0, 5)).toEqual([]);
  }, 120_000);
});

describe('formattedOffset', () => {
  it('reads hours, minutes and seconds east (+) or west (- or U+2212) of GMT, and GMT alone as 0', () => {
    expect(formattedOffset('2026, GMT+02:00')).toBe(120);
    expect(formattedOffset('2026, GMT-04:00')).toBe(-240);
    expect(formattedOffset('2026, GMT\u221203:30')).toBe(-210);
    expect(formattedOffset('1850, GMT+00:53:28')).toBe(3208 / 60);
    expect(formattedOffset('1849, GMT-00:25:21')).toBe(-1521 / 60);
    expect(Object.is(formattedOffset('2026, GMT'), 0)).toBe(true);
    expect(Object.is(formattedOffset('2026, GMT+00:00'), 0)).toBe(true);
    expect(formattedOffset('2026, UTC+2')).toBe(null);
    expect(formattedOffset('2026, GMT+2')).toBe(null);
  });
});
