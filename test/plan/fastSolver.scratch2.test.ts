import { it } from 'vitest';
import { randomDay } from '../reference/randomDays.js';
import { solveDayFast, toStoredDay } from '../../src/plan/fast/index.js';

it('inspect', () => {
  for (const name of ['scratch-17','scratch-39','scratch-48','scratch-57','scratch-102','scratch-112','scratch-153','scratch-167']) {
    const p = randomDay(name);
    const d = toStoredDay(p);
    const b = p.battery;
    console.log(name, JSON.stringify({ T: d.periods, arb: d.arbitrageCount, X: d.chargeStepMwh.toFixed(3), Y: d.dischargeStepMwh.toFixed(3), win: (b.socMaxMwh - b.socMinMwh).toFixed(3), cap: b.maxDischargeMwhPerDay?.toFixed(2), eta: [b.chargeEfficiency.toFixed(3), b.dischargeEfficiency.toFixed(3)], deg: b.degradationCostPerMwh, spreadPoint: p.buyPricePerMwh[0] === p.sellPricePerMwh[0] }));
  }
});
