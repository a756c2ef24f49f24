import { requireFinite, requirePositive } from '../stats/validate.js';

/** Days in a year for annualisation: the Julian year, 365.25 days, averaging leap years. */
export const DAYS_PER_YEAR = 365.25;

/**
 * Annualised profit of a backtest that covered `daysCovered` delivery days.
 *
 * Notes: annual = profit * 365.25 / daysCovered, with the Julian year of 365.25 days (so a backtest
 * of four calendar years, one of them a leap year, 1461 days, annualises to exactly a quarter of its
 * profit). It assumes the covered days represent the year (no seasonal correction).
 *
 * @param profit total profit over the covered days [currency], finite (may be negative)
 * @param daysCovered number of delivery days in the backtest [day], > 0
 * @returns profit per year [currency/year]
 * @example
 * annualiseProfit(1000, 1461); // 250
 *
 * Reference: IAU (the Julian year of 365.25 days of 86400 s), e.g. P. K. Seidelmann (ed.) (1992),
 * Explanatory Supplement to the Astronomical Almanac.
 */
export function annualiseProfit(profit: number, daysCovered: number): number {
  requireFinite('profit', profit);
  requirePositive('daysCovered', daysCovered);
  return (profit * DAYS_PER_YEAR) / daysCovered;
}
