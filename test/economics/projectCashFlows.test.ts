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
    // out at 3.33 years, after the end of life, so it is not replaced.
    const result = projectCashFlows(BASE);
    expect(result.capex).toBe(7000);
    expect(result.annualFixedOm).toBe(50);
    expect(result.replacementCost).toBe(6000);
    expect(result.replacementYears).toEqual([2]);
    expect(result.cashFlows).toEqual([-7000, 950, -5050, 950]);
  });

  it('has no replacement when the warranty throughput lasts the life, nor when it ends exactly at the end', () => {
    // 10 years * 400 cycles = 4000 cycles = lifeCycles: runs out exactly at the end of life.
    const exact = projectCashFlows({ ...BASE, lifeYears: 10, lifeCycles: 4000, cyclesPerYear: 400 });
    expect(exact.replacementYears).toEqual([]);
    expect(projectCashFlows({ ...BASE, lifeCycles: Infinity }).replacementYears).toEqual([]);
    expect(projectCashFlows({ ...BASE, cyclesPerYear: 0 }).replacementYears).toEqual([]);
  });

  it('replaces in the year the throughput runs out: 4000 cycles at 365 per year end in year 11 (10.96 years)', () => {
    const result = projectCashFlows({ ...BASE, lifeYears: 15, lifeCycles: 4000, cyclesPerYear: 365 });
    expect(result.replacementYears).toEqual([11]);
    expect(result.cashFlows[11]).toBe(1000 - 50 - 6000);
    expect(result.cashFlows[10]).toBe(950);
  });

  it('books two replacements in one year when a set lasts less than half a year', () => {
    // lifeCycles 100 at 250 per year: sets run out at 0.4, 0.8, 1.2, 1.6, 2.0 (end of life, not replaced).
    const result = projectCashFlows({ ...BASE, lifeYears: 2, lifeCycles: 100, cyclesPerYear: 250 });
    expect(result.replacementYears).toEqual([1, 1, 2, 2]);
    expect(result.cashFlows).toEqual([-7000, 950 - 12000, 950 - 12000]);
  });

  it('charges the replacement fraction of the energy capex', () => {
    const result = projectCashFlows({ ...BASE, replacementFraction: 0.6 });
    expect(result.replacementCost).toBeCloseTo(3600, 12);
    expect(result.cashFlows[2]).toBeCloseTo(950 - 3600, 12);
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
