import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { BatteryModel, DayProblem, MarketSpec, QuantileDay } from '../../src/types.js';
import { type DaySolverChoice, solveDay } from '../../src/plan/solveDay.js';
import { planDay } from '../../src/plan/planDay.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

// Laws of the planning LP (docs/design.md section 4) checked on seeded random days (fast-check, fixed seeds),
// through each of solveDay's two paths: the warehouse solver and the LP path (javascript-lp-solver
// with our branch and bound), so days are short (<= 12 periods) to keep the suite quick.

const batteryArb = fc.record({
  energyMwh: fc.double({ min: 1, max: 20, noNaN: true }),
  chargeMw: fc.double({ min: 0.5, max: 10, noNaN: true }),
  dischargeMw: fc.double({ min: 0.5, max: 10, noNaN: true }),
  eta: fc.double({ min: 0.7, max: 1, noNaN: true }),
  minFrac: fc.double({ min: 0, max: 0.3, noNaN: true }),
  maxFrac: fc.double({ min: 0.6, max: 1, noNaN: true }),
  startFrac: fc.double({ min: 0, max: 1, noNaN: true }),
  cycles: fc.option(fc.double({ min: 0.2, max: 3, noNaN: true }), { nil: undefined }),
  deg: fc.double({ min: 0, max: 10, noNaN: true }),
});

type BatteryDraw = typeof batteryArb extends fc.Arbitrary<infer T> ? T : never;

function model(b: BatteryDraw): BatteryModel {
  const socMinMwh = b.minFrac * b.energyMwh;
  const socMaxMwh = b.maxFrac * b.energyMwh;
  return {
    energyMwh: b.energyMwh,
    chargeMw: b.chargeMw,
    dischargeMw: b.dischargeMw,
    chargeEfficiency: b.eta,
    dischargeEfficiency: b.eta,
    socMinMwh,
    socMaxMwh,
    socInitialMwh: socMinMwh + b.startFrac * (socMaxMwh - socMinMwh),
    socFinalMinMwh: undefined,
    maxFromStoreMwhPerDay: b.cycles === undefined ? undefined : b.cycles * (socMaxMwh - socMinMwh),
    degradationCostPerMwh: b.deg,
  };
}

function problem(battery: BatteryModel, prices: readonly number[], spread = 0): DayProblem {
  return {
    periodHours: 0.25,
    buyPricePerMwh: prices.map((p) => p + spread),
    sellPricePerMwh: prices.map((p) => p - spread),
    battery,
    socStartMwh: battery.socInitialMwh,
    socEndMinMwh: battery.socInitialMwh,
  };
}

function objective(p: DayProblem, solver: DaySolverChoice): number {
  const outcome = solveDay(p, { solver });
  if (outcome.status !== 'optimal') throw new Error(`expected optimal, got ${outcome.status}`);
  return outcome.objective;
}

const prices = fc.array(fc.double({ min: -200, max: 400, noNaN: true }), { minLength: 1, maxLength: 12 });
const settings = { numRuns: 60, seed: 20270328 };

describe.each(['warehouse', 'lp'] as const)('planning laws through the %s path', (solver) => {
  it('scaling all prices and the degradation cost by k > 0 scales the objective by k', () => {
    fc.assert(
      fc.property(batteryArb, prices, fc.double({ min: 0.1, max: 10, noNaN: true }), (b, p, k) => {
        const battery = model(b);
        const base = objective(problem(battery, p, 3), solver);
        const scaled = objective(problem({ ...battery, degradationCostPerMwh: battery.degradationCostPerMwh * k }, p.map((x) => x * k), 3 * k), solver);
        expect(Math.abs(scaled - k * base)).toBeLessThanOrEqual(1e-7 * Math.max(1, Math.abs(k * base)));
      }),
      settings,
    );
  });

  it('with efficiency 1, no wear and the end held at the start, adding a constant to every price changes nothing', () => {
    // Energy bought equals energy sold when s_T = s_0 and eta = 1, so sum dt (p + k)(d - c) = sum dt p (d - c).
    // Prices stay >= 0 so that ending above the start never pays (the end floor then binds).
    fc.assert(
      fc.property(batteryArb, fc.array(fc.double({ min: 50, max: 300, noNaN: true }), { minLength: 1, maxLength: 12 }), fc.double({ min: -50, max: 50, noNaN: true }), (b, p, k) => {
        const battery = { ...model({ ...b, eta: 1, deg: 0 }) };
        const base = objective(problem(battery, p), solver);
        expect(Math.abs(objective(problem(battery, p.map((x) => x + k)), solver) - base)).toBeLessThanOrEqual(1e-7 * Math.max(1, Math.abs(base)));
      }),
      settings,
    );
  });

  it('more power or more energy never lowers the objective', () => {
    fc.assert(
      fc.property(batteryArb, prices, fc.double({ min: 1, max: 3, noNaN: true }), (b, p, grow) => {
        const battery = model(b);
        const base = objective(problem(battery, p, 2), solver);
        const tol = 1e-7 * Math.max(1, Math.abs(base));
        expect(objective(problem({ ...battery, chargeMw: battery.chargeMw * grow }, p, 2), solver)).toBeGreaterThanOrEqual(base - tol);
        expect(objective(problem({ ...battery, dischargeMw: battery.dischargeMw * grow }, p, 2), solver)).toBeGreaterThanOrEqual(base - tol);
        expect(objective(problem({ ...battery, socMaxMwh: battery.socMaxMwh * grow, energyMwh: battery.energyMwh * grow }, p, 2), solver)).toBeGreaterThanOrEqual(base - tol);
      }),
      settings,
    );
  });

});

describe('planning laws', () => {
  it('the quantile policy never plans a negative value when the battery may idle (end floor = start)', () => {
    const market: MarketSpec = { timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' };
    const periods = deliveryPeriods('2027-06-15', 'Europe/Berlin', 60);
    fc.assert(
      fc.property(batteryArb, fc.array(fc.tuple(fc.double({ min: -300, max: 500, noNaN: true }), fc.double({ min: 0, max: 80, noNaN: true })), { minLength: 24, maxLength: 24 }), fc.double({ min: 0.05, max: 0.45, noNaN: true }), (b, rows, alpha) => {
        const forecast: QuantileDay = { day: '2027-06-15', levels: [0.05, 0.5, 0.95], periods, prices: rows.map(([mid, half]) => [mid - half, mid, mid + half]) };
        const result = planDay({ forecast, market, battery: model(b), policy: 'quantile', alpha, socStartMwh: model(b).socInitialMwh });
        expect(result.status).toBe('optimal');
        if (result.status === 'optimal') expect(result.outcome.objective).toBeGreaterThanOrEqual(-1e-7);
      }),
      { numRuns: 25, seed: 7 },
    );
  });
});
