import type { StoredDay } from './storedDay.js';

/**
 * A schedule in stored-energy units (storedDay.ts): x_t [MWh put into the store] and y_t [MWh taken
 * out] per period, with its value sum_t (q_t y_t - p_t x_t) + V s_T (without any multiplier term)
 * and its discharged energy sum_t y_t. Every stage writes its answer into one of these.
 */
export class StoredSchedule {
  readonly x: Float64Array;
  readonly y: Float64Array;
  value = 0;
  discharged = 0;

  constructor(periods: number) {
    this.x = new Float64Array(periods);
    this.y = new Float64Array(periods);
  }

  copyFrom(other: StoredSchedule): void {
    this.x.set(other.x);
    this.y.set(other.y);
    this.value = other.value;
    this.discharged = other.discharged;
  }
}

/**
 * Netting of simultaneous flows in period t: (x, y) -> (x - y, 0) if x >= y, else (0, y - x).
 * Keeps every s_t, lowers power and cycle use, and changes the value by (p_t - q_t) min(x, y),
 * which is >= 0 outside arbitrage periods (proof in storedDay.ts).
 */
export function netPeriod(schedule: StoredSchedule, t: number): void {
  const x = schedule.x[t]!;
  const y = schedule.y[t]!;
  // Both flows lowered by the smaller, nothing when either is 0: one formula for every case (x - x
  // and y - y are exactly 0), since a case of its own, first met late, would throw the compiled
  // callers away.
  const netted = Math.max(0, Math.min(x, y));
  schedule.x[t] = x - netted;
  schedule.y[t] = y - netted;
}

/** Periods netted before a schedule is revalued: none, those outside arbitrage periods (no loss), or every one. */
export type Netting = 'none' | 'outside-arbitrage' | 'every';

/**
 * Nets the periods `netting` names (netPeriod), then recomputes value = sum_t (q_t y_t - p_t x_t) + V s_T
 * and the discharged energy sum_t y_t, in one pass.
 */
export function revalue(day: StoredDay, schedule: StoredSchedule, netting: Netting = 'none'): void {
  let value = 0;
  let discharged = 0;
  let soc = day.socStartMwh;
  for (let t = 0; t < day.periods; t++) {
    if (netting === 'every' || (netting === 'outside-arbitrage' && day.arbitrage[t] === 0)) netPeriod(schedule, t);
    const x = schedule.x[t]!;
    const y = schedule.y[t]!;
    value += day.dischargePrice[t]! * y - day.chargePrice[t]! * x;
    discharged += y;
    soc += x - y;
  }
  schedule.value = value + day.terminalValuePerMwh * soc;
  schedule.discharged = discharged;
}
