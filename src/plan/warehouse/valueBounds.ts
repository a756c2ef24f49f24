import { Pwl } from './pwl.js';
import { PwlSeries } from './pwlSeries.js';
import { StoredSchedule } from './storedSchedule.js';
import { backwardValues, followValues, type ProgramRun, type StepScratch } from './valueSteps.js';

/**
 * Bounds that let the exact dynamic program (valueProgram.ts) drop states that cannot lie on an optimal
 * path: an upper bound W_t(s) on the best value still to come from state s after period t, and a
 * lower bound on the optimum (the value of one feasible path).
 *
 * Notes. W is the backward program of valueSteps.ts over the same day, multiplier mu and modes as
 * the program's run (Bellman 1956), in one of two forms:
 * - chord (cheap): every convex period's k_t is replaced by its concave hull, the chord of
 *   storedDay.ts; khat_t >= k_t, every W_t is concave (a sup-convolution of concave functions, two
 *   breakpoints more per period) and at least the value of every feasible continuation from s;
 * - exact (tighter, used once the forward program grows): the true k_t, except that a W_t with more
 *   than maxBreakpoints breakpoints is replaced by upper hulls of its pieces (pwl.ts upperHulls),
 *   which lie at or above it; by induction each W_t is still at least the best continuation value,
 *   and far closer to it than the chord form on days with many arbitrage periods.
 * The lower bound follows W forward (valueSteps.ts followValues) with the true, complementary k_t, so
 * the path is feasible and its value is attained. A state s after period t with
 * F_t(s) + W_t(s) < lower bound is on no optimal path (branch and bound's pruning rule; Land and
 * Doig 1960).
 */
export class ValueBounds {
  readonly values: PwlSeries;
  private readonly current = new Pwl();
  private readonly next = new Pwl();
  private readonly path: StoredSchedule;
  /** Value of the followed feasible path at the multiplier (value - mu sum y), or -Infinity when none was found. */
  lowerBound = -Infinity;

  constructor(
    capacity: number,
    /** Most breakpoints of one exact W_t; larger ones are replaced by upper hulls of pieces. */
    private readonly maxBreakpoints = 128,
  ) {
    this.values = new PwlSeries(capacity + 1, 8);
    this.path = new StoredSchedule(capacity);
  }

  /** Computes W_0..W_T and the lower bound; false when no path reaches the end-of-day floor. */
  compute(run: ProgramRun, exact: boolean, scratch: StepScratch): boolean {
    this.lowerBound = -Infinity;
    const pass = { downTo: 0, convex: exact ? 'exact' : 'chord', maxBreakpoints: exact ? this.maxBreakpoints : Infinity } as const;
    if (!backwardValues(run, pass, this.values, scratch, this.current, this.next)) return false;
    const { day } = run;
    this.path.value = 0;
    this.path.discharged = 0;
    const end = followValues(run, this.values, { stage: 0, state: day.socStartMwh, direction: 1 }, scratch.kernel, this.path);
    if (!(end >= day.socEndFloorMwh - day.window.eps)) return true;
    // W and the program's F carry the multiplier term; the path's value does not.
    this.lowerBound = this.path.value - run.mu * this.path.discharged;
    return true;
  }

  /** max of W_t over [lo, hi] (inside its domain): the ends and the breakpoints between. */
  maxOver(t: number, lo: number, hi: number): number {
    const values = this.values;
    const from = values.start[t]!;
    const n = values.count[t]!;
    const { xs, vs } = values;
    let best = Math.max(values.at(t, lo), values.at(t, hi));
    // first breakpoint > lo
    let l = from;
    let h = from + n;
    while (l < h) {
      const m = (l + h) >>> 1;
      if (xs[m]! <= lo) l = m + 1;
      else h = m;
    }
    for (let i = l; i < from + n && xs[i]! < hi; i++) {
      // Read once, before the test: a second read in the rarely taken arm, first taken late, would
      // throw the compiled program away.
      const v = vs[i]!;
      if (v > best) best = v;
    }
    return best;
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
  const { xs, vs } = f;
  const rule: PruneRule = { t, lo: bounds.values.domainLo(t), hi: bounds.values.domainHi(t), threshold };
  let first = -1;
  let last = -1;
  for (let i = 0; i < n - 1; i++) {
    if (!segmentDead(f, i, bounds, rule)) {
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
    while (j <= last && segmentDead(f, j, bounds, rule)) j++;
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

/** The stage t a function lives after, W_t's domain [lo, hi] and the least value a live state must be able to reach. */
interface PruneRule {
  readonly t: number;
  readonly lo: number;
  readonly hi: number;
  readonly threshold: number;
}

/** Whether f's segment [x_i, x_{i+1}] is dead (see pruneDead). */
function segmentDead(f: Pwl, i: number, bounds: ValueBounds, rule: PruneRule): boolean {
  const a = f.xs[i]!;
  const b = f.xs[i + 1]!;
  if (b < rule.lo || a > rule.hi) return true;
  return Math.max(f.vs[i]!, f.vs[i + 1]!) + bounds.maxOver(rule.t, Math.max(a, rule.lo), Math.min(b, rule.hi)) < rule.threshold;
}
