import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { BatterySpec, HistoryDay } from '../../src/types.js';
import { RunMemo, type PolicyRun } from '../../src/backtest/policyRun.js';
import { alphaSplit, chooseAlpha } from '../../src/sizing/alphaChoice.js';
import { scaledBatterySpec } from '../../src/sizing/scaledBattery.js';
import { sizeEconomics, type SizeCosts } from '../../src/sizing/sizeEconomics.js';
import { sizeSettingRow, type SizeSetting, type SizeStudy } from '../../src/sizing/sizeSettingRow.js';
import { batteryModel } from '../../src/battery/batterySpec.js';
import { irr } from '../../src/economics/irr.js';
import { npv } from '../../src/economics/npv.js';
import { randomMarketArb, type RandomMarket } from '../backtest/randomMarket.js';

// Laws of `quantbid size` on seeded small random markets (fast-check, fixed seeds; inputs only, never
// check values), and its economics against closed forms.

const SEED = 20260715;
const COSTS: SizeCosts = Object.freeze({ capexPerMwh: 1000, capexPerMw: 500, fixedOmPerMwYear: 20, lifeYears: 10, lifeCycles: null, discountRate: 0.07 });

/** A battery spec with a window, a start inside it, maybe a cycle cap and an end floor, a wear cost. */
const specArb: fc.Arbitrary<BatterySpec> = fc
  .record({
    energyMwh: fc.double({ min: 1, max: 20, noNaN: true }),
    powerMw: fc.double({ min: 0.5, max: 10, noNaN: true }),
    roundTrip: fc.double({ min: 0.6, max: 1, noNaN: true }),
    window: fc.tuple(fc.double({ min: 0, max: 0.3, noNaN: true }), fc.double({ min: 0.6, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })),
    cycles: fc.option(fc.double({ min: 0.3, max: 3, noNaN: true }), { nil: undefined }),
    deg: fc.double({ min: 0, max: 10, noNaN: true }),
  })
  .map((b) => {
    const [low, high, start] = b.window;
    return Object.freeze({
      energyMwh: b.energyMwh, chargeMw: b.powerMw, dischargeMw: b.powerMw, roundTripEfficiency: b.roundTrip,
      socMinFraction: low, socMaxFraction: high, socInitialFraction: low + start * (high - low),
      ...(b.cycles === undefined ? {} : { maxCyclesPerDay: b.cycles }), degradationCostPerMwh: b.deg,
    });
  });

function study(m: RandomMarket, spec: BatterySpec, alpha: SizeStudy['alpha'] = { method: 'fixed', alpha: 0.1 }): SizeStudy {
  return { market: m.market, batterySpec: spec, history: m.history, forecast: m.forecast, from: m.from, to: m.to, alpha, unaccepted: 'follow-plan', costs: COSTS };
}

function row(s: SizeStudy, setting: SizeSetting) {
  return sizeSettingRow(s, setting, new RunMemo<PolicyRun>());
}

const profitOf = (s: SizeStudy, energyMwh: number, powerMw: number): number => row(s, { energyMwh, powerMw, policy: 'perfect-foresight' }).profit as number;

/** The market with every realised price made positive (|p| + 1): each perfect-foresight day then ends at its floor. */
function positivePrices(m: RandomMarket): RandomMarket {
  const days = m.history.days.map((d): HistoryDay => ({ ...d, pricePerMwh: d.pricePerMwh.map((p) => Math.abs(p) + 1) }));
  return { ...m, history: { ...m.history, days } };
}

const slack = (x: number) => 1e-7 * Math.max(1, Math.abs(x));

describe('perfect-foresight profit over battery sizes', () => {
  it('never falls when energy grows at the same power, or power at the same energy (positive prices)', () => {
    // With prices > 0 no day ends above its floor, so each day starts from the same fraction of the
    // energy; a schedule of the smaller battery, its state of charge shifted by the larger start, is
    // then feasible for the larger one and earns the same (the window and the cycle cap only widen).
    fc.assert(
      fc.property(randomMarketArb(3), specArb, fc.double({ min: 1.01, max: 3, noNaN: true }), (market, spec, k) => {
        const s = study(positivePrices(market), spec);
        const base = profitOf(s, spec.energyMwh, spec.chargeMw);
        expect(profitOf(s, k * spec.energyMwh, spec.chargeMw)).toBeGreaterThanOrEqual(base - slack(base));
        expect(profitOf(s, spec.energyMwh, k * spec.chargeMw)).toBeGreaterThanOrEqual(base - slack(base));
      }),
      { seed: SEED, numRuns: 40, endOnFailure: true },
    );
  });

  it('doubles when energy and power double together, prices and window fractions fixed (negative prices too)', () => {
    // Every bound of the day LP, the start and the carried state of charge double, the prices stay: the
    // schedules double and so does the profit (the LP is positively homogeneous in its right-hand side).
    fc.assert(
      fc.property(randomMarketArb(3), specArb, (market, spec) => {
        const s = study(market, spec);
        const base = profitOf(s, spec.energyMwh, spec.chargeMw);
        const doubled = profitOf(s, 2 * spec.energyMwh, 2 * spec.chargeMw);
        expect(Math.abs(doubled - 2 * base)).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(2 * base)));
      }),
      { seed: SEED + 1, numRuns: 40, endOnFailure: true },
    );
  });
});

describe('sizeEconomics against closed forms', () => {
  const totals = { days: 1461, profit: 4 * 150_000, tradingCash: 4 * 160_000, dischargedMwh: 4 * 8000, equivalentFullCycles: 2000 };
  const size = { energyMwh: 20, powerMw: 10 };
  const costs: SizeCosts = { capexPerMwh: 30_000, capexPerMw: 20_000, fixedOmPerMwYear: 1000, lifeYears: 15, lifeCycles: null, discountRate: 0.07 };
  // Annuity factor a(r, n) = (1 - (1 + r)^-n) / r (present value of 1 a year for n years; Brealey, Myers
  // and Allen, Principles of Corporate Finance; tables give a(0.07, 15) = 9.1079, value from memory).
  const annuity = (r: number, n: number) => (1 - (1 + r) ** -n) / r;

  it('annualises by the Julian year and values the flows as capex plus an annuity (no replacement)', () => {
    const e = sizeEconomics(size, totals, costs);
    // 1461 days are 4 Julian years: a quarter of the profit, throughput and cycles per year.
    expect(e.profitPerYear).toBeCloseTo(150_000, 9);
    expect(e.cyclesPerYear).toBeCloseTo(500, 9);
    expect(e.throughputMwhPerYear).toBeCloseTo(8000, 9);
    expect(e.spreadPerMwhDischarged).toBeCloseTo(20, 12);
    expect(e.capex).toBe(20 * 30_000 + 10 * 20_000);
    expect(annuity(0.07, 15)).toBeCloseTo(9.1079, 4);
    expect(e.npv).toBeCloseTo(-800_000 + (150_000 - 10_000) * annuity(0.07, 15), 6);
    expect(e.replacements).toBe(0);
    // Simple payback of a level annuity: capex / yearly flow = 800000 / 140000 years.
    expect(e.simplePaybackYears).toBeCloseTo(800_000 / 140_000, 12);
    // IRR: the rate at which the same flows have NPV 0.
    expect(npv(e.irr as number, e.cashFlows)).toBeCloseTo(0, 6);
  });

  it('pays a cell replacement in each year the cells reach their life in cycles before the end of life', () => {
    // 500 cycles a year and cells of 2000 cycles: they run out at 4, 8 and 12 years (16 is past the life).
    // The set bought at 12 years lasts 4 and has 1 of them left at 15: residual value 1/4 of a replacement
    // (straight-line), credited in year 15.
    const e = sizeEconomics(size, totals, { ...costs, lifeCycles: 2000 });
    const replacement = 20 * 30_000;
    expect(e.replacements).toBe(3);
    expect(e.residualValue).toBeCloseTo(replacement / 4, 6);
    const closedForm = -800_000 + 140_000 * annuity(0.07, 15) - replacement * (1.07 ** -4 + 1.07 ** -8 + 1.07 ** -12) + (replacement / 4) * 1.07 ** -15;
    expect(e.npv).toBeCloseTo(closedForm, 6);
  });

  it('NPV falls as the discount rate rises for conventional flows (one outlay, then inflows)', () => {
    const values = [0, 0.02, 0.05, 0.07, 0.1, 0.2, 0.5].map((discountRate) => sizeEconomics(size, totals, { ...costs, discountRate }).npv);
    values.slice(1).forEach((v, i) => expect(v).toBeLessThan(values[i] as number));
    // At rate 0 NPV is the plain sum of the flows.
    expect(values[0]).toBeCloseTo(-800_000 + 15 * 140_000, 6);
  });

  it('has no IRR and pays back at once when nothing is invested (the flows never change sign)', () => {
    const e = sizeEconomics(size, totals, { ...costs, capexPerMwh: 0, capexPerMw: 0 });
    expect(irr(e.cashFlows).status).toBe('none');
    expect(e.irr).toBeNull();
    expect(e.simplePaybackYears).toBe(0);
  });
});

describe('--alpha best: choose on the earlier days, score on the later ones', () => {
  it('splits [from, to] into the first floor(n/2) days and the rest', () => {
    expect(alphaSplit('2026-01-01', '2026-01-05')).toEqual({ choose: { from: '2026-01-01', to: '2026-01-02' }, score: { from: '2026-01-03', to: '2026-01-05' } });
    // Two years: the first chooses, the second scores.
    expect(alphaSplit('2025-01-01', '2026-12-31')).toEqual({ choose: { from: '2025-01-01', to: '2025-12-31' }, score: { from: '2026-01-01', to: '2026-12-31' } });
    expect(() => alphaSplit('2026-01-01', '2026-01-01')).toThrow(RangeError);
  });

  const alphas = [0.1, 0.2, 0.3, 0.4];
  const best = { method: 'best' as const, alphas };

  /** The market with every realised price of the days from `day` on replaced by another draw. */
  function changedFrom(m: RandomMarket, day: string, factor: number, shift: number): RandomMarket {
    const days = m.history.days.map((d): HistoryDay => (d.day >= day ? { ...d, pricePerMwh: d.pricePerMwh.map((p, t) => factor * p + shift * ((t % 3) - 1)) } : d));
    return { ...m, history: { ...m.history, days } };
  }

  it('chooses the same alpha whatever the scored days hold, and scores exactly what that alpha earns there', () => {
    fc.assert(
      fc.property(randomMarketArb(4), specArb, fc.double({ min: 0.2, max: 3, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), (market, spec, factor, shift) => {
        const split = alphaSplit(market.from, market.to);
        const setting: SizeSetting = { energyMwh: spec.energyMwh, powerMw: spec.chargeMw, policy: 'quantile' };
        const chosen = row(study(market, spec, best), setting);
        const changed = row(study(changedFrom(market, split.score.from, factor, shift), spec, best), setting);
        expect(changed.alpha).toBe(chosen.alpha);
        // The choice is the argmax over the choosing days alone ...
        const battery = batteryModel(scaledBatterySpec(spec, setting));
        const choice = chooseAlpha({ ...market, battery, ...split.choose }, 'quantile', alphas, 'follow-plan');
        expect(chosen.alpha).toBe(choice.alpha);
        expect(Math.max(...choice.profits)).toBe(choice.profits[alphas.indexOf(choice.alpha)]);
        // ... and the scored profit is that alpha's fixed-alpha profit over the scoring days only.
        const fixed = row({ ...study(market, spec, { method: 'fixed', alpha: choice.alpha }), ...split.score }, setting);
        expect(chosen.profit).toBe(fixed.profit);
        expect(chosen.days).toBe(2);
      }),
      { seed: SEED + 2, numRuns: 25, endOnFailure: true },
    );
  });

  it('scores perfect foresight on the later days only: the choosing days do not change its row', () => {
    fc.assert(
      fc.property(randomMarketArb(4), specArb, (market, spec) => {
        const setting: SizeSetting = { energyMwh: spec.energyMwh, powerMw: spec.chargeMw, policy: 'perfect-foresight' };
        const before = row(study(market, spec, best), setting);
        // Change every day, then put the scoring days back: only the choosing days differ.
        const split = alphaSplit(market.from, market.to);
        const everyDay = changedFrom(market, market.from, 2, 10);
        const chooseOnly = { ...everyDay, history: { ...everyDay.history, days: everyDay.history.days.map((d, i) => (d.day >= split.score.from ? (market.history.days[i] as HistoryDay) : d)) } };
        expect(row(study(chooseOnly, spec, best), setting)).toEqual(before);
      }),
      { seed: SEED + 3, numRuns: 20, endOnFailure: true },
    );
  });
});

describe('scaledBatterySpec', () => {
  const spec: BatterySpec = Object.freeze({
    energyMwh: 10, chargeMw: 5, dischargeMw: 4, chargeEfficiency: 0.95, dischargeEfficiency: 0.9,
    socMinFraction: 0.05, socMaxFraction: 0.95, socInitialFraction: 0.5, socFinalMinFraction: 0.2, maxCyclesPerDay: 2, degradationCostPerMwh: 4,
  });

  it('sets energy and both powers, keeps fractions, cycle cap and wear cost, and does not touch its input', () => {
    expect(scaledBatterySpec(spec, { energyMwh: 30, powerMw: 12 })).toEqual({ ...spec, energyMwh: 30, chargeMw: 12, dischargeMw: 12 });
    const model = batteryModel(scaledBatterySpec(spec, { energyMwh: 30, powerMw: 12 }));
    // The cycle cap is per usable MWh: 2 x (0.95 - 0.05) x 30 MWh.
    expect(model.maxFromStoreMwhPerDay).toBeCloseTo(54, 12);
  });

  it('replaces split efficiencies by a given round trip, split as its square root', () => {
    const scaled = scaledBatterySpec(spec, { energyMwh: 10, powerMw: 5, roundTripEfficiency: 0.81 });
    expect(scaled.chargeEfficiency).toBeUndefined();
    expect(batteryModel(scaled).chargeEfficiency).toBeCloseTo(0.9, 15);
    expect(batteryModel(scaled).dischargeEfficiency).toBeCloseTo(0.9, 15);
  });
});
