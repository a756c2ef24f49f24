import { describe, expect, it } from 'vitest';
import { backtestSummary, backtestSummaryText } from '../../../src/app/backtest/backtestSummary.js';
import { backtestMetrics } from '../../../src/backtest/backtestMetrics.js';
import { runBacktest } from '../../../src/backtest/runBacktest.js';
import { jsonText } from '../../../src/io/planOutputs.js';
import { battery, history, input, market } from '../../backtest/handWorkedWeek.js';
import { backtestReport } from '../../../src/report/backtestReport.js';
import type { HistoryDay } from '../../../src/types.js';

// summary.json of the hand-worked week (test/backtest/handWorkedWeek.ts): 3 covered days of 4 periods.

const result = runBacktest(input, { policies: ['quantile', 'perfect-foresight'] });
const metrics = backtestMetrics(result, battery);

describe('backtest summary', () => {
  it('the same result gives the same bytes', () => {
    const again = runBacktest(input, { policies: ['quantile', 'perfect-foresight'] });
    expect(jsonText(backtestSummary(again, backtestMetrics(again, battery), { market, battery, inputs: {} }))).toBe(
      jsonText(backtestSummary(result, metrics, { market, battery, inputs: {} })),
    );
  });

  it('names the imbalance source and lists the skipped days', () => {
    const summary = backtestSummary(result, metrics, { market, battery, inputs: { history: 'h.csv' } });
    expect(summary.imbalanceSource).toEqual({ kind: 'history', description: "the history's imbalance_price column" });
    expect(summary.skippedDays.map((d) => d.day)).toEqual(['2026-05-06', '2026-05-08']);
    // Worked in handWorkedWeek.ts: the quantile policy's profit over the three covered days.
    expect(summary.policies.quantile?.profit).toBeCloseTo(856, 6);
    expect(backtestSummaryText(result, metrics, market, 'out')).toMatch(/3 days covered, 2 skipped[\s\S]*quantile +856 /);
  });

  it('the line naming the scenario paths comes before the files written, which end the summary', () => {
    const text = backtestSummaryText(result, metrics, market, 'out', undefined, undefined, ['  paths: from --paths p.csv']);
    expect(text.endsWith('  paths: from --paths p.csv\n  wrote out/ledger.csv, days.csv, summary.json\n')).toBe(true);
  });
});

describe('yearly figures from three days are flagged as extrapolated', () => {
  it('in summary.json and in the report, naming the month covered and the months missing', () => {
    // 3 covered days, all in May 2026: profitPerMwYear = profit x 365.25 / 3 / dischargeMw, a factor of 121.75.
    const summary = backtestSummary(result, metrics, { market, battery, inputs: {} });
    expect(summary.yearlyFigures).toMatchObject({ figures: ['profitPerMwYear', 'profitPerMwhYear'], days: 3, monthsCovered: ['2026-05'], extrapolated: true });
    expect(summary.yearlyFigures.warning).toBe(
      'profitPerMwYear and profitPerMwhYear are extrapolated to a year: scaled x 365.25 / 3 = 121.75 from 3 covered days in 1 month (2026-05); January, February, March, April, June, July, August, September, October, November and December are missing, so their prices never entered these figures (seasonal bias)',
    );
    expect(backtestReport({ result, metrics, market, battery })).toMatch(/yearly figures<\/dt>\s*<dd>Warning: the yearly figures of summary.json \(profitPerMwYear, profitPerMwhYear\) are extrapolated to a year: scaled x 365.25 \/ 3 = 121.75/);
  });
});

describe('deliberate imbalance is flagged in summary.json, on the console and in the report', () => {
  // Day A of handWorkedWeek.ts with the first price raised to 25: the quantile plan's buy of 4 MW at limit
  // 22 is not accepted (25 > 22), its sell of 4 MW at limit 18 is (95 >= 18). Under follow-accepted the store
  // stays empty, so the 4 MWh sold cannot be delivered and are bought back at the imbalance price 96:
  // deliberate imbalance 4 MWh in 1 period, cash -384; the auction pays +380, profit -4; against the
  // clearing price the 4 MWh cost (96 - 95) x 4 = 4. Under follow-plan the buy is closed at the imbalance
  // price 21 and the sell is delivered: no deliberate imbalance.
  const dayA = history.days[0] as HistoryDay;
  const raised: HistoryDay = { ...dayA, pricePerMwh: [25, 45, 95, 50] };
  const oneDay = { ...input, history: { ...history, days: [raised] }, from: '2026-05-04', to: '2026-05-04' };
  const run = (unaccepted: 'follow-plan' | 'follow-accepted') => {
    const r = runBacktest(oneDay, { policies: ['quantile'], unaccepted });
    return { result: r, metrics: backtestMetrics(r, battery) };
  };

  it('follow-accepted: counted and flagged', () => {
    const { result: r, metrics: m } = run('follow-accepted');
    const summary = backtestSummary(r, m, { market, battery, inputs: {} });
    expect(summary.policies.quantile?.deliberateImbalanceMwh).toBeCloseTo(4, 12);
    expect(summary.policies.quantile?.deliberateImbalancePeriods).toBe(1);
    expect(summary.policies.quantile?.deliberateImbalanceCash).toBeCloseTo(-384, 9);
    expect(summary.policies.quantile?.imbalanceCostVsClearing).toBeCloseTo(4, 9);
    expect(summary.policies.quantile?.profit).toBeCloseTo(-4, 9);
    const text = backtestSummaryText(r, m, market, 'out');
    expect(text).toContain('warning: deliberate imbalance: accepted orders the battery could not deliver or absorb');
    expect(text).toContain('    quantile: 4 MWh in 1 periods, cash -384');
    const page = backtestReport({ result: r, metrics: m, market, battery });
    expect(page).toMatch(/deliberate imbalance<\/dt>\s*<dd>quantile 4 MWh in 1 periods/);
  });

  it('follow-plan: none, and no flag', () => {
    const { result: r, metrics: m } = run('follow-plan');
    expect(m.policies.quantile?.deliberateImbalanceMwh).toBe(0);
    expect(backtestSummaryText(r, m, market, 'out')).not.toContain('deliberate');
    expect(backtestReport({ result: r, metrics: m, market, battery })).not.toContain('deliberate imbalance</dt>');
  });
});

describe('the loss from rounding to the exchange\'s steps, as the difference in profit', () => {
  // Day A of handWorkedWeek.ts, quantile policy: planned buy 4 MW in hour 0 at limit 22 and sell 4 MW in
  // hour 2 at limit 18: realised 20 and 95, both accepted, profit -80 + 380 = 300.
  // With a quantity step of 3 MW and a price tick of 5: the buy rounds down to 3 MW (3 MWh in store), the
  // sell to 3 MW; the buy limit 22 down to 20, the sell limit 18 up to 20. Clearing 20 <= 20: the buy is
  // accepted (a tie), 95 >= 20: the sell too. Profit -60 + 285 = 225: a loss from rounding of 75.
  const stepped = { ...market, quantityStepMw: 3, priceTickPerMwh: 5 };
  const dayA = { ...input, from: '2026-05-04', to: '2026-05-04' };
  const rounded = runBacktest({ ...dayA, market: stepped }, { policies: ['quantile'] });
  const plain = runBacktest(dayA, { policies: ['quantile'] });
  const roundedMetrics = backtestMetrics(rounded, battery);
  const plainMetrics = backtestMetrics(plain, battery);

  it('summary.json and the console say what rounding cost, worked by hand', () => {
    expect(roundedMetrics.policies.quantile?.profit).toBeCloseTo(225, 9);
    const summary = backtestSummary(rounded, roundedMetrics, { market: stepped, battery, inputs: {}, unrounded: plainMetrics });
    expect(summary.orderSteps).toMatchObject({ quantityStepMw: 3, minimumQuantityMw: null, priceTickPerMwh: 5 });
    expect(summary.orderSteps?.profitWithoutRounding.quantile).toBeCloseTo(300, 9);
    expect(summary.orderSteps?.roundingLoss.quantile).toBeCloseTo(75, 9);
    const text = backtestSummaryText(rounded, roundedMetrics, stepped, 'out', undefined, plainMetrics);
    expect(text).toContain("profit lost to rounding the orders to the exchange's steps (against the same backtest unrounded): quantile 75");
  });

  it('without steps: no rounding key and no line (outputs as before)', () => {
    const summary = backtestSummary(plain, plainMetrics, { market, battery, inputs: {} });
    expect('orderSteps' in summary).toBe(false);
    expect(backtestSummaryText(plain, plainMetrics, market, 'out')).not.toContain('rounding');
  });
});
