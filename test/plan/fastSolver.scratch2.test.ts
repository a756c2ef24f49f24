import { it } from 'vitest';
import { randomDay } from '../reference/randomDays.js';
import { loadHighsSolver, solveDayWithHighs } from '../reference/highsDayModel.js';
import { solveDayFast } from '../../src/plan/fast/index.js';

const highs = await loadHighsSolver();
it('inspect', () => {
  for (let i = 0; i < 60; i++) {
    const name = `scratch-${i}`;
    const p = randomDay(name);
    const t0 = performance.now();
    const got = solveDayFast(p, { maxNodes: 200 });
    const ms = performance.now() - t0;
    const ref = solveDayWithHighs(highs, p, true);
    const o = (r: any) => r.status === 'optimal' ? r.objective.toFixed(6) : r.status;
    console.log(name, ms.toFixed(2), o(got), o(ref), (got as any).nodes, p.battery.maxDischargeMwhPerDay !== undefined);
  }
});
