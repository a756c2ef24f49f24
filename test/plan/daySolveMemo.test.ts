import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DayProblem } from '../../src/types.js';
import { runBacktest } from '../../src/backtest/runBacktest.js';
import { DaySolveMemo } from '../../src/plan/daySolveMemo.js';
import { SOLVE_DAY_DEFAULTS, solveDay } from '../../src/plan/solveDay.js';
import { HIGHS_NPM_VERSION, loadHighsSolver, solveDayWithHighs } from '../reference/highsDayModel.js';
import { randomDay } from '../reference/randomDays.js';
import { randomMarketArb } from '../backtest/randomMarket.js';

// Reference: HiGHS (npm `highs`, version in HIGHS_NPM_VERSION) solving the MIP of
// test/reference/highsDayModel.ts; a memo may only ever hand out the optimum of the problem asked.
const highs = await loadHighsSolver();
const relGap = (a: number, b: number): number => Math.abs(a - b) / Math.max(1, Math.abs(b));
const nextUp = (x: number): number => {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  view.setBigInt64(0, view.getBigInt64(0) + (x >= 0 ? 1n : -1n));
  return x === 0 ? Number.MIN_VALUE : view.getFloat64(0);
};

describe(`DaySolveMemo against HiGHS ${HIGHS_NPM_VERSION}`, () => {
  it('an equal problem (prices copied) gets the kept outcome; a problem one ulp or one field away is solved afresh, to the MIP optimum', () => {
    const failures: string[] = [];
    for (let i = 0; i < 40; i++) {
      const name = `day-solve-memo-${i}`;
      const problem = randomDay(name);
      const memo = new DaySolveMemo();
      const first = solveDay(problem, { memo });
      const copy: DayProblem = { ...problem, buyPricePerMwh: [...problem.buyPricePerMwh], sellPricePerMwh: [...problem.sellPricePerMwh] };
      if (solveDay(copy, { memo }) !== first) failures.push(`${name}: an equal problem was solved again`);
      const t = i % problem.buyPricePerMwh.length;
      const variants: [string, DayProblem][] = [
        ['buy price one ulp up', { ...copy, buyPricePerMwh: copy.buyPricePerMwh.map((p, k) => (k === t ? nextUp(p) : p)) }],
        ['sell price one ulp up', { ...copy, sellPricePerMwh: copy.sellPricePerMwh.map((p, k) => (k === t ? nextUp(p) : p)) }],
        ['start one ulp up', { ...copy, socStartMwh: nextUp(copy.socStartMwh) }],
        ['end floor lowered', { ...copy, socEndMinMwh: copy.battery.socMinMwh }],
        ['another battery object', { ...copy, battery: { ...copy.battery } }],
      ];
      for (const [what, variant] of variants) {
        if (memo.find(variant, SOLVE_DAY_DEFAULTS) !== undefined && !(what === 'end floor lowered' && variant.socEndMinMwh === problem.socEndMinMwh)) {
          failures.push(`${name}: ${what}: served from the memo`);
        }
        const outcome = solveDay(variant, { memo });
        const reference = solveDayWithHighs(highs, variant, true);
        if (outcome.status !== reference.status) failures.push(`${name}: ${what}: ${outcome.status}, HiGHS ${reference.status}`);
        else if (outcome.status === 'optimal' && reference.status === 'optimal' && relGap(outcome.objective, reference.objective) > 1e-6) {
          failures.push(`${name}: ${what}: objective ${outcome.objective}, HiGHS ${reference.objective}`);
        }
      }
      if (memo.find(problem, { ...SOLVE_DAY_DEFAULTS, maxNodes: 7 }) !== undefined) failures.push(`${name}: other solver settings served from the memo`);
    }
    expect(failures).toEqual([]);
  }, 120_000);
});

describe('the backtest shares a day solve between policies only when the problem is the same', () => {
  it('each policy run alone gives the same days, ledger and end state as run among all five (random markets, both rules)', () => {
    fc.assert(
      fc.property(randomMarketArb(3), fc.constantFrom('follow-plan' as const, 'follow-accepted' as const), (m, unaccepted) => {
        const all = runBacktest(m, { unaccepted, keepLedger: true });
        all.policies.forEach((policy, k) => {
          const alone = runBacktest(m, { unaccepted, keepLedger: true, policies: [policy] });
          expect(alone.days.map((d) => d.runs[0])).toEqual(all.days.map((d) => d.runs[k]));
          expect(alone.socEndMwh[policy]).toBe(all.socEndMwh[policy]);
        });
      }),
      { seed: 20261205, numRuns: 40 },
    );
  });

  it('median, point and price-taking under follow-plan plan on the median from one state: one solve a day serves all three', () => {
    fc.assert(
      fc.property(randomMarketArb(3), (m) => {
        const stopwatch = { now: () => 0, spentMs: 0, calls: 0 };
        const result = runBacktest(m, { unaccepted: 'follow-plan', policies: ['median', 'point', 'price-taking'], solveOptions: { stopwatch } });
        for (const day of result.days) expect(new Set(day.runs.map((r) => r.socStartMwh)).size).toBe(1);
        expect(stopwatch.calls).toBe(result.days.length);
      }),
      { seed: 20261206, numRuns: 40 },
    );
  });
});
