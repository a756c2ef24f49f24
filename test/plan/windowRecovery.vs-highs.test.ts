import { describe, expect, it } from 'vitest';
import { solveDayWithRecovery, windowRecovery } from '../../src/plan/windowRecovery.js';
import type { DayProblem } from '../../src/types.js';
import { loadHighsSolver, solveDayWithHighs, type SocBounds } from '../reference/highsDayModel.js';
import { randomDay, SeededRandom } from '../reference/randomDays.js';

// Reference: HiGHS (npm `highs` 1.15.3) solving the MIP of test/reference/highsDayModel.ts (a binary
// mode per period, zero gaps) with the window's bounds replaced by the time-varying bounds of a start
// outside the window: s_t >= min(socMin, s_0 + t eta_c dt chargeMw) from below, or
// s_t <= max(socMax, s_0 - t dt dischargeMw / eta_d) from above (t = 1..T counts period ends). They
// say "back into the window as fast as the power allows" and nothing more, so HiGHS's optimum is the
// best plan that keeps that promise, found without any of src/plan's recovery code.
const highs = await loadHighsSolver();
const relGap = (a: number, b: number): number => Math.abs(a - b) / Math.max(1, Math.abs(b));

/** A seeded day starting outside the window by `periodsOut` full-power periods (or null when the day has no room beyond its window). */
function dayOutside(name: string, periodsOut: number): { problem: DayProblem; bounds: SocBounds } | null {
  const seeded = randomDay(name, { periods: 24 });
  const rng = SeededRandom.fromName(`${name} start`);
  // A narrow window in the middle and a low power, so that a start several periods outside it is possible.
  const e = seeded.battery.energyMwh;
  const power = (rng.uniform(0.03, 0.09) * e) / seeded.periodHours;
  const b = { ...seeded.battery, socMinMwh: 0.45 * e, socMaxMwh: 0.55 * e, chargeMw: power, dischargeMw: rng.chance(0.5) ? power : 1.2 * power };
  const base: DayProblem = { ...seeded, battery: b };
  const dt = base.periodHours;
  const up = b.chargeEfficiency * dt * b.chargeMw;
  const down = (dt * b.dischargeMw) / b.dischargeEfficiency;
  const fromBelow = rng.chance(0.5);
  const s0 = fromBelow ? b.socMinMwh - periodsOut * up : b.socMaxMwh + periodsOut * down;
  // A state of charge lies in [0, energyMwh] whatever the window.
  if (s0 < 0 || s0 > b.energyMwh) return null;
  const periods = base.buyPricePerMwh.length;
  const problem: DayProblem = { ...base, socStartMwh: s0, socEndMinMwh: Math.min(b.socMaxMwh, Math.max(b.socMinMwh, base.socEndMinMwh)) };
  const bounds: SocBounds = {
    lowerMwh: Array.from({ length: periods }, (_, t) => (fromBelow ? Math.min(b.socMinMwh, s0 + (t + 1) * up) : b.socMinMwh)),
    upperMwh: Array.from({ length: periods }, (_, t) => (fromBelow ? b.socMaxMwh : Math.max(b.socMaxMwh, s0 - (t + 1) * down))),
  };
  return { problem, bounds };
}

describe('a start outside the window, against HiGHS with the time-varying bounds', () => {
  it('80 seeded days starting 0.3 to 3.7 full-power periods outside the window, through the warehouse solver and the LP path', () => {
    let compared = 0;
    let optimal = 0;
    for (let i = 0; i < 120 && compared < 80; i++) {
      const periodsOut = 0.3 + (i % 12) * 0.3;
      const day = dayOutside(`recovery ${i}`, periodsOut);
      if (day === null) continue;
      const { problem, bounds } = day;
      const recovery = windowRecovery(problem.battery, problem.periodHours, problem.socStartMwh, problem.buyPricePerMwh.length);
      expect(recovery).not.toBeNull();
      if (recovery === null) continue;
      // The forced periods: every whole period after which one more cannot yet reach the window.
      expect(recovery.forcedPeriods).toBe(Math.max(0, Math.ceil(periodsOut - 1 - 1e-9)));
      const reference = solveDayWithHighs(highs, problem, true, bounds);
      // The warehouse solver alone (a day it did not cover would throw) and the LP path alone.
      for (const solver of ['warehouse', 'lp'] as const) {
        const ours = solveDayWithRecovery(problem, recovery, { solver });
        const label = `day ${i}, ${solver === 'warehouse' ? 'warehouse solver' : 'LP path'}`;
        expect(ours.status, label).toBe(reference.status);
        if (ours.status !== 'optimal' || reference.status !== 'optimal') continue;
        expect(relGap(ours.objective, reference.objective), `${label}: ${ours.objective} against ${reference.objective}`).toBeLessThan(1e-6);
        // Our schedule keeps the same bounds, and the forced periods run at full power.
        const tol = 1e-7 * Math.max(1, problem.battery.energyMwh);
        ours.schedule.socMwh.forEach((s, t) => {
          expect(s, `${label}, period ${t}`).toBeGreaterThanOrEqual((bounds.lowerMwh[t] as number) - tol);
          expect(s, `${label}, period ${t}`).toBeLessThanOrEqual((bounds.upperMwh[t] as number) + tol);
        });
        for (let t = 0; t < recovery.forcedPeriods; t++) {
          const flow = recovery.direction === 'charge' ? ours.schedule.chargeMw[t] : ours.schedule.dischargeMw[t];
          expect(flow, label).toBe(recovery.direction === 'charge' ? problem.battery.chargeMw : problem.battery.dischargeMw);
        }
      }
      if (reference.status === 'optimal') optimal++;
      compared++;
    }
    expect(compared).toBe(80);
    // Most days have a plan (an unreachable end floor or a cycle cap below the forced discharge can leave none).
    expect(optimal).toBeGreaterThan(60);
  });
});
