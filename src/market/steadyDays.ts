import { Info, type Zone } from 'luxon';
import { dayNumber } from './civilDays.js';

/**
 * Days of an IANA zone whose UTC offset holds throughout, found without the zone library's date
 * arithmetic: a day that starts at local midnight S (its first instant is midnight: the clocks did not
 * skip it) with offset o is steady when the offset is o at
 * S + 24 h - 1 ms, at S + 24 h and at S + 48 h - 1 ms. Its periods are then UTC plus o, its end is S +
 * 24 h, and that end is the next day's local midnight, which occurs once (no clock change within a
 * day of it), so the next day is checked from there: one day to the next costs two offset lookups
 * instead of the zone library's resolution of two local midnights. A day next to a clock change, or
 * the first day asked after a gap, is not steady here and goes the general way (calendar.ts).
 */

/** UTC offset of a zone at an instant [min], as the zone library gives it; lookups kept per zone. */
export function offsetMinutes(ms: number, timeZone: string): number {
  return zoneOf(timeZone).offset(ms);
}

/** A steady day: its start [epoch ms] and its offset [min]. */
export interface SteadyDay {
  readonly startMs: number;
  readonly offsetMin: number;
}

/**
 * `day` (YYYY-MM-DD) when it is steady in `timeZone`, else null. `localMidnight` gives the day's start
 * the general way, asked only when the day before was not found steady.
 */
export function steadyDay(day: string, timeZone: string, localMidnight: () => number): SteadyDay | null {
  const number = dayNumber(day);
  if (number === null) return null;
  const zone = zoneOf(timeZone);
  const startMs = zone.starts.get(number) ?? localMidnight();
  const offsetMin = zone.offset(startMs);
  // The general way's start is the day's first instant: not midnight on a day whose clocks skip it.
  if (startMs + offsetMin * 60_000 !== number * DAY_MS) return null;
  const endMs = startMs + DAY_MS;
  if (zone.offset(endMs - 1) !== offsetMin || zone.offset(endMs) !== offsetMin || zone.offset(endMs + DAY_MS - 1) !== offsetMin) return null;
  zone.starts.set(number + 1, endMs);
  return { startMs, offsetMin };
}

const DAY_MS = 86_400_000;

/** A zone's offset lookups (the last few instants asked: consecutive days ask the same ones) and the known starts of steady days' successors. */
class ZoneOffsets {
  /** Day number -> its local midnight [epoch ms], known from a steady day before it. */
  readonly starts = new Map<number, number>();
  private readonly recentMs = [Number.NaN, Number.NaN, Number.NaN, Number.NaN];
  private readonly recentOffset = [0, 0, 0, 0];
  private next = 0;

  /** The engine's formatter of the zone's offset at an instant, e.g. `2026, GMT+02:00` (null where it cannot make one). */
  private readonly offsetText: Intl.DateTimeFormat | null;

  constructor(private readonly zone: Zone) {
    this.offsetText = offsetFormatter(zone.name);
  }

  offset(ms: number): number {
    for (let k = 0; k < 4; k++) if (this.recentMs[k] === ms) return this.recentOffset[k] as number;
    const offset = this.offsetText === null ? this.zone.offset(ms) : (formattedOffset(this.offsetText.format(ms)) ?? this.zone.offset(ms));
    this.recentMs[this.next] = ms;
    this.recentOffset[this.next] = offset;
    this.next = (this.next + 1) & 3;
    return offset;
  }
}

const zones = new Map<string, ZoneOffsets>();

function zoneOf(timeZone: string): ZoneOffsets {
  let zone = zones.get(timeZone);
  if (zone === undefined) {
    zone = new ZoneOffsets(Info.normalizeZone(timeZone));
    zones.set(timeZone, zone);
  }
  return zone;
}

/**
 * A formatter of a zone's UTC offset in the engine's own time-zone data, the data the zone library
 * reads too: one formatted text per instant instead of the library's parts of a local date and time
 * turned back into an instant (some 20 times slower). Null when the engine cannot make one.
 */
function offsetFormatter(timeZone: string): Intl.DateTimeFormat | null {
  try {
    return new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'longOffset', year: 'numeric' });
  } catch {
    return null;
  }
}

const GMT_OFFSET = /GMT(?:([+\-\u2212])(\d{2}):(\d{2})(?::(\d{2}))?)?$/;

/**
 * The offset [min] in a text ending `GMT+HH:MM`, `GMT-HH:MM:SS` or `GMT` (zero), as the zone library
 * computes it: whole seconds of local time less whole seconds of UTC, divided by 60,000 ms (so
 * seconds / 60, the same correctly rounded quotient); null for any other text (the caller then asks the
 * zone library).
 */
export function formattedOffset(text: string): number | null {
  const match = GMT_OFFSET.exec(text);
  if (match === null) return null;
  if (match[1] === undefined) return 0;
  const seconds = Number(match[2]) * 3600 + Number(match[3]) * 60 + (match[4] === undefined ? 0 : Number(match[4]));
  if (seconds === 0) return 0;
  return match[1] === '+' ? seconds / 60 : -seconds / 60;
}
