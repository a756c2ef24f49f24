import { describe, expect, it } from 'vitest';
import type { BatteryModel, Side } from '../../src/types.js';
import { settleDay, type PeriodOrder, type UnacceptedRule } from '../../src/settle/settleDay.js';

// A week settled by hand: 7 short days of 4 one-hour periods, the same orders under both rules for
// unaccepted orders, the state of charge carried from day to day. Every number below is worked out in
// the comments from docs/design.md section 5 (acceptance, cash at the clearing price) and the conventions of
// settleDay; none comes from running the code.
//
// Battery: 10 MWh, charge 5 MW, discharge 4 MW, eta_c = eta_d = 0.8, window [1, 9] MWh, starts at 4 MWh,
// wear 2 per MWh discharged. Buying q MW for 1 h stores 0.8 q MWh; selling q MW takes q / 0.8 MWh.
// Imbalance rule: clearing + 10 for energy bought at imbalance, clearing - 10 for energy sold at imbalance.

const battery: BatteryModel = Object.freeze({
  energyMwh: 10,
  chargeMw: 5,
  dischargeMw: 4,
  chargeEfficiency: 0.8,
  dischargeEfficiency: 0.8,
  socMinMwh: 1,
  socMaxMwh: 9,
  socInitialMwh: 4,
  socFinalMinMwh: undefined,
  maxFromStoreMwhPerDay: undefined,
  degradationCostPerMwh: 2,
});
const PENALTY = 10;

const o = (side: Side, quantityMw: number, limitPrice: number): PeriodOrder => Object.freeze({ side, quantityMw, limitPrice });

interface HandDay {
  readonly prices: readonly number[];
  readonly orders: readonly (PeriodOrder | null)[];
  /** Accepted per period (null: no order): the same under both rules. */
  readonly accepted: readonly (boolean | null)[];
  /** Profit per period and state of charge at the end of each period, per rule. */
  readonly expected: Readonly<Record<UnacceptedRule, { readonly profit: readonly number[]; readonly soc: readonly number[] }>>;
}

const week: readonly HandDay[] = [
  {
    // Day 1, all accepted: buy 5 @ 25 clears at 20 (20 <= 25): pays 20 x 5 = 100, stores 4 -> 8 MWh.
    // Sell 4 @ 85 clears at 90 (90 >= 85): receives 90 x 4 = 360, wear 2 x 4 = 8, takes 5 -> 3 MWh. Both rules alike.
    prices: [20, 30, 80, 90],
    orders: [o('buy', 5, 25), null, null, o('sell', 4, 85)],
    accepted: [true, null, null, true],
    expected: {
      'follow-plan': { profit: [-100, 0, 0, 352], soc: [8, 8, 8, 3] },
      'follow-accepted': { profit: [-100, 0, 0, 352], soc: [8, 8, 8, 3] },
    },
  },
  {
    // Day 2, buy 5 @ 30 not accepted (35 > 30), sell 4 @ 65 accepted (70 >= 65).
    // follow-plan, from 3: the buy is bought at imbalance 35 + 10 = 45: -225, 3 -> 7; sell +280 - 8 wear, 7 -> 2.
    // follow-accepted, from 3: no buy. The store can give (3 - 1) x 0.8 = 1.6 MWh of the 4 sold: wear 2 x 1.6 = 3.2,
    // 3 -> 1; the missing 2.4 MWh are bought back at 70 + 10 = 80: -192. Period: 280 - 192 - 3.2 = 84.8.
    prices: [40, 35, 70, 60],
    orders: [null, o('buy', 5, 30), o('sell', 4, 65), null],
    accepted: [null, false, true, null],
    expected: {
      'follow-plan': { profit: [0, -225, 272, 0], soc: [3, 7, 2, 2] },
      'follow-accepted': { profit: [0, 0, 84.8, 0], soc: [3, 3, 1, 1] },
    },
  },
  {
    // Day 3, buy 5 @ 20 accepted (10 <= 20), sell 4 @ 55 not accepted (45 < 55).
    // follow-plan, from 2: -50, 2 -> 6; the sell is sold at imbalance 45 - 10 = 35: +140 - 8 wear, 6 -> 1.
    // follow-accepted, from 1: -50, 1 -> 5; no sell: 5 MWh carried to day 4.
    prices: [10, 15, 50, 45],
    orders: [o('buy', 5, 20), null, null, o('sell', 4, 55)],
    accepted: [true, null, null, false],
    expected: {
      'follow-plan': { profit: [-50, 0, 0, 132], soc: [6, 6, 6, 1] },
      'follow-accepted': { profit: [-50, 0, 0, 0], soc: [5, 5, 5, 5] },
    },
  },
  {
    // Day 4, everything accepted: buy 5 @ 20 at 15, buy 5 @ 20 at 12, sell 4 @ 60 at 70, sell 2.4 @ 60 at 80.
    // follow-plan, from 1: -75 (1 -> 5), -60 (5 -> 9), +280 - 8 (9 -> 4), +192 - 4.8 (4 -> 1).
    // follow-accepted, from 5: -75 (5 -> 9); the second buy finds the store full: 5 MWh bought at 12 (-60)
    // cannot be stored and are sold back at 12 - 10 = 2 (+10): -50, stays 9; then +272 (9 -> 4), +187.2 (4 -> 1).
    prices: [15, 12, 70, 80],
    orders: [o('buy', 5, 20), o('buy', 5, 20), o('sell', 4, 60), o('sell', 2.4, 60)],
    accepted: [true, true, true, true],
    expected: {
      'follow-plan': { profit: [-75, -60, 272, 187.2], soc: [5, 9, 4, 1] },
      'follow-accepted': { profit: [-75, -50, 272, 187.2], soc: [9, 9, 4, 1] },
    },
  },
  {
    // Day 5, nothing accepted: buy 5 @ 30 at 50, sell 3.2 @ 100 at 90.
    // follow-plan, from 1: bought at 50 + 10 = 60: -300 (1 -> 5); sold at 90 - 10 = 80: 256 - 6.4 wear (5 -> 1).
    // follow-accepted: the battery does not move, nothing is paid.
    prices: [50, 40, 90, 70],
    orders: [o('buy', 5, 30), null, o('sell', 3.2, 100), null],
    accepted: [false, null, false, null],
    expected: {
      'follow-plan': { profit: [-300, 0, 249.6, 0], soc: [5, 5, 1, 1] },
      'follow-accepted': { profit: [0, 0, 0, 0], soc: [1, 1, 1, 1] },
    },
  },
  {
    // Day 6, a negative price: buy 5 @ 0 clears at -20 (accepted): the buyer is paid 20 x 5 = +100 (1 -> 5;
    // a negative clearing price pays the buyer: cash = -price x quantity, common practice in day-ahead auctions);
    // sell 3.2 @ 35 at 40: +128 - 6.4 (5 -> 1). Both rules alike.
    prices: [-20, 10, 30, 40],
    orders: [o('buy', 5, 0), null, null, o('sell', 3.2, 35)],
    accepted: [true, null, null, true],
    expected: {
      'follow-plan': { profit: [100, 0, 0, 121.6], soc: [5, 5, 5, 1] },
      'follow-accepted': { profit: [100, 0, 0, 121.6], soc: [5, 5, 5, 1] },
    },
  },
  {
    // Day 7, ties: buy 5 @ 30 clears at 30, sell 3.2 @ 55 clears at 55: both accepted (an order whose limit
    // equals the clearing price is accepted: common practice in day-ahead auctions).
    // -150 (1 -> 5), 3.2 x 55 = 176 - 6.4 (5 -> 1). Both rules alike.
    prices: [30, 30, 55, 50],
    orders: [null, o('buy', 5, 30), o('sell', 3.2, 55), null],
    accepted: [null, true, true, null],
    expected: {
      'follow-plan': { profit: [0, -150, 169.6, 0], soc: [1, 5, 1, 1] },
      'follow-accepted': { profit: [0, -150, 169.6, 0], soc: [1, 5, 1, 1] },
    },
  },
];

// Week totals by hand: follow-plan 252 + 47 + 82 + 324.2 - 50.4 + 221.6 + 19.6 = 896;
// follow-accepted 252 + 84.8 - 50 + 334.2 + 0 + 221.6 + 19.6 = 862.2.
const WEEK_PROFIT: Record<UnacceptedRule, number> = { 'follow-plan': 896, 'follow-accepted': 862.2 };

// The imbalance figures of the week by hand. Under clearing +- 10 every MWh at the imbalance price costs
// exactly 10 against the clearing price. follow-plan: unaccepted orders on day 2 (buy 5), day 3 (sell 4) and
// day 5 (buy 5, sell 3.2): 17.2 MWh, cost 172; gross cash -225 + 140 - 300 + 256 = -129; no deliberate
// imbalance (the store never runs out). follow-accepted: only deliberate imbalance, day 2 (2.4 MWh bought
// back at 80: -192) and day 4 (5 MWh sold back at 2: +10): 7.4 MWh in 2 periods, cash -182, cost 74.
const WEEK_IMBALANCE: Record<UnacceptedRule, { gross: number; cost: number; deliberateMwh: number; deliberatePeriods: number; deliberateCash: number }> = {
  'follow-plan': { gross: -129, cost: 172, deliberateMwh: 0, deliberatePeriods: 0, deliberateCash: 0 },
  'follow-accepted': { gross: -182, cost: 74, deliberateMwh: 7.4, deliberatePeriods: 2, deliberateCash: -182 },
};

function settleWeek(unaccepted: UnacceptedRule) {
  let soc = battery.socInitialMwh;
  return week.map((day) => {
    const settled = settleDay(
      Object.freeze({
        periodHours: 1,
        battery,
        socStartMwh: soc,
        orders: Object.freeze([...day.orders]),
        clearingPricePerMwh: Object.freeze([...day.prices]),
        imbalance: Object.freeze({ buyPerMwh: Object.freeze(day.prices.map((p) => p + PENALTY)), sellPerMwh: Object.freeze(day.prices.map((p) => p - PENALTY)) }),
        unaccepted,
      }),
    );
    soc = settled.socEndMwh;
    return settled;
  });
}

describe.each(['follow-plan', 'follow-accepted'] as const)('a hand-settled week, %s', (unaccepted) => {
  const settled = settleWeek(unaccepted);

  it.each(week.map((day, d) => [d + 1, day] as const))('day %i: acceptance, profit and state of charge per period', (d, day) => {
    const result = settled[d - 1];
    if (result === undefined) throw new Error('missing day');
    expect(result.periods.map((p) => p.accepted)).toEqual(day.accepted);
    result.periods.forEach((p, t) => {
      expect(p.profit).toBeCloseTo(day.expected[unaccepted].profit[t] as number, 9);
      expect(p.socMwh).toBeCloseTo(day.expected[unaccepted].soc[t] as number, 9);
    });
  });

  it('carries the state of charge from day to day and totals the week', () => {
    settled.slice(1).forEach((day, d) => expect(day.socStartMwh).toBe((settled[d] as { socEndMwh: number }).socEndMwh));
    expect(settled.reduce((sum, day) => sum + day.totals.profit, 0)).toBeCloseTo(WEEK_PROFIT[unaccepted], 9);
  });

  it('totals the gross imbalance cash, its cost against the clearing price and the deliberate imbalance', () => {
    const week = (key: 'imbalanceCash' | 'imbalanceCostVsClearing' | 'deliberateImbalanceMwh' | 'deliberateImbalancePeriods' | 'deliberateImbalanceCash') =>
      settled.reduce((sum, day) => sum + day.totals[key], 0);
    const expected = WEEK_IMBALANCE[unaccepted];
    expect(week('imbalanceCash')).toBeCloseTo(expected.gross, 9);
    expect(week('imbalanceCostVsClearing')).toBeCloseTo(expected.cost, 9);
    expect(week('deliberateImbalanceMwh')).toBeCloseTo(expected.deliberateMwh, 9);
    expect(week('deliberateImbalancePeriods')).toBe(expected.deliberatePeriods);
    expect(week('deliberateImbalanceCash')).toBeCloseTo(expected.deliberateCash, 9);
  });
});

describe('the sell the store cannot cover and the buy the store cannot take (follow-accepted)', () => {
  const settled = settleWeek('follow-accepted');

  it('day 2: 1.6 MWh come from the store, 2.4 MWh are bought back at clearing + penalty', () => {
    const p = settled[1]?.periods[2];
    expect(p?.soldAuctionMwh).toBeCloseTo(4, 12);
    expect(p?.dischargedMwh).toBeCloseTo(1.6, 12);
    expect(p?.boughtImbalanceMwh).toBeCloseTo(2.4, 12);
    expect(p?.auctionCash).toBeCloseTo(280, 9);
    expect(p?.imbalanceCash).toBeCloseTo(-192, 9);
    expect(p?.degradationCost).toBeCloseTo(3.2, 9);
  });

  it('day 4: 5 MWh bought into a full store are sold back at clearing - penalty', () => {
    const p = settled[3]?.periods[1];
    expect(p?.boughtAuctionMwh).toBe(5);
    expect(p?.chargedMwh).toBeCloseTo(0, 12);
    expect(p?.soldImbalanceMwh).toBeCloseTo(5, 12);
    expect(p?.imbalanceCash).toBeCloseTo(10, 9);
  });

  it('day 3: an unaccepted order moves nothing and costs nothing', () => {
    const p = settled[2]?.periods[3];
    expect(p?.accepted).toBe(false);
    expect([p?.soldAuctionMwh, p?.soldImbalanceMwh, p?.dischargedMwh, p?.profit]).toEqual([0, 0, 0, 0]);
  });
});

describe('follow-plan closes unaccepted orders at the imbalance price', () => {
  const settled = settleWeek('follow-plan');

  it('day 2: the unaccepted buy is bought at 45, the battery still charges', () => {
    const p = settled[1]?.periods[1];
    expect(p?.boughtImbalanceMwh).toBe(5);
    expect(p?.boughtAuctionMwh).toBe(0);
    expect(p?.chargedMwh).toBe(5);
    expect(p?.imbalanceCash).toBeCloseTo(-225, 9);
  });

  it('day 3: the unaccepted sell is sold at 35, the battery still discharges', () => {
    const p = settled[2]?.periods[3];
    expect(p?.soldImbalanceMwh).toBe(4);
    expect(p?.dischargedMwh).toBe(4);
    expect(p?.imbalanceCash).toBeCloseTo(140, 9);
  });
});
