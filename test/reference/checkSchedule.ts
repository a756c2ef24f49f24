import type { DayProblem, Schedule } from '../../src/types.js';

/**
 * An independent feasibility check of a schedule against the day problem of docs/design.md section 4.
 *
 * Recomputes the state of charge by s_t = s_{t-1} + eta_c dt c_t - dt d_t / eta_d from s_{-1} =
 * socStart and lists every violation of: array lengths; 0 <= c_t <= chargeMw; 0 <= d_t <=
 * dischargeMw; the reported s_t equal to the recomputed one; socMin <= s_t <= socMax;
 * s_{T-1} >= socEndMin; sum_t dt d_t / eta_d <= maxFromStoreMwhPerDay (energy taken out of the store);
 * never c_t > 0 and d_t > 0 together.
 *
 * Tolerance: `toleranceMwh` (default 1e-9 x max(1, energyMwh)) on energies and the same number,
 * read in MW, on powers; a flow counts as simultaneous when both flows exceed it.
 */
export function checkSchedule(problem: DayProblem, schedule: Schedule, toleranceMwh = 1e-9 * Math.max(1, problem.battery.energyMwh)): string[] {
  const b = problem.battery;
  const dt = problem.periodHours;
  const periods = problem.buyPricePerMwh.length;
  const tol = toleranceMwh;
  const problems: string[] = [];
  for (const [name, series] of [['chargeMw', schedule.chargeMw], ['dischargeMw', schedule.dischargeMw], ['socMwh', schedule.socMwh]] as const) {
    if (series.length !== periods) problems.push(`${name} has ${series.length} values, the day has ${periods} periods`);
  }
  if (problems.length > 0) return problems;
  let soc = problem.socStartMwh;
  let fromStoreMwh = 0;
  for (let t = 0; t < periods; t++) {
    const c = schedule.chargeMw[t] as number;
    const d = schedule.dischargeMw[t] as number;
    if (!(c >= -tol && c <= b.chargeMw + tol)) problems.push(`period ${t}: charge ${c} MW outside [0, ${b.chargeMw}]`);
    if (!(d >= -tol && d <= b.dischargeMw + tol)) problems.push(`period ${t}: discharge ${d} MW outside [0, ${b.dischargeMw}]`);
    if (c > tol && d > tol) problems.push(`period ${t}: charges ${c} MW and discharges ${d} MW at once`);
    soc += b.chargeEfficiency * dt * c - (dt * d) / b.dischargeEfficiency;
    fromStoreMwh += (dt * d) / b.dischargeEfficiency;
    const reported = schedule.socMwh[t] as number;
    if (!(Math.abs(reported - soc) <= tol)) problems.push(`period ${t}: reported state of charge ${reported} MWh, recomputed ${soc}`);
    if (!(soc >= b.socMinMwh - tol && soc <= b.socMaxMwh + tol)) problems.push(`period ${t}: state of charge ${soc} MWh outside [${b.socMinMwh}, ${b.socMaxMwh}]`);
  }
  if (!(soc >= problem.socEndMinMwh - tol)) problems.push(`end state of charge ${soc} MWh below the floor ${problem.socEndMinMwh}`);
  const cap = b.maxFromStoreMwhPerDay;
  if (cap !== undefined && !(fromStoreMwh <= cap + tol)) problems.push(`took ${fromStoreMwh} MWh out of the store, above the cycle cap ${cap}`);
  return problems;
}

/**
 * The objective of a schedule, recomputed from its flows [currency]:
 * sum_t dt ((sell_t - deg) d_t - buy_t c_t) + terminal s_{T-1}, with s recomputed by the recursion.
 */
export function recomputedObjective(problem: DayProblem, schedule: Schedule): number {
  const b = problem.battery;
  const dt = problem.periodHours;
  let value = 0;
  let soc = problem.socStartMwh;
  for (let t = 0; t < problem.buyPricePerMwh.length; t++) {
    const c = schedule.chargeMw[t] as number;
    const d = schedule.dischargeMw[t] as number;
    value += dt * (((problem.sellPricePerMwh[t] as number) - b.degradationCostPerMwh) * d - (problem.buyPricePerMwh[t] as number) * c);
    soc += b.chargeEfficiency * dt * c - (dt * d) / b.dischargeEfficiency;
  }
  return value + (problem.terminalValuePerMwh ?? 0) * soc;
}
