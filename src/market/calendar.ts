import { DateTime, IANAZone } from 'luxon';
import type { DeliveryPeriod } from './deliveryPeriod.js';
import { dayNumber, dayText } from './civilDays.js';
import { offsetMinutes, steadyDay } from './steadyDays.js';

export { isValidDay } from './civilDays.js';

/**
 * The delivery periods of one delivery day in a market's IANA zone.
 *
 * A delivery day runs from local midnight to the next local midnight, so it lasts 23 or 25 hours on
 * clock-change days (92 or 100 quarter-hours in a zone that shifts by one hour). Periods are cut in
 * absolute time from the day's start; each is named by its start as ISO 8601 with the local offset,
 * e.g. `2027-03-28T03:00:00+02:00`.
 *
 * @param day YYYY-MM-DD
 * @param timeZone IANA zone, e.g. `Europe/Berlin`, `Australia/Adelaide`
 * @param periodMinutes 15, 30 or 60 [min]
 */
export function deliveryPeriods(day: string, timeZone: string, periodMinutes: number): DeliveryPeriod[] {
  const stepMs = periodMinutes * 60_000;
  // Most days: a steady offset, found from the day before by two offset lookups (steadyDays.ts).
  const steady = DAY_MS % stepMs === 0 ? steadyDay(day, timeZone, () => deliveryDayBounds(day, timeZone).startMs) : null;
  if (steady !== null) return cutPeriods(steady.startMs, steady.startMs + DAY_MS, stepMs, fixedOffsetFormatter(steady.offsetMin));
  const { startMs, endMs } = deliveryDayBounds(day, timeZone);
  if ((endMs - startMs) % stepMs !== 0) {
    throw new RangeError(`delivery day ${day} in ${timeZone} is not a whole number of ${periodMinutes}-minute periods`);
  }
  // Formatting through the zone database is slow; on days whose offset does not change (all but the
  // clock-change days) local time is UTC plus one fixed offset, so the text is built by arithmetic.
  const startOffset = offsetMinutes(startMs, timeZone);
  const fixed = startOffset === offsetMinutes(endMs, timeZone) && startOffset === offsetMinutes(endMs - 1, timeZone);
  return fixed ? cutPeriods(startMs, endMs, stepMs, fixedOffsetFormatter(startOffset)) : cutPeriodsThroughZone(startMs, endMs, stepMs, timeZone);
}

/**
 * The periods of [startMs, endMs) in steps of stepMs, named by `format`, always a fixedOffsetFormatter:
 * the compiled loop calls that one function; a clock-change day's other formatter, first passed in
 * March, would throw the compiled loop away (cutPeriodsThroughZone has its own).
 */
function cutPeriods(startMs: number, endMs: number, stepMs: number, format: (ms: number) => string): DeliveryPeriod[] {
  const periods: DeliveryPeriod[] = [];
  let start = format(startMs);
  for (let ms = startMs; ms < endMs; ms += stepMs) {
    const end = format(ms + stepMs);
    periods.push({ start, end, startMs: ms });
    start = end;
  }
  return periods;
}

/** cutPeriods for a day whose offset changes: each period named through the zone database. */
function cutPeriodsThroughZone(startMs: number, endMs: number, stepMs: number, timeZone: string): DeliveryPeriod[] {
  const periods: DeliveryPeriod[] = [];
  let start = formatInstant(startMs, timeZone);
  for (let ms = startMs; ms < endMs; ms += stepMs) {
    const end = formatInstant(ms + stepMs, timeZone);
    periods.push({ start, end, startMs: ms });
    start = end;
  }
  return periods;
}

/**
 * ISO 8601 local time for a fixed offset, e.g. `2027-06-15T10:00:00+02:00` (same text as formatInstant),
 * by day numbers and integer arithmetic; the date text of the last day asked is kept (a day's periods
 * share it). Years outside 0000 to 9999 are written through Date.
 */
function fixedOffsetFormatter(offsetMin: number): (ms: number) => string {
  const abs = Math.abs(offsetMin);
  const suffix = `${offsetMin < 0 ? '-' : '+'}${pad2(Math.floor(abs / 60))}:${pad2(abs % 60)}`;
  let lastDay = Number.NaN;
  let lastDate: string | null = null;
  const clocks = clockTexts(suffix);
  return (ms) => {
    // Whole milliseconds, as Date keeps them (offsets of local mean time are not whole minutes).
    const local = Math.trunc(ms + offsetMin * 60_000);
    const day = Math.floor(local / DAY_MS);
    if (day !== lastDay) {
      lastDay = day;
      lastDate = dayText(day);
    }
    if (lastDate === null) return formatWithOffset(ms, offsetMin);
    const inDay = local - day * DAY_MS;
    if (inDay % 60_000 === 0) {
      // A whole minute (every period start): its clock text is the same on every day with this offset.
      const minute = inDay / 60_000;
      return lastDate + (clocks[minute] ??= clockText(inDay, suffix));
    }
    return lastDate + clockText(inDay, suffix);
  };
}

/** `THH:MM:SS` and the offset suffix, for `inDay` milliseconds after local midnight. */
function clockText(inDay: number, suffix: string): string {
  return `T${pad2(Math.floor(inDay / 3_600_000))}:${pad2(Math.floor((inDay % 3_600_000) / 60_000))}:${pad2(Math.floor((inDay % 60_000) / 1000))}${suffix}`;
}

/** The clock texts of whole minutes of the day (index: minute of the day) by offset suffix, made as they are first asked. */
const CLOCK_TEXTS = new Map<string, (string | undefined)[]>();

function clockTexts(suffix: string): (string | undefined)[] {
  let texts = CLOCK_TEXTS.get(suffix);
  if (texts === undefined) {
    texts = new Array<string | undefined>(24 * 60).fill(undefined);
    CLOCK_TEXTS.set(suffix, texts);
  }
  return texts;
}

const DAY_MS = 86_400_000;

/** ISO 8601 local time for a fixed offset through Date (any year Date can hold). */
function formatWithOffset(ms: number, offsetMin: number): string {
  const local = new Date(ms + offsetMin * 60_000);
  const sign = offsetMin < 0 ? '-' : '+';
  const abs = Math.abs(offsetMin);
  return (
    `${String(local.getUTCFullYear()).padStart(4, '0')}-${pad2(local.getUTCMonth() + 1)}-${pad2(local.getUTCDate())}` +
    `T${pad2(local.getUTCHours())}:${pad2(local.getUTCMinutes())}:${pad2(local.getUTCSeconds())}` +
    `${sign}${pad2(Math.floor(abs / 60))}:${pad2(abs % 60)}`
  );
}

function pad2(n: number): string {
  return Number.isInteger(n) && n >= 0 && n < 60 ? (TWO_DIGITS[n] as string) : n < 10 ? `0${n}` : String(n);
}

const TWO_DIGITS: readonly string[] = Array.from({ length: 60 }, (_, n) => String(n).padStart(2, '0'));

/** Absolute start and end [epoch ms] of a delivery day (local midnight to next local midnight). */
export function deliveryDayBounds(day: string, timeZone: string): { startMs: number; endMs: number } {
  const start = DateTime.fromISO(day, { zone: timeZone }).startOf('day');
  if (!start.isValid) throw new RangeError(`not a valid day: ${day} (${start.invalidExplanation ?? 'invalid'})`);
  const end = start.plus({ days: 1 }).startOf('day');
  return { startMs: start.toMillis(), endMs: end.toMillis() };
}

/**
 * Whether a zone skipped `day` altogether: its clocks jumped over the whole date (e.g. Pacific/Apia
 * moved across the date line on 2011-12-30), so no instant has that local date and the day has no
 * delivery periods of its own.
 */
export function isSkippedDay(day: string, timeZone: string): boolean {
  return dayOfInstant(deliveryDayBounds(day, timeZone).startMs, timeZone) !== day;
}

/** ISO 8601 with the zone's offset at that instant, seconds kept, milliseconds dropped. */
export function formatInstant(ms: number, timeZone: string): string {
  const text = DateTime.fromMillis(ms, { zone: timeZone }).toISO({ suppressMilliseconds: true });
  if (text === null) throw new RangeError(`cannot format instant ${ms} in ${timeZone}`);
  // One spelling for a zero offset everywhere: +00:00 (luxon writes Z in UTC).
  return text.endsWith('Z') ? `${text.slice(0, -1)}+00:00` : text;
}

/** The delivery day (YYYY-MM-DD, local) that contains an instant. */
export function dayOfInstant(ms: number, timeZone: string): string {
  const text = DateTime.fromMillis(ms, { zone: timeZone }).toISODate();
  if (text === null) throw new RangeError(`cannot find the day of instant ${ms} in ${timeZone}`);
  return text;
}

/** The day after `day` (YYYY-MM-DD), calendar arithmetic. */
export function nextDay(day: string): string {
  return shiftDay(day, 1);
}

/** `day` shifted by `days` calendar days. */
export function shiftDay(day: string, days: number): string {
  // Days YYYY-MM-DD within years 0000 to 9999 by day numbers; anything else as the zone library has it.
  const number = Number.isInteger(days) ? dayNumber(day) : null;
  const shifted = number === null ? null : dayText(number + days);
  if (shifted !== null) return shifted;
  const text = DateTime.fromISO(day, { zone: 'UTC' }).plus({ days }).toISODate();
  if (text === null) throw new RangeError(`not a valid day: ${day}`);
  return text;
}

/** All days from `from` to `to`, both included. */
export function daysBetween(from: string, to: string): string[] {
  const days: string[] = [];
  for (let day = from; day <= to; day = nextDay(day)) days.push(day);
  return days;
}

/** Day of the week of a calendar day, 1 = Monday ... 7 = Sunday (ISO 8601). */
export function isoWeekday(day: string): number {
  return DateTime.fromISO(day, { zone: 'UTC' }).weekday;
}

export function isValidTimeZone(name: string): boolean {
  return IANAZone.isValidZone(name);
}
