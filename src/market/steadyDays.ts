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

  constructor(private readonly zone: Zone) {}

  offset(ms: number): number {
    for (let k = 0; k < 4; k++) if (this.recentMs[k] === ms) return this.recentOffset[k] as number;
    const offset = this.zone.offset(ms);
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
