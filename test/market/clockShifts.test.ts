import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { CLOCK_SHIFT_YEARS, localTimeOffset, unevenClockShift } from '../../src/market/clockShifts.js';

// unevenClockShift finds each zone's offset at local midnight of 1 January and 1 July by offset lookups;
// the reference is the zone library itself (luxon, DateTime.fromObject), read the way the method says:
// the offsets on 1 January and 1 July of each year of CLOCK_SHIFT_YEARS, and from each 1 January to the
// next. Every zone the engine's time-zone database knows, at 15, 30 and 60 minutes.

/** Every clock shift [min, absolute] the method looks at, through luxon's date objects. */
function shiftsByLuxon(timeZone: string): number[] {
  const offset = (year: number, month: number) => DateTime.fromObject({ year, month, day: 1 }, { zone: timeZone }).offset;
  const shifts: number[] = [];
  for (let year = CLOCK_SHIFT_YEARS.from; year <= CLOCK_SHIFT_YEARS.to; year++) {
    shifts.push(Math.abs(offset(year, 7) - offset(year, 1)));
    if (year < CLOCK_SHIFT_YEARS.to) shifts.push(Math.abs(offset(year + 1, 1) - offset(year, 1)));
  }
  return shifts;
}

describe('localTimeOffset', () => {
  it('gives luxon\'s offset at local midnight of every month\'s first day of CLOCK_SHIFT_YEARS, in every zone', () => {
    for (const zone of Intl.supportedValuesOf('timeZone')) {
      for (let year = CLOCK_SHIFT_YEARS.from; year <= CLOCK_SHIFT_YEARS.to; year += 4) {
        for (let month = 1; month <= 12; month++) {
          expect(localTimeOffset(zone, Date.UTC(year, month - 1, 1)), `${zone} ${year}-${month}`).toBe(DateTime.fromObject({ year, month, day: 1 }, { zone }).offset);
        }
      }
    }
  });

  it('gives luxon\'s offset in skipped and repeated hours: every quarter-hour of the clock-change days of 2026', () => {
    // Zones that change at 02:00, at 03:00, at midnight (the day starts in a gap), by half an hour.
    let changes = 0;
    for (const zone of ['Europe/Berlin', 'America/New_York', 'Australia/Adelaide', 'Australia/Lord_Howe', 'America/Santiago', 'Asia/Beirut', 'America/Havana', 'Pacific/Chatham']) {
      for (let day = Date.UTC(2026, 0, 1); day < Date.UTC(2027, 0, 1); day += 86_400_000) {
        const noon = (ms: number) => DateTime.fromMillis(ms + 12 * 3_600_000, { zone }).offset;
        if (noon(day) === noon(day - 86_400_000)) continue;
        changes++;
        for (let local = day - 86_400_000; local < day + 86_400_000; local += 900_000) {
          const at = new Date(local);
          const fields = { year: at.getUTCFullYear(), month: at.getUTCMonth() + 1, day: at.getUTCDate(), hour: at.getUTCHours(), minute: at.getUTCMinutes() };
          expect(localTimeOffset(zone, local), `${zone} ${at.toISOString()}`).toBe(DateTime.fromObject(fields, { zone }).offset);
        }
      }
    }
    expect(changes).toBeGreaterThanOrEqual(14);
  });
});

describe('unevenClockShift', () => {
  it('gives what luxon\'s date objects give, for every zone the engine knows', () => {
    const zones = Intl.supportedValuesOf('timeZone');
    expect(zones.length).toBeGreaterThan(300);
    let uneven = 0;
    for (const zone of zones) {
      const shifts = shiftsByLuxon(zone);
      for (const minutes of [15, 30, 60]) {
        const sizes = shifts.filter((size) => size % minutes !== 0);
        const expected = sizes.length === 0 ? null : Math.min(...sizes);
        expect(unevenClockShift(zone, minutes), `${zone} ${minutes}`).toBe(expected);
        if (expected !== null) uneven++;
      }
    }
    // Zones with half-hour daylight saving time (e.g. Australia/Lord_Howe) are among them.
    expect(uneven).toBeGreaterThan(0);
    expect(unevenClockShift('Australia/Lord_Howe', 60)).toBe(30);
    expect(unevenClockShift('Europe/Berlin', 60)).toBeNull();
  });
});
