import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { BatteryModel, MarketSpec, QuantileDay } from '../../src/types.js';
import { BATTERY_LIMITS, batteryModel, parseBatterySpec } from '../../src/battery/batterySpec.js';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { planDay, type PlanResult } from '../../src/plan/planDay.js';
import { seedOf } from './mutations.js';

/**
 * The planner on random batteries (every field inside its valid range) and random quantile days,
 * including the clock-change days and negative prices: it returns an optimal schedule that keeps
 * every limit, or an infeasible (or unbounded) status with a reason; it never throws.
 */
const LEVELS = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95];

const marketArbitrary: fc.Arbitrary<MarketSpec> = fc.record({
  timeZone: fc.constantFrom('Europe/Berlin', 'Australia/Adelaide', 'America/New_York', 'UTC'),
  periodMinutes: fc.constantFrom(15 as const, 30 as const, 60 as const),
  priceFloor: fc.constantFrom(-500, -100, 0),
  priceCap: fc.constantFrom(300, 4000),
  currency: fc.constant('HLV'),
  gateClosure: fc.constant('12:00'),
});

/**
 * A battery spec as a user would write it, every field inside its documented range: energy from 1 kWh
 * to 10 GWh, charge and discharge power from 0.01 to 100 times the energy per hour (C-rates), as
 * powers of ten so that every scale is drawn as often, kept inside the powers' range [0.001, 100000] MW.
 */
const batterySpecArbitrary = fc
  .record({
    energyExponent: fc.double({ min: -3, max: 4, noNaN: true }),
    chargeRateExponent: fc.double({ min: -2, max: 2, noNaN: true }),
    dischargeRateExponent: fc.double({ min: -2, max: 2, noNaN: true }),
    efficiency: fc.oneof(
      fc.record({ roundTripEfficiency: fc.double({ min: 0.3, max: 1, noNaN: true }) }),
      fc.record({ chargeEfficiency: fc.double({ min: 0.5, max: 1, noNaN: true }), dischargeEfficiency: fc.double({ min: 0.5, max: 1, noNaN: true }) }),
    ),
    window: fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })),
    finalFloor: fc.boolean(),
    maxCyclesPerDay: fc.option(fc.double({ min: 0.05, max: 5, noNaN: true }), { nil: undefined }),
    degradationCostPerMwh: fc.double({ min: 0, max: 50, noNaN: true }),
  })
  .map(({ energyExponent, chargeRateExponent, dischargeRateExponent, efficiency, window, finalFloor, ...rest }) => {
    const energyMwh = 10 ** energyExponent;
    const [a, b, c, d] = window;
    const socMinFraction = Math.min(a, b) * 0.9;
    const socMaxFraction = Math.max(Math.max(a, b), socMinFraction + 0.05);
    const within = (x: number) => socMinFraction + x * (Math.min(1, socMaxFraction) - socMinFraction);
    return {
      ...rest,
      energyMwh,
      chargeMw: inPowerRange(energyMwh * 10 ** chargeRateExponent),
      dischargeMw: inPowerRange(energyMwh * 10 ** dischargeRateExponent),
      ...efficiency,
      socMinFraction,
      socMaxFraction: Math.min(1, socMaxFraction),
      socInitialFraction: within(c),
      ...(finalFloor ? { socFinalMinFraction: within(d) } : {}),
    };
  });

/** A power kept inside the battery spec's range of powers (BATTERY_LIMITS.powerMw). */
function inPowerRange(mw: number): number {
  const [lo, hi] = BATTERY_LIMITS.powerMw;
  return Math.min(hi, Math.max(lo, mw));
}

/** A quantile day: per period a random centre and spread, quantiles sorted, all inside [floor, cap]. */
function quantileDayArbitrary(market: MarketSpec): fc.Arbitrary<QuantileDay> {
  return fc.constantFrom('2027-03-28', '2027-06-15', '2027-10-31', '2027-04-04', '2027-11-07').chain((day) => {
    const periods = deliveryPeriods(day, market.timeZone, market.periodMinutes);
    const price = fc.double({ min: market.priceFloor, max: market.priceCap, noNaN: true });
    const row = fc.array(price, { minLength: LEVELS.length, maxLength: LEVELS.length }).map((p) => [...p].sort((x, y) => x - y));
    return fc.array(row, { minLength: periods.length, maxLength: periods.length }).map((prices) => ({ day, levels: LEVELS, periods, prices }));
  });
}

const caseArbitrary = marketArbitrary.chain((market) =>
  fc.record({
    market: fc.constant(market),
    spec: batterySpecArbitrary,
    forecast: quantileDayArbitrary(market),
    policy: fc.constantFrom('quantile' as const, 'median' as const, 'point' as const),
    alpha: fc.constantFrom(0.05, 0.1, 0.2, 0.25, 0.3, 0.45),
    socStart: fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: undefined }),
  }),
);

/** Checks every limit of docs/design.md section 4 on an optimal plan, to a tolerance relative to the sizes. */
function expectFeasible(result: Extract<PlanResult, { status: 'optimal' }>, battery: BatteryModel, market: MarketSpec): void {
  const { schedule } = result.outcome;
  const dt = result.problem.periodHours;
  const tolMw = 1e-6 * Math.max(1, battery.chargeMw, battery.dischargeMw);
  const tolMwh = 1e-6 * Math.max(1, battery.energyMwh);
  let soc = result.problem.socStartMwh;
  let fromStore = 0;
  schedule.chargeMw.forEach((c, t) => {
    const d = schedule.dischargeMw[t] as number;
    expect(c).toBeGreaterThanOrEqual(0);
    expect(d).toBeGreaterThanOrEqual(0);
    expect(c).toBeLessThanOrEqual(battery.chargeMw + tolMw);
    expect(d).toBeLessThanOrEqual(battery.dischargeMw + tolMw);
    expect(Math.min(c, d), 'charge and discharge in one period').toBeLessThanOrEqual(tolMw);
    soc += battery.chargeEfficiency * dt * c - (dt * d) / battery.dischargeEfficiency;
    fromStore += (dt * d) / battery.dischargeEfficiency;
    expect(Math.abs(soc - (schedule.socMwh[t] as number))).toBeLessThanOrEqual(tolMwh);
    expect(soc).toBeGreaterThanOrEqual(battery.socMinMwh - tolMwh);
    expect(soc).toBeLessThanOrEqual(battery.socMaxMwh + tolMwh);
  });
  expect(soc).toBeGreaterThanOrEqual(result.problem.socEndMinMwh - tolMwh);
  if (battery.maxFromStoreMwhPerDay !== undefined) expect(fromStore).toBeLessThanOrEqual(battery.maxFromStoreMwhPerDay + tolMwh);
  for (const order of result.orders) {
    expect(order.limitPrice).toBeGreaterThanOrEqual(market.priceFloor);
    expect(order.limitPrice).toBeLessThanOrEqual(market.priceCap);
    expect(order.quantityMw).toBeGreaterThan(0);
  }
  // Doing nothing is feasible when the end floor is not above the start, and earns 0: the optimum earns no less.
  if (result.problem.socEndMinMwh <= result.problem.socStartMwh) {
    expect(result.outcome.objective).toBeGreaterThanOrEqual(-1e-6 * Math.max(1, Math.abs(result.outcome.objective)));
  }
}

describe('the planner on random batteries and quantile days', () => {
  it('returns a feasible optimal schedule or a status with a reason, never throws', () => {
    fc.assert(
      fc.property(caseArbitrary, ({ market, spec, forecast, policy, alpha, socStart }) => {
        const parsed = parseBatterySpec(spec);
        expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
        if (!parsed.success) return;
        const battery = batteryModel(Object.freeze(parsed.data));
        const socStartMwh = socStart === undefined ? battery.socInitialMwh : battery.socMinMwh + socStart * (battery.socMaxMwh - battery.socMinMwh);
        const result = planDay({ forecast: Object.freeze(forecast), market: Object.freeze(market), battery, policy, alpha, socStartMwh });
        if (result.status === 'optimal') expectFeasible(result, battery, market);
        else expect(result.reason.length).toBeGreaterThan(10);
      }),
      { seed: seedOf('planner random batteries'), numRuns: 120 },
    );
  });
});
