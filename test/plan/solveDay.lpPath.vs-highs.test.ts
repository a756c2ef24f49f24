import { describe, expect, it } from 'vitest';
import { solveDay, UncoveredDayError } from '../../src/plan/solveDay.js';
import { isArbitragePeriod } from '../../src/plan/simultaneousFlows.js';
import { coversDay, WAREHOUSE_SOLVER_NAME } from '../../src/plan/warehouse/index.js';
import type { DayProblem } from '../../src/types.js';
import { checkSchedule, recomputedObjective } from '../reference/checkSchedule.js';
import { HIGHS_NPM_VERSION, loadHighsSolver, solveDayWithHighs } from '../reference/highsDayModel.js';
import { randomDay, SeededRandom } from '../reference/randomDays.js';

// The general LP path of solveDay (dayLpModel.ts, javascript-lp-solver behind lpSolver.ts, the
// branch and bound of solveDay.ts), forced with `solver: 'lp'`, against HiGHS (npm `highs`, version
// in HIGHS_NPM_VERSION) solving the MIP of test/reference/highsDayModel.ts with a binary mode per
// period and zero MIP gaps. The days are the seeded days of test/reference/randomDays.ts cut short
// (4 to 24 hourly periods; javascript-lp-solver's dense simplex is slow on full days, whose LP path
// runs in bench/daySolverLpPath.js): negative prices, cycle caps, wear, tight windows, starts at the
// window's edges; the warehouse solver would take every one of them.
const highs = await loadHighsSolver();
const relGap = (a: number, b: number): number => Math.abs(a - b) / Math.max(1, Math.abs(b));
const DAYS = 300;
const CHUNK = 100;

/** A short seeded day; about two in three with a negative-price stretch. */
function shortDay(name: string): DayProblem {
  const rng = SeededRandom.fromName(`${name}-shape`);
  return randomDay(name, { periods: rng.pick([4, 6, 8, 12, 24]), negativePrices: rng.chance(2 / 3) });
}

describe(`solveDay's LP path (solver: 'lp') against HiGHS ${HIGHS_NPM_VERSION}`, () => {
  for (let from = 0; from < DAYS; from += CHUNK) {
    it(`seeded short days ${from}..${from + CHUNK - 1}: the MIP optimum to 1e-6 relative, feasible, no simultaneous flows, solved by javascript-lp-solver`, () => {
      const failures: string[] = [];
      const seen = { covered: 0, arbitrage: 0, cap: 0, wear: 0, tight: 0, optimal: 0 };
      for (let i = from; i < from + CHUNK; i++) {
        const name = `lp-path-vs-highs-${i}`;
        const problem = shortDay(name);
        const b = problem.battery;
        if (coversDay(problem)) seen.covered++;
        if (problem.buyPricePerMwh.some((_, t) => isArbitragePeriod(problem, t))) seen.arbitrage++;
        if (b.maxFromStoreMwhPerDay !== undefined) seen.cap++;
        if (b.degradationCostPerMwh > 0) seen.wear++;
        if (b.socMaxMwh - b.socMinMwh < 0.15 * b.energyMwh) seen.tight++;
        const reference = solveDayWithHighs(highs, problem, true);
        const outcome = solveDay(problem, { solver: 'lp' });
        if (reference.status !== 'optimal' || outcome.status !== 'optimal') {
          if (reference.status !== outcome.status) failures.push(`${name}: HiGHS ${reference.status}, LP path ${outcome.status}`);
          continue;
        }
        seen.optimal++;
        if (outcome.solver !== 'javascript-lp-solver') failures.push(`${name}: solved by ${outcome.solver}, not the LP path`);
        if (relGap(outcome.objective, reference.objective) > 1e-6) failures.push(`${name}: objective ${outcome.objective}, HiGHS ${reference.objective}`);
        if (relGap(recomputedObjective(problem, outcome.schedule), outcome.objective) > 1e-9) failures.push(`${name}: reported objective differs from its schedule`);
        // The LP path's flows come from a simplex: tolerate 1e-7 of the energy (HiGHS's own default feasibility tolerance).
        failures.push(...checkSchedule(problem, outcome.schedule, 1e-7 * Math.max(1, b.energyMwh)).map((v) => `${name}: ${v}`));
      }
      expect(failures).toEqual([]);
      // The kinds of day the warehouse solver would otherwise take must all be here.
      expect(seen.covered).toBe(CHUNK);
      expect(seen.optimal).toBeGreaterThan(0.8 * CHUNK);
      for (const kind of ['arbitrage', 'cap', 'wear', 'tight'] as const) expect(seen[kind], kind).toBeGreaterThan(0.1 * CHUNK);
    }, 120_000);
  }
});

describe("solveDay's solver option", () => {
  it("auto and warehouse take the warehouse solver, lp the LP path, on the same optimum", () => {
    const problem = shortDay('solver-option-0');
    const outcomes = (['auto', 'warehouse', 'lp'] as const).map((solver) => solveDay(problem, { solver }));
    const [auto, warehouse, lp] = outcomes.map((o) => (o.status === 'optimal' ? o : null));
    expect(auto?.solver).toBe(WAREHOUSE_SOLVER_NAME);
    expect(warehouse?.solver).toBe(WAREHOUSE_SOLVER_NAME);
    expect(lp?.solver).toBe('javascript-lp-solver');
    expect(relGap(lp!.objective, warehouse!.objective)).toBeLessThanOrEqual(1e-6);
  });

  it('warehouse alone refuses a day it does not cover, naming why', () => {
    const base = shortDay('solver-option-1');
    const problem = { ...base, buyPricePerMwh: base.buyPricePerMwh.map((p, t) => (t === 1 ? Number.NaN : p)) };
    expect(() => solveDay(problem, { solver: 'warehouse' })).toThrow(UncoveredDayError);
    expect(() => solveDay(problem, { solver: 'warehouse' })).toThrow(/period 1 is not a finite number/);
  });
});
