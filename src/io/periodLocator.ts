import type { DeliveryPeriod } from '../types.js';
import { locatePeriod, type DayCalendar, type LocatedPeriod } from '../market/dayCalendar.js';

/**
 * locatePeriod for the rows of a file, one after another, with the same answer for every timestamp
 * but without a parse or a zone lookup for the usual row.
 *
 * The calendar writes each period start of a day once (its zone offset found once for the day, or
 * period by period on a clock-change day), and the text of period t of day D is accepted by
 * locatePeriod as exactly (D, t) - no other text names that period with that offset. So a timestamp
 * whose characters equal the text of the period after the last one found (files in time order), or of
 * the period its clock time names on the same day (rows shuffled within a day), is that period;
 * anything else goes through locatePeriod itself, which also words every problem. The timestamp is
 * compared where it stands in the file's text: no string is cut from it unless it needs locatePeriod.
 */
export class PeriodLocator {
  /** The day and the periods of the last period found, and its index; index -1 before the first. */
  private day = '';
  private periods: readonly DeliveryPeriod[] = [];
  private index = -1;
  /** The day after `day` when its first period starts where `day` ends, else null (looked up once per day). */
  private following: { readonly day: string; readonly periods: readonly DeliveryPeriod[] } | null = null;

  constructor(private readonly calendar: DayCalendar) {}

  /** locatePeriod(text.slice(from, to), calendar). */
  locateAt(text: string, from: number, to: number): LocatedPeriod {
    return this.quick(text, from, to) ?? this.remember(locatePeriod(text.slice(from, to), this.calendar));
  }

  /** locatePeriod(stamp, calendar). */
  locate(stamp: string): LocatedPeriod {
    return this.quick(stamp, 0, stamp.length) ?? this.remember(locatePeriod(stamp, this.calendar));
  }

  /** The period whose calendar text stands at text[from, to): the next one, or one of the same day; else null. */
  private quick(text: string, from: number, to: number): LocatedPeriod | null {
    if (this.index < 0) return null;
    const next = this.index + 1;
    if (next < this.periods.length) {
      if (sameText(text, from, to, (this.periods[next] as DeliveryPeriod).start)) return this.found(this.day, this.periods, next);
    } else {
      const following = this.followingDay();
      if (following !== null && sameText(text, from, to, (following.periods[0] as DeliveryPeriod).start)) return this.found(following.day, following.periods, 0);
    }
    // The same day, out of order: the period its clock time names, if the calendar writes it so.
    if (to - from !== STAMP_LENGTH || !sameText(text, from, from + 10, this.day)) return null;
    const minutes = clockMinutes(text, from);
    const guess = minutes / this.calendar.periodMinutes;
    if (!Number.isInteger(guess) || guess >= this.periods.length) return null;
    return sameText(text, from, to, (this.periods[guess] as DeliveryPeriod).start) ? this.found(this.day, this.periods, guess) : null;
  }

  private found(day: string, periods: readonly DeliveryPeriod[], index: number): LocatedPeriod {
    if (day !== this.day) {
      this.day = day;
      this.periods = periods;
      this.following = null;
    }
    this.index = index;
    return { ok: true, day, index, startMs: (periods[index] as DeliveryPeriod).startMs };
  }

  /** Keeps what locatePeriod found as the last period (or forgets the last one when it found none). */
  private remember(located: LocatedPeriod): LocatedPeriod {
    if (!located.ok) {
      this.index = -1;
      return located;
    }
    if (located.day !== this.day) {
      this.day = located.day;
      this.periods = this.calendar.periods(located.day);
      this.following = null;
    }
    this.index = located.index;
    return located;
  }

  /** After a day's last period comes the first period of the day its end falls on (when it starts there). */
  private followingDay(): { readonly day: string; readonly periods: readonly DeliveryPeriod[] } | null {
    if (this.following === null) {
      const end = (this.periods[this.periods.length - 1] as DeliveryPeriod).end;
      const day = end.slice(0, 10);
      const periods = this.calendar.periodsIfValid(day);
      const first = periods === null || 'uncut' in periods ? undefined : periods[0];
      this.following = first !== undefined && first.start === end ? { day, periods: periods as readonly DeliveryPeriod[] } : NO_FOLLOWING;
    }
    return this.following === NO_FOLLOWING ? null : this.following;
  }
}

const NO_FOLLOWING = Object.freeze({ day: '', periods: [] as readonly DeliveryPeriod[] });

/** Length of the calendar's period text, e.g. 2027-03-28T03:00:00+02:00. */
const STAMP_LENGTH = 25;

/** Whether text[from, to) is `expected`, character for character. */
function sameText(text: string, from: number, to: number, expected: string): boolean {
  if (to - from !== expected.length) return false;
  for (let i = 0; i < expected.length; i++) if (text.charCodeAt(from + i) !== expected.charCodeAt(i)) return false;
  return true;
}

/** Clock minutes after midnight of a timestamp text at `from` (HH at 11, MM at 14); NaN when not digits. */
function clockMinutes(text: string, from: number): number {
  const digit = (at: number): number => {
    const code = text.charCodeAt(from + at) - 48;
    return code >= 0 && code <= 9 ? code : Number.NaN;
  };
  return (10 * digit(11) + digit(12)) * 60 + 10 * digit(14) + digit(15);
}
