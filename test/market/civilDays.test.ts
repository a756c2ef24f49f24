import fc from 'fast-check';
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { deliveryPeriods, isValidDay, shiftDay } from '../../src/market/calendar.js';
import { dayNumber, dayText } from '../../src/market/civilDays.js';

/** Reference: luxon's reading of ISO dates in UTC (proleptic Gregorian calendar). */
const luxonValid = (text: string): boolean => /^\d{4}-\d{2}-\d{2}$/.test(text) && DateTime.fromISO(text, { zone: 'UTC' }).isValid;
const luxonShift = (day: string, days: number): string | null => DateTime.fromISO(day, { zone: 'UTC' }).plus({ days }).toISODate();

const pad = (n: number, width: number) => String(n).padStart(width, '0');
/** YYYY-MM-DD texts with any year, months 00 to 19 and days 00 to 39: valid and invalid dates alike. */
const dayLike = fc.tuple(fc.integer({ min: 0, max: 9999 }), fc.integer({ min: 0, max: 19 }), fc.integer({ min: 0, max: 39 })).map(([y, m, d]) => `${pad(y, 4)}-${pad(m, 2)}-${pad(d, 2)}`);
const validDay = fc.date({ min: new Date('0000-01-01T00:00:00Z'), max: new Date('9999-12-31T00:00:00Z'), noInvalidDate: true }).map((date) => date.toISOString().slice(0, 10));

describe('civil days against luxon', () => {
  it('isValidDay agrees with luxon on every YYYY-MM-DD text, leap days of 1900, 2000 and year 0 included', () => {
    for (const day of ['0000-02-29', '0001-02-29', '1900-02-29', '2000-02-29', '2024-02-29', '2026-02-29', '2026-04-31', '2026-12-31', '9999-12-31', '2026-1-01', '2026-01-01T', '+2026-01-01', '２０２６-01-01']) {
      expect(isValidDay(day), day).toBe(luxonValid(day));
    }
    fc.assert(
      fc.property(dayLike, (day) => isValidDay(day) === luxonValid(day)),
      { seed: 170301, numRuns: 50_000 },
    );
  });

  it('day numbers count days: 1970-01-01 is 0, and a day number written back is the same day', () => {
    expect(dayNumber('1970-01-01')).toBe(0);
    expect(dayNumber('2000-03-01')).toBe(11017);
    fc.assert(
      fc.property(validDay, (day) => {
        const number = dayNumber(day);
        expect(number).toBe(Math.round(Date.parse(`${day}T00:00:00Z`) / 86_400_000));
        expect(dayText(number as number)).toBe(day);
      }),
      { seed: 170302, numRuns: 20_000 },
    );
  });

  it('shiftDay agrees with luxon, also past the years 0000 and 9999', () => {
    expect(shiftDay('9999-12-31', 1)).toBe('+010000-01-01');
    expect(shiftDay('0000-01-01', -1)).toBe('-000001-12-31');
    expect(shiftDay('2026-02-28', 1)).toBe('2026-03-01');
    fc.assert(
      fc.property(validDay, fc.integer({ min: -4_000_000, max: 4_000_000 }), (day, days) => shiftDay(day, days) === luxonShift(day, days)),
      { seed: 170303, numRuns: 20_000 },
    );
    expect(() => shiftDay('2026-02-30', 1)).toThrow(RangeError);
  });
});

describe('period texts of days with one offset', () => {
  /** Reference: the local time written from the engine's Date (UTC fields of the instant plus the offset). */
  function byDate(ms: number, offsetMin: number): string {
    const local = new Date(ms + offsetMin * 60_000);
    const two = (n: number) => (n < 10 ? `0${n}` : String(n));
    const abs = Math.abs(offsetMin);
    return (
      `${String(local.getUTCFullYear()).padStart(4, '0')}-${two(local.getUTCMonth() + 1)}-${two(local.getUTCDate())}` +
      `T${two(local.getUTCHours())}:${two(local.getUTCMinutes())}:${two(local.getUTCSeconds())}${offsetMin < 0 ? '-' : '+'}${two(Math.floor(abs / 60))}:${two(abs % 60)}`
    );
  }

  it('are the Date-written local times with the day offset (luxon), in zones with quarter- and half-hour offsets and in local mean time', () => {
    const zones = ['Europe/Berlin', 'America/St_Johns', 'Asia/Kathmandu', 'Pacific/Chatham', 'Australia/Lord_Howe', 'America/Los_Angeles', 'Pacific/Kiritimati', 'UTC'];
    fc.assert(
      fc.property(fc.constantFrom(...zones), validDay.filter((day) => day >= '1850-01-01' && day <= '2100-12-31'), fc.constantFrom(15, 30, 60), (zone, day, periodMinutes) => {
        let periods;
        try {
          periods = deliveryPeriods(day, zone, periodMinutes);
        } catch {
          return; // a day not cut into whole periods (a shift of seconds in local mean time)
        }
        const offsets = new Set(periods.map((p) => DateTime.fromMillis(p.startMs, { zone }).offset));
        const first = periods[0] as { startMs: number };
        const offset = DateTime.fromMillis(first.startMs, { zone }).offset;
        if (offsets.size !== 1 || DateTime.fromMillis(first.startMs + periods.length * periodMinutes * 60_000, { zone }).offset !== offset) return;
        periods.forEach((p) => {
          expect(p.start).toBe(byDate(p.startMs, offset));
          expect(p.end).toBe(byDate(p.startMs + periodMinutes * 60_000, offset));
        });
      }),
      { seed: 170304, numRuns: 1_500 },
    );
  });
});
