import type { DayContext, MultiplierStep } from './dayContext.js';
import type { StageStatus } from './stageStatus.js';
import type { StoredDay } from './storedDay.js';
import { revalue, type StoredSchedule } from './storedSchedule.js';

/**
 * A node's problem with the cycle cap sum_t y_t <= C, solved exactly by a parametric step on the
 * cap's Lagrange multiplier mu; the inner solver (dayContext.ts) solves the node at a given mu.
 *
 * Notes. For mu >= 0 let z(mu) = max over the node of value - mu (sum y - C) (the inner solve).
 * z is convex and piecewise linear in mu; at the minimiser mu* (Everett 1963, "Generalized
 * Lagrange multiplier method", Oper. Res. 11(3), doi:10.1287/opre.11.3.399) there are two
 * solutions A (sum y >= C) and B (sum y <= C) both maximising at mu*, and the mix
 * theta A + (1 - theta) B with theta = (C - y_B) / (y_A - y_B) meets the cap with equality, keeps
 * complementary slackness and so is optimal for the capped problem over the convex hull of the
 * node's schedules (its value equals z(mu*), an upper bound on every capped schedule of the node by
 * weak duality). mu* is found by intersecting the lines value_A - mu (y_A - C) and
 * value_B - mu (y_B - C) and re-solving there (the cutting-plane step of Kelley 1960 in one
 * dimension): either the new solution lies on those lines (mu* found) or it replaces A or B, and
 * z has finitely many pieces. The start is A at mu = 0 and B at mu high enough to discharge as
 * little as the window allows; if even B exceeds C, the cap cannot be met. Any feasible B with
 * y_B <= C gives a valid line (a lower bound on z), so when doing nothing is feasible that schedule
 * is the first B (value V s_0, no discharge) and the solve at the high mu is saved: about one solve
 * in seven on seeded capped days. The break test then still holds: at the crossing of the lines of
 * A and B both attain z when the trial does not rise above them.
 * The mix is taken per period on (x, y); periods that are not arbitrage periods are then netted
 * (no loss, lower cycle use); an arbitrage period with x, y > 0 is left for the branch and bound.
 */

const MAX_STEPS = 64;

export function solveWithCap(ctx: DayContext, modes: Int8Array, out: StoredSchedule): StageStatus {
  const { day, solver } = ctx;
  const observed = ctx.observer?.multiplierStep !== undefined;
  let above = ctx.above;
  let below = ctx.below;
  let trial = ctx.trial;
  const status = solver.solveAt(0, modes, above);
  if (observed) report(ctx, 'zero', 0, status, above);
  if (status !== 'ok') return status;
  const cap = day.dischargeCapMwh;
  const capTol = 1e-12 * Math.max(1, cap);
  const net = solver.method === 'sweep';
  if (above.discharged <= cap + capTol) {
    finish(day, above, out, net);
    return 'ok';
  }
  // Every solve's status counts: the dynamic program may give up (too-many-breakpoints) at any mu,
  // and a stale solution must never enter the mix.
  if (idleFits(day)) {
    idle(day, below);
    if (observed) report(ctx, 'idle', ctx.muHigh, 'ok', below);
  } else {
    const highStatus = solver.solveAt(ctx.muHigh, modes, below);
    if (observed) report(ctx, 'high', ctx.muHigh, highStatus, below);
    if (highStatus !== 'ok') return highStatus;
    if (below.discharged > cap + capTol) return 'cap-unreachable';
  }
  let muLow = 0;
  let muHigh = ctx.muHigh;
  for (let step = 0; step < MAX_STEPS; step++) {
    let mu = (above.value - below.value) / (above.discharged - below.discharged);
    if (!(mu >= muLow)) mu = muLow;
    // Only the idle start can put the crossing beyond muHigh: then solve at muHigh, which
    // replaces the idle schedule by an optimal one there (the start of the note).
    const beyond = !(mu <= muHigh);
    if (beyond) mu = muHigh;
    const trialStatus = solver.solveAt(mu, modes, trial);
    if (observed) report(ctx, 'trial', mu, trialStatus, trial);
    if (trialStatus !== 'ok') return trialStatus;
    if (beyond && trial.discharged > cap + capTol) return 'cap-unreachable';
    const onLine = above.value - mu * (above.discharged - cap);
    const atTrial = trial.value - mu * (trial.discharged - cap);
    if (!beyond && atTrial <= onLine + 1e-13 * (Math.abs(above.value) + Math.abs(below.value) + mu * cap + 1)) break;
    if (Math.abs(trial.discharged - cap) <= capTol) {
      finish(day, trial, out, net);
      return 'ok';
    }
    const spare = trial;
    if (trial.discharged > cap) {
      trial = above;
      above = spare;
      muLow = mu;
    } else {
      trial = below;
      below = spare;
      muHigh = mu;
    }
  }
  mix(above, below, (cap - below.discharged) / (above.discharged - below.discharged), day.periods, out);
  finish(day, out, out, true);
  return 'ok';
}

/** Shows a step to the observer. */
function report(ctx: DayContext, kind: MultiplierStep['kind'], mu: number, status: StageStatus, schedule: StoredSchedule): void {
  ctx.observer?.multiplierStep?.({ kind, mu, status, value: schedule.value, discharged: schedule.discharged });
}

/** Whether doing nothing all day is feasible: the start lies in the window and meets the end floor. */
function idleFits(day: StoredDay): boolean {
  return day.socStartMwh >= day.socMinMwh && day.socStartMwh <= day.socMaxMwh && day.socStartMwh >= day.socEndFloorMwh;
}

/** The schedule that does nothing: no flows, the start kept to the end. */
function idle(day: StoredDay, out: StoredSchedule): void {
  out.x.fill(0, 0, day.periods);
  out.y.fill(0, 0, day.periods);
  out.value = day.terminalValuePerMwh * day.socStartMwh;
  out.discharged = 0;
}

/** out = theta a + (1 - theta) b per period, exact where a and b agree. */
function mix(a: StoredSchedule, b: StoredSchedule, theta: number, periods: number, out: StoredSchedule): void {
  for (let t = 0; t < periods; t++) {
    const xa = a.x[t]!;
    const xb = b.x[t]!;
    const ya = a.y[t]!;
    const yb = b.y[t]!;
    out.x[t] = xa === xb ? xa : theta * xa + (1 - theta) * xb;
    out.y[t] = ya === yb ? ya : theta * ya + (1 - theta) * yb;
  }
}

/** out = schedule, netted outside arbitrage periods and revalued when `net` (the sweep's flows may be simultaneous there). */
function finish(day: StoredDay, schedule: StoredSchedule, out: StoredSchedule, net: boolean): void {
  if (schedule !== out) out.copyFrom(schedule);
  if (net) revalue(day, out, 'outside-arbitrage');
}
