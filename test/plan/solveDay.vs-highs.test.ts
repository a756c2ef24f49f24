import { describe, expect, it } from 'vitest';
import { solveDay } from '../../src/plan/solveDay.js';
import { checkSchedule, recomputedObjective } from '../reference/checkSchedule.js';
import { HIGHS_NPM_VERSION, loadHighsSolver, solveDayWithHighs } from '../reference/highsDayModel.js';
import { randomDay } from '../reference/randomDays.js';

// Reference: HiGHS (npm `highs`, version in HIGHS_NPM_VERSION) solving the MIP of
// test/reference/highsDayModel.ts with a binary mode per period and zero MIP gaps.
const highs = await loadHighsSolver();
const relGap = (a: number, b: number): number => Math.abs(a - b) / Math.max(1, Math.abs(b));
const DAYS = 300;
const CHUNK = 50;

describe(`solveDay against HiGHS ${HIGHS_NPM_VERSION}`, () => {
  for (let from = 0; from < DAYS; from += CHUNK) {
    it(`seeded random days ${from}..${from + CHUNK - 1}: the MIP optimum to 1e-6 relative, feasible, no simultaneous flows`, () => {
      const failures: string[] = [];
      for (let i = from; i < from + CHUNK; i++) {
        const name = `solve-day-vs-highs-${i}`;
        const problem = randomDay(name);
        const reference = solveDayWithHighs(highs, problem, true);
        let outcome: ReturnType<typeof solveDay>;
        try {
          outcome = solveDay(problem);
        } catch (error) {
          failures.push(`${name}: solveDay threw ${error instanceof Error ? error.message : String(error)}`);
          continue;
        }
        if (reference.status !== 'optimal' || outcome.status !== 'optimal') {
          if (reference.status !== outcome.status) failures.push(`${name}: HiGHS ${reference.status}, solveDay ${outcome.status}`);
          continue;
        }
        if (relGap(outcome.objective, reference.objective) > 1e-6) failures.push(`${name}: objective ${outcome.objective}, HiGHS ${reference.objective}`);
        if (relGap(recomputedObjective(problem, outcome.schedule), outcome.objective) > 1e-9) failures.push(`${name}: reported objective differs from its schedule`);
        // solveDay's flows come from a simplex: tolerate 1e-7 of the energy (HiGHS's own default feasibility tolerance).
        failures.push(...checkSchedule(problem, outcome.schedule, 1e-7 * Math.max(1, problem.battery.energyMwh)).map((v) => `${name}: ${v}`));
      }
      expect(failures).toEqual([]);
    }, 900_000);
  }
});
