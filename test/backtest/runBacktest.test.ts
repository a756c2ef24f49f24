import { describe, expect, it } from 'vitest';
import type { BatteryModel, HistoryDay, Order, PriceHistory, QuantileDay } from '../../src/types.js';
import { backtestMetrics } from '../../src/backtest/backtestMetrics.js';
import { runBacktest, type BacktestResult } from '../../src/backtest/runBacktest.js';
import { planPolicyDay } from '../../src/backtest/planPolicyDay.js';
import { NoImbalancePriceError } from '../../src/settle/imbalancePrices.js';
import { battery, history, input, market } from './handWorkedWeek.js';
import { hourlyPeriods } from './randomMarket.js';

// The inputs and the hand arithmetic are in handWorkedWeek.ts.

function profits(result: BacktestResult, policy: string): number[] {
  const k = result.policies.indexOf(policy as never);
  return result.days.map((d) => d.runs[k]?.totals.profit ?? Number.NaN);
}

describe('runBacktest on a hand-worked week', () => {
  const plan = runBacktest(input, { policies: ['quantile', 'perfect-foresight'], unaccepted: 'follow-plan' });
  const accepted = runBacktest(input, { policies: ['quantile', 'perfect-foresight'], unaccepted: 'follow-accepted' });

  it('skips and lists days without a complete history or forecast, never filling them', () => {
    expect(plan.days.map((d) => d.day)).toEqual(['2026-05-04', '2026-05-05', '2026-05-07']);
    expect(plan.skippedDays).toEqual([
      { day: '2026-05-06', reason: 'history incomplete: 1 of 4 periods missing (2026-05-06T02:00:00Z)' },
      { day: '2026-05-08', reason: 'no forecast' },
    ]);
  });

  it('follow-plan: daily profits 300, 260, 296; perfect foresight 300, 280, 300', () => {
    profits(plan, 'quantile').forEach((p, d) => expect(p).toBeCloseTo([300, 260, 296][d] as number, 6));
    profits(plan, 'perfect-foresight').forEach((p, d) => expect(p).toBeCloseTo([300, 280, 300][d] as number, 6));
  });

  it('follow-accepted: 300, -80, 120, with the unsold 4 MWh carried across the skipped day', () => {
    profits(accepted, 'quantile').forEach((p, d) => expect(p).toBeCloseTo([300, -80, 120][d] as number, 6));
    const quantile = accepted.days.map((d) => d.runs[0]);
    expect(quantile.map((r) => r?.socStartMwh)).toEqual([0, 0, expect.closeTo(4, 6)]);
    expect(quantile[2]?.socEndMwh).toBeCloseTo(4, 6);
    expect(accepted.socEndMwh.quantile).toBeCloseTo(4, 6);
  });

  it('metrics: capture ratio, acceptance, cycles and annualised profit', () => {
    const m = backtestMetrics(plan, battery).policies.quantile;
    // 856 of 880; buys accepted A h0, C h1, D h2 of 4; sells A h2, D h1, D h3 of 4.
    expect(m?.profit).toBeCloseTo(856, 6);
    expect(m?.captureRatio).toBeCloseTo(856 / 880, 9);
    expect(m?.buyAcceptanceRate).toBe(0.75);
    expect(m?.sellAcceptanceRate).toBe(0.75);
    // Discharged 4 + 4 + 8 = 16 MWh (lossless: 16 MWh out of the store) over a 4 MWh window: 4 cycles,
    // 4 / 3 per day. 3 days = 3 / 365.25 years.
    expect(m?.cyclesTotal).toBeCloseTo(4, 9);
    expect(m?.cyclesPerDay).toBeCloseTo(4 / 3, 9);
    expect(m?.profitPerMwYear).toBeCloseTo((856 * 365.25) / 3 / 4, 6);
    expect(m?.profitPerMwhYear).toBeCloseTo((856 * 365.25) / 3 / 8, 6);
    // Imbalance: C sold 4 MWh at 85 (+340), D bought 4 MWh at 26 (-104).
    expect(m?.soldImbalanceMwh).toBeCloseTo(4, 9);
    expect(m?.boughtImbalanceMwh).toBeCloseTo(4, 9);
    expect(m?.imbalanceCash).toBeCloseTo(236, 6);
    // Against the clearing price: C sold at 85 where it cleared at 90, -(85 - 90) x 4 = +20; D bought at 26
    // where it cleared at 25, (26 - 25) x 4 = +4: a cost of 24. No deliberate imbalance under follow-plan.
    expect(m?.imbalanceCostVsClearing).toBeCloseTo(24, 6);
    expect(m?.deliberateImbalanceMwh).toBe(0);
  });

  it('the month table sums to the totals', () => {
    const metrics = backtestMetrics(plan, battery);
    expect(metrics.months.map((row) => row.month)).toEqual(['2026-05']);
    expect(metrics.months[0]?.policies.quantile?.profit).toBeCloseTo(856, 6);
    expect(metrics.edge).toBeNull();
  });
});

describe('runBacktest inputs', () => {
  it('uses the market rule when the history has no imbalance column, and fails without either', () => {
    const bare: PriceHistory = { ...history, days: history.days.map((d) => ({ ...d, imbalancePricePerMwh: null })) };
    expect(() => runBacktest({ ...input, history: bare })).toThrow(NoImbalancePriceError);
    const ruled = runBacktest({ ...input, history: bare, market: { ...market, imbalance: { kind: 'clearing-plus-penalty', penaltyPerMwh: 5 } } }, { policies: ['quantile'] });
    expect(ruled.imbalanceSource).toEqual({ kind: 'clearing-plus-penalty', penaltyPerMwh: 5 });
    // Day C: the sell closes at clearing - 5 = 85: the same 260 as with the history's 85.
    expect(profits(ruled, 'quantile')[1]).toBeCloseTo(260, 6);
  });

  it('leaves out the ledger when asked and rejects from after to', () => {
    const lean = runBacktest(input, { policies: ['point'], keepLedger: false });
    expect(lean.days.every((d) => d.runs.every((r) => r.ledger === null))).toBe(true);
    expect(() => runBacktest({ ...input, from: '2026-05-09' })).toThrow(RangeError);
  });
});

describe('planPolicyDay', () => {
  // Two hours, median -100 then 50 (spread 2), efficiency 0.9 both ways, window [0, 0.45] MWh: at -100
  // the relaxation would charge and discharge at once. The LP path with a budget of no nodes proves no optimum.
  const day = '2026-05-04';
  const forecast: QuantileDay = { day, levels: [0.1, 0.5, 0.9], periods: hourlyPeriods(day, 2), prices: [[-102, -100, -98], [48, 50, 52]] };
  const realised: HistoryDay = { day, periods: hourlyPeriods(day, 2), pricePerMwh: [-100, 50], imbalancePricePerMwh: null, exogenous: {} };
  const small: BatteryModel = { ...battery, energyMwh: 1, chargeMw: 1, dischargeMw: 1, chargeEfficiency: 0.9, dischargeEfficiency: 0.9, socMaxMwh: 0.45 };
  const request = { forecast, realised, market, battery: small, alpha: 0.1, socStartMwh: 0, solveOptions: {}, unaccepted: 'follow-plan' as const, scenarioPlanning: null, scenarios: null };

  it('without a proven optimum in the node budget the policy places no orders and says why', () => {
    const plan = planPolicyDay({ ...request, policy: 'point', solveOptions: { maxNodes: 0, solver: 'lp' } });
    expect(plan.status).toBe('node-limit');
    expect(plan.orders).toEqual([null, null]);
  });

  it('price-taking bids the point plan at the cap and the floor; perfect foresight too, on the realised prices', () => {
    // Point plan (= perfect foresight here, the median is realised): buy 0.5 MW at -100 (stores 0.45 MWh),
    // sell 0.45 x 0.9 = 0.405 MW at 50 (test/plan/handWorked.test.ts works the same day).
    for (const policy of ['price-taking', 'perfect-foresight'] as const) {
      const plan = planPolicyDay({ ...request, policy });
      expect(plan.status).toBe('optimal');
      const orders = plan.orders as readonly (Order | null)[]; // a schedule's orders, one per period
      expect(orders.map((o) => [o?.side, o?.limitPrice, o?.quantileLevel])).toEqual([['buy', 1000, null], ['sell', -100, null]]);
      expect(orders[0]?.quantityMw).toBeCloseTo(0.5, 6);
      expect(orders[1]?.quantityMw).toBeCloseTo(0.405, 6);
    }
  });
});
