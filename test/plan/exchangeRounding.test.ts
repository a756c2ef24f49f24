import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exchangeSteps, roundDownToStep, roundLimit, roundSchedule, roundUpToStep, type ExchangeSteps } from '../../src/plan/exchangeRounding.js';
import { planDay } from '../../src/plan/planDay.js';
import { settleDay } from '../../src/settle/settleDay.js';
import type { DayProblem, MarketSpec, Schedule } from '../../src/types.js';
import { randomMarketArb } from '../backtest/randomMarket.js';
import { testBattery } from './testBattery.js';

// Exchange-ready orders (docs/design.md section 4.5): quantities down to the step so that the battery can
// always deliver them, orders below the minimum dropped, buy limits down and sell limits up to the tick.
// The hand-worked days below have one-hour periods, so q MW for a period is q MWh at the grid.

const STEPS = (quantityStepMw: number | null, minimumQuantityMw: number | null = null, priceTickPerMwh: number | null = null): ExchangeSteps =>
  Object.freeze({ quantityStepMw, minimumQuantityMw, priceTickPerMwh });

function problem(overrides: Partial<DayProblem> & { battery?: DayProblem['battery'] }, periods: number): DayProblem {
  return Object.freeze({
    periodHours: 1,
    buyPricePerMwh: new Array<number>(periods).fill(20),
    sellPricePerMwh: new Array<number>(periods).fill(60),
    battery: testBattery({ energyMwh: 4, socMaxMwh: 4, chargeMw: 4, dischargeMw: 4 }),
    socStartMwh: 0,
    socEndMinMwh: 0,
    ...overrides,
  });
}

const schedule = (chargeMw: number[], dischargeMw: number[], socMwh: number[]): Schedule => Object.freeze({ chargeMw, dischargeMw, socMwh });

describe('steps and ticks', () => {
  it('rounds on the decimal step, not on its binary approximation', () => {
    // 2.3 / 0.1 is 22.999999999999996 in binary floating point: still 23 steps.
    expect(roundDownToStep(2.3, 0.1)).toBe(2.3);
    expect(roundDownToStep(2.37, 0.1)).toBe(2.3);
    expect(roundUpToStep(2.31, 0.1)).toBe(2.4);
    expect(roundDownToStep(0.3, 0.1)).toBe(0.3); // 3 x 0.1 is 0.30000000000000004 unless written to the step's decimals
    expect(roundDownToStep(7.9, 2.5)).toBe(7.5);
    expect(roundDownToStep(0.049, 0.05)).toBe(0);
  });

  it('limits move in the safe direction: a buy down, a sell up, negative prices included', () => {
    // Tick 0.01: buy 45.678 -> 45.67, sell 45.671 -> 45.68. Tick 0.1 at negative prices: buy -12.345 ->
    // -12.4 (down is more negative), sell -12.345 -> -12.3. A price on the tick stays.
    expect(roundLimit('buy', 45.678, 0.01)).toBe(45.67);
    expect(roundLimit('sell', 45.671, 0.01)).toBe(45.68);
    expect(roundLimit('buy', -12.345, 0.1)).toBe(-12.4);
    expect(roundLimit('sell', -12.345, 0.1)).toBe(-12.3);
    expect(roundLimit('buy', 4000, 0.01)).toBe(4000);
    expect(roundLimit('sell', -500, 0.01)).toBe(-500);
  });

  it('a market spec without steps asks for no rounding', () => {
    const market: MarketSpec = { timeZone: 'UTC', periodMinutes: 60, priceFloor: -100, priceCap: 1000, currency: 'TST', gateClosure: '12:00' };
    expect(exchangeSteps(market)).toBeNull();
    expect(exchangeSteps({ ...market, priceTickPerMwh: 0.01 })).toEqual({ quantityStepMw: null, minimumQuantityMw: null, priceTickPerMwh: 0.01 });
  });
});

describe('roundSchedule on hand-worked days', () => {
  it('buys rounded down leave less in store, so the sale is capped at what the store holds', () => {
    // Lossless, window [0, 4] MWh, start 0, floor 0, step 0.1 MW. Planned: buy 0.95 MW in each of 4 hours
    // (3.8 MWh), sell 3.8 MW in hour 5. Buys round to 0.9 each: 3.6 MWh in store. Rounding the sale on its
    // own would keep 3.8 MW, 0.2 MWh more than the store holds; capped at 3.6 it is on the step already.
    // Value at buy 20 / sell 60: planned -20 x 3.8 + 60 x 3.8 = 152; rounded -20 x 3.6 + 60 x 3.6 = 144; loss 8.
    const p = problem({}, 5);
    const planned = schedule([0.95, 0.95, 0.95, 0.95, 0], [0, 0, 0, 0, 3.8], [0.95, 1.9, 2.85, 3.8, 0]);
    const r = roundSchedule(p, planned, STEPS(0.1));
    expect(r.schedule.chargeMw).toEqual([0.9, 0.9, 0.9, 0.9, 0]);
    expect(r.schedule.dischargeMw).toEqual([0, 0, 0, 0, 3.6]);
    expect(r.schedule.socMwh[4]).toBeCloseTo(0, 12);
    expect(r.boughtMwhRemoved).toBeCloseTo(0.2, 12);
    expect(r.soldMwhRemoved).toBeCloseTo(0.2, 12);
    expect([r.ordersDropped, r.socEndShortMwh]).toEqual([0, 0]);
  });

  it('a lossy day: the sale is cut further to give back the end-of-day floor', () => {
    // eta_c = eta_d = 0.9, window [0, 4] MWh, start 2 MWh, floor 2 MWh (the day's start), step 0.5 MW.
    // Planned: buy 1.45 MW (stores 1.305 MWh: 3.305), sell 1.1745 MW (takes 1.305 MWh: back to 2).
    // 1. Forward: the buy rounds to 1.0 MW (stores 0.9: 2.9 MWh); the store could give 2.9 x 0.9 = 2.61 MW,
    //    so the sale rounds to 1.0 MW, taking 1.0 / 0.9 = 1.1111 MWh: the day ends at 1.7889 MWh, 0.2111
    //    below the floor.
    // 2. Back to the floor: 0.2111 MWh in store is 0.2111 x 0.9 = 0.19 MW less sold: 1.0 - 0.19 = 0.81
    //    rounded down to the step is 0.5 MW, taking 0.5556 MWh: the day ends at 2.3444 MWh.
    // 3. Down to the floor: 0.3444 MWh too much, 0.3444 / 0.9 = 0.383 MW less bought; the buy would be
    //    1.0 - 0.383 = 0.617 MW, rounded up to the step 1.0: no cut possible (under one step). End 2.3444.
    // Value at buy 20 / sell 60: planned -29 + 70.47 = 41.47; rounded -20 + 30 = 10: loss 31.47.
    const battery = testBattery({ energyMwh: 4, socMaxMwh: 4, chargeMw: 4, dischargeMw: 4, chargeEfficiency: 0.9, dischargeEfficiency: 0.9 });
    const p = problem({ battery, socStartMwh: 2, socEndMinMwh: 2 }, 2);
    const r = roundSchedule(p, schedule([1.45, 0], [0, 1.1745], [3.305, 2]), STEPS(0.5));
    expect(r.schedule.chargeMw).toEqual([1, 0]);
    expect(r.schedule.dischargeMw).toEqual([0, 0.5]);
    expect(r.schedule.socMwh[1]).toBeCloseTo(2.9 - 0.5 / 0.9, 12);
    expect(r.socEndShortMwh).toBe(0);
    // With a minimum of 0.6 MW the 0.5 MW sale is dropped (the store has room for the 0.9 MWh kept); the
    // day would then end at 2.9, 0.9 MWh above the floor, which step 3 takes off the buy: 0.9 / 0.9 = 1.0 MW
    // less, i.e. none. Both orders are dropped: a round trip of 1.0 MW in, 0.5 MW out is not on offer.
    const min = roundSchedule(p, schedule([1.45, 0], [0, 1.1745], [3.305, 2]), STEPS(0.5, 0.6));
    expect(min.schedule.chargeMw).toEqual([0, 0]);
    expect(min.schedule.dischargeMw).toEqual([0, 0]);
    expect(min.ordersDropped).toBe(2);
    expect(min.schedule.socMwh[1]).toBeCloseTo(2, 12);
  });

  it('energy left above the floor is bought less, so that it does not stay in store for good', () => {
    // Lossless, window [0, 4], start 1, floor 1 (the start), step 0.25 MW. Planned: buy 2 MW, sell 1.9 MW,
    // buy 0.9 MW, sell 1.0 MW: ends at 1. Forward: 2 stays (soc 3), 1.9 -> 1.75 (soc 1.25), 0.9 -> 0.75
    // (soc 2.0), 1.0 stays (soc 1.0): ends on the floor, nothing to do. With the last sale planned at 0.9 MW
    // instead (the plan ends at 1.1, above its floor), the sale rounds to 0.75 and the day ends at 1.25,
    // 0.25 above the floor; the last buy is cut by 0.25 MW (the store holds at least 1.25 MWh after it)
    // to 0.5 MW: the day ends on the floor, 1.0.
    const p = problem({ socStartMwh: 1, socEndMinMwh: 1 }, 4);
    const exact = roundSchedule(p, schedule([2, 0, 0.9, 0], [0, 1.9, 0, 1.0], [3, 1.1, 2, 1]), STEPS(0.25));
    expect(exact.schedule.chargeMw).toEqual([2, 0, 0.75, 0]);
    expect(exact.schedule.dischargeMw).toEqual([0, 1.75, 0, 1]);
    expect(exact.schedule.socMwh[3]).toBeCloseTo(1, 12);
    const over = roundSchedule(p, schedule([2, 0, 0.9, 0], [0, 1.9, 0, 0.9], [3, 1.1, 2, 1.1]), STEPS(0.25));
    expect(over.schedule.chargeMw).toEqual([2, 0, 0.5, 0]);
    expect(over.schedule.dischargeMw).toEqual([0, 1.75, 0, 0.75]);
    expect(over.schedule.socMwh[3]).toBeCloseTo(1, 12);
  });
});

describe('planDay with the market\'s steps', () => {
  // Laws on seeded random markets (fast-check, fixed seed): every rounded quantity is a whole number of
  // steps and at least the minimum, every limit on the tick and on the safe side of the planned one, the
  // rounded orders are deliverable (settled with every order accepted, from the plan's start, the store
  // never falls short: no deliberate imbalance), and the plan without steps is the plan as before.
  const steps = { quantityStepMw: 0.1, minimumQuantityMw: 0.2, priceTickPerMwh: 0.5 };
  const onTick = (x: number, step: number) => Math.abs(x / step - Math.round(x / step)) < 1e-9;

  it('orders on the steps, deliverable, limits on the safe side; none of it without steps', () => {
    let withOrders = 0;
    fc.assert(
      fc.property(randomMarketArb(1), fc.constantFrom('quantile' as const, 'median' as const, 'point' as const), (m, policy) => {
        const forecast = m.forecast.days.get(m.from);
        if (forecast === undefined) return;
        const request = { forecast, market: m.market, battery: m.battery, policy, alpha: 0.1, socStartMwh: m.battery.socInitialMwh };
        const plain = planDay(request);
        const rounded = planDay({ ...request, market: { ...m.market, ...steps } });
        if (plain.status !== 'optimal' || rounded.status !== 'optimal') return;
        expect(plain.rounding).toBeNull();
        expect(rounded.rounding).not.toBeNull();
        const planned = new Map(plain.orders.map((o) => [o.periodStart, o]));
        if (rounded.orders.length > 0) withOrders++;
        for (const o of rounded.orders) {
          expect(onTick(o.quantityMw, 0.1), `${o.quantityMw}`).toBe(true);
          expect(o.quantityMw).toBeGreaterThanOrEqual(0.2 - 1e-12);
          expect(onTick(o.limitPrice, 0.5), `${o.limitPrice}`).toBe(true);
          const before = planned.get(o.periodStart);
          if (before !== undefined && before.side === o.side) {
            // Within 1e-9 of a step counts as on it (STEP_DUST in exchangeRounding.ts).
            expect(o.quantityMw).toBeLessThanOrEqual(before.quantityMw + 1e-9 * 0.1);
            if (o.side === 'buy') expect(o.limitPrice).toBeLessThanOrEqual(before.limitPrice + 1e-9 * 0.5);
            else expect(o.limitPrice).toBeGreaterThanOrEqual(before.limitPrice - 1e-9 * 0.5);
          }
        }
        const byPeriod = forecast.periods.map((p) => rounded.orders.find((o) => o.periodStart === p.start) ?? null);
        const accepted = byPeriod.map((o) => (o === null ? null : { ...o, limitPrice: o.side === 'buy' ? 1e9 : -1e9 }));
        const prices = forecast.periods.map(() => 50);
        const settled = settleDay({ periodHours: 1, battery: m.battery, socStartMwh: request.socStartMwh, orders: accepted, clearingPricePerMwh: prices, imbalance: { buyPerMwh: prices, sellPerMwh: prices }, unaccepted: 'follow-accepted' });
        expect(settled.totals.deliberateImbalanceMwh).toBe(0);
        const r = rounded.rounding;
        if (r === null) return;
        // The loss is the drop in value at the policy's prices; a floor short or a cut can only lower it
        // unless selling less was worth more (a sale at a price below the wear cost).
        expect(r.lossFromRounding).toBeCloseTo(r.valueBeforeRounding - r.valueAfterRounding, 9);
        expect(r.valueBeforeRounding).toBeCloseTo(plain.outcome.objective, 6);
        expect(rounded.outcome.objective).toBe(r.valueAfterRounding);
      }),
      { seed: 20260613, numRuns: 150 },
    );
    // The laws must have met rounded orders, or they test nothing.
    expect(withOrders).toBeGreaterThan(50);
  });
});
