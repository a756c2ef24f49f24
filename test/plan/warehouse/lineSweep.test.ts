import { describe, expect, it } from 'vitest';
import { PERIOD_MODE } from '../../../src/plan/periodMode.js';
import { sweepLine, SweepWorkspace } from '../../../src/plan/warehouse/lineSweep.js';
import { StoredSchedule } from '../../../src/plan/warehouse/storedSchedule.js';
import { loadHighsSolver } from '../../reference/highsDayModel.js';
import { type PeriodSet, solveStoredLp } from '../../reference/storedDayLp.js';
import { SeededRandom } from '../../reference/randomDays.js';
import { randomModes, randomStoredDay, relGap, storedLp, storedValue, storedViolations } from './randomStoredDays.js';

// The sweep (lineSweep.ts) solves the day at a multiplier mu with per-period modes, free arbitrage
// periods relaxed to the convex hull of their two modes. Brute force: the same relaxation written
// as an LP from its definition (test/reference/storedDayLp.ts) and solved by HiGHS: a fixed mode
// allows one flow, a free arbitrage period with q_t - mu > p_t the triangle x/X + y/Y <= 1, any
// other free period both flows (netting them loses nothing there, storedDay.ts).
const highs = await loadHighsSolver();

describe('the sweep against the LP of its relaxation (HiGHS)', () => {
  it('400 seeded small days with random modes and multipliers: the LP optimum to 1e-9, a feasible schedule, no simultaneous flows outside the relaxed periods', () => {
    const ws = new SweepWorkspace(8);
    const out = new StoredSchedule(8);
    const failures: string[] = [];
    let optimal = 0;
    for (let i = 0; i < 400; i++) {
      const name = `sweep-stage-${i}`;
      const day = randomStoredDay(name);
      const modes = randomModes(name, day.periods);
      const mu = SeededRandom.fromName(`${name}-mu`).pick([0, 0, 7.5, 40]);
      const relaxed = (t: number): boolean => modes[t] === PERIOD_MODE.free && day.arbitrage[t] === 1 && day.dischargePrice[t]! - mu > day.chargePrice[t]!;
      const sets: PeriodSet[] = Array.from(modes, (mode, t) => (mode === PERIOD_MODE.chargeOnly ? 'charge' : mode === PERIOD_MODE.dischargeOnly ? 'discharge' : relaxed(t) ? 'triangle' : 'box'));
      const reference = solveStoredLp(highs, storedLp(day, mu, sets));
      const status = sweepLine(day, mu, modes, ws, out);
      if (reference.status !== 'optimal') {
        if (reference.status !== 'infeasible' || (status !== 'start-unreachable' && status !== 'end-unreachable')) failures.push(`${name}: HiGHS ${reference.status}, sweep ${status}`);
        continue;
      }
      if (status !== 'ok') {
        failures.push(`${name}: HiGHS optimal, sweep ${status}`);
        continue;
      }
      optimal++;
      const atMu = out.value - mu * out.discharged;
      if (relGap(atMu, reference.objective) > 1e-9) failures.push(`${name}: sweep ${atMu}, HiGHS ${reference.objective}`);
      if (relGap(storedValue(day, out.x, out.y), out.value) > 1e-12) failures.push(`${name}: reported value differs from the schedule's`);
      failures.push(...storedViolations(day, out.x, out.y, { complementary: (t) => !relaxed(t) }).map((v) => `${name}: ${v}`));
      // Inside the relaxed periods the flows must lie in the triangle.
      for (let t = 0; t < day.periods; t++) {
        if (relaxed(t) && out.x[t]! / day.chargeStepMwh + out.y[t]! / day.dischargeStepMwh > 1 + 1e-9) failures.push(`${name}: period ${t} outside its triangle`);
      }
    }
    expect(failures).toEqual([]);
    // Most days must be feasible, or the check says little.
    expect(optimal).toBeGreaterThan(300);
  });
});
