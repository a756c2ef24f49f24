import { describe, expect, it } from 'vitest';
import { branchOnArbitrage } from '../../../src/plan/warehouse/arbitrageBranching.js';
import { DayContext, SweepSolver } from '../../../src/plan/warehouse/dayContext.js';
import { StoredSchedule } from '../../../src/plan/warehouse/storedSchedule.js';
import type { StoredDay } from '../../../src/plan/warehouse/storedDay.js';
import { ValueProgram } from '../../../src/plan/warehouse/valueProgram.js';
import { loadHighsSolver } from '../../reference/highsDayModel.js';
import { type PeriodSet, solveStoredLp } from '../../reference/storedDayLp.js';
import { modeChoices, randomStoredDay, relGap, storedLp, storedValue, storedViolations } from './randomStoredDays.js';

// The branching (arbitrageBranching.ts) must end at the day's optimum with one mode in every
// arbitrage period (and, after netting, no simultaneous flows anywhere), with or without a cycle
// cap. Brute force: every assignment of charge-only or discharge-only to the arbitrage periods,
// each an LP solved by HiGHS (test/reference/storedDayLp.ts; other periods may use both flows,
// which netting makes free there), and the best of them. The days have 3 to 7 periods, about 60 %
// of them at negative prices: on smaller days netting the root's answer is nearly always optimal
// already, and a search that dropped a child or pruned too eagerly would go unnoticed.
const highs = await loadHighsSolver();
const DAYS = 300;

interface Case {
  readonly name: string;
  readonly day: StoredDay;
  /** The best value over every mode assignment, -Infinity when none is feasible. */
  readonly reference: number;
  readonly failures: readonly string[];
}

/** The seeded days and their brute-force optimum, shared by both inner solvers. */
const cases: Case[] = Array.from({ length: DAYS }, (_, i) => {
  const name = `branch-stage-${i}`;
  const day = randomStoredDay(name, { cap: i % 2 === 0, negativeShare: 0.6, minPeriods: 3, maxPeriods: 7 });
  const withCap = Number.isFinite(day.dischargeCapMwh);
  const arbitrage = Array.from(day.arbitrage.subarray(0, day.periods).keys()).filter((t) => day.arbitrage[t] === 1);
  let reference = -Infinity;
  const failures: string[] = [];
  for (const sets of modeChoices(Array<PeriodSet>(day.periods).fill('box'), arbitrage)) {
    const lp = solveStoredLp(highs, storedLp(day, 0, sets, withCap));
    if (lp.status === 'optimal') reference = Math.max(reference, lp.objective);
    else if (lp.status !== 'infeasible') failures.push(`${name}: HiGHS ${lp.status}`);
  }
  return { name, day, reference, failures };
});

function check(kind: 'sweep' | 'program'): string[] {
  const ctx = new DayContext(8);
  const sweep = new SweepSolver(8);
  const program = new ValueProgram(8);
  const best = new StoredSchedule(8);
  const failures: string[] = [];
  let split = 0;
  for (const { name, day, reference, failures: referenceFailures } of cases) {
    failures.push(...referenceFailures);
    const withCap = Number.isFinite(day.dischargeCapMwh);
    const solver = kind === 'sweep' ? sweep.load(day) : program.load(day, { maxBreakpoints: Infinity, incumbent: null });
    const outcome = branchOnArbitrage(ctx.load(day, solver), Infinity, best);
    if (reference === -Infinity) {
      if (!['start-unreachable', 'end-unreachable', 'cap-unreachable'].includes(outcome.status)) failures.push(`${name}: no feasible mode assignment, branching ${outcome.status}`);
      continue;
    }
    if (outcome.status !== 'ok') {
      failures.push(`${name}: HiGHS optimal, branching ${outcome.status}`);
      continue;
    }
    if (outcome.nodes > 1) split++;
    if (relGap(best.value, reference) > 1e-9) failures.push(`${name}: branching ${best.value}, best mode assignment ${reference}`);
    if (relGap(storedValue(day, best.x, best.y), best.value) > 1e-12) failures.push(`${name}: reported value differs from the schedule's`);
    failures.push(...storedViolations(day, best.x, best.y, { withCap, complementary: () => true }).map((v) => `${name}: ${v}`));
  }
  // The sweep must have to split on many days, or the branching is hardly exercised.
  if (kind === 'sweep' && split < DAYS / 10) failures.push(`only ${split} days needed more than one node`);
  return failures;
}

describe('the branching on arbitrage periods against every mode assignment (HiGHS)', () => {
  it(`${DAYS} seeded small days, half with a cycle cap, on the chord sweep: the best assignment's value to 1e-9, feasible, one mode per period`, () => {
    expect(check('sweep')).toEqual([]);
  });

  it(`${DAYS} seeded small days (the same), on the dynamic program: the best assignment's value to 1e-9, feasible, one mode per period`, () => {
    expect(check('program')).toEqual([]);
  });
});
