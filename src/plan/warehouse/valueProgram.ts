import { PERIOD_MODE } from '../periodMode.js';
import type { MultiplierSolver } from './dayContext.js';
import { Pwl } from './pwl.js';
import { PwlSeries } from './pwlSeries.js';
import { PERIOD_SHAPE, periodKernel, periodShape } from './periodShape.js';
import type { StageStatus } from './stageStatus.js';
import type { StoredDay } from './storedDay.js';
import type { StoredSchedule } from './storedSchedule.js';
import { pruneDead, ValueBounds } from './valueBounds.js';
import { backwardValues, followValues, periodStep, type ProgramRun, StepScratch } from './valueSteps.js';

/**
 * Exact dynamic program over stored energy with complementarity in every period, arbitrage periods
 * included, at a multiplier mu on discharged energy (Bellman 1956, the warehouse problem).
 *
 * Notes. F_0 is the point (s_0, 0); F_t = (F_{t-1} (+) k_t) restricted to [socMin, socMax]
 * (valueSteps.ts periodStep). Outside convex periods k_t is concave and equals the sup-convolution
 * of its two pieces. In a convex period (periodShape.ts) k_t is the maximum of its two pieces and
 * F_t = max(F_{t-1} (+) charge piece, F_{t-1} (+) discharge piece): one mode per period, exactly,
 * with no branching. A period fixed to one mode uses that piece alone. F_t need not be concave, so
 * it is kept as a general piecewise-linear function (pwl.ts).
 * Periods after the last convex one form a concave problem, solved backwards instead (the tail,
 * valueSteps.ts backwardValues): the forward program runs only up to that `join` stage, and the
 * best state there maximises F_join + J_join. The path is then recovered backwards from the join
 * (s_{t-1} maximises F_{t-1}(u) + k_t(s_t - u), at a breakpoint of F_{t-1}, the kink u = s_t or an
 * end of the allowed range) and forwards through the tail (valueSteps.ts followValues). Every
 * period's move is one signed w_t, so x_t y_t = 0 by construction.
 * Cost: linear in the breakpoints of the F_t, which stay few when the window is narrow against the
 * power steps but can grow with many arbitrage periods in a wide window; states that cannot lie on
 * an optimal path are pruned with the bounds of valueBounds.ts, and past `maxBreakpoints` in one F_t
 * the program gives up (too-many-breakpoints) rather than run long.
 */

/**
 * Breakpoints of F_t above which the program starts pruning with the chord relaxation's bounds
 * (below it pruning costs more than it saves), and above which it switches to the tighter exact
 * bounds (valueBounds.ts). Measured on seeded days.
 */
const PRUNE_FROM = 48;
const EXACT_BOUNDS_FROM = 160;

/** What a loaded day's runs may use: a breakpoint budget, and a feasible schedule's value and discharged energy (a lower bound). */
export interface ProgramLimits {
  /** Most breakpoints of one F_t before the run gives up (too-many-breakpoints). */
  readonly maxBreakpoints: number;
  /** A feasible schedule of the day, or null: a lower bound on runs with every period free. */
  readonly incumbent: { readonly value: number; readonly discharged: number } | null;
}

export class ValueProgram implements MultiplierSolver {
  readonly method = 'program';
  /** F_0..F_join of the last run, stage t at index t. */
  readonly forward: PwlSeries;
  /** J_join..J_T of the last run (the concave tail), stage t at index t. */
  readonly tail: PwlSeries;
  private readonly current = new Pwl();
  private readonly next = new Pwl();
  private readonly spare = new Pwl();
  private readonly bounds: ValueBounds;
  private readonly scratch = new StepScratch();
  private day!: StoredDay;
  private limits: ProgramLimits = { maxBreakpoints: Infinity, incumbent: null };
  /** The join stage of the last run: the forward program covers periods before it, the tail the rest. */
  join = 0;

  constructor(capacity: number) {
    this.forward = new PwlSeries(capacity + 1, 16);
    this.tail = new PwlSeries(capacity + 1, 16);
    this.bounds = new ValueBounds(capacity);
  }

  load(day: StoredDay, limits: ProgramLimits): this {
    this.day = day;
    this.limits = limits;
    return this;
  }

  solveAt(mu: number, modes: Int8Array, out: StoredSchedule): StageStatus {
    const day = this.day;
    const run: ProgramRun = { day, mu, modes };
    const { scratch, bounds } = this;
    const join = lastConvexPeriod(run) + 1;
    this.join = join;
    if (!backwardValues(run, { downTo: join, convex: 'exact', maxBreakpoints: Infinity }, this.tail, scratch, this.current, this.next)) return 'end-unreachable';
    let f = this.current;
    let next = this.next;
    let spare = this.spare;
    // States whose best possible value stays below a feasible path's value are simplified away;
    // the bounds are computed only once some F_t grows past PRUNE_FROM breakpoints.
    let threshold = Number.NaN;
    let exactBounds = false;
    f.clear();
    f.push(day.socStartMwh, 0);
    this.forward.clear();
    this.forward.store(0, f);
    for (let t = 0; t < join; t++) {
      const shape = periodKernel(run, t, 'forward', scratch.kernel);
      if (!periodStep(f, scratch.kernel, shape, 'exact', day.window, scratch, next)) return 'start-unreachable';
      [f, next] = [next, f];
      if (f.n > PRUNE_FROM) {
        if (Number.isNaN(threshold)) threshold = this.pruningThreshold(run, false);
        if (threshold > -Infinity && pruneDead(f, bounds, t + 1, threshold, spare)) [f, spare] = [spare, f];
        if (f.n > EXACT_BOUNDS_FROM && !exactBounds) {
          exactBounds = true;
          threshold = this.pruningThreshold(run, true);
          if (threshold > -Infinity && pruneDead(f, bounds, t + 1, threshold, spare)) [f, spare] = [spare, f];
        }
      }
      if (f.n > this.limits.maxBreakpoints) return 'too-many-breakpoints';
      this.forward.store(t + 1, f);
    }
    const joinState = bestJoin(f, this.tail, join, day.window.eps);
    if (Number.isNaN(joinState)) return 'end-unreachable';
    // The path: backwards from the join through F (the best predecessor of each state), then
    // forwards through the tail J.
    out.value = 0;
    out.discharged = 0;
    const start = followValues(run, this.forward, { stage: join, state: joinState, direction: -1 }, scratch.kernel, out);
    const end = followValues(run, this.tail, { stage: join, state: joinState, direction: 1 }, scratch.kernel, out);
    return Number.isNaN(start) || Number.isNaN(end) ? 'end-unreachable' : 'ok';
  }

  /** The lower bound less a rounding margin, or -Infinity when there is none (no pruning). */
  private pruningThreshold(run: ProgramRun, exact: boolean): number {
    const bounds = this.bounds;
    let lower = bounds.compute(run, exact, this.scratch) ? bounds.lowerBound : -Infinity;
    const incumbent = this.limits.incumbent;
    if (incumbent !== null && lower > -Infinity && allFree(run.modes, run.day.periods)) lower = Math.max(lower, incumbent.value - run.mu * incumbent.discharged);
    return lower === -Infinity ? -Infinity : lower - 1e-10 * Math.max(1, Math.abs(lower));
  }
}

/** The last period whose shape at mu is convex, or -1. */
function lastConvexPeriod(run: ProgramRun): number {
  for (let t = run.day.periods - 1; t >= 0; t--) {
    if (periodShape(run.day, t, run.mu, run.modes[t]!) === PERIOD_SHAPE.convex) return t;
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
  const lo = Math.max(f.xs[0]!, tail.domainLo(join));
  const hi = Math.min(f.xs[f.n - 1]!, tail.domainHi(join));
  if (lo > hi + eps) return Number.NaN;
  const top = Math.max(lo, hi);
  let bestS = lo;
  let best = f.at(lo) + tail.at(join, lo);
  // Candidates: the common domain's right end and every breakpoint of either function inside it.
  for (let c = -1; c < f.n + n; c++) {
    const s = c < 0 ? top : c < f.n ? f.xs[c]! : tail.xs[from + c - f.n]!;
    if (!(s > lo && s <= top)) continue;
    const v = f.at(s) + tail.at(join, s);
    if (v > best) {
      best = v;
      bestS = s;
    }
  }
  return bestS;
}

function allFree(modes: Int8Array, periods: number): boolean {
  for (let t = 0; t < periods; t++) if (modes[t] !== PERIOD_MODE.free) return false;
  return true;
}
