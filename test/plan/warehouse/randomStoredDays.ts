import type { StoredDay } from '../../../src/plan/warehouse/storedDay.js';
import { SeededRandom } from '../../reference/randomDays.js';
import type { PeriodSet, StoredLp } from '../../reference/storedDayLp.js';

/**
 * Small seeded days in stored-energy units for the stage tests of the warehouse solver: 2 to 6
 * periods, a lossy round trip, buy/sell spreads, wear, negative prices in about a third of the
 * periods (arbitrage periods), a terminal value, a start inside the window (sometimes at an edge,
 * sometimes just outside), an end floor, and a cycle cap on request. Invented inputs only, never
 * check values (the checks come from HiGHS, test/reference/storedDayLp.ts).
 *
 * The day is built here from its definition (storedDay.ts notes), not by toStoredDay, so a stage
 * test depends on no other stage.
 */
export interface StoredDayOptions {
  readonly cap?: boolean;
  readonly minPeriods?: number;
  readonly maxPeriods?: number;
  /** Share of periods with a negative price (default 0.35). */
  readonly negativeShare?: number;
}

export function randomStoredDay(name: string, options: StoredDayOptions = {}): StoredDay {
  const rng = SeededRandom.fromName(name);
  const lo = options.minPeriods ?? 2;
  const periods = lo + Math.floor(rng.next() * ((options.maxPeriods ?? 6) - lo + 1));
  const eta = rng.pick([1, 0.95, 0.9, 0.85]);
  const wear = rng.pick([0, 0, 3]);
  const socMinMwh = round(rng.uniform(0, 2));
  const width = round(rng.pick([0.5, 1, 2, 4]) * rng.uniform(0.5, 1.5));
  const socMaxMwh = socMinMwh + width;
  const chargeFullMwh = round(rng.uniform(0.3, 2.5));
  const dischargeFullMwh = rng.chance(0.5) ? chargeFullMwh : round(rng.uniform(0.3, 2.5));
  const startChoice = rng.next();
  const socStartMwh =
    startChoice < 0.15 ? socMinMwh : startChoice < 0.3 ? socMaxMwh : startChoice < 0.35 ? socMaxMwh + round(rng.uniform(0.1, 1)) : round(socMinMwh + width * rng.next());
  const inside = socStartMwh >= socMinMwh && socStartMwh <= socMaxMwh;
  const chargeStepMwh = Math.min(chargeFullMwh, inside ? width : Infinity);
  const dischargeStepMwh = Math.min(dischargeFullMwh, inside ? width : Infinity);
  const chargePrice = new Float64Array(periods);
  const dischargePrice = new Float64Array(periods);
  const arbitrage = new Uint8Array(periods);
  let arbitrageCount = 0;
  let priceSum = 0;
  for (let t = 0; t < periods; t++) {
    const price = rng.chance(options.negativeShare ?? 0.35) ? -round(rng.uniform(5, 80)) : round(rng.uniform(0, 100));
    const half = rng.chance(0.5) ? 0 : round(rng.uniform(0, 4));
    chargePrice[t] = (price + half) / eta;
    dischargePrice[t] = (price - half - wear) * eta;
    priceSum += chargePrice[t]! + dischargePrice[t]!;
    if (chargeStepMwh > 0 && dischargeStepMwh > 0 && dischargePrice[t]! > chargePrice[t]!) {
      arbitrage[t] = 1;
      arbitrageCount++;
    }
  }
  const floorChoice = rng.next();
  const socEndFloorMwh = Math.max(socMinMwh, floorChoice < 0.4 ? socStartMwh : floorChoice < 0.8 ? socMinMwh : round(socMinMwh + width * rng.next()));
  return {
    periods,
    chargeStepMwh,
    dischargeStepMwh,
    chargeFullMwh,
    dischargeFullMwh,
    chargePrice,
    dischargePrice,
    arbitrage,
    arbitrageCount,
    socStartMwh,
    socMinMwh,
    socMaxMwh,
    window: { lo: socMinMwh, hi: socMaxMwh, eps: 1e-12 * Math.max(1, socMaxMwh, chargeStepMwh, dischargeStepMwh) },
    socEndFloorMwh,
    terminalValuePerMwh: rng.chance(0.3) ? round(rng.uniform(0, 60)) : 0,
    dischargeCapMwh: options.cap === true ? round(rng.uniform(0, 2.5 * width)) : Infinity,
    priceSum,
  };
}

/** Per-period modes for a node: free mostly, some periods fixed to one flow (PERIOD_MODE values). */
export function randomModes(name: string, periods: number): Int8Array {
  const rng = SeededRandom.fromName(`${name}-modes`);
  return Int8Array.from({ length: periods }, () => (rng.chance(0.6) ? 0 : rng.chance(0.5) ? 1 : 2));
}

/** The stored day as the brute force's LP at multiplier mu with the given per-period sets. */
export function storedLp(day: StoredDay, mu: number, sets: readonly PeriodSet[], withCap = false): StoredLp {
  return {
    chargeStepMwh: day.chargeStepMwh,
    dischargeStepMwh: day.dischargeStepMwh,
    chargePrice: Array.from(day.chargePrice.subarray(0, day.periods)),
    dischargePrice: Array.from(day.dischargePrice.subarray(0, day.periods)),
    socStartMwh: day.socStartMwh,
    socMinMwh: day.socMinMwh,
    socMaxMwh: day.socMaxMwh,
    socEndFloorMwh: day.socEndFloorMwh,
    terminalValuePerMwh: day.terminalValuePerMwh,
    dischargeCapMwh: withCap ? day.dischargeCapMwh : Infinity,
    mu,
    sets,
  };
}

/** Every assignment of charge or discharge to the given periods, over the base sets. */
export function* modeChoices(base: readonly PeriodSet[], periods: readonly number[]): Generator<PeriodSet[]> {
  for (let m = 0; m < 1 << periods.length; m++) {
    const sets = [...base];
    periods.forEach((t, k) => (sets[t] = (m >> k) & 1 ? 'charge' : 'discharge'));
    yield sets;
  }
}

const round = (x: number): number => Math.round(x * 100) / 100;

/**
 * Violations of a stored-units schedule against the day: 0 <= x_t <= X, 0 <= y_t <= Y, s_t in the
 * window, s_{T-1} >= the end floor, sum y_t <= the cap when `withCap`, and x_t y_t = 0 in the
 * periods `complementary` names. Tolerance 1e-9 x the day's scale.
 */
export function storedViolations(day: StoredDay, x: ArrayLike<number>, y: ArrayLike<number>, options: { withCap?: boolean; complementary?: (t: number) => boolean } = {}): string[] {
  const tol = 1e-9 * Math.max(1, day.socMaxMwh, day.chargeStepMwh, day.dischargeStepMwh);
  const problems: string[] = [];
  let s = day.socStartMwh;
  let discharged = 0;
  for (let t = 0; t < day.periods; t++) {
    const xt = x[t]!;
    const yt = y[t]!;
    if (!(xt >= -tol && xt <= day.chargeStepMwh + tol)) problems.push(`period ${t}: x ${xt} outside [0, ${day.chargeStepMwh}]`);
    if (!(yt >= -tol && yt <= day.dischargeStepMwh + tol)) problems.push(`period ${t}: y ${yt} outside [0, ${day.dischargeStepMwh}]`);
    if (options.complementary?.(t) && xt > tol && yt > tol) problems.push(`period ${t}: x ${xt} and y ${yt} at once`);
    s += xt - yt;
    discharged += yt;
    if (!(s >= day.socMinMwh - tol && s <= day.socMaxMwh + tol)) problems.push(`period ${t}: s ${s} outside [${day.socMinMwh}, ${day.socMaxMwh}]`);
  }
  if (!(s >= day.socEndFloorMwh - tol)) problems.push(`end state ${s} below the floor ${day.socEndFloorMwh}`);
  if (options.withCap && !(discharged <= day.dischargeCapMwh + tol)) problems.push(`discharged ${discharged} above the cap ${day.dischargeCapMwh}`);
  return problems;
}

/** sum_t (q_t y_t - p_t x_t) + V s_T of a stored-units schedule, from the definition. */
export function storedValue(day: StoredDay, x: ArrayLike<number>, y: ArrayLike<number>): number {
  let value = 0;
  let s = day.socStartMwh;
  for (let t = 0; t < day.periods; t++) {
    value += day.dischargePrice[t]! * y[t]! - day.chargePrice[t]! * x[t]!;
    s += x[t]! - y[t]!;
  }
  return value + day.terminalValuePerMwh * s;
}

/** |a - b| relative to max(1, |b|). */
export const relGap = (a: number, b: number): number => Math.abs(a - b) / Math.max(1, Math.abs(b));
