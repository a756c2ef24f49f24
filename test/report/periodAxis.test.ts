import { describe, expect, it } from 'vitest';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { categoryAxis, localTime, periodAxis, PERIOD_TICK_HOURS } from '../../src/report/index.js';

/*
 * Clock changes in Europe/Berlin follow EU summer time (Directive 2000/84/EC, Articles 2 and 3):
 * clocks go forward on the last Sunday of March and back on the last Sunday of October, at 01:00 UTC.
 * In 2027 those Sundays are 28 March (02:00 local does not exist) and 31 October (02:00-03:00 local
 * happens twice).
 */
const labelsOf = (axis: ReturnType<typeof periodAxis>, hours: number) => (axis.tickSets[PERIOD_TICK_HOURS.indexOf(hours)] ?? []).map((t) => `${t.at}:${t.label}`);

describe('periodAxis: local clock time from the ISO strings', () => {
  it('an ordinary day of 96 quarter-hours: every 2 hours is 00:00 ... 22:00 and 24:00 at the end', () => {
    const axis = periodAxis(deliveryPeriods('2027-01-01', 'Europe/Berlin', 15), 'Europe/Berlin');
    expect(axis.bandLabels).toHaveLength(96);
    expect(axis.bandLabels[0]).toBe('00:00\u201300:15');
    expect(axis.bandLabels[95]).toBe('23:45\u201300:00');
    expect(labelsOf(axis, 2)).toEqual(['0:00:00', '8:02:00', '16:04:00', '24:06:00', '32:08:00', '40:10:00', '48:12:00', '56:14:00', '64:16:00', '72:18:00', '80:20:00', '88:22:00', '96:24:00']);
    expect(axis.title).toEqual({ label: 'start of delivery period', unit: 'local time, Europe/Berlin' });
  });

  it('the spring day (28 March 2027): 92 periods, no 02:00, 03:00 four periods after 01:00', () => {
    const axis = periodAxis(deliveryPeriods('2027-03-28', 'Europe/Berlin', 15), 'Europe/Berlin');
    expect(axis.bandLabels).toHaveLength(92);
    const hourly = labelsOf(axis, 1);
    expect(hourly.slice(0, 4)).toEqual(['0:00:00', '4:01:00', '8:03:00', '12:04:00']);
    expect(hourly.some((t) => t.endsWith(':02:00'))).toBe(false);
    expect(hourly[hourly.length - 1]).toBe('92:24:00');
    expect(axis.title.unit).toBe('local time, Europe/Berlin, UTC offset +01:00 then +02:00');
    expect(axis.bandLabels[7]).toBe('01:45\u201303:00 (UTC+01:00)');
  });

  it('the autumn day (31 October 2027): 100 periods, 02:00 twice, an hour apart', () => {
    const axis = periodAxis(deliveryPeriods('2027-10-31', 'Europe/Berlin', 15), 'Europe/Berlin');
    expect(axis.bandLabels).toHaveLength(100);
    expect(labelsOf(axis, 1).filter((t) => t.endsWith(':02:00'))).toEqual(['8:02:00', '12:02:00']);
    expect(axis.bandLabels[8]).toBe('02:00\u201302:15 (UTC+02:00)');
    expect(axis.bandLabels[12]).toBe('02:00\u201302:15 (UTC+01:00)');
  });

  it('an hourly market in a zone without clock changes', () => {
    const axis = periodAxis(deliveryPeriods('2027-06-15', 'Asia/Tokyo', 60), 'Asia/Tokyo');
    expect(axis.bandLabels).toHaveLength(24);
    expect(labelsOf(axis, 6)).toEqual(['0:00:00', '6:06:00', '12:12:00', '18:18:00', '24:24:00']);
  });

  it('reads the clock from the text, and refuses text without an offset', () => {
    expect(localTime('2027-03-28T03:00:00+02:00')).toEqual({ hour: 3, minute: 0, text: '03:00', offset: '+02:00' });
    expect(localTime('2027-01-01T12:30:00Z').offset).toBe('+00:00');
    expect(() => localTime('2027-01-01 12:30')).toThrow(/ISO 8601/);
  });
});

describe('categoryAxis', () => {
  it('candidate tick sets label every 1st, 2nd, 5th, 10th, 20th, 50th band, centred', () => {
    const labels = Array.from({ length: 30 }, (_, i) => `d${i}`);
    const axis = categoryAxis(labels, { label: 'delivery day', unit: 'YYYY-MM-DD' });
    expect(axis.tickSets.map((s) => s.length)).toEqual([30, 15, 6, 3, 2, 1]);
    expect(axis.tickSets[2]?.map((t) => t.label)).toEqual(['d0', 'd5', 'd10', 'd15', 'd20', 'd25']);
    expect(axis.tickSets[0]?.[0]?.at).toBe(0.5);
  });
});
