import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateBids } from '../../src/scenarios/evaluateBids.js';
import { profitDistribution } from '../../src/scenarios/profitDistribution.js';
import { scenarioPath, scenarioSet } from '../../src/scenarios/scenarioSet.js';
import type { PeriodBid, PeriodOrder } from '../../src/settle/periodBid.js';
import { settleDay } from '../../src/settle/settleDay.js';
import { worstTailMean } from '../../src/stats/worstTailMean.js';
import { batteryModelArb } from '../backtest/randomMarket.js';

// The scenario evaluator is settleDay run on every path at once: path by path it must give settleDay's
// profit to the last bit, its state of charge at the end and its imbalance energy ("vector equals
// loop"), for single orders under both rules and for curves (stacks of limit orders) under
// follow-accepted. The reference is settleDay itself, whose arithmetic is checked by hand in
// test/settle/settleWeek.test.ts.

const SEED = 20261604;
const price = fc.double({ min: -300, max: 600, noNaN: true });
const orderArb = fc.record({ side: fc.constantFrom('buy' as const, 'sell' as const), quantityMw: fc.double({ min: 0, max: 8, noNaN: true }), limitPrice: price });
const bidArb = (curves: boolean): fc.Arbitrary<PeriodBid> =>
  curves ? fc.oneof(fc.constant(null), orderArb, fc.array(orderArb, { minLength: 1, maxLength: 4 })) : fc.option(orderArb, { nil: null, freq: 3 });

const dayArb = fc
  .record({ periods: fc.integer({ min: 1, max: 10 }), paths: fc.integer({ min: 1, max: 7 }), rule: fc.constantFrom('follow-plan' as const, 'follow-accepted' as const) })
  .chain(({ periods, paths, rule }) =>
    fc.record({
      rule: fc.constant(rule),
      battery: batteryModelArb,
      periodHours: fc.constantFrom(0.25, 0.5, 1),
      bids: fc.array(bidArb(rule === 'follow-accepted'), { minLength: periods, maxLength: periods }),
      clearing: fc.array(fc.array(price, { minLength: periods, maxLength: periods }), { minLength: paths, maxLength: paths }),
      buy: fc.array(fc.array(price, { minLength: periods, maxLength: periods }), { minLength: paths, maxLength: paths }),
      sell: fc.array(fc.array(price, { minLength: periods, maxLength: periods }), { minLength: paths, maxLength: paths }),
    }),
  );

describe('evaluateBids', () => {
  it('equals settleDay path by path: profit to the last bit, the end state and the imbalance energy', () => {
    fc.assert(
      fc.property(dayArb, (day) => {
        const scenarios = scenarioSet(day.clearing, day.buy, day.sell);
        const socStartMwh = day.battery.socInitialMwh;
        const outcomes = evaluateBids({ bids: day.bids, scenarios, battery: day.battery, periodHours: day.periodHours, socStartMwh, unaccepted: day.rule });
        for (let w = 0; w < scenarios.pathCount; w++) {
          const path = scenarioPath(scenarios, w);
          const settled = settleDay({
            periodHours: day.periodHours,
            battery: day.battery,
            socStartMwh,
            orders: day.bids,
            clearingPricePerMwh: path.clearing,
            imbalance: { buyPerMwh: path.imbalanceBuy, sellPerMwh: path.imbalanceSell },
            unaccepted: day.rule,
          });
          expect(outcomes.profit[w]).toBe(settled.totals.profit);
          expect(outcomes.socEndMwh[w]).toBe(settled.socEndMwh);
          const imbalance = settled.totals.boughtImbalanceMwh + settled.totals.soldImbalanceMwh;
          expect(Math.abs((outcomes.imbalanceMwh[w] as number) - imbalance)).toBeLessThanOrEqual(1e-9 * Math.max(1, imbalance));
        }
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('the distribution: mean, sample sd, CVaR 5 %, loss share and mean imbalance of the path outcomes', () => {
    const profit = Float64Array.from([-20, 10, 30, 0, 40]);
    const d = profitDistribution({ profit, imbalanceMwh: Float64Array.from([1, 0, 0, 2, 0]), socEndMwh: new Float64Array(5) });
    // mean 12; deviations -32, -2, 18, -12, 28: squares 1024 + 4 + 324 + 144 + 784 = 2280, sd = sqrt(2280 / 4).
    expect(d.mean).toBe(12);
    expect(d.sd).toBeCloseTo(Math.sqrt(570), 12);
    expect(d.standardError).toBeCloseTo(Math.sqrt(570 / 5), 12);
    // 5 % of 5 paths is a quarter of the worst one: CVaR = the worst profit, -20.
    expect(d.cvar5).toBe(worstTailMean(profit, 0.05));
    expect(d.cvar5).toBe(-20);
    expect(d.lossProbability).toBe(0.2);
    expect(d.imbalanceMwh).toBeCloseTo(0.6, 14);
  });

  it('refuses bids of another length than the scenario set, and a curve under follow-plan', () => {
    const scenarios = scenarioSet([[10, 20]], [[10, 20]], [[10, 20]]);
    const battery = { energyMwh: 1, chargeMw: 1, dischargeMw: 1, chargeEfficiency: 1, dischargeEfficiency: 1, socMinMwh: 0, socMaxMwh: 1, socInitialMwh: 0.5, socFinalMinMwh: undefined, maxFromStoreMwhPerDay: undefined, degradationCostPerMwh: 0 };
    const curve: PeriodOrder[] = [{ side: 'buy', quantityMw: 1, limitPrice: 15 }];
    expect(() => evaluateBids({ bids: [null], scenarios, battery, periodHours: 1, socStartMwh: 0.5, unaccepted: 'follow-plan' })).toThrow(RangeError);
    expect(() => evaluateBids({ bids: [curve, null], scenarios, battery, periodHours: 1, socStartMwh: 0.5, unaccepted: 'follow-plan' })).toThrow(RangeError);
  });
});
