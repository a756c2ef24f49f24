import { describe, expect, it } from 'vitest';
import { PERIOD_MODE } from '../../../src/plan/periodMode.js';
import { StoredSchedule } from '../../../src/plan/warehouse/storedSchedule.js';
import { ValueBounds } from '../../../src/plan/warehouse/valueBounds.js';
import { ValueProgram } from '../../../src/plan/warehouse/valueProgram.js';
import { StepScratch } from '../../../src/plan/warehouse/valueSteps.js';
import type { StoredDay } from '../../../src/plan/warehouse/storedDay.js';
import { loadHighsSolver } from '../../reference/highsDayModel.js';
import { SeededRandom } from '../../reference/randomDays.js';
import { type PeriodSet, solveStoredLp } from '../../reference/storedDayLp.js';
import { modeChoices, randomModes, randomStoredDay, relGap, storedLp, storedValue, storedViolations } from './randomStoredDays.js';

// The dynamic program (valueProgram.ts) solves the day at a multiplier mu with one mode in every period
// exactly. Brute force: every assignment of charge-only or discharge-only to the periods where that
// choice matters (free arbitrage periods with q_t - mu > p_t), each an LP solved by HiGHS
// (test/reference/storedDayLp.ts; elsewhere both flows may run, which netting makes free), and the
// best of them. The bounds (valueBounds.ts) are checked against the same optimum: the chord bound
// W_0(s_0) is at least the optimum, the exact one equals it on these small days (no upper hulls
// needed), and the lower bound is at most the optimum (equal to it with the exact values).
const highs = await loadHighsSolver();
const DAYS = 300;

interface Case {
  readonly name: string;
  readonly day: StoredDay;
  readonly modes: Int8Array;
  readonly mu: number;
  /** The best value over mode assignments at mu (value - mu sum y), -Infinity when none is feasible. */
  readonly optimum: number;
}

function cases(): Case[] {
  const all: Case[] = [];
  for (let i = 0; i < DAYS; i++) {
    const name = `dp-stage-${i}`;
    const day = randomStoredDay(name);
    const modes = randomModes(name, day.periods);
    const mu = SeededRandom.fromName(`${name}-mu`).pick([0, 0, 5, 30]);
    const either: number[] = [];
    const base: PeriodSet[] = Array.from(modes, (mode, t) => {
      if (mode === PERIOD_MODE.chargeOnly) return 'charge';
      if (mode === PERIOD_MODE.dischargeOnly) return 'discharge';
      if (day.arbitrage[t] === 1 && day.dischargePrice[t]! - mu > day.chargePrice[t]!) either.push(t);
      return 'box';
    });
    let optimum = -Infinity;
    for (const sets of modeChoices(base, either)) {
      const lp = solveStoredLp(highs, storedLp(day, mu, sets));
      if (lp.status === 'optimal') optimum = Math.max(optimum, lp.objective);
    }
    all.push({ name, day, modes, mu, optimum });
  }
  return all;
}

const days = cases();

describe('the dynamic program against every mode assignment (HiGHS)', () => {
  it(`${DAYS} seeded small days with random modes and multipliers: the best assignment's value to 1e-9, feasible, one mode in every period`, () => {
    const program = new ValueProgram(8);
    const out = new StoredSchedule(8);
    const failures: string[] = [];
    let feasible = 0;
    for (const { name, day, modes, mu, optimum } of days) {
      const status = program.load(day, { maxBreakpoints: Infinity, incumbent: null }).solveAt(mu, modes, out);
      if (optimum === -Infinity) {
        if (status !== 'start-unreachable' && status !== 'end-unreachable') failures.push(`${name}: no feasible assignment, program ${status}`);
        continue;
      }
      if (status !== 'ok') {
        failures.push(`${name}: HiGHS optimal, program ${status}`);
        continue;
      }
      feasible++;
      const atMu = out.value - mu * out.discharged;
      if (relGap(atMu, optimum) > 1e-9) failures.push(`${name}: program ${atMu}, best assignment ${optimum}`);
      if (relGap(storedValue(day, out.x, out.y), out.value) > 1e-12) failures.push(`${name}: reported value differs from the schedule's`);
      failures.push(...storedViolations(day, out.x, out.y, { complementary: () => true }).map((v) => `${name}: ${v}`));
      for (let t = 0; t < day.periods; t++) {
        if (modes[t] === PERIOD_MODE.chargeOnly && out.y[t]! > 0) failures.push(`${name}: period ${t} is charge-only but discharges`);
        if (modes[t] === PERIOD_MODE.dischargeOnly && out.x[t]! > 0) failures.push(`${name}: period ${t} is discharge-only but charges`);
      }
    }
    expect(failures).toEqual([]);
    expect(feasible).toBeGreaterThan(DAYS * 0.75);
  });
});

describe('the bounds of the dynamic program against the same optimum', () => {
  it(`${DAYS} seeded small days: chord W_0(s_0) >= optimum, exact W_0(s_0) = optimum, lower bound <= optimum (= with the exact values)`, () => {
    const bounds = new ValueBounds(8);
    const scratch = new StepScratch();
    const failures: string[] = [];
    for (const { name, day, modes, mu, optimum } of days) {
      const inside = day.socStartMwh >= day.socMinMwh && day.socStartMwh <= day.socMaxMwh;
      if (optimum === -Infinity || !inside) continue;
      const run = { day, mu, modes };
      const tol = 1e-9 * Math.max(1, Math.abs(optimum));
      for (const exact of [false, true]) {
        const label = exact ? 'exact' : 'chord';
        if (!bounds.compute(run, exact, scratch)) {
          failures.push(`${name}: ${label} bounds found no path on a feasible day`);
          continue;
        }
        const upper = bounds.values.at(0, day.socStartMwh);
        if (upper < optimum - tol) failures.push(`${name}: ${label} W_0(s_0) ${upper} below the optimum ${optimum}`);
        if (exact && Math.abs(upper - optimum) > tol) failures.push(`${name}: exact W_0(s_0) ${upper}, optimum ${optimum}`);
        if (bounds.lowerBound > optimum + tol) failures.push(`${name}: ${label} lower bound ${bounds.lowerBound} above the optimum ${optimum}`);
        if (exact && Math.abs(bounds.lowerBound - optimum) > tol) failures.push(`${name}: exact lower bound ${bounds.lowerBound}, optimum ${optimum}`);
      }
    }
    expect(failures).toEqual([]);
  });
});
