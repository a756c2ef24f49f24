import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { deliveryPeriods } from '../../src/market/calendar.js';

/**
 * The calendar finds most days' midnights by chaining steady days (src/market/steadyDays.ts) instead of
 * asking the zone library. Reference: the periods built from luxon alone (local midnight to the next
 * local midnight, each start written with luxon's offset at that instant), for every day of the
 * years below, asked in order, backwards and in a scrambled order (the chain must not change an
 * answer). Zones and their rules come from the IANA tz database through luxon: Berlin and Lisbon
 * (one-hour shifts at night), Santiago and Havana (shifts at midnight: some days start at 01:00),
 * Lord Howe (a 30-minute shift), Chatham (+12:45/+13:45), Kathmandu (its one-off change from +05:30
 * to +05:45 in 1986), Apia (no 30 December 2011), Troll (a two-hour shift), Casablanca (daylight
 * saving time suspended in Ramadan), Sao Paulo (a shift at midnight until 2019), UTC.
 */
const CASES: readonly { zone: string; periodMinutes: number; years: readonly number[] }[] = [
  { zone: 'Europe/Berlin', periodMinutes: 15, years: [2026, 2027] },
  { zone: 'Europe/Lisbon', periodMinutes: 60, years: [2026] },
  { zone: 'America/Santiago', periodMinutes: 60, years: [2026] },
  { zone: 'America/Havana', periodMinutes: 30, years: [2026] },
  { zone: 'Australia/Lord_Howe', periodMinutes: 30, years: [2026] },
  { zone: 'Australia/Lord_Howe', periodMinutes: 60, years: [2026] },
  { zone: 'Pacific/Chatham', periodMinutes: 15, years: [2026] },
  { zone: 'Asia/Kathmandu', periodMinutes: 15, years: [1986] },
  { zone: 'Pacific/Apia', periodMinutes: 60, years: [2011] },
  { zone: 'Antarctica/Troll', periodMinutes: 60, years: [2026] },
  { zone: 'Africa/Casablanca', periodMinutes: 60, years: [2026] },
  { zone: 'America/Sao_Paulo', periodMinutes: 60, years: [2018] },
  { zone: 'UTC', periodMinutes: 60, years: [2026] },
];

/** luxon's ISO text with the offset, `+00:00` for a zero offset (the calendar's one spelling). */
function isoAt(ms: number, zone: string): string {
  const text = DateTime.fromMillis(ms, { zone }).toISO({ suppressMilliseconds: true }) as string;
  return text.endsWith('Z') ? `${text.slice(0, -1)}+00:00` : text;
}

/** The day's periods from luxon alone, or the error's message when the day is no whole number of periods. */
function reference(day: string, zone: string, periodMinutes: number): { start: string; end: string; startMs: number }[] | string {
  const start = DateTime.fromISO(day, { zone }).startOf('day');
  const startMs = start.toMillis();
  const endMs = start.plus({ days: 1 }).startOf('day').toMillis();
  const stepMs = periodMinutes * 60_000;
  if ((endMs - startMs) % stepMs !== 0) return `delivery day ${day} in ${zone} is not a whole number of ${periodMinutes}-minute periods`;
  const periods = [];
  for (let ms = startMs; ms < endMs; ms += stepMs) periods.push({ start: isoAt(ms, zone), end: isoAt(ms + stepMs, zone), startMs: ms });
  return periods;
}

function answer(day: string, zone: string, periodMinutes: number): ReturnType<typeof reference> {
  try {
    return deliveryPeriods(day, zone, periodMinutes).map((p) => ({ ...p }));
  } catch (err) {
    return (err as Error).message;
  }
}

function daysOf(years: readonly number[]): string[] {
  const days: string[] = [];
  for (const year of years) {
    for (let d = DateTime.fromObject({ year, month: 1, day: 1 }, { zone: 'UTC' }); d.year === year; d = d.plus({ days: 1 })) days.push(d.toISODate() as string);
  }
  return days;
}

describe('deliveryPeriods, steady days chained', () => {
  for (const { zone, periodMinutes, years } of CASES) {
    it(`${zone}, ${periodMinutes}-minute periods, ${years.join(', ')}: the same periods as luxon alone, in any order of asking`, () => {
      const days = daysOf(years);
      const expected = new Map(days.map((day) => [day, reference(day, zone, periodMinutes)]));
      // A fixed scramble: every 7th day from a start, wrapping round (7 and 365/366 share no factor).
      const scrambled = days.map((_, i) => days[(i * 7 + 3) % days.length] as string);
      for (const order of [days, [...days].reverse(), scrambled]) {
        for (const day of order) expect(answer(day, zone, periodMinutes), `${zone} ${day}`).toEqual(expected.get(day));
      }
    });
  }
});
