import type { LineSolution } from './lineSweep.js';
import type { StoredDay } from './storedDay.js';

/**
 * Netting of simultaneous flows in stored units: (x, y) -> (x - y, 0) if x >= y, else (0, y - x).
 * Keeps every s_t, lowers power and cycle use, and changes the value by (p_t - q_t) min(x, y),
 * which is >= 0 outside arbitrage periods (proof in storedDay.ts).
 */
export function netPeriod(sol: LineSolution, t: number): void {
  const x = sol.x[t]!;
  const y = sol.y[t]!;
  if (x <= 0 || y <= 0) return;
  if (x >= y) {
    sol.x[t] = x - y;
    sol.y[t] = 0;
  } else {
    sol.x[t] = 0;
    sol.y[t] = y - x;
  }
}

/** Periods netted before a solution is revalued: none, those outside arbitrage periods (no loss), or every one. */
export type Netting = 'none' | 'outside-arbitrage' | 'every';

/**
 * Nets the periods `netting` names (netPeriod), then recomputes value = sum_t (q_t y_t - p_t x_t) + V s_T
 * and the total y of the solution, in one pass.
 */
export function revalue(day: StoredDay, sol: LineSolution, netting: Netting = 'none'): void {
  let value = 0;
  let discharged = 0;
  let soc = day.socStartMwh;
  for (let t = 0; t < day.periods; t++) {
    if (netting === 'every' || (netting === 'outside-arbitrage' && day.arbitrage[t] === 0)) netPeriod(sol, t);
    const x = sol.x[t]!;
    const y = sol.y[t]!;
    value += day.dischargePrice[t]! * y - day.chargePrice[t]! * x;
    discharged += y;
    soc += x - y;
  }
  sol.value = value + day.terminalValuePerMwh * soc;
  sol.discharged = discharged;
}
