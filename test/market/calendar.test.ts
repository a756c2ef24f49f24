import { describe, expect, it } from 'vitest';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { DayCalendar, locatePeriod } from '../../src/market/dayCalendar.js';

// Clock-change dates are stated facts of the zones' rules (EU: last Sunday of March / October;
// South Australia: first Sunday of April / October), as published in the IANA tz database.
describe('deliveryPeriods', () => {
  it('has 92, 96 and 100 quarter-hours on the spring, normal and autumn days of a central-European zone', () => {
    expect(deliveryPeriods('2027-03-28', 'Europe/Berlin', 15)).toHaveLength(92);
    expect(deliveryPeriods('2027-06-15', 'Europe/Berlin', 15)).toHaveLength(96);
    expect(deliveryPeriods('2027-10-31', 'Europe/Berlin', 15)).toHaveLength(100);
  });

  it('has 46, 48 and 50 half-hours in a southern-hemisphere zone with a half-hour offset', () => {
    // Australia/Adelaide: UTC+10:30 in summer, +09:30 in winter; summer time ends 2027-04-04, starts 2026-10-04.
    expect(deliveryPeriods('2026-10-04', 'Australia/Adelaide', 30)).toHaveLength(46);
    expect(deliveryPeriods('2026-12-01', 'Australia/Adelaide', 30)).toHaveLength(48);
    expect(deliveryPeriods('2027-04-04', 'Australia/Adelaide', 30)).toHaveLength(50);
    const first = deliveryPeriods('2026-12-01', 'Australia/Adelaide', 30)[0];
    expect(first?.start).toBe('2026-12-01T00:00:00+10:30');
  });

  it('names periods by their local start with the offset, and the doubled autumn hour twice', () => {
    const periods = deliveryPeriods('2027-10-31', 'Europe/Berlin', 60);
    expect(periods.map((p) => p.start).slice(1, 5)).toEqual([
      '2027-10-31T01:00:00+02:00',
      '2027-10-31T02:00:00+02:00',
      '2027-10-31T02:00:00+01:00',
      '2027-10-31T03:00:00+01:00',
    ]);
    expect(periods[0]?.end).toBe(periods[1]?.start);
    const spring = deliveryPeriods('2027-03-28', 'Europe/Berlin', 60).map((p) => p.start);
    expect(spring[1]).toBe('2027-03-28T01:00:00+01:00');
    expect(spring[2]).toBe('2027-03-28T03:00:00+02:00');
  });

  it('covers the day without gaps: each period ends where the next starts', () => {
    const periods = deliveryPeriods('2027-03-28', 'Europe/Berlin', 15);
    for (let t = 1; t < periods.length; t++) expect(periods[t]?.startMs).toBe((periods[t - 1]?.startMs ?? 0) + 900_000);
    expect(periods[periods.length - 1]?.end).toBe('2027-03-29T00:00:00+02:00');
  });
});

describe('locatePeriod', () => {
  const calendar = new DayCalendar('Europe/Berlin', 15);

  it('finds both copies of the doubled autumn hour by their offsets', () => {
    const a = locatePeriod('2027-10-31T02:00:00+02:00', calendar);
    const b = locatePeriod('2027-10-31T02:00:00+01:00', calendar);
    expect(a.ok && b.ok && b.index - a.index).toBe(4);
  });

  it('rejects a timestamp without an offset, and an offset that is wrong for the date', () => {
    const bare = locatePeriod('2027-06-15T10:00:00', calendar);
    expect(bare.ok === false && bare.message).toMatch(/no UTC offset/);
    const wrong = locatePeriod('2027-06-15T10:00:00+01:00', calendar);
    expect(wrong.ok === false && wrong.message).toMatch(/does not match Europe\/Berlin/);
  });

  it('rejects a time that does not start a period, and a spring hour that does not exist', () => {
    const off = locatePeriod('2027-06-15T10:07:00+02:00', calendar);
    expect(off.ok).toBe(false);
    const missing = locatePeriod('2027-03-28T02:15:00+01:00', calendar);
    expect(missing.ok).toBe(false);
  });
});
