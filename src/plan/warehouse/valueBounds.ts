import { CHARGE_ONLY, DISCHARGE_ONLY } from './lineSweep.js';
import { clip, concaveSlide, maxOf, Pwl, slideMax, valueAt } from './pwl.js';
import { PwlSeries } from './pwlSeries.js';
import type { StoredDay } from './storedDay.js';

/**
 * Bounds that let the exact dynamic program (valueDp.ts) drop states that cannot lie on an optimal
 * path: an upper bound W_t(s) on the best value still to come from state s after period t, and a
 * lower bound on the optimum (the value of one feasible path).
 *
 * Notes. W is a backward dynamic program over the same model, multiplier mu and per-period modes
 * as the program's run (Bellman 1956), in one of two forms:
 * - chord (cheap): every arbitrage period's per-period value k_t is replaced by its concave hull,
 *   the chord of storedDay.ts; W_T(s) = V s on [floor, socMax], W_{t-1}(s) = max_w khat_t(w) +
 *   W_t(s + w) on the window. khat_t >= k_t, every W_t is concave (a sup-convolution of concave
 *   functions, two breakpoints more per period) and at least the value of every feasible
 *   continuation from s;
 * - exact (tighter, used once the forward program grows): the same recursion with the true k_t,
 *   except that a W_t with more than maxBreakpoints breakpoints is replaced by upper hulls of its
 *   pieces (upperHulls), which lie at or above it; by induction each W_t is still at least the best
 *   continuation value, and far closer to it than the chord form on days with many arbitrage periods.
 * The lower bound follows W greedily: from s_0, each period moves to the s_t that maximises
 * k_t(s_t - s_{t-1}) + W_t(s_t) with the true, complementary k_t (charge or discharge, never both),
 * so the path is feasible and its value is attained. A state s after period t with
 * F_t(s) + W_t(s) < lower bound is on no optimal path (branch and bound's pruning rule; Land and
 * Doig 1960).
 */
/**
 * out = the value of ending the day at s: V s on [max(socMin, socEndMin), socMax] (the stage after the
 * last period of a backward program); false when the floor lies above socMax by more than eps.
 */
export function endOfDayValue(day: StoredDay, eps: number, out: Pwl): boolean {
  const floor = day.socEndFloorMwh;
  if (floor > day.socMaxMwh + eps) return false;
  const V = day.terminalValuePerMwh;
  const end = Math.min(floor, day.socMaxMwh);
  out.clear();
  out.push(end, V * end);
  if (end < day.socMaxMwh) out.push(day.socMaxMwh, V * day.socMaxMwh);
  return true;
}

export class ValueBounds {
  private readonly series: PwlSeries;
  private readonly a = new Pwl();
  private readonly b = new Pwl();
  private readonly c = new Pwl();
  private readonly d = new Pwl();
  /** Value of the greedy feasible path, or -Infinity when none was found. */
  lowerBound = -Infinity;

  constructor(
    capacity: number,
    /** Most breakpoints of one W_t; larger ones are replaced by upper hulls of pieces (upperHulls). */
    private readonly maxBreakpoints = 128,
  ) {
    this.series = new PwlSeries(capacity + 1, 8);
  }

  /** Computes W_0..W_T and the lower bound; false when no path reaches the end-of-day floor. */
  compute(day: StoredDay, mu: number, modes: Int8Array, eps: number, exact: boolean): boolean {
    this.lowerBound = -Infinity;
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    const T = day.periods;
    let w = this.a;
    let spare = this.b;
    const tmp = this.c;
    const other = this.d;
    if (!endOfDayValue(day, eps, w)) return false;
    this.series.clear();
    this.series.store(T, w);
    for (let t = T - 1; t >= 0; t--) {
      const p = day.chargePrice[t]!;
      const qm = day.dischargePrice[t]! - mu;
      const mode = modes[t]!;
      // Backward step with w' = -w: W_{t}(s) = max_{w'} W_{t+1}(s - w') + k(-w').
      // The chord relaxation is concave: its sup-convolutions merge slopes (concaveSlide, cheap).
      const slide = exact ? slideMax : concaveSlide;
      if (mode === CHARGE_ONLY) {
        slide(w, -X, 0, p, tmp);
      } else if (mode === DISCHARGE_ONLY) {
        slide(w, 0, Y, qm, tmp);
      } else if (day.arbitrage[t] === 1 && qm > p) {
        if (exact) {
          slideMax(w, -X, 0, p, spare);
          slideMax(w, 0, Y, qm, other);
          maxOf(spare, other, tmp);
        } else {
          // The chord from (-Y, qm Y) to (X, -p X): khat(w) = c0 + c1 w on [-Y, X].
          const c1 = (-p * X - qm * Y) / (X + Y);
          const c0 = qm * Y + c1 * Y;
          concaveSlide(w, -X, Y, -c1, tmp);
          for (let i = 0; i < tmp.n; i++) tmp.vs[i] = tmp.vs[i]! + c0;
        }
      } else {
        slide(w, 0, Y, qm, spare);
        slide(spare, -X, 0, p, tmp);
      }
      if (!clip(tmp, day.socMinMwh, day.socMaxMwh, eps, spare)) return false;
      if (spare.n > this.maxBreakpoints) {
        upperHulls(spare, this.maxBreakpoints, w);
      } else {
        [w, spare] = [spare, w];
      }
      this.series.store(t, w);
    }
    this.lowerBound = this.greedyPath(day, mu, modes, eps);
    return true;
  }

  /** max of W_t over [lo, hi] (inside its domain): the ends and the breakpoints between. */
  maxOver(t: number, lo: number, hi: number): number {
    const from = this.series.start[t]!;
    const n = this.series.count[t]!;
    const xs = this.series.xs;
    const vs = this.series.vs;
    let best = Math.max(valueAt(xs, vs, from, n, lo), valueAt(xs, vs, from, n, hi));
    // first breakpoint > lo
    let l = from;
    let h = from + n;
    while (l < h) {
      const m = (l + h) >>> 1;
      if (xs[m]! <= lo) l = m + 1;
      else h = m;
    }
    for (let i = l; i < from + n && xs[i]! < hi; i++) if (vs[i]! > best) best = vs[i]!;
    return best;
  }

  /** The domain [lo, hi] of W_t. */
  domainLo(t: number): number {
    return this.series.xs[this.series.start[t]!]!;
  }

  domainHi(t: number): number {
    return this.series.xs[this.series.start[t]! + this.series.count[t]! - 1]!;
  }

  private greedyPath(day: StoredDay, mu: number, modes: Int8Array, eps: number): number {
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    const xs = this.series.xs;
    const vs = this.series.vs;
    let s = day.socStartMwh;
    let value = 0;
    for (let t = 0; t < day.periods; t++) {
      const p = day.chargePrice[t]!;
      const qm = day.dischargePrice[t]! - mu;
      const mode = modes[t]!;
      const from = this.series.start[t + 1]!;
      const n = this.series.count[t + 1]!;
      const lo = Math.max(xs[from]!, s - (mode === CHARGE_ONLY ? 0 : Y));
      const hi = Math.min(xs[from + n - 1]!, s + (mode === DISCHARGE_ONLY ? 0 : X));
      if (lo > hi + eps) return -Infinity;
      let bestNext = lo;
      let best = -Infinity;
      for (let c = -3; c < n; c++) {
        const u = c === -3 ? lo : c === -2 ? Math.max(lo, hi) : c === -1 ? s : xs[from + c]!;
        if (c >= -1 && !(u > lo && u < hi)) continue;
        const move = u - s;
        const v = valueAt(xs, vs, from, n, u) + (move >= 0 ? -p * move : -qm * move);
        if (v > best) {
          best = v;
          bestNext = u;
        }
      }
      const move = bestNext - s;
      value += move >= 0 ? -p * move : -qm * move;
      s = bestNext;
    }
    if (s < day.socEndFloorMwh - eps) return -Infinity;
    return value + day.terminalValuePerMwh * s;
  }

}

/**
 * out = f with the states after period t that lie on no optimal path simplified away: f must stay
 * at or below the true value function and equal to it on live states (see ValueBounds). A segment
 * [x_i, x_{i+1}] is dead when max(f(x_i), f(x_{i+1})) + max W_t over it < threshold. Dead runs at
 * either end are cut off the domain; an inner dead run x_i..x_j keeps its ends and becomes
 * (x_i, v_i), (x_{i+1}, c), (x_{j-1}, c), (x_j, v_j) with c the least value at its inner breakpoints:
 * below f on every piece, because f is linear between breakpoints. False (out untouched) when
 * every segment is dead, which only rounding can cause; the caller then keeps f.
 */
export function pruneDead(f: Pwl, bounds: ValueBounds, t: number, threshold: number, out: Pwl): boolean {
  const n = f.n;
  if (n < 3) return false;
  const xs = f.xs;
  const vs = f.vs;
  const lo = bounds.domainLo(t);
  const hi = bounds.domainHi(t);
  // dead[i] for the segment [x_i, x_{i+1}]
  let first = -1;
  let last = -1;
  for (let i = 0; i < n - 1; i++) {
    if (!segmentDead(xs, vs, i, bounds, t, lo, hi, threshold)) {
      if (first < 0) first = i;
      last = i;
    }
  }
  if (first < 0) return false;
  out.clear();
  out.push(xs[first]!, vs[first]!);
  let i = first;
  while (i <= last) {
    // segment i is live here; find the run of dead segments after it
    out.push(xs[i + 1]!, vs[i + 1]!);
    let j = i + 1;
    while (j <= last && segmentDead(xs, vs, j, bounds, t, lo, hi, threshold)) j++;
    // segments i+1 .. j-1 are dead, x_{i+1} .. x_j their ends
    if (j - (i + 1) >= 3) {
      let c = Infinity;
      for (let k = i + 2; k <= j - 1; k++) c = Math.min(c, vs[k]!);
      out.push(xs[i + 2]!, c);
      out.push(xs[j - 1]!, c);
    } else {
      for (let k = i + 2; k <= j - 1; k++) out.push(xs[k]!, vs[k]!);
    }
    if (j > i + 1) out.push(xs[j]!, vs[j]!);
    i = j;
  }
  return true;
}

function segmentDead(xs: Float64Array, vs: Float64Array, i: number, bounds: ValueBounds, t: number, lo: number, hi: number, threshold: number): boolean {
  const a = xs[i]!;
  const b = xs[i + 1]!;
  if (b < lo || a > hi) return true;
  return Math.max(vs[i]!, vs[i + 1]!) + bounds.maxOver(t, Math.max(a, lo), Math.min(b, hi)) < threshold;
}

/**
 * out >= f with at most `most` breakpoints: f's breakpoints are cut into pieces of equal count that
 * share their end points, and each piece is replaced by its upper concave hull (Andrew 1979, the
 * monotone chain), which passes through the piece's end points, so out is continuous and at or
 * above f everywhere. Fewer, longer pieces until the result fits; one piece gives the concave hull.
 */
function upperHulls(f: Pwl, most: number, out: Pwl): void {
  const n = f.n;
  const xs = f.xs;
  const vs = f.vs;
  for (let pieces = Math.max(1, most >> 2); ; pieces = pieces >> 1) {
    out.clear();
    const size = Math.ceil((n - 1) / pieces);
    for (let from = 0; from < n - 1; from += size) {
      const to = Math.min(n - 1, from + size);
      upperHull(xs, vs, from, to, out);
    }
    if (out.n <= most || pieces === 1) return;
  }
}

let hull = new Int32Array(64);

/** Appends the upper concave hull of points from..to (inclusive) to out. */
function upperHull(xs: Float64Array, vs: Float64Array, from: number, to: number, out: Pwl): void {
  if (hull.length < to - from + 1) hull = new Int32Array(2 * (to - from + 1));
  let top = 0;
  for (let i = from; i <= to; i++) {
    // pop while the last point lies on or below the chord from the one before it to point i
    while (top >= 2) {
      const a = hull[top - 2]!;
      const b = hull[top - 1]!;
      const cross = (xs[b]! - xs[a]!) * (vs[i]! - vs[a]!) - (vs[b]! - vs[a]!) * (xs[i]! - xs[a]!);
      if (cross >= 0) top--;
      else break;
    }
    hull[top++] = i;
  }
  for (let k = 0; k < top; k++) out.push(xs[hull[k]!]!, vs[hull[k]!]!);
}
