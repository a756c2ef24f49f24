import type { Highs } from 'highs';
import { beforeAll, describe, expect, it } from 'vitest';
import type { BatteryModel, MarketSpec } from '../../src/types.js';
import { loadHighsSolver } from '../../src/app/solver/highsSolver.js';
import { solveCurveProgram } from '../../src/curves/curveProgram.js';
import type { SparseLpSolver } from '../../src/curves/linearProgram.js';
import { curvePricePoints } from '../../src/curves/pricePoints.js';
import { curveBids, netSoldFromStored } from '../../src/curves/stepCurve.js';
import { riskAdjustedValue } from '../../src/scenarios/criterion.js';
import { evaluateBids } from '../../src/scenarios/evaluateBids.js';
import { profitDistribution } from '../../src/scenarios/profitDistribution.js';
import { scenarioSet } from '../../src/scenarios/scenarioSet.js';
import { loadHighsSolver as loadHighs } from '../reference/highsDayModel.js';
import { solveExtensiveCurveMip, type ExtensiveCurveDay } from '../reference/extensiveCurveMip.js';
import { SeededRandom } from '../reference/randomDays.js';

// The stored-energy LP of a day of step curves (src/curves/curveProgram.ts), solved with lazy rows,
// against the extensive form in grid units with a binary per path and period against simultaneous
// charge and discharge, solved by HiGHS as a MIP (test/reference/extensiveCurveMip.ts; Huangfu and
// Hall 2018), on seeded tiny days: 2-4 periods, 2-6 paths, 1-4 steps, prices -30..70 (ties included),
// efficiencies 0.75-1, wear, cycle caps, end-of-day floors, with and without the CVaR term. The two
// optima must agree to 1e-6; the curves the program returns, settled path by path (evaluateBids, i.e.
// settleDay), must deliver every cleared quantity on the planning paths (no imbalance) and earn the
// optimum.

const CASES = 250;
const PROXIMAL_CASES = 60;
const market = { priceFloor: -500, priceCap: 3000, periodMinutes: 60 } as MarketSpec;

let highs: Highs;
let solver: SparseLpSolver;
beforeAll(async () => {
  highs = await loadHighs();
  solver = await loadHighsSolver();
});

function randomCase(i: number) {
  const rng = SeededRandom.fromName(`curve-program-${i}`);
  const T = 2 + Math.floor(rng.next() * 3);
  const S = 2 + Math.floor(rng.next() * 5);
  const steps = 1 + Math.floor(rng.next() * 4);
  const energyMwh = 4;
  const socMinMwh = rng.chance(0.5) ? 0 : 0.4;
  const socMaxMwh = rng.chance(0.5) ? 4 : 3.6;
  const battery: BatteryModel = {
    energyMwh,
    chargeMw: rng.uniform(0.8, 3),
    dischargeMw: rng.uniform(0.8, 3),
    chargeEfficiency: rng.chance(0.2) ? 1 : rng.uniform(0.75, 1),
    dischargeEfficiency: rng.chance(0.2) ? 1 : rng.uniform(0.75, 1),
    socMinMwh,
    socMaxMwh,
    socInitialMwh: 2,
    socFinalMinMwh: undefined,
    maxFromStoreMwhPerDay: rng.chance(0.4) ? rng.uniform(0.5, 3) : undefined,
    degradationCostPerMwh: rng.chance(0.5) ? 0 : rng.uniform(0, 5),
  };
  // One case in ten asks to fill the store from empty: out of reach for weak chargers on short days.
  const fill = rng.chance(0.1);
  const socStartMwh = fill ? socMinMwh : rng.uniform(socMinMwh, socMaxMwh);
  const socEndMinMwh = fill ? socMaxMwh : rng.chance(0.8) ? socStartMwh : rng.uniform(socMinMwh, socMaxMwh);
  const prices = Array.from({ length: S }, () => Array.from({ length: T }, () => Math.round(rng.uniform(-30, 70))));
  const riskWeight = rng.chance(0.4) ? rng.uniform(0.1, 2) : 0;
  return { battery, socStartMwh, socEndMinMwh, prices, steps, riskWeight, T, S };
}

/** The extensive form of a case, on the steps the program's price points give each path. */
function extensiveDay(c: ReturnType<typeof randomCase>, points: ReturnType<typeof curvePricePoints>): ExtensiveCurveDay {
  return {
    battery: c.battery,
    periodHours: 1,
    socStartMwh: c.socStartMwh,
    socEndMinMwh: c.socEndMinMwh,
    prices: c.prices,
    steps: points.map((p) => p.breakpoints.length + 1),
    stepOf: c.prices.map((_, w) => points.map((p) => p.stepOfPath[w] as number)),
    sellable: points.map((p) => Array.from(p.sellable, (v) => v === 1)),
    riskWeight: c.riskWeight,
    cvarShare: 0.05,
  };
}

describe('the curve program against the extensive form (HiGHS MIP)', () => {
  it(`agrees on ${CASES} seeded tiny days, and its curves earn the optimum on the planning paths`, () => {
    let optimal = 0;
    let infeasible = 0;
    for (let i = 0; i < CASES; i++) {
      const c = randomCase(i);
      const scenarios = scenarioSet(c.prices, c.prices, c.prices);
      const points = curvePricePoints(scenarios, c.steps);
      const lp = solveCurveProgram({ scenarios, points, battery: c.battery, periodHours: 1, socStartMwh: c.socStartMwh, socEndMinMwh: c.socEndMinMwh, riskWeight: c.riskWeight, cvarShare: 0.05, solver });
      const mip = solveExtensiveCurveMip(highs, extensiveDay(c, points));
      expect(mip.status, `case ${i}`).not.toBe('other');
      expect(lp.status, `case ${i}`).toBe(mip.status);
      if (lp.status !== 'optimal' || mip.status !== 'optimal') {
        infeasible++;
        continue;
      }
      optimal++;
      expect(Math.abs(lp.objective - mip.objective), `case ${i}: LP ${lp.objective}, MIP ${mip.objective}`).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(mip.objective)));
      // The curves, as stacks of limit orders, settled on the planning paths.
      const curves = lp.storedMwh.map((e, t) => ({ breakpoints: Array.from((points[t] as (typeof points)[number]).breakpoints), netSoldMw: Array.from(e, (v) => netSoldFromStored(v, c.battery, 1)) }));
      for (const curve of curves) for (let k = 1; k < curve.netSoldMw.length; k++) expect(curve.netSoldMw[k] as number).toBeGreaterThanOrEqual(curve.netSoldMw[k - 1] as number);
      const outcomes = evaluateBids({ bids: curveBids(curves, market), scenarios, battery: c.battery, periodHours: 1, socStartMwh: c.socStartMwh, unaccepted: 'follow-accepted' });
      for (let w = 0; w < c.S; w++) {
        expect(outcomes.imbalanceMwh[w] as number, `case ${i} path ${w}`).toBeLessThanOrEqual(1e-6);
        expect(outcomes.socEndMwh[w] as number).toBeGreaterThanOrEqual(Math.max(c.battery.socMinMwh, c.socEndMinMwh) - 1e-6);
      }
      const value = riskAdjustedValue(profitDistribution(outcomes), c.riskWeight);
      expect(Math.abs(value - mip.objective), `case ${i}: settled ${value}, MIP ${mip.objective}`).toBeLessThanOrEqual(1e-5 * Math.max(1, Math.abs(mip.objective)));
    }
    // The seeded cases cover both outcomes.
    expect(optimal).toBeGreaterThan(CASES / 2);
    expect(infeasible).toBeGreaterThan(0);
  }, 120_000);

  // The proximal term towards fixed stored energies f_t (the flat bids'), solved for a list of penalties
  // in turn from the last basis: each member's optimum against the extensive form with the same term,
  // written in grid units with a binary per step (test/reference/extensiveCurveMip.ts).
  it(`with the proximal term: every penalty's optimum agrees with the extensive form on ${PROXIMAL_CASES} seeded tiny days`, () => {
    let compared = 0;
    let moved = 0;
    for (let i = 0; i < PROXIMAL_CASES; i++) {
      const c = randomCase(i);
      const rng = SeededRandom.fromName(`curve-program-proximal-${i}`);
      const usable = c.battery.socMaxMwh - c.battery.socMinMwh;
      const towardsStoredMwh = Array.from({ length: c.T }, () => rng.uniform(-usable / 3, usable / 3));
      const penaltiesPerMwh = [0, rng.uniform(0.5, 10), rng.uniform(10, 80)];
      const scenarios = scenarioSet(c.prices, c.prices, c.prices);
      const points = curvePricePoints(scenarios, c.steps);
      const lp = solveCurveProgram({ scenarios, points, battery: c.battery, periodHours: 1, socStartMwh: c.socStartMwh, socEndMinMwh: c.socEndMinMwh, riskWeight: c.riskWeight, cvarShare: 0.05, solver, proximal: { towardsStoredMwh, penaltiesPerMwh } });
      const day = extensiveDay(c, points);
      if (lp.status !== 'optimal') {
        expect(solveExtensiveCurveMip(highs, day).status, `case ${i}`).toBe(lp.status);
        continue;
      }
      expect(lp.family.map((m) => m.penaltyPerMwh)).toEqual(penaltiesPerMwh);
      for (const member of lp.family) {
        const mip = solveExtensiveCurveMip(highs, { ...day, proximal: { towardsStoredMwh, penaltyPerMwh: member.penaltyPerMwh } });
        expect(mip.status, `case ${i} rho ${member.penaltyPerMwh}`).toBe('optimal');
        if (mip.status !== 'optimal') continue;
        expect(Math.abs(member.objective - mip.objective), `case ${i} rho ${member.penaltyPerMwh}: LP ${member.objective}, MIP ${mip.objective}`).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(mip.objective)));
        for (const e of member.storedMwh) for (let k = 1; k < e.length; k++) expect(e[k] as number).toBeLessThanOrEqual(e[k - 1] as number);
        compared++;
      }
      // A penalty changes the optimum in some cases (the term is not idle).
      if (Math.abs((lp.family[2] as (typeof lp.family)[number]).objective - lp.objective) > 1e-6) moved++;
    }
    expect(compared).toBeGreaterThan(PROXIMAL_CASES);
    expect(moved).toBeGreaterThan(PROXIMAL_CASES / 4);
  }, 120_000);
});
