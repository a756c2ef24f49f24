import { CHARGE, CHORD, DISCHARGE, LiveSegments } from './liveSegments.js';
import type { StoredDay } from './storedDay.js';

/**
 * Exact solution of the day problem when every period's value function of its net move is concave
 * (no arbitrage period, or arbitrage periods relaxed to their chord or fixed to one mode), with the
 * cycle cap priced at mu per MWh taken out of the store: a forward dynamic program on the concave
 * piecewise-linear value function of stored energy (Bellman 1956, the warehouse problem).
 *
 * Notes. F_t(s) = best value of periods 1..t ending with s_t = s. F_0 is the point s_0. Then
 *   F_t = (F_{t-1} (+) k_t) restricted to [socMin, socMax],   (+) the sup-convolution,
 * and the sup-convolution of concave piecewise-linear functions is the merge of their slope
 * sequences (Rockafellar 1970, Convex Analysis, section 5). F_t is kept as its left end lo_t and a
 * multiset of segments ordered by slope; k_t contributes its segments (liveSegments.ts) and moves
 * the left end by -Y (every period starts from "sell all it can"). Restricting to the window cuts
 * the left end (the steepest segments are forced: taken) and the right end (the flattest segments
 * are dropped). At the end the floor max(socMin, socEndMin) forces more, and then every segment
 * whose slope plus the terminal value V is positive is taken. The schedule is read off the segments:
 * a period's charge is the taken part of its charge segment, its discharge is Y minus the taken part
 * of its discharge segment, a chord at taken part tau is the mix tau / (X + Y) of "charge X" and
 * "discharge Y". Exactness: each cut removes exactly the part of the slope sequence outside the
 * window, so after each period the multiset is F_t; every taken part is a prefix of the steepest
 * segments present at some time, so s_t stays within [lo_t, hi_t] (feasible), and the value of
 * the read-off schedule is F_T(s_T) + V s_T by construction.
 * Complementarity: a period's discharge segment ranks above its charge segment, cuts and takes
 * work from the ends, so its charge segment is touched only after its discharge segment is fully
 * taken (discharge 0) or the charge segment was dropped first (charge 0).
 *
 * The open segments live in a short sorted array (liveSegments.ts): they hold at most the window's
 * width of energy, so an insert moves few of them, and the ends are read in O(1).
 */
export const SWEEP_OK = 0;
export const SWEEP_START_UNREACHABLE = 1;
export const SWEEP_END_UNREACHABLE = 2;
/** The dynamic program (valueDp.ts) gave up: its value functions outgrew their breakpoint budget. */
export const SWEEP_TOO_LARGE = 4;
export type SweepStatus = typeof SWEEP_OK | typeof SWEEP_START_UNREACHABLE | typeof SWEEP_END_UNREACHABLE | typeof SWEEP_TOO_LARGE;

/** Per-period restriction set by the branch and bound. */
export const FREE = 0;
export const CHARGE_ONLY = 1;
export const DISCHARGE_ONLY = 2;

/** A solution in stored units with its value (without the multiplier term) and total y. */
export class LineSolution {
  readonly x: Float64Array;
  readonly y: Float64Array;
  value = 0;
  discharged = 0;

  constructor(periods: number) {
    this.x = new Float64Array(periods);
    this.y = new Float64Array(periods);
  }

  copyFrom(other: LineSolution): void {
    this.x.set(other.x);
    this.y.set(other.y);
    this.value = other.value;
    this.discharged = other.discharged;
  }
}

/** Scratch arrays for days of up to `capacity` periods, reused from sweep to sweep. */
export class SweepWorkspace {
  readonly length: Float64Array;
  readonly remaining: Float64Array;
  readonly taken: Float64Array;
  readonly dropped: Float64Array;
  readonly live: LiveSegments;

  constructor(capacity: number) {
    const n = 3 * capacity;
    this.length = new Float64Array(n);
    this.remaining = new Float64Array(n);
    this.taken = new Float64Array(n);
    this.dropped = new Float64Array(n);
    this.live = new LiveSegments(capacity);
  }
}

/** Tolerance for a window edge to count as reached despite rounding [MWh]. */
export function edgeTolerance(day: StoredDay): number {
  return 1e-12 * Math.max(1, Math.abs(day.socMaxMwh), Math.abs(day.socMinMwh), day.chargeStepMwh, day.dischargeStepMwh);
}

/** Solves at multiplier mu with per-period modes; writes the solution into `out`. */
export function sweepLine(day: StoredDay, mu: number, modes: Int8Array, ws: SweepWorkspace, out: LineSolution): SweepStatus {
  const X = day.chargeStepMwh;
  const Y = day.dischargeStepMwh;
  const p = day.chargePrice;
  const q = day.dischargePrice;
  const { socMinMwh: low, socMaxMwh: high } = day;
  const eps = edgeTolerance(day);
  ws.live.clear();
  let lo = day.socStartMwh;
  let hi = lo;
  for (let t = 0; t < day.periods; t++) {
    const mode = modes[t]!;
    const id = 3 * t;
    const qm = q[t]! - mu;
    if (mode === CHARGE_ONLY) {
      insert(ws, id + CHARGE, X, -p[t]!);
      hi += X;
    } else if (mode === DISCHARGE_ONLY) {
      insert(ws, id + DISCHARGE, Y, -qm);
      lo -= Y;
    } else if (day.arbitrage[t] === 1 && qm > p[t]!) {
      insert(ws, id + CHORD, X + Y, -(p[t]! * X + qm * Y) / (X + Y));
      lo -= Y;
      hi += X;
    } else {
      insert(ws, id + DISCHARGE, Y, -qm);
      insert(ws, id + CHARGE, X, -p[t]!);
      lo -= Y;
      hi += X;
    }
    if (lo > high) {
      if (lo > high + eps) return SWEEP_START_UNREACHABLE;
      lo = high;
    }
    if (hi < low) {
      if (hi < low - eps) return SWEEP_START_UNREACHABLE;
      hi = low;
    }
    if (lo < low) {
      takeSteepest(ws, low - lo);
      lo = low;
    }
    if (hi > high) {
      dropFlattest(ws, hi - high);
      hi = high;
    }
  }
  const floor = day.socEndFloorMwh;
  if (hi < floor - eps) return SWEEP_END_UNREACHABLE;
  if (lo < floor) takeSteepest(ws, floor - lo);
  takeWhileProfitable(ws, -day.terminalValuePerMwh);
  readSolution(day, modes, mu, ws, out);
  return SWEEP_OK;
}

function insert(ws: SweepWorkspace, id: number, length: number, slope: number): void {
  ws.length[id] = length;
  ws.remaining[id] = length;
  ws.taken[id] = 0;
  ws.dropped[id] = 0;
  if (length > 0) ws.live.insert(id, slope);
}

/** Takes `amount` MWh from the steepest segments (they are forced into the solution). */
function takeSteepest(ws: SweepWorkspace, amount: number): void {
  const live = ws.live;
  let left = amount;
  while (left > 0 && live.size > 0) {
    const id = live.steepest();
    const rest = ws.remaining[id]!;
    if (rest > left) {
      ws.taken[id] = ws.taken[id]! + left;
      ws.remaining[id] = rest - left;
      return;
    }
    left -= rest;
    ws.taken[id] = ws.length[id]! - ws.dropped[id]!;
    ws.remaining[id] = 0;
    live.removeSteepest();
  }
}

/** Drops `amount` MWh from the flattest segments (the window cannot hold them). */
function dropFlattest(ws: SweepWorkspace, amount: number): void {
  const live = ws.live;
  let left = amount;
  while (left > 0 && live.size > 0) {
    const id = live.flattest();
    const rest = ws.remaining[id]!;
    if (rest > left) {
      ws.dropped[id] = ws.dropped[id]! + left;
      ws.remaining[id] = rest - left;
      return;
    }
    left -= rest;
    ws.dropped[id] = ws.length[id]! - ws.taken[id]!;
    ws.remaining[id] = 0;
    live.removeFlattest();
  }
}

/** Takes every open segment steeper than `threshold` (= -V: keeping a MWh is worth V). */
function takeWhileProfitable(ws: SweepWorkspace, threshold: number): void {
  const live = ws.live;
  while (live.size > 0 && live.steepestSlope() > threshold) {
    const id = live.steepest();
    ws.taken[id] = ws.length[id]! - ws.dropped[id]!;
    ws.remaining[id] = 0;
    live.removeSteepest();
  }
}

function readSolution(day: StoredDay, modes: Int8Array, mu: number, ws: SweepWorkspace, out: LineSolution): void {
  const X = day.chargeStepMwh;
  const Y = day.dischargeStepMwh;
  const L = X + Y;
  const p = day.chargePrice;
  const q = day.dischargePrice;
  let value = 0;
  let discharged = 0;
  let soc = day.socStartMwh;
  for (let t = 0; t < day.periods; t++) {
    const id = 3 * t;
    const mode = modes[t]!;
    let x = 0;
    let y = 0;
    if (mode === CHARGE_ONLY) {
      x = ws.taken[id + CHARGE]!;
    } else if (mode === DISCHARGE_ONLY) {
      y = Y - ws.taken[id + DISCHARGE]!;
    } else if (day.arbitrage[t] === 1 && q[t]! - mu > p[t]!) {
      const tau = ws.taken[id + CHORD]!;
      x = tau >= L ? X : (X * tau) / L;
      y = tau <= 0 ? Y : tau >= L ? 0 : (Y * (L - tau)) / L;
    } else {
      x = ws.taken[id + CHARGE]!;
      y = Y - ws.taken[id + DISCHARGE]!;
    }
    out.x[t] = x;
    out.y[t] = y;
    value += q[t]! * y - p[t]! * x;
    discharged += y;
    soc += x - y;
  }
  out.value = value + day.terminalValuePerMwh * soc;
  out.discharged = discharged;
}
