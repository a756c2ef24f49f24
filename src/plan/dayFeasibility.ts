import type { DayProblem } from '../types.js';

/**
 * Reasons a day problem has no feasible schedule that can be told before solving, in words an operator
 * can act on; null when none is found (the LP may still find one).
 */
export function infeasibilityReason(problem: DayProblem): string | null {
  const { battery, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const s0 = problem.socStartMwh;
  const tol = 1e-9 * Math.max(1, battery.energyMwh);
  if (periods === 0) return 'the day has no delivery periods';
  if (problem.sellPricePerMwh.length !== periods) return 'buy and sell price series differ in length';
  // A start outside the window is a day problem only when the first period can bring it inside at
  // full power (the rows s_t in [socMin, socMax] hold from the first period's end on); further out,
  // planDay first runs the forced periods of windowRecovery.ts.
  const firstChargeMwh = battery.chargeEfficiency * dt * battery.chargeMw;
  const firstDischargeMwh = (dt * battery.dischargeMw) / battery.dischargeEfficiency;
  if (s0 + firstChargeMwh < battery.socMinMwh - tol || s0 - firstDischargeMwh > battery.socMaxMwh + tol) {
    return `the starting state of charge ${fmt(s0)} MWh is outside the window [${fmt(battery.socMinMwh)}, ${fmt(battery.socMaxMwh)}] MWh and the first period cannot bring it inside at full power; start inside it (--soc-start) or widen the window`;
  }
  const target = Math.max(problem.socEndMinMwh, battery.socMinMwh);
  if (target > battery.socMaxMwh + tol) {
    return `the end-of-day floor ${fmt(target)} MWh is above the highest allowed state of charge ${fmt(battery.socMaxMwh)} MWh`;
  }
  const reachable = Math.min(battery.socMaxMwh, s0 + battery.chargeEfficiency * dt * battery.chargeMw * periods);
  if (reachable < target - tol) {
    return `the end-of-day floor ${fmt(target)} MWh cannot be reached from ${fmt(s0)} MWh: at most ${fmt(reachable)} MWh can be stored by the end of the day at ${fmt(battery.chargeMw)} MW`;
  }
  return null;
}

function fmt(x: number): string {
  return Number(x.toFixed(6)).toString();
}
