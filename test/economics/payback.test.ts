import { describe, expect, it } from 'vitest';
import { annualiseProfit, discountedPayback, simplePayback } from '../../src/economics/index.js';

// The payback convention: flows at the end of each year, the crossing interpolated linearly within its
// year (common practice in project appraisal).
describe('simplePayback (end-of-year flows, linear within the year of the crossing)', () => {
  it('interpolates within the year: [-100, 30, 40, 50] pays back after 2 + 30/50 = 2.6 years (by hand)', () => {
    expect(simplePayback(Object.freeze([-100, 30, 40, 50]))).toEqual({ status: 'reached', years: 2.6 });
  });

  it('is a whole number of years when the cumulative flow hits zero at a year end, and 0 without investment', () => {
    expect(simplePayback([-100, 50, 50, 50])).toEqual({ status: 'reached', years: 2 });
    expect(simplePayback([0, 10])).toEqual({ status: 'reached', years: 0 });
  });

  it('takes the first crossing even if a later flow pulls the sum below zero again', () => {
    expect(simplePayback([-100, 100, -500, 10])).toEqual({ status: 'reached', years: 1 });
  });

  it("is 'never' when the cumulative flow stays below zero", () => {
    expect(simplePayback([-100, 30, 30, 30])).toMatchObject({ status: 'never', reason: expect.stringMatching(/3 years/) });
  });
});

describe('discountedPayback', () => {
  it('pays back [-100, 55, 60.5] at 10% after exactly 2 years (55/1.1 + 60.5/1.21 = 50 + 50, by hand)', () => {
    const result = discountedPayback(0.1, [-100, 55, 60.5]);
    expect(result.status).toBe('reached');
    if (result.status === 'reached') expect(result.years).toBeCloseTo(2, 12);
  });

  it('is no earlier than the simple payback for a positive rate, and equals it at rate 0', () => {
    const flows = [-100, 30, 40, 50, 60];
    const simple = simplePayback(flows);
    const discounted = discountedPayback(0.08, flows);
    expect(discountedPayback(0, flows)).toEqual(simple);
    // by hand: discounted flows 27.778, 34.294, 39.692 sum to 101.76 after 3 years, so payback is in year 3
    expect(discounted).toMatchObject({ status: 'reached' });
    if (simple.status === 'reached' && discounted.status === 'reached') {
      expect(discounted.years).toBeGreaterThan(simple.years);
      expect(discounted.years).toBeCloseTo(2 + (100 - 30 / 1.08 - 40 / 1.08 ** 2) / (50 / 1.08 ** 3), 12);
    }
  });

  it("is 'never' when discounting pushes the payback past the horizon", () => {
    expect(discountedPayback(0.1, [-100, 50, 50]).status).toBe('never');
    expect(() => discountedPayback(-1.5, [-100, 50])).toThrow(/invalid argument 'rate'/);
  });
});

describe('annualiseProfit (Julian year of 365.25 days)', () => {
  it('scales by 365.25 / daysCovered', () => {
    expect(annualiseProfit(1000, 1461)).toBe(250); // four years with one leap day
    expect(annualiseProfit(-73.05, 73.05)).toBeCloseTo(-365.25, 12);
    expect(annualiseProfit(500, 365.25)).toBe(500);
  });

  it('rejects zero days and a non-finite profit', () => {
    expect(() => annualiseProfit(1, 0)).toThrow(/invalid argument 'daysCovered'/);
    expect(() => annualiseProfit(Number.NaN, 10)).toThrow(/invalid argument 'profit'/);
  });
});
