import { describe, expect, it } from 'vitest';
import { meanPrice, orderExpectation } from '../../src/forecast/quantileDistribution.js';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { imbalanceExpectation } from '../../src/plan/imbalanceExpectation.js';
import { planDay } from '../../src/plan/planDay.js';
import { expectedPlanValue, losingPairs, valueIfFilledAtLimits } from '../../src/plan/planValues.js';
import type { HistoryDay, MarketSpec, Order, QuantileDay } from '../../src/types.js';
import { testBattery } from './testBattery.js';

// A fictional hourly market: floor -100, cap 1000, imbalance at clearing +/- 5.
const market: MarketSpec = Object.freeze({ timeZone: 'UTC', periodMinutes: 60, priceFloor: -100, priceCap: 1000, currency: 'XYZ', gateClosure: '12:00', imbalance: { kind: 'clearing-plus-penalty' as const, penaltyPerMwh: 5 } });
const periods = deliveryPeriods('2030-01-01', 'UTC', 60).slice(0, 3);
const levels = [0.1, 0.5, 0.9];
// The small day of the hand-worked figures below: three periods, three levels.
const forecast: QuantileDay = Object.freeze({ day: '2030-01-01', levels, periods, prices: [[10, 20, 40], [30, 50, 60], [80, 100, 140]] });
// eta_c = eta_d = 0.9 (round trip 0.81), wear 2 per MWh discharged, 2 MWh / 1 MW.
const battery = testBattery({ energyMwh: 2, socMaxMwh: 2, chargeEfficiency: 0.9, dischargeEfficiency: 0.9, degradationCostPerMwh: 2 });
const order = (t: number, side: Order['side'], quantityMw: number, limitPrice: number): Order => ({ periodStart: periods[t]!.start, periodEnd: periods[t]!.end, side, quantityMw, limitPrice, quantileLevel: null });

describe('a period\'s distribution read from its quantiles (linear between levels, flat tails)', () => {
  it('a buy limited inside an interval: acceptance and the partial expectations worked by hand', () => {
    // [10, 20, 40] at [0.1, 0.5, 0.9], buy limited at 30: the lower tail (0.1 at 10) is accepted,
    // [10, 20] (0.4, mean 15) wholly, [20, 40] (0.4) half: 0.2 with mean 25 accepted, 0.2 with mean
    // 35 not; the upper tail (0.1 at 40, just above it) not.
    // acceptance 0.1 + 0.4 + 0.2 = 0.7; E[p 1{acc}] = 1 + 6 + 5 = 12; E[p 1{not}] = 7 + 4 = 11.
    const x = orderExpectation(levels, [10, 20, 40], 'buy', 30, market);
    expect(x.acceptance).toBeCloseTo(0.7, 12);
    expect(x.acceptedPrice).toBeCloseTo(12, 12);
    expect(x.unacceptedPrice).toBeCloseTo(11, 12);
    // The mean, 0.1 x 10 + 0.4 x 15 + 0.4 x 30 + 0.1 x 40 = 23, is their sum.
    expect(meanPrice(levels, [10, 20, 40])).toBeCloseTo(23, 12);
  });

  it('limits at the outermost quantiles get exactly the nominal share (the tails lie just outside them)', () => {
    // A buy at q(0.9) = 40 is accepted unless the price is in the upper tail: 0.9. A sell at q(0.1) = 10: 0.9.
    expect(orderExpectation(levels, [10, 20, 40], 'buy', 40, market).acceptance).toBeCloseTo(0.9, 12);
    expect(orderExpectation(levels, [10, 20, 40], 'sell', 10, market).acceptance).toBeCloseTo(0.9, 12);
    // Beyond them: everything or nothing.
    expect(orderExpectation(levels, [10, 20, 40], 'buy', 40.01, market).acceptance).toBeCloseTo(1, 12);
    expect(orderExpectation(levels, [10, 20, 40], 'buy', 9.99, market).acceptance).toBe(0);
  });

  it('ties: equal quantiles put their probability on one price, which a limit at that price takes in on either side', () => {
    // [20, 20, 40]: 0.4 sits at 20. A buy at 20: lower tail 0.1 + the 0.4 at 20 = 0.5. A sell at 20:
    // the 0.4 at 20 + [20, 40] 0.4 + upper tail 0.1 = 0.9 (the lower tail lies below 20).
    expect(orderExpectation(levels, [20, 20, 40], 'buy', 20, market).acceptance).toBeCloseTo(0.5, 12);
    expect(orderExpectation(levels, [20, 20, 40], 'sell', 20, market).acceptance).toBeCloseTo(0.9, 12);
  });

  it('a tail at the floor or cap sits there: orders at the floor and cap are always accepted', () => {
    const edge = [-100, 0, 1000];
    expect(orderExpectation(levels, edge, 'sell', -100, market).acceptance).toBeCloseTo(1, 12);
    expect(orderExpectation(levels, edge, 'buy', 1000, market).acceptance).toBeCloseTo(1, 12);
  });
});

describe('a plan\'s value three ways, on the small day worked by hand', () => {
  // Orders: buy 1 MW in hour 0 limited at 30, buy 0.5 MW in hour 1 at 75, sell 0.8 MW in hour 2 at 90.
  const orders = [order(0, 'buy', 1, 30), order(1, 'buy', 0.5, 75), order(2, 'sell', 0.8, 90)];

  it('filled at the limits: 0.8 x (90 - 2) - 1 x 30 - 0.5 x 75 = 2.9', () => {
    expect(valueIfFilledAtLimits(orders, 1, battery)).toBeCloseTo(2.9, 12);
  });

  it('expected under the forecast, unaccepted orders at clearing +/- 5', () => {
    // Hour 0, buy 1 MWh at 30 on [10, 20, 40]: P = 0.7, E[p 1{acc}] = 12, E[p 1{not}] = 11 (above):
    //   auction -12; imbalance -(11 + 5 x 0.3) = -12.5, of which -1.5 against the clearing price.
    // Hour 1, buy 0.5 MWh at 75 on [30, 50, 60]: every piece lies below 75: P = 1, E[p] = 3 + 16 + 22 + 6 = 47:
    //   auction -23.5.
    // Hour 2, sell 0.8 MWh at 90 on [80, 100, 140]: lower tail 0.1 at 80 not accepted (8); [80, 100]
    //   half: 0.2 at 85 not (17), 0.2 at 95 accepted (19); [100, 140] 0.4 at 120 accepted (48); upper
    //   tail 0.1 at 140 accepted (14): P = 0.7, E[p 1{acc}] = 81, E[p 1{not}] = 25:
    //   auction 0.8 x 81 = 64.8; imbalance 0.8 x (25 - 5 x 0.3) = 18.8, of which -1.2 against clearing.
    // Wear 2 x 0.8 = 1.6. Value = -12 - 12.5 - 23.5 + 64.8 + 18.8 - 1.6 = 34.
    const e = expectedPlanValue(orders, forecast, market, { kind: 'clearing-plus-penalty', penaltyPerMwh: 5 }, battery);
    expect(e.value).toBeCloseTo(34, 10);
    expect(e.auctionCash).toBeCloseTo(-12 - 23.5 + 64.8, 10);
    expect(e.imbalanceCash).toBeCloseTo(-12.5 + 18.8, 10);
    expect(e.imbalanceCostAgainstClearing).toBeCloseTo(-2.7, 10);
    expect(e.wearCost).toBeCloseTo(1.6, 12);
    // Accepted energy: buys (0.7 x 1 + 1 x 0.5) / 1.5 = 0.8, sells 0.7; unaccepted 0.3 + 0.8 x 0.3 = 0.54 MWh.
    expect(e.buyAcceptance).toBeCloseTo(0.8, 12);
    expect(e.sellAcceptance).toBeCloseTo(0.7, 12);
    expect(e.imbalanceMwh).toBeCloseTo(0.54, 12);
    expect(e.orderAcceptance.map((p) => Number(p.toFixed(12)))).toEqual([0.7, 1, 0.7]);
  });

  it('with a history spread instead of the market rule: the same spread in both directions', () => {
    // Spread +2: hour 0 imbalance -(11 + 2 x 0.3) = -11.6; hour 2 0.8 x (25 + 2 x 0.3) = 20.48.
    // Value = -12 - 11.6 - 23.5 + 64.8 + 20.48 - 1.6 = 36.58.
    const e = expectedPlanValue(orders, forecast, market, { kind: 'history-spread', meanSpreadPerMwh: 2, from: '2029-01-01', to: '2029-12-30', periods: 1 }, battery);
    expect(e.value).toBeCloseTo(36.58, 10);
  });

  it('the pair that cannot break even: (90 - 2) x 0.81 = 71.28 < 75, short by 3.72 per MWh bought', () => {
    const pairs = losingPairs(orders, battery, market);
    expect(pairs.count).toBe(1);
    expect(pairs.pairs).toBe(2);
    expect(pairs.worst?.buy.limitPrice).toBe(75);
    expect(pairs.worst?.lossPerMwhBought).toBeCloseTo(3.72, 12);
    // A buy at the cap sets no limit: left out of the check.
    expect(losingPairs([...orders, order(0, 'buy', 1, 1000)], battery, market).pairs).toBe(2);
  });
});

describe('the imbalance price a plan expects', () => {
  const day = (d: string, price: number, imbalance: number): HistoryDay => ({ day: d, periods: deliveryPeriods(d, 'UTC', 60), pricePerMwh: new Array(24).fill(price), imbalancePricePerMwh: new Array(24).fill(imbalance), exogenous: {} });
  const history = { days: [day('2029-12-28', 50, 53), day('2029-12-29', 50, 51), day('2029-12-30', 50, 80), day('2029-12-31', 50, 90)], exogenousNames: [], incompleteDays: [] };
  it('the market\'s rule first; else the mean spread of the days complete before gate closure (up to two days before)', () => {
    expect(imbalanceExpectation(market, history, '2030-01-01')).toEqual({ kind: 'clearing-plus-penalty', penaltyPerMwh: 5 });
    const { imbalance: _, ...noRule } = market;
    // Planning 2030-01-01: 2029-12-31 is the gate-closure day and left out; the spreads 3, 1 and 30 average 34 / 3.
    const e = imbalanceExpectation(noRule, history, '2030-01-01');
    expect(e?.kind).toBe('history-spread');
    if (e?.kind === 'history-spread') {
      expect(e.meanSpreadPerMwh).toBeCloseTo(34 / 3, 12);
      expect([e.from, e.to, e.periods]).toEqual(['2029-12-28', '2029-12-30', 72]);
    }
    expect(imbalanceExpectation(noRule, undefined, '2030-01-01')).toBeNull();
  });
});

describe('plan --policy price-taking', () => {
  it('is the point schedule with every buy limited at the cap and every sell at the floor', () => {
    const request = { forecast, market, battery: testBattery({ energyMwh: 2, socMaxMwh: 2 }), alpha: 0.1, socStartMwh: 0 };
    const point = planDay({ ...request, policy: 'point' });
    const taking = planDay({ ...request, policy: 'price-taking' });
    if (point.status !== 'optimal' || taking.status !== 'optimal') throw new Error('expected optimal plans');
    expect(taking.outcome.schedule).toEqual(point.outcome.schedule);
    expect(taking.orders.length).toBeGreaterThan(0);
    expect(taking.orders.map((o) => [o.side, o.quantityMw, o.limitPrice, o.quantileLevel])).toEqual(
      point.orders.map((o) => [o.side, o.quantityMw, o.side === 'buy' ? 1000 : -100, null]),
    );
  });
});
