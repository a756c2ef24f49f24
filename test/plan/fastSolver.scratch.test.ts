import { it } from 'vitest';
import { loadHighsSolver, solveDayWithHighs } from '../reference/highsDayModel.js';
import { randomDay } from '../reference/randomDays.js';
import { checkSchedule } from '../reference/checkSchedule.js';
import { solveDayFast } from '../../src/plan/fast/index.js';

const highs = await loadHighsSolver();
it('scratch', () => {
  let worst = 0; let fails = 0; let maxNodes = 0; let infeas = 0; let hi = 0;
  const N = Number(process.env.N ?? 300);
  for (let i = 0; i < N; i++) {
    const name = `scratch-${i}`;
    const p = randomDay(name);
    const t0 = performance.now();
    const ref = solveDayWithHighs(highs, p, true);
    hi += performance.now() - t0;
    const got = solveDayFast(p);
    if (ref.status !== 'optimal' || got.status !== 'optimal') {
      if (ref.status !== got.status) { fails++; console.log(name, ref.status, got.status, (got as any).reason ?? (ref as any).detail); }
      else infeas++;
      continue;
    }
    const gap = Math.abs(got.objective - ref.objective) / Math.max(1, Math.abs(ref.objective));
    maxNodes = Math.max(maxNodes, got.nodes);
    const v = checkSchedule(p, got.schedule);
    if (gap > 1e-9 || v.length) { fails++; console.log(name, got.objective, ref.objective, gap, got.nodes, v.slice(0, 3)); }
    worst = Math.max(worst, gap);
  }
  console.log({ worst, fails, maxNodes, infeas, highsMs: hi / N });
});
