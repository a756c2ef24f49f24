import { Info, Settings, type Zone } from 'luxon';

/**
 * Years over which a market spec's zone is checked for clock shifts (inclusive): recent and coming
 * years, so that a zone is refused for a recurring uneven shift (half-hour daylight saving time) but not
 * for a one-off change of standard time decades ago. A day with a one-off uneven shift is still refused,
 * by the calendar, when a file names it.
 */
export const CLOCK_SHIFT_YEARS = Object.freeze({ from: 2020, to: 2040 });

const known = new Map<string, number | null>();

/**
 * The smallest clock shift of an IANA zone over CLOCK_SHIFT_YEARS that is not a multiple of
 * `periodMinutes` [min], or null when every shift is. A delivery day runs from local midnight to local
 * midnight, so a shift of 30 minutes (as in a zone with half-hour daylight saving time) makes a day of
 * 23.5 or 24.5 hours, which 60-minute periods cannot cut.
 *
 * Method: the offsets on 1 January and 1 July of each year (daylight saving time is in force on one of
 * them wherever it exists), and from each 1 January to the next (changes of standard time).
 */
export function unevenClockShift(timeZone: string, periodMinutes: number): number | null {
  const key = `${timeZone} ${periodMinutes}`;
  const cached = known.get(key);
  if (cached !== undefined) return cached;
  const found = firstUnevenShift(timeZone, periodMinutes);
  known.set(key, found);
  return found;
}

function firstUnevenShift(timeZone: string, periodMinutes: number): number | null {
  const zone = Info.normalizeZone(timeZone);
  const nowOffset = zone.offset(Settings.now());
  const offsets = new Map<number, number>();
  const offset = (year: number, month: number): number => {
    const key = year * 12 + month;
    let found = offsets.get(key);
    if (found === undefined) {
      found = wallClockOffset(zone, Date.UTC(year, month - 1, 1), nowOffset);
      offsets.set(key, found);
    }
    return found;
  };
  let uneven: number | null = null;
  const consider = (shift: number) => {
    const size = Math.abs(shift);
    if (size % periodMinutes !== 0 && (uneven === null || size < uneven)) uneven = size;
  };
  for (let year = CLOCK_SHIFT_YEARS.from; year <= CLOCK_SHIFT_YEARS.to; year++) {
    const january = offset(year, 1);
    consider(offset(year, 7) - january);
    if (year < CLOCK_SHIFT_YEARS.to) consider(offset(year + 1, 1) - january);
  }
  return uneven;
}

/**
 * The offset [min] of `timeZone` at the wall-clock time `localMs` (epoch ms of that local time read as
 * if it were UTC), as the zone library gives it for a date built from its fields:
 * `DateTime.fromObject({ year, month, day, hour, minute }, { zone }).offset`, without building the date
 * (test/market/clockShifts.test.ts compares the two).
 */
export function localTimeOffset(timeZone: string, localMs: number): number {
  const zone = Info.normalizeZone(timeZone);
  return wallClockOffset(zone, localMs, zone.offset(Settings.now()));
}

/**
 * luxon's own search (fixOffset): from the offset now, at most two lookups; in a skipped hour, the
 * offset after it.
 */
function wallClockOffset(zone: Zone, localMs: number, nowOffset: number): number {
  let utcGuess = localMs - nowOffset * 60_000;
  const second = zone.offset(utcGuess);
  if (second === nowOffset) return nowOffset;
  utcGuess -= (second - nowOffset) * 60_000;
  const third = zone.offset(utcGuess);
  return second === third ? second : Math.max(second, third);
}
