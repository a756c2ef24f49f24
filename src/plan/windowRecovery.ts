import type { BatteryModel, DayOutcome, DayProblem, Schedule } from '../types.js';
import { scheduleValue } from './scheduleValue.js';
import { solveDay, type SolveDayOptions } from './solveDay.js';

/**
 * How a day that starts outside the state-of-charge window comes back into it (a trip or a manual
 * operation can leave the battery there): at full power toward the window, as fast as the power
 * allows (docs/design.md section 4.2).
 *
 * The forced periods are those after which, even at full power, the state is still more than one
 * period away from the window: s_t = s_0 + t eta_c dt chargeMw (below the window) or
 * s_0 - t dt dischargeMw / eta_d (above it), for t = 1..k, where k is the first t from which one more
 * full-power period reaches the window. The period after them (the crossing period) is left to the
 * day solver, which must end it inside the window but may move more than the least that does so;
 * the day solver's rows s_t in [socMin, socMax] for every period end do exactly that from a start
 * within one period of the window. Together this is the day problem with the time-varying bounds
 *   s_t >= min(socMin, s_0 + t eta_c dt chargeMw)   or   s_t <= max(socMax, s_0 - t dt dischargeMw / eta_d),
 * which force the first k periods and nothing else.
 */
export interface WindowRecovery {
  /** `charge` from below the window, `discharge` from above it. */
  readonly direction: 'charge' | 'discharge';
  /** Periods at full power before the crossing period [-]. */
  readonly forcedPeriods: number;
  /** State of charge after them [MWh]: within one full-power period of the window. */
  readonly socAfterMwh: number;
  /** Energy the forced periods move at the grid [MWh]: bought (charge) or sold (discharge). */
  readonly forcedMwh: number;
}

/**
 * The recovery of a start outside the window, or null when the start lies inside it (within
 * `tolMwh`). `periods` bounds the forced periods: when the day is too short, forcedPeriods equals
 * `periods` and socAfterMwh is still more than one period from the window.
 */
export function windowRecovery(battery: BatteryModel, periodHours: number, socStartMwh: number, periods: number, tolMwh = 1e-9 * Math.max(1, battery.energyMwh)): WindowRecovery | null {
  const below = socStartMwh < battery.socMinMwh - tolMwh;
  const above = socStartMwh > battery.socMaxMwh + tolMwh;
  if (!below && !above) return null;
  const stepMwh = below ? battery.chargeEfficiency * periodHours * battery.chargeMw : (periodHours * battery.dischargeMw) / battery.dischargeEfficiency;
  const gridMwh = below ? periodHours * battery.chargeMw : periodHours * battery.dischargeMw;
  // Within one period of the window: one full-power period reaches it.
  const reaches = (s: number): boolean => (below ? s + stepMwh >= battery.socMinMwh - tolMwh : s - stepMwh <= battery.socMaxMwh + tolMwh);
  let soc = socStartMwh;
  let forced = 0;
  while (forced < periods && !reaches(soc) && stepMwh > 0) {
    soc += below ? stepMwh : -stepMwh;
    forced++;
  }
  return { direction: below ? 'charge' : 'discharge', forcedPeriods: forced, socAfterMwh: soc, forcedMwh: forced * gridMwh };
}

/**
 * A day problem whose start lies outside the window (`recovery`, from windowRecovery): the forced
 * periods at full power, then solveDay from where they leave the battery, the cycle cap (energy out
 * of the store) lowered by what the forced periods take out of it. The objective is the whole day's at the problem's prices.
 */
export function solveDayWithRecovery(problem: DayProblem, recovery: WindowRecovery, solveOptions: Partial<SolveDayOptions> | undefined): DayOutcome {
  const { battery, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const k = recovery.forcedPeriods;
  if (k >= periods) {
    return { status: 'infeasible', reason: `the starting state of charge ${fmt(problem.socStartMwh)} MWh is outside the window [${fmt(battery.socMinMwh)}, ${fmt(battery.socMaxMwh)}] MWh and the day is too short to come back into it at full power` };
  }
  const charge = recovery.direction === 'charge' ? battery.chargeMw : 0;
  const discharge = recovery.direction === 'discharge' ? battery.dischargeMw : 0;
  // The cycle cap counts energy taken out of the store (equivalentFullCycles.ts): the forced periods take socStart - socAfter.
  const cap = battery.maxFromStoreMwhPerDay;
  const fromStoreMwh = recovery.direction === 'discharge' ? problem.socStartMwh - recovery.socAfterMwh : 0;
  if (cap !== undefined && fromStoreMwh > cap) {
    return { status: 'infeasible', reason: `coming back into the window from ${fmt(problem.socStartMwh)} MWh takes ${fmt(fromStoreMwh)} MWh out of the store, more than the cycle cap of ${fmt(cap)} MWh per day` };
  }
  const rest: DayProblem = {
    ...problem,
    buyPricePerMwh: problem.buyPricePerMwh.slice(k),
    sellPricePerMwh: problem.sellPricePerMwh.slice(k),
    battery: cap === undefined || recovery.direction === 'charge' ? battery : { ...battery, maxFromStoreMwhPerDay: cap - fromStoreMwh },
    socStartMwh: recovery.socAfterMwh,
  };
  const outcome = solveDay(rest, solveOptions);
  if (outcome.status !== 'optimal') return outcome;
  const socMwh: number[] = [];
  let soc = problem.socStartMwh;
  for (let t = 0; t < k; t++) {
    soc += battery.chargeEfficiency * dt * charge - (dt * discharge) / battery.dischargeEfficiency;
    socMwh.push(soc);
  }
  const schedule: Schedule = {
    chargeMw: [...new Array<number>(k).fill(charge), ...outcome.schedule.chargeMw],
    dischargeMw: [...new Array<number>(k).fill(discharge), ...outcome.schedule.dischargeMw],
    socMwh: [...socMwh, ...outcome.schedule.socMwh],
  };
  return { status: 'optimal', schedule, objective: scheduleValue(problem, schedule), solver: outcome.solver, nodes: outcome.nodes };
}

function fmt(x: number): string {
  return Number(x.toFixed(6)).toString();
}
