import { describe, expect, it } from 'vitest';
import { backtestSummary, backtestSummaryText } from '../../../src/app/backtest/backtestSummary.js';
import { backtestMetrics } from '../../../src/backtest/backtestMetrics.js';
import { runBacktest } from '../../../src/backtest/runBacktest.js';
import { jsonText } from '../../../src/io/planOutputs.js';
import { battery, input, market } from '../../backtest/handWorkedWeek.js';

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
});
