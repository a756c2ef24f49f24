import fc from 'fast-check';
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { PeriodLocator } from '../../src/io/periodLocator.js';
import { DayCalendar, locatePeriod, type LocatedPeriod } from '../../src/market/dayCalendar.js';

/**
 * The locator must answer exactly as locatePeriod for any sequence of timestamps, in particular across
 * the clock changes it does not look up. Zones (rules from the IANA tz database, read through luxon):
 * Berlin (one-hour shifts at 02:00/03:00), New York, Adelaide (+09:30/+10:30), Lord Howe (a 30-minute
 * shift, +10:30/+11:00), Chatham (+12:45/+13:45), Santiago (shifts at midnight: some days start at
 * 01:00), Kathmandu (+05:45 since its one-off change from +05:30 in 1986) and UTC.
 */
const MARKETS: readonly { zone: string; periodMinutes: number; years: readonly number[] }[] = [
  { zone: 'Europe/Berlin', periodMinutes: 15, years: [2026] },
  { zone: 'Europe/Berlin', periodMinutes: 60, years: [2027] },
  { zone: 'America/New_York', periodMinutes: 30, years: [2026] },
  { zone: 'Australia/Adelaide', periodMinutes: 30, years: [2026] },
  { zone: 'Australia/Lord_Howe', periodMinutes: 15, years: [2026] },
  { zone: 'Australia/Lord_Howe', periodMinutes: 30, years: [2027] },
  { zone: 'Pacific/Chatham', periodMinutes: 15, years: [2026] },
  { zone: 'America/Santiago', periodMinutes: 60, years: [2026] },
  { zone: 'Asia/Kathmandu', periodMinutes: 15, years: [1985, 1986, 2026] },
  { zone: 'UTC', periodMinutes: 60, years: [2026] },
];

/**
 * Days of a year whose UTC offset at local midnight differs from the offset a day later (luxon): the
 * clock-change days, found from the zone's rules rather than written down.
 */
function clockChangeDays(zone: string, year: number): string[] {
  const days: string[] = [];
  for (let day = DateTime.fromObject({ year, month: 1, day: 1 }, { zone }); day.year === year; day = day.plus({ days: 1 })) {
    if (day.startOf('day').offset !== day.plus({ days: 1 }).startOf('day').offset) days.push(day.toISODate() as string);
  }
  return days;
}

const shift = (day: string, days: number): string => DateTime.fromISO(day, { zone: 'UTC' }).plus({ days }).toISODate() as string;

/** The calendar texts of the periods of `count` days from `first` (days the calendar cannot cut are left out). */
function stampsFrom(calendar: DayCalendar, first: string, count: number): string[] {
  const stamps: string[] = [];
  for (let d = 0; d < count; d++) {
    const periods = calendar.periodsIfValid(shift(first, d));
    if (periods !== null && !('uncut' in periods)) stamps.push(...periods.map((p) => p.start));
  }
  return stamps;
}

/** Changes to a timestamp that make it another period, another day, or no period at all. */
const EDITS = [
  (s: string) => s.replace(/[+-]\d\d:\d\d$/, '+01:00'),
  (s: string) => s.replace(/[+-]\d\d:\d\d$/, '+05:45'),
  (s: string) => s.replace(/[+-]\d\d:\d\d$/, '+10:30'),
  (s: string) => s.replace(/[+-]\d\d:\d\d$/, 'Z'),
  (s: string) => s.replace(/:(\d\d)$/, '$1'),
  (s: string) => s.replace(/:00([+-])/, ':00.000$1'),
  (s: string) => s.replace(/:00([+-])/, ':30$1'),
  (s: string) => s.replace(/T(\d\d):/, 'T24:'),
  (s: string) => s.replace(/T(\d\d):(\d\d)/, (_, h: string, m: string) => `T${h}:${String((Number(m) + 15) % 60).padStart(2, '0')}`),
  (s: string) => s.replace(/T(\d\d)/, (_, h: string) => `T${String((Number(h) + 1) % 24).padStart(2, '0')}`),
  (s: string) => s.slice(0, 10),
  (s: string) => `${s} `,
  (s: string) => s.replace('T', ' '),
];

type Step = { kind: 'keep' } | { kind: 'drop' } | { kind: 'repeat' } | { kind: 'swap' } | { kind: 'edit'; edit: number } | { kind: 'jump'; to: number };

const stepArb: fc.Arbitrary<Step> = fc.oneof(
  { weight: 12, arbitrary: fc.constant({ kind: 'keep' as const }) },
  fc.constant({ kind: 'drop' as const }),
  fc.constant({ kind: 'repeat' as const }),
  fc.constant({ kind: 'swap' as const }),
  fc.integer({ min: 0, max: EDITS.length - 1 }).map((edit) => ({ kind: 'edit' as const, edit })),
  fc.nat().map((to) => ({ kind: 'jump' as const, to })),
);

/** A file's timestamp column: the calendar's texts in order, with rows dropped, repeated, swapped, edited, or taken from elsewhere. */
function mutated(stamps: readonly string[], steps: readonly Step[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < stamps.length; i++) {
    const stamp = stamps[i] as string;
    const step = steps[i % steps.length] as Step;
    if (step.kind === 'keep') out.push(stamp);
    else if (step.kind === 'repeat') out.push(stamp, stamp);
    else if (step.kind === 'swap' && i + 1 < stamps.length) {
      out.push(stamps[i + 1] as string, stamp);
      i++;
    } else if (step.kind === 'edit') out.push((EDITS[step.edit] as (s: string) => string)(stamp));
    else if (step.kind === 'jump') out.push(stamps[step.to % stamps.length] as string);
  }
  return out;
}

/**
 * Outside check of an answer (luxon and the tz database, not the calendar): the stamp's instant lies
 * in the answered day, its offset is the zone's offset at that instant, and the instant is a whole
 * number of periods after the day's local midnight.
 */
function expectTrueToTheZone(stamp: string, located: LocatedPeriod, zone: string, periodMinutes: number): void {
  if (!located.ok) return;
  const instant = DateTime.fromISO(stamp, { setZone: true });
  const local = DateTime.fromMillis(located.startMs, { zone });
  expect(instant.toMillis()).toBe(located.startMs);
  expect(instant.offset).toBe(local.offset);
  expect(local.toISODate()).toBe(located.day);
  const sinceMidnightMs = located.startMs - local.startOf('day').toMillis();
  expect(sinceMidnightMs % (periodMinutes * 60_000)).toBe(0);
}

describe('PeriodLocator: locatePeriod exactly, across clock changes', () => {
  it('finds clock-change days in every zone but UTC and Kathmandu after 1986 (the test covers them)', () => {
    for (const { zone, years } of MARKETS) {
      const changes = years.flatMap((year) => clockChangeDays(zone, year));
      expect(changes.length > 0, zone).toBe(zone !== 'UTC');
    }
  });

  for (const { zone, periodMinutes, years } of MARKETS) {
    it(`${zone}, ${periodMinutes}-minute periods: every period of the days around each clock change, in order, shuffled and mutated`, () => {
      const calendar = new DayCalendar(zone, periodMinutes);
      const starts = [`${years[0]}-06-10`, ...years.flatMap((year) => clockChangeDays(zone, year)).map((day) => shift(day, -1))];
      fc.assert(
        fc.property(fc.constantFrom(...starts), fc.integer({ min: 1, max: 3 }), fc.array(stepArb, { minLength: 1, maxLength: 40 }), fc.boolean(), (first, count, steps, viaText) => {
          const locator = new PeriodLocator(calendar);
          const stamps = mutated(stampsFrom(calendar, first, count), steps);
          // The timestamps as they stand in a file's text, or as strings.
          const text = `x,${stamps.join(',')}`;
          let at = 2;
          for (const stamp of stamps) {
            const found = viaText ? locator.locateAt(text, at, at + stamp.length) : locator.locate(stamp);
            at += stamp.length + 1;
            expect(found, stamp).toEqual(locatePeriod(stamp, calendar));
            expectTrueToTheZone(stamp, found, zone, periodMinutes);
          }
        }),
        { seed: 170100 + periodMinutes, numRuns: 60 },
      );
    });
  }

  it('every period of the day after a clock change at midnight is found: Kathmandu, whose first day at +05:45 starts at 00:15', () => {
    const calendar = new DayCalendar('Asia/Kathmandu', 15);
    // The clock went from 24:00 at +05:30 to 00:15 at +05:45: 1985-12-31 is the day whose offset changes at its end.
    expect(clockChangeDays('Asia/Kathmandu', 1985)).toEqual(['1985-12-31']);
    const periods = calendar.periods('1986-01-01');
    expect(periods).toHaveLength(95);
    expect(periods[0]?.start).toBe('1986-01-01T00:15:00+05:45');
    expect(calendar.periods('1985-12-31').at(-1)?.end).toBe('1986-01-01T00:15:00+05:45');
    const locator = new PeriodLocator(calendar);
    for (const day of ['1985-12-31', '1986-01-01']) {
      calendar.periods(day).forEach((period, index) => expect(locator.locate(period.start)).toEqual({ ok: true, day, index, startMs: period.startMs }));
    }
    // Out of order within the day: 00:30 is period 1, not the period its clock time would give on a whole day.
    expect(locator.locate('1986-01-01T00:30:00+05:45')).toEqual(locatePeriod('1986-01-01T00:30:00+05:45', calendar));
    expect(locator.locate('1986-01-01T00:00:00+05:45')).toEqual(locatePeriod('1986-01-01T00:00:00+05:45', calendar));
  });
});
