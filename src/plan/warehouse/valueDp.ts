import { CHARGE_ONLY, DISCHARGE_ONLY, edgeTolerance, LineSolution, SWEEP_END_UNREACHABLE, SWEEP_OK, SWEEP_START_UNREACHABLE, SWEEP_TOO_LARGE, type SweepStatus } from './lineSweep.js';
import { clip, concaveSlide, concaveStep, isConcave, maxOf, Pwl, slide, slideMax, valueAt } from './pwl.js';
import { PwlSeries } from './pwlSeries.js';
import type { StoredDay } from './storedDay.js';
import { endOfDayValue, pruneDead, ValueBounds } from './valueBounds.js';

/**
 * Exact dynamic program over stored energy with complementarity in every period, arbitrage periods
 * included, at a multiplier mu on discharged energy (Bellman 1956, the warehouse problem).
 *
 * Notes. F_0 is the point (s_0, 0); F_t = (F_{t-1} (+) k_t) restricted to [socMin, socMax], where
 * (+) is the sup-convolution and k_t(w) = -p_t w (w >= 0, charge) or -(q_t - mu) w (w <= 0,
 * discharge). Outside arbitrage periods k_t is concave and equals the sup-convolution of its two
 * pieces, so F_t = (F_{t-1} (+) discharge piece) (+) charge piece. In an arbitrage period k_t is
 * convex, the maximum of its two pieces, and F_t = max(F_{t-1} (+) charge piece, F_{t-1} (+)
 * discharge piece): one mode per period, exactly, with no branching. A period fixed to one mode uses
 * that piece alone. F_t need not be concave, so it is kept as a general piecewise-linear function
 * (pwl.ts). The end state maximises F_T(s) + V s over [max(socMin, socEndMin), socMax]; the path is
 * recovered backwards: s_{t-1} maximises F_{t-1}(u) + k_t(s_t - u), whose maximum lies at a
 * breakpoint of F_{t-1}, at u = s_t (the kink of k_t) or at an end of the allowed range.
 * Every period's move is then one signed w_t, so x_t y_t = 0 by construction.
 * Cost: linear in the breakpoints of the F_t, which stay few when the window is narrow against the
 * power steps but can grow with many arbitrage periods in a wide window; past `maxBreakpoints` in
 * one F_t the program gives up (SWEEP_TOO_LARGE) rather than run long.
 */
/**
 * Breakpoints of F_t above which the program starts pruning with the chord relaxation's bounds
 * (below it pruning costs more than it saves), and above which it switches to the tighter bounds
 * of the simplified exact backward program (valueBounds.ts). Measured on seeded days.
 */
const PRUNE_FROM = 48;
const EXACT_BOUNDS_FROM = 160;

export class ValueDp {
  private readonly series: PwlSeries;
  /** J_t of the concave tail (tailValues), stage t at index t. */
  private readonly tail: PwlSeries;
  private readonly f = new Pwl();
  private readonly g = new Pwl();
  private readonly h = new Pwl();
  private readonly k = new Pwl();
  private readonly spare = new Pwl();
  private readonly bounds: ValueBounds;

  private day!: StoredDay;
  /** A feasible schedule's value and discharged energy, or null: a lower bound when no mode is fixed. */
  private incumbent: { value: number; discharged: number } | null = null;

  constructor(
    capacity: number,
    /** Most breakpoints of one F_t before giving up (SWEEP_TOO_LARGE). */
    public maxBreakpoints: number,
  ) {
    this.series = new PwlSeries(capacity + 1, 16);
    this.tail = new PwlSeries(capacity + 1, 16);
    this.bounds = new ValueBounds(capacity);
  }

  load(day: StoredDay): void {
    this.day = day;
    this.incumbent = null;
  }

  /** A feasible schedule of the loaded day (value without the multiplier term, total y). */
  setIncumbent(value: number, discharged: number): void {
    this.incumbent = { value, discharged };
  }

  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus {
    const day = this.day;
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    const eps = edgeTolerance(day);
    const { h, k, bounds } = this;
    let g = this.g;
    // Periods after the last convex one form a concave problem: solved backwards (tailValues), so
    // the general forward program runs only up to stage `join`.
    const join = lastConvexPeriod(day, mu, modes) + 1;
    if (!this.tailValues(mu, modes, join, eps)) return SWEEP_END_UNREACHABLE;
    let f = this.f;
    let spare = this.spare;
    // States whose best possible value stays below a feasible path's value are simplified away;
    // the bounds are computed only once some F_t grows past PRUNE_FROM breakpoints.
    let threshold = NaN;
    let exactBounds = false;
    f.clear();
    f.push(day.socStartMwh, 0);
    this.series.clear();
    this.series.store(0, f);
    for (let t = 0; t < join; t++) {
      const p = day.chargePrice[t]!;
      const qm = day.dischargePrice[t]! - mu;
      const mode = modes[t]!;
      let next: Pwl | null;
      if (mode === CHARGE_ONLY) {
        slide(f, 0, X, -p, g);
        next = g;
      } else if (mode === DISCHARGE_ONLY) {
        slide(f, -Y, 0, -qm, g);
        next = g;
      } else if (day.arbitrage[t] === 1 && qm > p) {
        if (isConcave(f)) {
          concaveSlide(f, 0, X, -p, g);
          concaveSlide(f, -Y, 0, -qm, h);
        } else {
          slideMax(f, 0, X, -p, g);
          slideMax(f, -Y, 0, -qm, h);
        }
        maxOf(g, h, k);
        next = k;
      } else if (isConcave(f)) {
        // Both pieces and the window in one pass (the common case before the first convex period).
        if (!concaveStep(f, -Y, Y, -qm, X, -p, day.socMinMwh, day.socMaxMwh, eps, g)) return SWEEP_START_UNREACHABLE;
        const done = g;
        g = f;
        f = done;
        next = null;
      } else {
        slideMax(f, -Y, 0, -qm, g);
        slideMax(g, 0, X, -p, h);
        next = h;
      }
      if (next !== null && !clip(next, day.socMinMwh, day.socMaxMwh, eps, f)) return SWEEP_START_UNREACHABLE;
      if (f.n > PRUNE_FROM) {
        if (Number.isNaN(threshold)) threshold = this.pruningThreshold(mu, modes, eps, false);
        if (threshold > -Infinity && pruneDead(f, bounds, t + 1, threshold, spare)) [f, spare] = [spare, f];
        if (f.n > EXACT_BOUNDS_FROM && !exactBounds) {
          exactBounds = true;
          threshold = this.pruningThreshold(mu, modes, eps, true);
          if (threshold > -Infinity && pruneDead(f, bounds, t + 1, threshold, spare)) [f, spare] = [spare, f];
        }
      }
      if (f.n > this.maxBreakpoints) return SWEEP_TOO_LARGE;
      this.series.store(t + 1, f);
    }
    const joinState = bestJoin(f, this.tail, join, eps);
    if (Number.isNaN(joinState)) return SWEEP_END_UNREACHABLE;
    this.recover(join, joinState, mu, modes, out);
    this.recoverTail(join, joinState, mu, modes, out);
    return SWEEP_OK;
  }

  /**
   * J_t for t = T down to `join`: the best value of periods t+1..T from s_t = s, the end-of-day
   * floor and terminal value included. No period there is convex, so every J_t is concave:
   * J_T(s) = V s on [floor, socMax], J_{t-1}(s) = max_w k_t(w) + J_t(s + w) on the window, by
   * slope merges. False when no state of the window reaches the floor.
   */
  private tailValues(mu: number, modes: Int8Array, join: number, eps: number): boolean {
    const day = this.day;
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    const T = day.periods;
    const h = this.h;
    let g = this.g;
    let j = this.k;
    if (!endOfDayValue(day, eps, j)) return false;
    this.tail.clear();
    this.tail.store(T, j);
    for (let t = T - 1; t >= join; t--) {
      const p = day.chargePrice[t]!;
      const qm = day.dischargePrice[t]! - mu;
      const mode = modes[t]!;
      // With w' = -w: J_{t-1}(s) = max_{w'} J_t(s - w') + k_t(-w').
      let next: Pwl | null;
      if (mode === CHARGE_ONLY) {
        slide(j, -X, 0, p, g);
        next = g;
      } else if (mode === DISCHARGE_ONLY) {
        slide(j, 0, Y, qm, g);
        next = g;
      } else if (isConcave(j)) {
        if (!concaveStep(j, -X, X, p, Y, qm, day.socMinMwh, day.socMaxMwh, eps, g)) return false;
        const done = g;
        g = j;
        j = done;
        next = null;
      } else {
        slideMax(j, 0, Y, qm, g);
        slideMax(g, -X, 0, p, h);
        next = h;
      }
      if (next !== null && !clip(next, day.socMinMwh, day.socMaxMwh, eps, j)) return false;
      this.tail.store(t, j);
    }
    return true;
  }

  /** The lower bound less a rounding margin, or -Infinity when there is none (no pruning). */
  private pruningThreshold(mu: number, modes: Int8Array, eps: number, exact: boolean): number {
    const bounds = this.bounds;
    let lower = bounds.compute(this.day, mu, modes, eps, exact) ? bounds.lowerBound : -Infinity;
    if (this.incumbent !== null && lower > -Infinity && allFree(modes, this.day.periods)) lower = Math.max(lower, this.incumbent.value - mu * this.incumbent.discharged);
    return lower === -Infinity ? -Infinity : lower - 1e-10 * Math.max(1, Math.abs(lower));
  }

  /** Backward pass from stage `join`: the best predecessor of each state, one signed move per period. */
  private recover(join: number, joinState: number, mu: number, modes: Int8Array, out: LineSolution): void {
    const day = this.day;
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    const xs = this.series.xs;
    const vs = this.series.vs;
    let s = joinState;
    let value = 0;
    let discharged = 0;
    for (let t = join - 1; t >= 0; t--) {
      const p = day.chargePrice[t]!;
      const qm = day.dischargePrice[t]! - mu;
      const mode = modes[t]!;
      const from = this.series.start[t]!;
      const n = this.series.count[t]!;
      const domLo = xs[from]!;
      const domHi = xs[from + n - 1]!;
      const lo = Math.max(domLo, s - (mode === DISCHARGE_ONLY ? 0 : X));
      const hi = Math.min(domHi, s + (mode === CHARGE_ONLY ? 0 : Y));
      // The move into s is s - u.
      const bestU = bestNeighbour(xs, vs, from, n, s, lo, hi, p, qm, -1);
      const w = s - bestU;
      const x = w > 0 ? w : 0;
      const y = w < 0 ? -w : 0;
      out.x[t] = x;
      out.y[t] = y;
      value += day.dischargePrice[t]! * y - p * x;
      discharged += y;
      s = bestU;
    }
    out.value = value;
    out.discharged = discharged;
  }

  /**
   * Forward pass from stage `join` (adds to out.value and out.discharged from recover): s_t
   * maximises k_t(s_t - s_{t-1}) + J_t(s_t), found among the ends of the reachable range, the kink
   * s_t = s_{t-1} and the breakpoints of J_t inside; the end state's terminal value closes the sum.
   */
  private recoverTail(join: number, joinState: number, mu: number, modes: Int8Array, out: LineSolution): void {
    const day = this.day;
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    const xs = this.tail.xs;
    const vs = this.tail.vs;
    let s = joinState;
    let value = out.value;
    let discharged = out.discharged;
    for (let t = join; t < day.periods; t++) {
      const p = day.chargePrice[t]!;
      const qm = day.dischargePrice[t]! - mu;
      const mode = modes[t]!;
      const from = this.tail.start[t + 1]!;
      const n = this.tail.count[t + 1]!;
      const lo = Math.max(xs[from]!, s - (mode === CHARGE_ONLY ? 0 : Y));
      const hi = Math.min(xs[from + n - 1]!, s + (mode === DISCHARGE_ONLY ? 0 : X));
      // The move out of s is u - s.
      const bestU = bestNeighbour(xs, vs, from, n, s, lo, hi, p, qm, 1);
      const w = bestU - s;
      const x = w > 0 ? w : 0;
      const y = w < 0 ? -w : 0;
      out.x[t] = x;
      out.y[t] = y;
      value += day.dischargePrice[t]! * y - p * x;
      discharged += y;
      s = bestU;
    }
    out.value = value + day.terminalValuePerMwh * s;
    out.discharged = discharged;
  }
}

/**
 * The state u in [lo, hi] maximising F(u) + k(w), F stored in xs, vs [from, from + n), w = direction
 * (u - s) the period's move and k(w) = -p w (charge, w >= 0) or -qm w (discharge). F + k is linear
 * between F's breakpoints and the kink u = s, so the maximum lies at one of those or an end of the range.
 */
function bestNeighbour(xs: Float64Array, vs: Float64Array, from: number, n: number, s: number, lo: number, hi: number, p: number, qm: number, direction: 1 | -1): number {
  let bestU = lo;
  let best = -Infinity;
  for (let c = -3; c < n; c++) {
    const u = c === -3 ? lo : c === -2 ? hi : c === -1 ? s : xs[from + c]!;
    if (c >= -1 && !(u > lo && u < hi)) continue;
    const w = direction * (u - s);
    // A breakpoint's value is stored; only the range ends and the kink need interpolating.
    const v = (c >= 0 ? vs[from + c]! : valueAt(xs, vs, from, n, u)) + (w >= 0 ? -p * w : -qm * w);
    if (v > best) {
      best = v;
      bestU = u;
    }
  }
  return bestU;
}

/** The last period that may take either mode and whose value k_t is convex (q_t - mu > p_t), or -1. */
function lastConvexPeriod(day: StoredDay, mu: number, modes: Int8Array): number {
  for (let t = day.periods - 1; t >= 0; t--) {
    if (modes[t] === 0 && day.arbitrage[t] === 1 && day.dischargePrice[t]! - mu > day.chargePrice[t]!) return t;
  }
  return -1;
}

/**
 * The state at stage `join` that maximises F(s) + J(s), J the stage's tail value (concave): a
 * breakpoint of either, on the common domain (their ends closer than `eps` count as meeting), or
 * NaN when the domains do not meet.
 */
function bestJoin(f: Pwl, tail: PwlSeries, join: number, eps: number): number {
  const from = tail.start[join]!;
  const n = tail.count[join]!;
  const { xs, vs } = tail;
  const lo = Math.max(f.xs[0]!, xs[from]!);
  const hi = Math.min(f.xs[f.n - 1]!, xs[from + n - 1]!);
  if (lo > hi + eps) return Number.NaN;
  const top = Math.max(lo, hi);
  let bestS = lo;
  let best = f.at(lo) + valueAt(xs, vs, from, n, lo);
  // Candidates: the common domain's right end and every breakpoint of either function inside it.
  for (let c = -1; c < f.n + n; c++) {
    const s = c < 0 ? top : c < f.n ? f.xs[c]! : xs[from + c - f.n]!;
    if (!(s > lo && s <= top)) continue;
    const v = f.at(s) + valueAt(xs, vs, from, n, s);
    if (v > best) {
      best = v;
      bestS = s;
    }
  }
  return bestS;
}

function allFree(modes: Int8Array, periods: number): boolean {
  for (let t = 0; t < periods; t++) if (modes[t] !== 0) return false;
  return true;
}
