import type { BandAxis, BandTick } from './chartTypes.js';

/** A delivery period as the axis needs it: ISO 8601 start and end with the market zone's offset. */
export interface PeriodBounds {
  readonly start: string;
  readonly end: string;
}

/** Hours between labelled ticks, densest first; the chart takes the first whose labels fit. */
export const PERIOD_TICK_HOURS: readonly number[] = Object.freeze([1, 2, 3, 4, 6, 12]);

const ISO_LOCAL = /^\d{4}-\d{2}-\d{2}T(\d{2}):(\d{2})(?::\d{2}(?:\.\d+)?)?([+-]\d{2}:\d{2}|Z)$/;

/**
 * Time axis over the delivery periods of a day, one band per period, labelled in local clock time
 * read from the ISO strings themselves (`2027-03-28T03:00:00+02:00` is 03:00), so clock-change days
 * come out right without a zone database: on the spring day 02:00 is missing, on the autumn day it
 * appears twice. Ticks sit at period starts on whole hours; the end of the day is labelled 24:00.
 * When the UTC offset changes within the periods, the axis title names both offsets.
 *
 * @param periods delivery periods in order
 * @param timeZone IANA zone named in the axis title, e.g. `Europe/Berlin`
 */
export function periodAxis(periods: readonly PeriodBounds[], timeZone: string): BandAxis {
  const starts = periods.map((p) => localTime(p.start));
  const ends = periods.map((p) => localTime(p.end));
  const offsets = [...new Set([...starts, ...ends].map((t) => t.offset))];
  const changes = offsets.length > 1;
  const bandLabels = periods.map((_, t) => {
    const s = starts[t] as LocalTime;
    const e = ends[t] as LocalTime;
    return `${s.text}\u2013${e.text}${changes ? ` (UTC${s.offset})` : ''}`;
  });
  const last = ends[ends.length - 1];
  const tickSets = PERIOD_TICK_HOURS.map((step) => {
    const ticks: BandTick[] = [];
    starts.forEach((s, t) => {
      if (s.minute === 0 && s.hour % step === 0) ticks.push({ at: t, label: s.text });
    });
    if (last !== undefined && last.minute === 0 && last.hour === 0) ticks.push({ at: periods.length, label: '24:00' });
    return ticks;
  });
  const unit = `local time, ${timeZone}${changes ? `, UTC offset ${offsets.join(' then ')}` : ''}`;
  return { kind: 'band', title: { label: 'start of delivery period', unit }, bandLabels, tickSets };
}

interface LocalTime {
  readonly hour: number;
  readonly minute: number;
  /** `HH:MM` */
  readonly text: string;
  /** `+02:00`; `Z` is written `+00:00` */
  readonly offset: string;
}

/** Local clock time of an ISO 8601 instant with offset, read from the text (no zone arithmetic). */
export function localTime(iso: string): LocalTime {
  const m = ISO_LOCAL.exec(iso);
  if (m === null) throw new RangeError(`not an ISO 8601 time with an offset: ${iso}`);
  const hh = m[1] as string;
  const mm = m[2] as string;
  const offset = m[3] === 'Z' ? '+00:00' : (m[3] as string);
  return { hour: Number(hh), minute: Number(mm), text: `${hh}:${mm}`, offset };
}
