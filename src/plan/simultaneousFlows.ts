import type { DayProblem } from '../types.js';

/**
 * Simultaneous charge and discharge in one period, and when removing it costs nothing.
 *
 * Replacing a pair (c, d) by its net flow keeps the stored energy eta_c dt c - dt d / eta_d unchanged:
 *   if eta_c eta_d c >= d:  (c - d / (eta_c eta_d), 0)   value changes by dt d (buy / (eta_c eta_d) - sell + deg)
 *   otherwise:              (0, d - eta_c eta_d c)       value changes by dt c (buy - (sell - deg) eta_c eta_d)
 * Both changes are >= 0 exactly when (sell - deg) eta_c eta_d <= buy, and both lower power and
 * discharged energy (so the cycle cap still holds). Where the inequality fails (an "arbitrage
 * period", possible only at negative prices) the relaxation profits from burning energy in losses,
 * and complementarity must be enforced by branching.
 */
export function isArbitragePeriod(problem: DayProblem, t: number): boolean {
  const { chargeEfficiency, dischargeEfficiency, degradationCostPerMwh } = problem.battery;
  const sell = problem.sellPricePerMwh[t] as number;
  const buy = problem.buyPricePerMwh[t] as number;
  return (sell - degradationCostPerMwh) * chargeEfficiency * dischargeEfficiency > buy;
}

/** Nets the simultaneous flow of period t in place (exact; see isArbitragePeriod for the proof). */
export function netPeriod(problem: DayProblem, chargeMw: number[], dischargeMw: number[], t: number): void {
  const roundTrip = problem.battery.chargeEfficiency * problem.battery.dischargeEfficiency;
  const c = chargeMw[t] as number;
  const d = dischargeMw[t] as number;
  if (c <= 0 || d <= 0) return;
  if (roundTrip * c >= d) {
    chargeMw[t] = c - d / roundTrip;
    dischargeMw[t] = 0;
  } else {
    chargeMw[t] = 0;
    dischargeMw[t] = d - roundTrip * c;
  }
}
