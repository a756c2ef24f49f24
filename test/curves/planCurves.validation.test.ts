import { beforeAll, describe, expect, it } from 'vitest';
import type { MarketSpec } from '../../src/types.js';
import { LOSSLESS_BATTERY } from '../reference/losslessBattery.js';
import { loadHighsSolver } from '../../src/app/solver/highsSolver.js';
import type { SparseLpSolver } from '../../src/curves/linearProgram.js';
import { planCurves, PROXIMAL_MULTIPLES } from '../../src/curves/planCurves.js';
import { scenarioSet } from '../../src/scenarios/scenarioSet.js';

// The curves' penalty chosen on validation paths drawn apart from the planning paths (planCurves), on a
// two-hour day worked out by hand. Lossless 4 MWh battery of 2 MW, no wear, starting and ending at
// 2 MWh; the flat bids place no order. Planning paths: 10 in the first hour, 90 in the second, give or
// take 0.5, so the program buys 2 MWh first and sells them after, in every step of the curve:
// 2 x (90 - 10) = 160 per path.
// - Validation paths that agree (10 then 90, give or take 1): the curves earn 2 (p2 - p1) on each, about
//   160 with a standard error near 0.1, so they are kept, and their validation advantage is
//   2 (mean p2 - mean p1) of the validation paths, computed here by hand from the prices.
// - Validation paths that reverse the hours (90 then 10): the curves lose 160 a path there, so the flat
//   bids are chosen, although on the planning paths the curves look 160 better.

const battery = LOSSLESS_BATTERY;
const market = { priceFloor: -500, priceCap: 3000, periodMinutes: 60 } as MarketSpec;
let solver: SparseLpSolver;
beforeAll(async () => {
  solver = await loadHighsSolver();
});

/** n paths [first, second] with a fixed wiggle of +-spread (alternating signs, no randomness). */
function paths(n: number, first: number, second: number, spread: number): number[][] {
  return Array.from({ length: n }, (_, w) => [first + spread * Math.sin(w + 1), second + spread * Math.cos(3 * w + 1)]);
}

function plan(validationPrices: number[][]) {
  const planningPrices = paths(40, 10, 90, 0.5);
  return planCurves({
    planning: scenarioSet(planningPrices, planningPrices, planningPrices),
    validation: scenarioSet(validationPrices, validationPrices, validationPrices),
    switchStandardErrors: 2,
    market,
    battery,
    socStartMwh: 2,
    socEndMinMwh: 2,
    steps: 4,
    riskWeight: 0,
    flatBids: [null, null],
    solver,
  });
}

describe('planCurves: the penalty chosen on validation paths', () => {
  it('keeps the curves where the validation paths confirm them', () => {
    const validationPrices = paths(60, 10, 90, 1);
    const result = plan(validationPrices);
    expect(result.status).toBe('optimal');
    if (result.status !== 'optimal') return;
    expect(result.validated.map((v) => v.penaltyPerMwh)).toHaveLength(PROXIMAL_MULTIPLES.length);
    expect(result.chosen).toBe('curves');
    // Every step buys 2 MW in the first hour and sells 2 MW in the second: a flat curve at any price.
    for (const y of (result.curves[0] as (typeof result.curves)[number]).netSoldMw) expect(y).toBeCloseTo(-2, 9);
    for (const y of (result.curves[1] as (typeof result.curves)[number]).netSoldMw) expect(y).toBeCloseTo(2, 9);
    const byHand = validationPrices.reduce((sum, [p1, p2]) => sum + 2 * ((p2 as number) - (p1 as number)), 0) / validationPrices.length;
    const kept = result.validated.find((v) => v.penaltyPerMwh === result.penaltyPerMwh);
    expect(kept?.advantage.mean).toBeCloseTo(byHand, 9);
    expect(result.plannedCurves.mean - result.plannedFlat.mean).toBeCloseTo(160, 0);
  });

  it('falls back to the flat bids where the validation paths reverse the hours', () => {
    const result = plan(paths(60, 90, 10, 1));
    expect(result.status).toBe('optimal');
    if (result.status !== 'optimal') return;
    expect(result.chosen).toBe('flat');
    expect(result.penaltyPerMwh).toBeNull();
    for (const v of result.validated) expect(v.advantage.mean).toBeLessThan(-150);
    // On the paths it was planned on the program's curves still look 160 better: only validation sees through it.
    expect(result.plannedCurves.mean - result.plannedFlat.mean).toBeCloseTo(160, 0);
  });
});
