/** Names of the months of the year, January first. */
export const MONTH_NAMES = Object.freeze(['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']);

/** Covered days [day] below which a yearly figure is scaled up from less than a year. */
export const DAYS_IN_A_YEAR = 365;

/** How much of a year the days behind a yearly figure cover (yearCoverage). */
export interface YearCoverage {
  /** Covered days n [day]. */
  readonly days: number;
  /** Calendar months YYYY-MM with at least one covered day, ascending. */
  readonly monthsCovered: readonly string[];
  /** Months of the year (January..December) without any covered day, in calendar order. */
  readonly monthsMissing: readonly string[];
  /** True when a figure x 365.25 / n is extrapolated: fewer than 365 covered days, or a month of the year missing. */
  readonly extrapolated: boolean;
}

/**
 * Whether yearly figures (x 365.25 / n, annualiseProfit.ts) are extrapolated from the covered days,
 * and which months they cover: a yearly figure stands for every season only when the days cover a whole
 * year, so it is extrapolated when there are fewer than 365 covered days or when some month of the year
 * has no covered day (electricity prices are seasonal: a winter quarter scaled to a year carries the
 * winter's spreads into the summer; common practice).
 *
 * @param days covered delivery days, YYYY-MM-DD, any order
 * @example
 * yearCoverage(['2026-01-01', '2026-02-01']).monthsMissing; // ['March', ..., 'December']
 */
export function yearCoverage(days: readonly string[]): YearCoverage {
  const months = [...new Set(days.map((day) => day.slice(0, 7)))].sort();
  const ofYear = new Set(months.map((month) => Number(month.slice(5, 7)) - 1));
  const monthsMissing = MONTH_NAMES.filter((_, m) => !ofYear.has(m));
  return { days: days.length, monthsCovered: months, monthsMissing, extrapolated: days.length < DAYS_IN_A_YEAR || monthsMissing.length > 0 };
}

/**
 * The warning a yearly figure carries when it is extrapolated (null when it is not): what was scaled, by
 * how much, from which months, and which months of the year are missing.
 *
 * @param figures what is scaled, e.g. `profitPerMwYear and profitPerMwhYear`
 * @example
 * // 90 days, 2026-01-01 to 2026-03-31:
 * // "profitPerMwYear ... are scaled x 365.25 / 90 = 4.06 from 90 covered days in 3 months (2026-01 to
 * //  2026-03); April, May, ... December are missing, so their prices never entered these figures"
 */
export function extrapolationWarning(coverage: YearCoverage, figures: string): string | null {
  if (!coverage.extrapolated) return null;
  const n = coverage.days;
  if (n === 0) return `${figures}: no covered day, no yearly figure`;
  const months = coverage.monthsCovered;
  const span = months.length === 1 ? (months[0] as string) : `${months[0] as string} to ${months[months.length - 1] as string}`;
  const factor = Math.round((365.25 / n) * 100) / 100;
  const missing =
    coverage.monthsMissing.length === 0
      ? 'every month of the year has a covered day, but fewer than 365 days are covered'
      : `${listText(coverage.monthsMissing)} ${coverage.monthsMissing.length === 1 ? 'is' : 'are'} missing, so ${coverage.monthsMissing.length === 1 ? 'its' : 'their'} prices never entered these figures (seasonal bias)`;
  return `${figures} are extrapolated to a year: scaled x 365.25 / ${n} = ${factor} from ${n} covered day${n === 1 ? '' : 's'} in ${months.length} month${months.length === 1 ? '' : 's'} (${span}); ${missing}`;
}

function listText(items: readonly string[]): string {
  if (items.length <= 2) return items.join(' and ');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1] as string}`;
}
