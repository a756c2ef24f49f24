import { describe, expect, it } from 'vitest';
import { PERIOD_MODE } from '../../../src/plan/periodMode.js';
import { solveWithCap } from '../../../src/plan/warehouse/cycleCapMultiplier.js';
import { DayContext, SweepSolver } from '../../../src/plan/warehouse/dayContext.js';
import { StoredSchedule } from '../../../src/plan/warehouse/storedSchedule.js';
import { ValueProgram } from '../../../src/plan/warehouse/valueProgram.js';
import { loadHighsSolver } from '../../reference/highsDayModel.js';
import { type PeriodSet, solveStoredHull, solveStoredLp } from '../../reference/storedDayLp.js';
import { randomModes, randomStoredDay, relGap, storedLp, storedValue, storedViolations } from './randomStoredDays.js';

// The cycle-cap search (cycleCapMultiplier.ts) turns an inner solver at a multiplier mu into the
// node's optimum under the cap sum_t y_t <= C. Brute force, by HiGHS on LPs written from their
// definitions (test/reference/storedDayLp.ts), with the cap as a row:
// - with the sweep inside, the chord relaxation (a free arbitrage period in its triangle) is an LP,
//   and the search must reach its optimum (LP duality: the cap's multiplier closes the gap);
// - with the exact dynamic program inside (one mode per period), the search reaches the Lagrangian
//   dual of the cap, which equals the best value over the convex hull of the node's schedules with
//   the cap (Geoffrion 1974): the disjunctive LP of Balas (1979) over the free arbitrage periods.
// A cap no schedule meets must give cap-unreachable (the LP is then infeasible with the cap only).
const highs = await loadHighsSolver();
const DAYS = 300;

function check(kind: 'sweep' | 'program'): string[] {
  const ctx = new DayContext(8);
  const solver = kind === 'sweep' ? new SweepSolver(8) : new ValueProgram(8);
  const out = new StoredSchedule(8);
  const failures: string[] = [];
  let binding = 0;
  for (let i = 0; i < DAYS; i++) {
    const name = `cap-stage-${kind}-${i}`;
    const day = randomStoredDay(name, { cap: true, maxPeriods: kind === 'program' ? 5 : 6 });
    const modes = randomModes(name, day.periods);
    const either = Array.from(modes.keys()).filter((t) => modes[t] === PERIOD_MODE.free && day.arbitrage[t] === 1);
    const sets: PeriodSet[] = Array.from(modes, (mode, t) =>
      mode === PERIOD_MODE.chargeOnly ? 'charge' : mode === PERIOD_MODE.dischargeOnly ? 'discharge' : kind === 'sweep' && either.includes(t) ? 'triangle' : 'box',
    );
    const lp = storedLp(day, 0, sets, true);
    const reference = kind === 'sweep' ? solveStoredLp(highs, lp) : solveStoredHull(highs, lp, either);
    if (kind === 'sweep') solver instanceof SweepSolver && solver.load(day);
    else solver instanceof ValueProgram && solver.load(day, { maxBreakpoints: Infinity, incumbent: null });
    const status = solveWithCap(ctx.load(day, solver), modes, out);
    if (reference.status !== 'optimal') {
      const uncapped = solveStoredLp(highs, { ...lp, dischargeCapMwh: Infinity, sets: sets.map((s, t) => (either.includes(t) ? 'triangle' : s)) });
      const expected = uncapped.status === 'optimal' ? 'cap-unreachable' : ['start-unreachable', 'end-unreachable'];
      if (reference.status !== 'infeasible' || !([] as string[]).concat(expected).includes(status)) failures.push(`${name}: HiGHS ${reference.status} (without the cap ${uncapped.status}), search ${status}`);
      continue;
    }
    if (status !== 'ok') {
      failures.push(`${name}: HiGHS optimal, search ${status}`);
      continue;
    }
    if (out.discharged > day.dischargeCapMwh * (1 - 1e-9)) binding++;
    if (relGap(out.value, reference.objective) > 1e-9) failures.push(`${name}: search ${out.value}, HiGHS ${reference.objective}`);
    if (relGap(storedValue(day, out.x, out.y), out.value) > 1e-12) failures.push(`${name}: reported value differs from the schedule's`);
    failures.push(...storedViolations(day, out.x, out.y, { withCap: true, complementary: (t) => day.arbitrage[t] === 0 }).map((v) => `${name}: ${v}`));
  }
  // The cap must bind on many days, or the search is hardly exercised.
  if (binding < DAYS / 4) failures.push(`the cap binds on ${binding} days only`);
  return failures;
}

describe('the cycle-cap multiplier search against HiGHS', () => {
  it(`${DAYS} seeded small capped days with the sweep inside: the capped chord relaxation's LP optimum to 1e-9, feasible, netted outside arbitrage periods`, () => {
    expect(check('sweep')).toEqual([]);
  });

  it(`${DAYS} seeded small capped days with the dynamic program inside: the disjunctive hull LP's optimum (the Lagrangian dual) to 1e-9, feasible`, () => {
    expect(check('program')).toEqual([]);
  });
});
