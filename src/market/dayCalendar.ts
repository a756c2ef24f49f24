import type { DeliveryPeriod } from './deliveryPeriod.js';
import { dayOfInstant, deliveryPeriods, isValidDay, nextDay } from './calendar.js';

/** The periods of each delivery day of one market, computed once per day and kept. */
export class DayCalendar {
  private readonly cache = new Map<string, readonly DeliveryPeriod[]>();
  private static readonly shared = new Map<string, DayCalendar>();

  constructor(
    readonly timeZone: string,
    readonly periodMinutes: number,
  ) {}

  /**
   * The calendar of a zone and period length shared by everything in this thread, so that the readers
   * of a history and of a forecast hand out the same period lists (ten years of quarter-hours are
   * 350,000 periods, some 45 MB each time they are made). The lists are read-only, so sharing is safe.
   */
  static of(timeZone: string, periodMinutes: number): DayCalendar {
    const key = `${timeZone} ${periodMinutes}`;
    let calendar = DayCalendar.shared.get(key);
    if (calendar === undefined) {
      calendar = new DayCalendar(timeZone, periodMinutes);
      DayCalendar.shared.set(key, calendar);
    }
    return calendar;
  }

  periods(day: string): readonly DeliveryPeriod[] {
    let periods = this.cache.get(day);
    if (periods === undefined) {
      periods = deliveryPeriods(day, this.timeZone, this.periodMinutes);
      this.cache.set(day, periods);
    }
    return periods;
  }

  /**
   * The periods of `day`; null when `day` is not a valid YYYY-MM-DD date; a RangeError's message when
   * the day cannot be cut into whole periods (a zone that shifts its clocks by less than a period, or a
   * historical local mean time). Checked once per day.
   */
  periodsIfValid(day: string): readonly DeliveryPeriod[] | null | { readonly uncut: string } {
    const cached = this.cache.get(day);
    if (cached !== undefined) return cached;
    if (!isValidDay(day)) return null;
    try {
      return this.periods(day);
    } catch (err) {
      if (err instanceof RangeError) return { uncut: err.message };
      throw err;
    }
  }

  /** Period length [h]. */
  get periodHours(): number {
    return this.periodMinutes / 60;
  }
}

const STAMP = /^(\d{4}-\d{2}-\d{2})T(\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/;

export type LocatedPeriod =
  | { readonly ok: true; readonly day: string; readonly index: number; readonly startMs: number }
  | { readonly ok: false; readonly message: string; readonly fix: string };

/**
 * Finds which delivery day and period a `period_start` timestamp names. The timestamp must carry an
 * offset (or Z), must equal a period start of the day its local date names, and its offset must be
 * the market zone's offset at that instant (so a doubled autumn hour is told apart by its offset).
 */
export function locatePeriod(text: string, calendar: DayCalendar): LocatedPeriod {
  const match = STAMP.exec(text);
  if (match === null) {
    if (/^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2})?$/.test(text)) {
      return { ok: false, message: `timestamp "${text}" has no UTC offset`, fix: `write it as ISO 8601 with the offset of ${calendar.timeZone}, e.g. 2027-03-28T03:00:00+02:00` };
    }
    const shown = text.length > 60 ? `${text.slice(0, 60)}...` : text;
    return { ok: false, message: `"${shown}" is not an ISO 8601 timestamp`, fix: 'write period starts like 2027-03-28T03:00:00+02:00' };
  }
  const day = match[1] as string;
  if (match[2] === '24') {
    const next = calendar.periodsIfValid(nextDay(day));
    const start = next !== null && !('uncut' in next) ? next[0]?.start : undefined;
    return { ok: false, message: `"${text}" writes midnight as 24:00, which names no period start of ${day}`, fix: `write the next day's start at 00:00${start === undefined ? '' : `, here ${start}`}` };
  }
  const fraction = match[5];
  if (fraction !== undefined && /[1-9]/.test(fraction)) {
    return { ok: false, message: `"${text}" has a fraction of a second (${fraction}); a delivery period starts on a whole minute`, fix: 'write period starts without fractions of a second, e.g. 2027-03-28T03:00:00+02:00' };
  }
  const startMs = Date.parse(text);
  const periods = calendar.periodsIfValid(day);
  if (periods === null || Number.isNaN(startMs)) {
    return { ok: false, message: `"${text}" is not a valid date and time`, fix: 'check the date and the time of day' };
  }
  if ('uncut' in periods) {
    return { ok: false, message: periods.uncut, fix: `use a shorter periodMinutes in the market spec, or check the date` };
  }
  const first = periods[0];
  const stepMs = calendar.periodMinutes * 60_000;
  const offset = (match[6] as string) === 'Z' ? '+00:00' : normaliseOffset(match[6] as string);
  const position = first === undefined ? -1 : (startMs - first.startMs) / stepMs;
  const period = Number.isInteger(position) ? periods[position] : undefined;
  if (period === undefined) {
    const own = periodAt(startMs, calendar);
    if (own !== undefined) return offsetMismatch(text, offset, own, calendar);
    const aligned = Number.isInteger((startMs - (first?.startMs ?? 0)) / stepMs);
    return aligned
      ? { ok: false, message: `timestamp "${text}" is not in delivery day ${day} of ${calendar.timeZone}`, fix: `use the local time with the zone's offset on that date, e.g. ${periods[0]?.start ?? ''}` }
      : { ok: false, message: `timestamp "${text}" is not the start of a ${calendar.periodMinutes}-minute delivery period`, fix: `period starts fall on multiples of ${calendar.periodMinutes} minutes` };
  }
  if (offset !== period.start.slice(-6)) return offsetMismatch(text, offset, period, calendar);
  return { ok: true, day, index: position, startMs };
}

/** The period that starts at an instant, in whichever delivery day holds it, or undefined. */
function periodAt(startMs: number, calendar: DayCalendar): DeliveryPeriod | undefined {
  const periods = calendar.periodsIfValid(dayOfInstant(startMs, calendar.timeZone));
  if (periods === null || 'uncut' in periods) return undefined;
  return periods.find((p) => p.startMs === startMs);
}

/** A timestamp naming the start of `period` with another offset than the zone's at that instant. */
function offsetMismatch(text: string, offset: string, period: DeliveryPeriod, calendar: DayCalendar): LocatedPeriod {
  return {
    ok: false,
    message: `offset ${offset} in "${text}" does not match ${calendar.timeZone} on that date (${period.start.slice(-6)})`,
    fix: `write each period start with the zone's offset at that instant: this instant is ${period.start}`,
  };
}

function normaliseOffset(offset: string): string {
  return offset.includes(':') ? offset : `${offset.slice(0, 3)}:${offset.slice(3)}`;
}
