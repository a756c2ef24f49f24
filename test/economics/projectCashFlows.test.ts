import { describe, expect, it } from 'vitest';
import { annuityFactor, npv, projectCashFlows, type ProjectInput } from '../../src/economics/index.js';

const BASE: ProjectInput = Object.freeze({
  energyMwh: 20,
  powerMw: 10,
  capexPerMwh: 300,
  capexPerMw: 100,
  fixedOmPerMwYear: 5,
  annualProfit: 1000,
  lifeYears: 3,
  lifeCycles: 500,
  cyclesPerYear: 300,
});

describe('projectCashFlows', () => {
  it('builds the doc example by hand', () => {
    // capex = 300 * 20 + 100 * 10 = 7000; O&M = 5 * 10 = 50 per year; replacement = 300 * 20 = 6000.
    // Cells run out at 500/300 = 1.67 years -> replaced at the end of year 2; the second set would run
    // out at 3.33 years, after the end of life, so it is not replaced. At the end of year 3 that set has
    // run 3 - 1.67 = 1.33 of its 1.67 years: residual value 6000 x (1 + 1 - 3 x 300 / 500) = 6000 x 0.2 = 1200.
    const result = projectCashFlows(BASE);
    expect(result.capex).toBe(7000);
    expect(result.annualFixedOm).toBe(50);
    expect(result.replacementCost).toBe(6000);
    expect(result.replacementYears).toEqual([2]);
    expect(result.residualValue).toBeCloseTo(1200, 9);
    expect(result.cashFlows.slice(0, 3)).toEqual([-7000, 950, -5050]);
    expect(result.cashFlows[3]).toBeCloseTo(950 + 1200, 9);
  });

  it('has no replacement when the warranty throughput lasts the life, nor when it ends exactly at the end', () => {
    // 10 years * 400 cycles = 4000 cycles = lifeCycles: runs out exactly at the end of life.
    const exact = projectCashFlows({ ...BASE, lifeYears: 10, lifeCycles: 4000, cyclesPerYear: 400 });
    expect(exact.replacementYears).toEqual([]);
    expect(exact.residualValue).toBe(0);
    expect(projectCashFlows({ ...BASE, lifeCycles: Infinity }).replacementYears).toEqual([]);
    expect(projectCashFlows({ ...BASE, cyclesPerYear: 0 }).replacementYears).toEqual([]);
  });

  it('replaces in the year the throughput runs out: 4000 cycles at 365 per year end in year 11 (10.96 years)', () => {
    const result = projectCashFlows({ ...BASE, lifeYears: 15, lifeCycles: 4000, cyclesPerYear: 365 });
    expect(result.replacementYears).toEqual([11]);
    expect(result.cashFlows[11]).toBe(1000 - 50 - 6000);
    expect(result.cashFlows[10]).toBe(950);
    // The replacement starts at 4000 / 365 = 10.96 years and lasts 10.96 years; at 15 years it has 6.92
    // left: 6000 x (2 - 15 x 365 / 4000) = 6000 x 0.63125 = 3787.5, credited in year 15.
    expect(result.residualValue).toBeCloseTo(3787.5, 9);
    expect(result.cashFlows[15]).toBeCloseTo(950 + 3787.5, 9);
  });

  it('books two replacements in one year when a set lasts less than half a year', () => {
    // lifeCycles 100 at 250 per year: sets run out at 0.4, 0.8, 1.2, 1.6, 2.0 (end of life, not replaced).
    const result = projectCashFlows({ ...BASE, lifeYears: 2, lifeCycles: 100, cyclesPerYear: 250 });
    expect(result.replacementYears).toEqual([1, 1, 2, 2]);
    // The fourth replacement runs out exactly at the end of life: residual 6000 x (4 + 1 - 2 x 250 / 100) = 0.
    expect(result.residualValue).toBe(0);
    expect(result.cashFlows).toEqual([-7000, 950 - 12000, 950 - 12000]);
  });

  it('charges the replacement fraction of the energy capex', () => {
    const result = projectCashFlows({ ...BASE, replacementFraction: 0.6 });
    expect(result.replacementCost).toBeCloseTo(3600, 12);
    expect(result.cashFlows[2]).toBeCloseTo(950 - 3600, 12);
    // The residual value is of what was paid: 3600 x 0.2 = 720.
    expect(result.residualValue).toBeCloseTo(720, 9);
  });

  it('a replacement late in the life carries its residual value: the cash-flow table worked by hand', () => {
    // 20 MWh / 10 MW at 180,000 per MWh and 60,000 per MW, fixed O&M 8,000 per MW-year, profit 500,000 a
    // year, 15 years, cells for 6,000 cycles used at 520 a year, 7 % a year:
    //   capex = 180,000 x 20 + 60,000 x 10 = 4,200,000; O&M = 80,000 a year; R = 180,000 x 20 = 3,600,000.
    //   The cells run out at 6000 / 520 = 11.54 years: replaced at the end of year 12. The new set would last
    //   to 23.08 years; at 15 it has run 15 - 11.54 = 3.46 of its 11.54 years, so it keeps
    //   1 - 3.46 / 11.54 = 2 - 15 x 520 / 6000 = 0.7 of its value: residual 0.7 x 3,600,000 = 2,520,000.
    //   year      0           1..11     12           13, 14    15
    //   CF   -4,200,000     420,000   -3,180,000    420,000   420,000 + 2,520,000 = 2,940,000
    //   NPV = -4,200,000 + 420,000 x a(7 %, 15) - 3,600,000 / 1.07^12 + 2,520,000 / 1.07^15
    //       = -4,200,000 + 420,000 x 9.107914 - 3,600,000 / 2.252192 + 2,520,000 / 2.759032
    //       = -4,200,000 + 3,825,323.9 - 1,598,443.7 + 913,364.6 = -1,059,755.2
    //   (without the residual value, as before: -1,973,119.2, the replacement counted in full).
    const result = projectCashFlows({
      energyMwh: 20, powerMw: 10, capexPerMwh: 180_000, capexPerMw: 60_000, fixedOmPerMwYear: 8000, annualProfit: 500_000,
      lifeYears: 15, lifeCycles: 6000, cyclesPerYear: 520,
    });
    expect(result.replacementYears).toEqual([12]);
    expect(result.residualValue).toBeCloseTo(2_520_000, 6);
    const table = [-4_200_000, ...new Array<number>(11).fill(420_000), -3_180_000, 420_000, 420_000, 2_940_000];
    result.cashFlows.forEach((cf, y) => expect(cf, `year ${y}`).toBeCloseTo(table[y] as number, 6));
    expect(npv(0.07, result.cashFlows)).toBeCloseTo(-1_059_755.2, 1);
  });

  it('without replacements has NPV = -capex + (profit - O&M) * annuity factor (closed form)', () => {
    const input = { ...BASE, lifeYears: 12, lifeCycles: 6000, cyclesPerYear: 365 };
    const { cashFlows, capex, annualFixedOm } = projectCashFlows(input);
    expect(cashFlows).toHaveLength(13);
    expect(npv(0.07, cashFlows)).toBeCloseTo(-capex + (input.annualProfit - annualFixedOm) * annuityFactor(0.07, 12), 9);
  });

  it('rejects negative sizes, a fractional life and zero life cycles, naming the field', () => {
    expect(() => projectCashFlows({ ...BASE, energyMwh: -1 })).toThrow(/invalid argument 'input.energyMwh'/);
    expect(() => projectCashFlows({ ...BASE, lifeYears: 2.5 })).toThrow(/invalid argument 'input.lifeYears'/);
    expect(() => projectCashFlows({ ...BASE, lifeCycles: 0 })).toThrow(/invalid argument 'input.lifeCycles'/);
    expect(() => projectCashFlows({ ...BASE, annualProfit: Number.NaN })).toThrow(/'input.annualProfit'/);
    expect(() => projectCashFlows({ ...BASE, replacementFraction: -0.1 })).toThrow(/'input.replacementFraction'/);
  });
});
