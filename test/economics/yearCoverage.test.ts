import { describe, expect, it } from 'vitest';
import { extrapolationWarning, yearCoverage } from '../../src/economics/yearCoverage.js';
import { daysBetween } from '../../src/market/calendar.js';

// Yearly figures are x 365.25 / n (the Julian year; annualiseProfit.ts). They stand for a year only when
// the days cover one: fewer than 365 covered days, or a month of the year without a covered day, is an
// extrapolation that must say which months it rests on (electricity prices are seasonal; common practice).

describe('yearCoverage and its warning', () => {
  it('a winter quarter: extrapolated x 4.06, nine months missing', () => {
    // 2026-01-01 to 2026-03-31: 31 + 28 + 31 = 90 days; 365.25 / 90 = 4.0583 -> 4.06.
    const coverage = yearCoverage(daysBetween('2026-01-01', '2026-03-31'));
    expect(coverage).toEqual({
      days: 90,
      monthsCovered: ['2026-01', '2026-02', '2026-03'],
      monthsMissing: ['April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'],
      extrapolated: true,
    });
    expect(extrapolationWarning(coverage, 'profit per year')).toBe(
      'profit per year are extrapolated to a year: scaled x 365.25 / 90 = 4.06 from 90 covered days in 3 months (2026-01 to 2026-03); April, May, June, July, August, September, October, November and December are missing, so their prices never entered these figures (seasonal bias)',
    );
  });

  it('a whole year, a leap year, or a year across two calendar years: not extrapolated, no warning', () => {
    for (const [from, to, days] of [['2026-01-01', '2026-12-31', 365], ['2028-01-01', '2028-12-31', 366], ['2025-07-01', '2026-06-30', 365]] as const) {
      const coverage = yearCoverage(daysBetween(from, to));
      expect(coverage.days).toBe(days);
      expect(coverage.monthsMissing).toEqual([]);
      expect(coverage.extrapolated).toBe(false);
      expect(extrapolationWarning(coverage, 'x')).toBeNull();
    }
  });

  it('every month but fewer than 365 days: still extrapolated', () => {
    // 2026 without its 5 first days: 360 days, every month present; 365.25 / 360 = 1.0146 -> 1.01.
    const coverage = yearCoverage(daysBetween('2026-01-06', '2026-12-31'));
    expect(coverage.days).toBe(360);
    expect(extrapolationWarning(coverage, 'x')).toBe('x are extrapolated to a year: scaled x 365.25 / 360 = 1.01 from 360 covered days in 12 months (2026-01 to 2026-12); every month of the year has a covered day, but fewer than 365 days are covered');
  });

  it('two years with the same month missing from both: a month of the year is missing', () => {
    const days = daysBetween('2025-01-01', '2026-12-31').filter((day) => day.slice(5, 7) !== '08');
    const coverage = yearCoverage(days);
    expect(coverage.days).toBe(730 - 62);
    expect(coverage.monthsMissing).toEqual(['August']);
    expect(extrapolationWarning(coverage, 'x')).toMatch(/August is missing, so its prices never entered these figures/);
  });

  it('one day', () => {
    expect(extrapolationWarning(yearCoverage(['2026-03-01']), 'x')).toMatch(/^x are extrapolated to a year: scaled x 365.25 \/ 1 = 365.25 from 1 covered day in 1 month \(2026-03\);/);
  });
});
