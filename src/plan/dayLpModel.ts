import type { DayProblem } from '../types.js';
import type { LpModel } from './lpSolver.js';

/** Per-period restriction used by the branch and bound: the period may only charge, or only discharge. */
export type PeriodMode = 'charge-only' | 'discharge-only';

/**
 * The planning LP of docs/design.md section 4 as a row model. Variables: c{t} charge [MW], d{t} discharge
 * [MW], s{t} state of charge at the end of period t [MWh]. Rows:
 * - b{t}: s_t - s_{t-1} - eta_c dt c_t + (dt / eta_d) d_t = 0   (s_0 moved to the right-hand side)
 * - s_t within [socMin, socMax]; s_T >= max(socMin, socEndMin)
 * - c_t <= chargeMw, d_t <= dischargeMw (0 where a mode forbids the flow)
 * - cycle cap: sum_t dt d_t / eta_d <= maxFromStoreMwhPerDay (energy taken out of the store)
 * Objective row `value`: sum_t dt (sell_t - deg) d_t - dt buy_t c_t + terminal s_T.
 */
export function dayLpModel(problem: DayProblem, modes: ReadonlyMap<number, PeriodMode> = new Map()): LpModel {
  const { battery, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const constraints: Record<string, { max?: number; min?: number; equal?: number }> = {};
  const variables: Record<string, Record<string, number>> = {};
  const endFloor = Math.max(battery.socMinMwh, problem.socEndMinMwh);
  const hasCap = battery.maxFromStoreMwhPerDay !== undefined;
  if (hasCap) constraints.cycles = { max: battery.maxFromStoreMwhPerDay as number };
  for (let t = 0; t < periods; t++) {
    const mode = modes.get(t);
    constraints[`b${t}`] = { equal: t === 0 ? problem.socStartMwh : 0 };
    constraints[`cmax${t}`] = { max: mode === 'discharge-only' ? 0 : battery.chargeMw };
    constraints[`dmax${t}`] = { max: mode === 'charge-only' ? 0 : battery.dischargeMw };
    constraints[`smax${t}`] = { max: battery.socMaxMwh };
    constraints[`smin${t}`] = { min: t === periods - 1 ? endFloor : battery.socMinMwh };
    variables[`c${t}`] = { value: -dt * (problem.buyPricePerMwh[t] as number), [`b${t}`]: -battery.chargeEfficiency * dt, [`cmax${t}`]: 1 };
    const discharge: Record<string, number> = {
      value: dt * ((problem.sellPricePerMwh[t] as number) - battery.degradationCostPerMwh),
      [`b${t}`]: dt / battery.dischargeEfficiency,
      [`dmax${t}`]: 1,
    };
    if (hasCap) discharge.cycles = dt / battery.dischargeEfficiency;
    variables[`d${t}`] = discharge;
    const soc: Record<string, number> = { [`b${t}`]: 1, [`smax${t}`]: 1, [`smin${t}`]: 1 };
    if (t + 1 < periods) soc[`b${t + 1}`] = -1;
    if (t === periods - 1 && problem.terminalValuePerMwh) soc.value = problem.terminalValuePerMwh;
    variables[`s${t}`] = soc;
  }
  return { objectiveRow: 'value', direction: 'max', constraints, variables };
}
