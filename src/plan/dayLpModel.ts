import type { DayProblem } from '../types.js';
import type { LpModel } from './lpSolver.js';
import { PERIOD_MODE } from './periodMode.js';
import { isArbitragePeriod } from './simultaneousFlows.js';

/**
 * The planning LP of docs/design.md section 4 as a row model. Variables: c{t} charge [MW], d{t} discharge
 * [MW], s{t} state of charge at the end of period t [MWh]. Rows:
 * - b{t}: s_t - s_{t-1} - eta_c dt c_t + (dt / eta_d) d_t = 0   (s_0 moved to the right-hand side)
 * - s_t within [socMin, socMax]; s_T >= max(socMin, socEndMin)
 * - c_t <= chargeMw, d_t <= dischargeMw (0 where the period's mode, a PERIOD_MODE value, forbids the flow)
 * - cycle cap: sum_t dt d_t / eta_d <= maxFromStoreMwhPerDay (energy taken out of the store)
 * - h{t}, in a free arbitrage period (simultaneousFlows.ts): c_t / C + d_t / D <= 1, the convex hull
 *   of "charge only" and "discharge only" (Balas 1979, "Disjunctive programming", Ann. Discrete Math.
 *   5). C and D are the most one period can charge and discharge without a simultaneous flow: the
 *   power limits, and when the start lies in the window also the window's width W (C <= W /
 *   (eta_c dt), D <= eta_d W / dt), since s_{t-1} and s_t both lie in it. Valid for every schedule
 *   without simultaneous flows, it tightens the relaxation the branch and bound starts from (a
 *   tight window against the power once took it past 5,000 nodes without it).
 * Objective row `value`: sum_t dt (sell_t - deg) d_t - dt buy_t c_t + terminal s_T.
 */
export function dayLpModel(problem: DayProblem, modes?: Int8Array): LpModel {
  const { battery, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const constraints: Record<string, { max?: number; min?: number; equal?: number }> = {};
  const variables: Record<string, Record<string, number>> = {};
  const endFloor = Math.max(battery.socMinMwh, problem.socEndMinMwh);
  const hasCap = battery.maxFromStoreMwhPerDay !== undefined;
  const inside = problem.socStartMwh >= battery.socMinMwh && problem.socStartMwh <= battery.socMaxMwh;
  const widthMwh = inside ? battery.socMaxMwh - battery.socMinMwh : Infinity;
  const hullChargeMw = Math.min(battery.chargeMw, widthMwh / (battery.chargeEfficiency * dt));
  const hullDischargeMw = Math.min(battery.dischargeMw, (widthMwh * battery.dischargeEfficiency) / dt);
  if (hasCap) constraints.cycles = { max: battery.maxFromStoreMwhPerDay as number };
  for (let t = 0; t < periods; t++) {
    const mode = modes?.[t] ?? PERIOD_MODE.free;
    constraints[`b${t}`] = { equal: t === 0 ? problem.socStartMwh : 0 };
    constraints[`cmax${t}`] = { max: mode === PERIOD_MODE.dischargeOnly ? 0 : battery.chargeMw };
    constraints[`dmax${t}`] = { max: mode === PERIOD_MODE.chargeOnly ? 0 : battery.dischargeMw };
    constraints[`smax${t}`] = { max: battery.socMaxMwh };
    constraints[`smin${t}`] = { min: t === periods - 1 ? endFloor : battery.socMinMwh };
    const charge: Record<string, number> = { value: -dt * (problem.buyPricePerMwh[t] as number), [`b${t}`]: -battery.chargeEfficiency * dt, [`cmax${t}`]: 1 };
    variables[`c${t}`] = charge;
    const discharge: Record<string, number> = {
      value: dt * ((problem.sellPricePerMwh[t] as number) - battery.degradationCostPerMwh),
      [`b${t}`]: dt / battery.dischargeEfficiency,
      [`dmax${t}`]: 1,
    };
    if (hasCap) discharge.cycles = dt / battery.dischargeEfficiency;
    if (mode === PERIOD_MODE.free && hullChargeMw > 0 && hullDischargeMw > 0 && isArbitragePeriod(problem, t)) {
      constraints[`h${t}`] = { max: 1 };
      charge[`h${t}`] = 1 / hullChargeMw;
      discharge[`h${t}`] = 1 / hullDischargeMw;
    }
    variables[`d${t}`] = discharge;
    const soc: Record<string, number> = { [`b${t}`]: 1, [`smax${t}`]: 1, [`smin${t}`]: 1 };
    if (t + 1 < periods) soc[`b${t + 1}`] = -1;
    if (t === periods - 1 && problem.terminalValuePerMwh) soc.value = problem.terminalValuePerMwh;
    variables[`s${t}`] = soc;
  }
  return { objectiveRow: 'value', direction: 'max', constraints, variables };
}
