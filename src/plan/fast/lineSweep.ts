import { CHARGE, CHORD, DISCHARGE, type SegmentRanking } from './segmentOrder.js';
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
 * multiset of segments ordered by slope; k_t contributes its segments (segmentOrder.ts) and moves
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
 * The segments live in a bitset over their ranks: insert O(1), steepest and flattest in O(T / 32).
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
  /** Bitset over ranks; `words` of it are in use for the current day. */
  readonly bits: Int32Array;
  words = 0;

  constructor(capacity: number) {
    const n = 3 * capacity;
    this.length = new Float64Array(n);
    this.remaining = new Float64Array(n);
    this.taken = new Float64Array(n);
    this.dropped = new Float64Array(n);
    this.bits = new Int32Array((n + 31) >>> 5);
  }
}

/** Tolerance for a window edge to count as reached despite rounding [MWh]. */
export function edgeTolerance(day: StoredDay): number {
  return 1e-12 * Math.max(1, Math.abs(day.socMaxMwh), Math.abs(day.socMinMwh), day.chargeStepMwh, day.dischargeStepMwh);
}

/** Solves at multiplier mu with per-period modes; writes the solution into `out`. */
export function sweepLine(day: StoredDay, ranking: SegmentRanking, modes: Int8Array, ws: SweepWorkspace, out: LineSolution): SweepStatus {
  const X = day.chargeStepMwh;
  const Y = day.dischargeStepMwh;
  const mu = ranking.mu;
  const p = day.chargePrice;
  const q = day.dischargePrice;
  const { socMinMwh: low, socMaxMwh: high } = day;
  const eps = edgeTolerance(day);
  ws.words = (3 * day.periods + 31) >>> 5;
  ws.bits.fill(0, 0, ws.words);
  let lo = day.socStartMwh;
  let hi = lo;
  for (let t = 0; t < day.periods; t++) {
    const mode = modes[t]!;
    const id = 3 * t;
    if (mode === CHARGE_ONLY) {
      insert(ws, ranking, id + CHARGE, X);
      hi += X;
    } else if (mode === DISCHARGE_ONLY) {
      insert(ws, ranking, id + DISCHARGE, Y);
      lo -= Y;
    } else if (day.arbitrage[t] === 1 && q[t]! - mu > p[t]!) {
      insert(ws, ranking, id + CHORD, X + Y);
      lo -= Y;
      hi += X;
    } else {
      insert(ws, ranking, id + DISCHARGE, Y);
      insert(ws, ranking, id + CHARGE, X);
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
      takeSteepest(ws, ranking, low - lo);
      lo = low;
    }
    if (hi > high) {
      dropFlattest(ws, ranking, hi - high);
      hi = high;
    }
  }
  const floor = day.socEndFloorMwh;
  if (hi < floor - eps) return SWEEP_END_UNREACHABLE;
  if (lo < floor) takeSteepest(ws, ranking, floor - lo);
  takeWhileProfitable(ws, ranking, -day.terminalValuePerMwh);
  readSolution(day, modes, mu, ws, out);
  return SWEEP_OK;
}

function insert(ws: SweepWorkspace, ranking: SegmentRanking, id: number, length: number): void {
  ws.length[id] = length;
  ws.remaining[id] = length;
  ws.taken[id] = 0;
  ws.dropped[id] = 0;
  if (length <= 0) return;
  const r = ranking.rankOf[id]!;
  ws.bits[r >>> 5] = ws.bits[r >>> 5]! | (1 << (r & 31));
}

function steepestRank(bits: Int32Array, words: number): number {
  for (let w = words - 1; w >= 0; w--) {
    const b = bits[w]!;
    if (b !== 0) return (w << 5) | (31 - Math.clz32(b));
  }
  return -1;
}

function flattestRank(bits: Int32Array, words: number): number {
  for (let w = 0; w < words; w++) {
    const b = bits[w]!;
    if (b !== 0) return (w << 5) | (31 - Math.clz32(b & -b));
  }
  return -1;
}

function clearRank(bits: Int32Array, r: number): void {
  bits[r >>> 5] = bits[r >>> 5]! & ~(1 << (r & 31));
}

/** Takes `amount` MWh from the steepest segments (they are forced into the solution). */
function takeSteepest(ws: SweepWorkspace, ranking: SegmentRanking, amount: number): void {
  consume(ws, ranking, amount, true);
}

/** Drops `amount` MWh from the flattest segments (the window cannot hold them). */
function dropFlattest(ws: SweepWorkspace, ranking: SegmentRanking, amount: number): void {
  consume(ws, ranking, amount, false);
}

/** Removes `amount` MWh from one end of the order, booking it as taken (steepest) or dropped. */
function consume(ws: SweepWorkspace, ranking: SegmentRanking, amount: number, steepest: boolean): void {
  const booked = steepest ? ws.taken : ws.dropped;
  const other = steepest ? ws.dropped : ws.taken;
  let left = amount;
  while (left > 0) {
    const r = steepest ? steepestRank(ws.bits, ws.words) : flattestRank(ws.bits, ws.words);
    if (r < 0) return;
    const id = ranking.segmentAt[r]!;
    const rest = ws.remaining[id]!;
    if (rest <= left) {
      left -= rest;
      booked[id] = ws.length[id]! - other[id]!;
      ws.remaining[id] = 0;
      clearRank(ws.bits, r);
    } else {
      booked[id] = booked[id]! + left;
      ws.remaining[id] = rest - left;
      return;
    }
  }
}

/** Takes every remaining segment steeper than `threshold` (= -V: keeping a MWh is worth V). */
function takeWhileProfitable(ws: SweepWorkspace, ranking: SegmentRanking, threshold: number): void {
  for (;;) {
    const r = steepestRank(ws.bits, ws.words);
    if (r < 0) return;
    const id = ranking.segmentAt[r]!;
    if (!(ranking.slope[id]! > threshold)) return;
    ws.taken[id] = ws.length[id]! - ws.dropped[id]!;
    ws.remaining[id] = 0;
    clearRank(ws.bits, r);
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
