/**
 * Calendar days YYYY-MM-DD of the proleptic Gregorian calendar as day numbers (days since 1970-01-01),
 * by integer arithmetic: the days-from-civil and civil-from-days algorithms of H. Hinnant (2013,
 * "chrono-Compatible Low-Level Date Algorithms"). The calendar walks days one by one, so it counts
 * them here rather than through the zone library.
 */

/** The day number of `day` when it is a valid YYYY-MM-DD (years 0000 to 9999), else null. */
export function dayNumber(day: string): number | null {
  if (day.length !== 10 || day.charCodeAt(4) !== 0x2d || day.charCodeAt(7) !== 0x2d) return null;
  const year = digitsAt(day, 0, 4);
  const month = digitsAt(day, 5, 2);
  const date = digitsAt(day, 8, 2);
  if (year < 0 || month < 1 || month > 12 || date < 1 || date > daysInMonth(year, month)) return null;
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const dayOfYear = Math.floor((153 * (month > 2 ? month - 3 : month + 9) + 2) / 5) + date - 1;
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146097 + dayOfEra - 719468;
}

/** Whether `text` is a day YYYY-MM-DD of the (proleptic Gregorian) calendar. */
export function isValidDay(text: string): boolean {
  return dayNumber(text) !== null;
}

/** The YYYY-MM-DD text of a day number, or null when its year is outside 0000 to 9999 (or it is no number). */
export function dayText(number: number): string | null {
  const z = number + 719468;
  const era = Math.floor(z / 146097);
  const dayOfEra = z - era * 146097;
  const yearOfEra = Math.floor((dayOfEra - Math.floor(dayOfEra / 1460) + Math.floor(dayOfEra / 36524) - Math.floor(dayOfEra / 146096)) / 365);
  const dayOfYear = dayOfEra - (365 * yearOfEra + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100));
  const shifted = Math.floor((5 * dayOfYear + 2) / 153);
  const date = dayOfYear - Math.floor((153 * shifted + 2) / 5) + 1;
  const month = shifted < 10 ? shifted + 3 : shifted - 9;
  const year = yearOfEra + era * 400 + (month <= 2 ? 1 : 0);
  if (!(year >= 0 && year <= 9999)) return null;
  return `${String(year).padStart(4, '0')}-${month < 10 ? '0' : ''}${month}-${date < 10 ? '0' : ''}${date}`;
}

function daysInMonth(year: number, month: number): number {
  if (month === 2) return year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0) ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

/** The decimal number written by `count` digits at `from`, or -1 when one of them is not a digit. */
function digitsAt(text: string, from: number, count: number): number {
  let value = 0;
  for (let i = from; i < from + count; i++) {
    const digit = text.charCodeAt(i) - 48;
    if (digit < 0 || digit > 9) return -1;
    value = value * 10 + digit;
  }
  return value;
}
