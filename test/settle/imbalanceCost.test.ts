import { describe, expect, it } from 'vitest';
import type { BatteryModel, Side } from '../../src/types.js';
import { settleDay, type PeriodOrder, type UnacceptedRule } from '../../src/settle/settleDay.js';

// The two imbalance figures (issue: gross imbalance cash against the cost of imbalance against the
// clearing price) and the deliberate imbalance, on days settled by hand from docs/design.md section 5.
// The imbalance price here is an observed one (the same for energy bought and sold), so it may lie on
// either side of the clearing price. No number below comes from running the code.
//
// Battery: lossless (eta_c = eta_d = 1), charge and discharge 5 MW, window [0, 8] MWh, no wear; one-hour
// periods, so an order of q MW is q MWh.

const battery: BatteryModel = Object.freeze({
  energyMwh: 8,
  chargeMw: 5,
  dischargeMw: 5,
  chargeEfficiency: 1,
  dischargeEfficiency: 1,
  socMinMwh: 0,
  socMaxMwh: 8,
  socInitialMwh: 4,
  socFinalMinMwh: undefined,
  maxFromStoreMwhPerDay: undefined,
  degradationCostPerMwh: 0,
});

const o = (side: Side, quantityMw: number, limitPrice: number): PeriodOrder => Object.freeze({ side, quantityMw, limitPrice });

function settle(socStartMwh: number, orders: (PeriodOrder | null)[], clearing: number[], imbalance: number[], unaccepted: UnacceptedRule) {
  return settleDay(
    Object.freeze({
      periodHours: 1,
      battery,
      socStartMwh,
      orders: Object.freeze(orders),
      clearingPricePerMwh: Object.freeze(clearing),
      imbalance: Object.freeze({ buyPerMwh: Object.freeze(imbalance), sellPerMwh: Object.freeze(imbalance) }),
      unaccepted,
    }),
  );
}

describe('gross imbalance cash and the cost of imbalance against the clearing price (follow-plan)', () => {
  // From 4 MWh:
  // t0 buy 4 @ 30, clearing 35: not accepted; bought at the imbalance price 50: gross -200;
  //    against clearing it cost (50 - 35) x 4 = +60. Store 4 -> 8.
  // t1 sell 3 @ 60, clearing 55: not accepted; sold at the imbalance price 70: gross +210;
  //    against clearing it gained: -(70 - 55) x 3 = -45. Store 8 -> 5.
  // t2 sell 2 @ 40, clearing 45: accepted, auction +90, no imbalance. Store 5 -> 3.
  // t3 buy 1 @ 20, clearing 25: not accepted; bought at the imbalance price 5: gross -5 (it looks like a
  //    cost) although against clearing it gained: (5 - 25) x 1 = -20. Store 3 -> 4.
  // Gross imbalance cash: -200 + 210 - 5 = +5. Cost against clearing: 60 - 45 - 20 = -5 (a gain of 5).
  // Profit: auction 90 + gross 5 = 95; equally, clearing x (sold - bought) over all energy,
  // 55 x 3 + 45 x 2 - 35 x 4 - 25 x 1 = 90, minus the cost against clearing (-5) = 95.
  const day = settle(4, [o('buy', 4, 30), o('sell', 3, 60), o('sell', 2, 40), o('buy', 1, 20)], [35, 55, 45, 25], [50, 70, 30, 5], 'follow-plan');

  it('reports both figures as worked by hand', () => {
    expect(day.totals.imbalanceCash).toBeCloseTo(5, 12);
    expect(day.totals.imbalanceCostVsClearing).toBeCloseTo(-5, 12);
    expect(day.totals.auctionCash).toBeCloseTo(90, 12);
    expect(day.totals.profit).toBeCloseTo(95, 12);
    expect(day.periods.map((p) => p.socMwh)).toEqual([8, 5, 3, 4]);
  });

  it('unaccepted orders closed under follow-plan are no deliberate imbalance', () => {
    expect([day.totals.deliberateImbalanceMwh, day.totals.deliberateImbalanceCash, day.totals.deliberateImbalancePeriods]).toEqual([0, 0, 0]);
    expect(day.periods.map((p) => p.deliberateImbalanceMwh)).toEqual([0, 0, 0, 0]);
  });
});

describe('deliberate imbalance: accepted orders the battery cannot honour (follow-accepted)', () => {
  // From 1 MWh:
  // t0 buy 4 @ 30, clearing 35: not accepted; under follow-accepted nothing moves. Store stays 1.
  // t1 sell 3 @ 50, clearing 55: accepted, auction +165; the store holds 1 MWh, so 2 MWh are bought back
  //    at the imbalance price 70: -140, deliberate. Against clearing: (70 - 55) x 2 = +30. Store 1 -> 0.
  // t2 buy 5 @ 40, clearing 20: accepted, auction -100, store 0 -> 5.
  // t3 buy 5 @ 40, clearing 30: accepted, auction -150; room for 3 MWh only, so 2 MWh are sold back at
  //    the imbalance price 10: +20, deliberate. Against clearing: -(10 - 30) x 2 = +40. Store 5 -> 8.
  // Deliberate imbalance: 2 + 2 = 4 MWh in 2 periods, cash -140 + 20 = -120 (all of the gross imbalance
  // cash); cost against clearing 30 + 40 = 70. Profit: 165 - 100 - 150 - 120 = -205.
  const day = settle(1, [o('buy', 4, 30), o('sell', 3, 50), o('buy', 5, 40), o('buy', 5, 40)], [35, 55, 20, 30], [50, 70, 25, 10], 'follow-accepted');

  it('counts the energy, the periods and the cash', () => {
    expect(day.totals.deliberateImbalanceMwh).toBeCloseTo(4, 12);
    expect(day.totals.deliberateImbalancePeriods).toBe(2);
    expect(day.totals.deliberateImbalanceCash).toBeCloseTo(-120, 12);
    expect(day.periods.map((p) => p.deliberateImbalanceMwh)).toEqual([0, 2, 0, 2]);
  });

  it('and its cost against the clearing price', () => {
    expect(day.totals.imbalanceCash).toBeCloseTo(-120, 12);
    expect(day.totals.imbalanceCostVsClearing).toBeCloseTo(70, 12);
    expect(day.totals.profit).toBeCloseTo(-205, 12);
    expect(day.periods.map((p) => p.socMwh)).toEqual([1, 0, 5, 8]);
  });
});
