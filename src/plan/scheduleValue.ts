import type { DayProblem, Schedule } from '../types.js';

/**
 * Objective value of a schedule at the problem's prices [currency]:
 * sum_t dt (sell_t d_t - buy_t c_t) - deg sum_t dt d_t + terminal s_T (docs/design.md section 4).
 */
export function scheduleValue(problem: DayProblem, schedule: Schedule): number {
  const dt = problem.periodHours;
  const deg = problem.battery.degradationCostPerMwh;
  let value = 0;
  for (let t = 0; t < schedule.chargeMw.length; t++) {
    const c = schedule.chargeMw[t] as number;
    const d = schedule.dischargeMw[t] as number;
    value += dt * (((problem.sellPricePerMwh[t] as number) - deg) * d - (problem.buyPricePerMwh[t] as number) * c);
  }
  const last = schedule.socMwh[schedule.socMwh.length - 1];
  if (problem.terminalValuePerMwh && last !== undefined) value += problem.terminalValuePerMwh * last;
  return value;
}

/** State of charge after each period by the recursion s_t = s_{t-1} + eta_c dt c_t - dt d_t / eta_d [MWh]. */
export function socPath(problem: DayProblem, chargeMw: readonly number[], dischargeMw: readonly number[]): number[] {
  const { chargeEfficiency, dischargeEfficiency } = problem.battery;
  const dt = problem.periodHours;
  const soc: number[] = new Array<number>(chargeMw.length);
  let s = problem.socStartMwh;
  for (let t = 0; t < chargeMw.length; t++) {
    s += chargeEfficiency * dt * (chargeMw[t] as number) - (dt * (dischargeMw[t] as number)) / dischargeEfficiency;
    soc[t] = s;
  }
  return soc;
}
