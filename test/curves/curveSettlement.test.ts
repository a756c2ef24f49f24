import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { BatteryModel, MarketSpec } from '../../src/types.js';
import { curveStack, netSoldAt, netSoldFromStored, type StepCurve } from '../../src/curves/stepCurve.js';
import { settleDay } from '../../src/settle/settleDay.js';
import { dayBidOrders } from '../../src/backtest/dayBid.js';
import { ordersCsv } from '../../src/io/planOutputs.js';

// Curves in the auction and at the battery, period by period, worked out by hand from docs/design.md
// section 5.2 (acceptance: a buy iff clearing <= limit, a sell iff clearing >= limit, a tie accepted;
// cash at the clearing price; what the store cannot take or give is closed at the imbalance price).
//
// Battery: 10 MWh, charge 5 MW, discharge 4 MW, eta_c = eta_d = 0.8, window [1, 9] MWh, starts at 4 MWh,
// wear 2 per MWh discharged; one-hour periods; imbalance prices clearing + 10 (buy) and - 10 (sell).

const battery: BatteryModel = Object.freeze({
  energyMwh: 10, chargeMw: 5, dischargeMw: 4, chargeEfficiency: 0.8, dischargeEfficiency: 0.8, socMinMwh: 1, socMaxMwh: 9,
  socInitialMwh: 4, socFinalMinMwh: undefined, maxFromStoreMwhPerDay: undefined, degradationCostPerMwh: 2,
});
const market = { priceFloor: -500, priceCap: 3000 } as MarketSpec;

function settleOne(curve: StepCurve, clearing: number, socStartMwh = 4) {
  const day = settleCurveDay(curve, clearing, socStartMwh);
  return { profit: day.totals.profit, soc: day.socEndMwh, period: day.periods[0], totals: day.totals };
}

function settleCurveDay(curve: StepCurve, clearing: number, socStartMwh: number) {
  const day = settleDay({
    periodHours: 1, battery, socStartMwh, orders: [curveStack(curve, market)], clearingPricePerMwh: [clearing],
    imbalance: { buyPerMwh: [clearing + 10], sellPerMwh: [clearing - 10] }, unaccepted: 'follow-accepted',
  });
  return day;
}

describe('a step curve as a stack of limit orders', () => {
  // Curve: buy 4 MW below 20, nothing between 20 and 50, sell 3 MW from 50: y = (-4, 0, 3), breakpoints (20, 50).
  const curve: StepCurve = { breakpoints: [20, 50], netSoldMw: [-4, 0, 3] };

  it('is a buy of 4 MW limited at 20 and a sell of 3 MW limited at 50', () => {
    expect(curveStack(curve, market)).toEqual([
      { side: 'buy', quantityMw: 4, limitPrice: 20 },
      { side: 'sell', quantityMw: 3, limitPrice: 50 },
    ]);
  });

  it('clearing 10: the buy clears, 4 MWh at 10 = -40; the store takes 0.8 x 4 = 3.2 MWh: 4 -> 7.2', () => {
    const r = settleOne(curve, 10);
    expect(r.profit).toBeCloseTo(-40, 12);
    expect(r.soc).toBeCloseTo(7.2, 12);
  });

  it('clearing 30: nothing clears, nothing moves', () => {
    const r = settleOne(curve, 30);
    expect(r.profit).toBe(0);
    expect(r.soc).toBe(4);
    expect(r.period?.accepted).toBe(false);
  });

  it('clearing 60: the sell clears, +180; the store can give only (4 - 1) x 0.8 = 2.4 MWh, 0.6 MWh bought back at 70 = -42, wear 4.8: 133.2', () => {
    const r = settleOne(curve, 60);
    expect(r.profit).toBeCloseTo(180 - 42 - 4.8, 12);
    expect(r.soc).toBeCloseTo(1, 12);
    expect(r.period?.boughtImbalanceMwh).toBeCloseTo(0.6, 12);
  });

  it('clearing 60: the 0.6 MWh the store cannot give is deliberate imbalance: -42 at the imbalance price, 0.6 x (70 - 60) = 6 against clearing', () => {
    const { totals, period } = settleOne(curve, 60);
    expect(period?.deliberateImbalanceMwh).toBeCloseTo(0.6, 12);
    expect(totals.deliberateImbalanceMwh).toBeCloseTo(0.6, 12);
    expect(totals.deliberateImbalanceCash).toBeCloseTo(-42, 12);
    expect(totals.deliberateImbalancePeriods).toBe(1);
    expect(totals.imbalanceCostVsClearing).toBeCloseTo(6, 12);
  });

  it('clearing 10: everything cleared is delivered, no deliberate imbalance', () => {
    const { totals } = settleOne(curve, 10);
    expect([totals.deliberateImbalanceMwh, totals.deliberateImbalanceCash, totals.deliberateImbalancePeriods, totals.imbalanceCostVsClearing]).toEqual([0, 0, 0, 0]);
  });

  it('clearing exactly 50 (a tie): the sell is accepted: 150 - 0.6 x 60 - 4.8 = 109.2', () => {
    expect(settleOne(curve, 50).profit).toBeCloseTo(150 - 36 - 4.8, 12);
  });

  it('a curve crossing 0 at one breakpoint: buy 2 MW limited at 40 and sell 1 MW limited at 40', () => {
    const cross: StepCurve = { breakpoints: [40], netSoldMw: [-2, 1] };
    expect(curveStack(cross, market)).toEqual([
      { side: 'buy', quantityMw: 2, limitPrice: 40 },
      { side: 'sell', quantityMw: 1, limitPrice: 40 },
    ]);
    // 39: the buy, -78, store 1.6: 5.6. 41: the sell, +41, take 1 / 0.8 = 1.25: 2.75, wear 2: 39.
    expect(settleOne(cross, 39).profit).toBeCloseTo(-78, 12);
    expect(settleOne(cross, 39).soc).toBeCloseTo(5.6, 12);
    expect(settleOne(cross, 41).profit).toBeCloseTo(39, 12);
    expect(settleOne(cross, 41).soc).toBeCloseTo(2.75, 12);
    // 40 exactly: both accepted (the tie rule), 40 x (1 - 2) = -40, the net 1 MWh charged: 4.8.
    expect(settleOne(cross, 40).profit).toBeCloseTo(-40, 12);
    expect(settleOne(cross, 40).soc).toBeCloseTo(4.8, 12);
  });

  it('a flat curve is one order at the cap (buy) or the floor (sell), accepted at every price', () => {
    expect(curveStack({ breakpoints: [10, 20], netSoldMw: [-3, -3, -3] }, market)).toEqual([{ side: 'buy', quantityMw: 3, limitPrice: 3000 }]);
    expect(curveStack({ breakpoints: [], netSoldMw: [2] }, market)).toEqual([{ side: 'sell', quantityMw: 2, limitPrice: -500 }]);
  });

  it('law: at any clearing price off the breakpoints the stack clears exactly the curve (a battery large enough to take it)', () => {
    const big: BatteryModel = { ...battery, energyMwh: 1e6, chargeMw: 1e3, dischargeMw: 1e3, socMinMwh: 0, socMaxMwh: 1e6, degradationCostPerMwh: 0 };
    const curveArb = fc
      .tuple(fc.uniqueArray(fc.integer({ min: -200, max: 800 }), { minLength: 0, maxLength: 6 }), fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: 7, maxLength: 7 }))
      .map(([cuts, ys]) => {
        const breakpoints = [...cuts].sort((a, b) => a - b);
        const netSoldMw = ys.slice(0, breakpoints.length + 1).sort((a, b) => a - b);
        return { breakpoints, netSoldMw };
      });
    fc.assert(
      fc.property(curveArb, fc.integer({ min: -300, max: 900 }), (c, p) => {
        const price = p + 0.5; // never on an integer breakpoint
        const day = settleDay({
          periodHours: 1, battery: big, socStartMwh: 5e5, orders: [curveStack(c, market)], clearingPricePerMwh: [price],
          imbalance: { buyPerMwh: [price], sellPerMwh: [price] }, unaccepted: 'follow-accepted',
        });
        const t = day.totals;
        expect(Math.abs(t.soldAuctionMwh - t.boughtAuctionMwh - netSoldAt(c, price))).toBeLessThanOrEqual(2e-9);
        // a curve never buys and sells at once off a breakpoint
        expect(Math.min(t.soldAuctionMwh, t.boughtAuctionMwh)).toBe(0);
      }),
      { seed: 7, numRuns: 400 },
    );
  });

  it('stored energy to MW sold: a charge of 4 MWh in half an hour at eta_c 0.8 buys 10 MW; a discharge of 2 MWh sells 3.2 MW', () => {
    expect(netSoldFromStored(4, battery, 0.5)).toBeCloseTo(-10, 12);
    expect(netSoldFromStored(-2, battery, 0.5)).toBeCloseTo(3.2, 12);
    expect(netSoldFromStored(0, battery, 0.5)).toBe(0);
  });
});

describe('orders.csv of a day of curves: one row per step, with the period and the side', () => {
  // Two hourly periods. Period 1 carries the curve buy 4 MW below 20, sell 3 MW from 50 (y = -4, 0, 3);
  // period 2 the curve crossing 0 at 40 (y = -2, 1). Worked by hand from curveStack's rule: period 1 is
  // a buy of 4 limited at 20 and a sell of 3 limited at 50; period 2 a buy of 2 and a sell of 1, both
  // limited at 40. A row is accepted as the auction accepts an order (a buy iff clearing <= limit, a sell
  // iff clearing >= limit), so the accepted rows of a period sum to the curve's net quantity: period 1
  // at 10: -4, at 30: 0, at 60: +3; period 2 at 30: -2, at 45: +1.
  const periods = [
    { start: '2027-01-01T00:00:00+00:00', end: '2027-01-01T01:00:00+00:00', startMs: 0 },
    { start: '2027-01-01T01:00:00+00:00', end: '2027-01-01T02:00:00+00:00', startMs: 3_600_000 },
  ];
  const curves: StepCurve[] = [
    { breakpoints: [20, 50], netSoldMw: [-4, 0, 3] },
    { breakpoints: [40], netSoldMw: [-2, 1] },
  ];
  const text = ordersCsv(dayBidOrders(periods, curves.map((c) => curveStack(c, market))));

  it('writes the rows worked out by hand, buys first, quantile level empty', () => {
    expect(text).toBe(
      [
        'period_start,period_end,side,quantity_mw,limit_price,quantile_level',
        '2027-01-01T00:00:00+00:00,2027-01-01T01:00:00+00:00,buy,4,20,',
        '2027-01-01T00:00:00+00:00,2027-01-01T01:00:00+00:00,sell,3,50,',
        '2027-01-01T01:00:00+00:00,2027-01-01T02:00:00+00:00,buy,2,40,',
        '2027-01-01T01:00:00+00:00,2027-01-01T02:00:00+00:00,sell,1,40,',
        '',
      ].join('\n'),
    );
  });

  it('read back row by row, the accepted rows of each period sum to the hand-worked net quantity', () => {
    const rows = text.trimEnd().split('\n').slice(1).map((line) => line.split(','));
    const netSold = (periodStart: string, clearing: number): number =>
      rows
        .filter((r) => r[0] === periodStart)
        .reduce((sum, [, , side, quantity, limit]) => {
          const accepted = side === 'buy' ? clearing <= Number(limit) : clearing >= Number(limit);
          return accepted ? sum + (side === 'sell' ? 1 : -1) * Number(quantity) : sum;
        }, 0);
    const [first, second] = periods.map((p) => p.start) as [string, string];
    expect([netSold(first, 10), netSold(first, 30), netSold(first, 60)]).toEqual([-4, 0, 3]);
    expect([netSold(second, 30), netSold(second, 45)]).toEqual([-2, 1]);
  });
});
