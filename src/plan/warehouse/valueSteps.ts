import { clip, concaveSlide, concaveStep, isConcave, type Kernel, maxOf, newKernel, type Piece, Pwl, PwlScratch, slide, slideMax, upperHulls, type Window } from './pwl.js';
import type { PwlSeries } from './pwlSeries.js';
import { type DayAtMultiplier, kernelValue, PERIOD_SHAPE, periodKernel, type PeriodShape } from './periodShape.js';
import type { StoredDay } from './storedDay.js';
import type { StoredSchedule } from './storedSchedule.js';

/**
 * The steps the programs over general piecewise-linear value functions share (valueProgram.ts,
 * valueBounds.ts): one period's step of a value function, the backward program, and the walk that
 * follows value functions to a schedule. All rest on one recursion (Bellman 1956, the warehouse
 * problem): with k_t the period's value of its move (periodShape.ts),
 *   forward   F_t(s)     = max_w F_{t-1}(s - w) + k_t(w)     (best value of periods 1..t ending at s)
 *   backward  W_{t-1}(s) = max_w k_t(w) + W_t(s + w)         (best value of periods t..T from s)
 * each restricted to the window [socMin, socMax]; the backward step is the forward one with the
 * reflected kernel (w' = -w). F_0 is the point (s_0, 0); W_T(s) = V s on [max(socMin, socEndMin), socMax].
 */

/** One run of a program: the loaded day, the multiplier mu on discharged energy, the per-period modes. */
export type ProgramRun = DayAtMultiplier;

/** How a step treats a convex period: the maximum of its two pieces (exact) or its chord (a concave upper bound). */
export type ConvexPeriods = 'exact' | 'chord';

/** Scratch of the steps: the period's kernel, the chord piece, three intermediate functions, the pwl scratch. */
export class StepScratch {
  readonly kernel: Kernel = newKernel();
  readonly chord: Piece = { from: 0, to: 0, slope: 0 };
  readonly slid = new Pwl();
  readonly slidTwice = new Pwl();
  readonly larger = new Pwl();
  readonly pwl = new PwlScratch();
}

/**
 * out = (f (+) kernel) restricted to the window: one period's step of a value function, forward
 * or backward by the kernel's direction (periodKernel). Per shape: a flow-only period slides f
 * along its one piece; a concave period along both (one slope merge when f is concave); a convex
 * period takes the maximum of the two slides (`exact`: one mode per period, the sup-convolution of
 * the maximum is the maximum of the sup-convolutions) or slides along the chord from the kernel's
 * lower end to its upper end (`chord`: the concave hull of k_t). False when the result misses the
 * window by more than its eps. `out` must differ from `f`.
 */
export function periodStep(f: Pwl, kernel: Kernel, shape: PeriodShape, convex: ConvexPeriods, window: Window, scratch: StepScratch, out: Pwl): boolean {
  const { lower, upper } = kernel;
  const { slid, slidTwice, larger } = scratch;
  if (shape === PERIOD_SHAPE.concave) {
    if (isConcave(f)) return concaveStep(f, kernel, window, scratch.pwl, out);
    slideMax(f, lower, scratch.pwl, slid);
    slideMax(slid, upper, scratch.pwl, slidTwice);
    return clip(slidTwice, window, out);
  }
  if (shape === PERIOD_SHAPE.convex && convex === 'exact') {
    if (isConcave(f)) {
      concaveSlide(f, upper, slid);
      concaveSlide(f, lower, slidTwice);
    } else {
      slideMax(f, upper, scratch.pwl, slid);
      slideMax(f, lower, scratch.pwl, slidTwice);
    }
    maxOf(slid, slidTwice, larger);
    return clip(larger, window, out);
  }
  if (shape === PERIOD_SHAPE.convex) {
    // The chord through (lower.from, lower.slope lower.from) and (upper.to, upper.slope upper.to):
    // slope c, value c0 at w = 0; a concave f stays concave, so the slope merge applies.
    const chord = scratch.chord;
    const width = upper.to - lower.from;
    chord.from = lower.from;
    chord.to = upper.to;
    chord.slope = (upper.slope * upper.to - lower.slope * lower.from) / width;
    const c0 = lower.slope * lower.from - chord.slope * lower.from;
    concaveSlide(f, chord, slid);
    for (let i = 0; i < slid.n; i++) slid.vs[i] = slid.vs[i]! + c0;
    return clip(slid, window, out);
  }
  // A flow-only period: the forbidden piece has length 0 (periodKernel).
  slide(f, lower.to > lower.from ? lower : upper, scratch.pwl, slid);
  return clip(slid, window, out);
}

/**
 * out = the value of ending the day at s: V s on [max(socMin, socEndMin), socMax] (the stage after the
 * last period of a backward program); false when the floor lies above socMax by more than eps.
 */
export function endOfDayValue(day: StoredDay, out: Pwl): boolean {
  const floor = day.socEndFloorMwh;
  if (floor > day.socMaxMwh + day.window.eps) return false;
  const V = day.terminalValuePerMwh;
  const end = Math.min(floor, day.socMaxMwh);
  out.clear();
  out.push(end, V * end);
  if (end < day.socMaxMwh) out.push(day.socMaxMwh, V * day.socMaxMwh);
  return true;
}

const ANYWHERE: Window = Object.freeze({ lo: -Infinity, hi: Infinity, eps: 0 });

/** What backwardValues computes: stages T down to `downTo`, convex periods `convex`, at most `maxBreakpoints` per stage. */
export interface BackwardPass {
  readonly downTo: number;
  readonly convex: ConvexPeriods;
  /** Past this many breakpoints a stage is replaced by upper hulls of its pieces (an upper bound); Infinity: never. */
  readonly maxBreakpoints: number;
}

/**
 * The backward program into `values` (stage t at index t): W_T = endOfDayValue, then
 * W_{t-1} = periodStep(W_t, backward kernel of period t) down to stage pass.downTo. Exact when every
 * period after downTo is concave or flow-only and no stage outgrows maxBreakpoints (the concave tail
 * of valueProgram.ts); an upper bound on the best continuation otherwise (valueBounds.ts), since the chord
 * and the upper hulls lie at or above what they replace. False when no state reaches the floor.
 */
export function backwardValues(run: ProgramRun, pass: BackwardPass, values: PwlSeries, scratch: StepScratch, current: Pwl, next: Pwl): boolean {
  const { day } = run;
  let w = current;
  let spare = next;
  if (!endOfDayValue(day, w)) return false;
  values.clear();
  values.store(day.periods, w);
  for (let t = day.periods - 1; t >= pass.downTo; t--) {
    const shape = periodKernel(run, t, 'backward', scratch.kernel);
    // W_0 is the value from the start, which need not lie in the window (the first period may bring it in).
    if (!periodStep(w, scratch.kernel, shape, pass.convex, t === 0 ? ANYWHERE : day.window, scratch, spare)) return false;
    if (spare.n > pass.maxBreakpoints) {
      upperHulls(spare, pass.maxBreakpoints, scratch.pwl, w);
    } else {
      [w, spare] = [spare, w];
    }
    values.store(t, w);
  }
  return true;
}

/**
 * The state u of stage `stage` of `values` that maximises values(u) + k(w), with k the forward
 * kernel of the period and w = direction (u - s) its move (direction 1: u follows s; -1: u precedes
 * s), over the states the kernel reaches from s inside the stage's domain; NaN when that range misses
 * the domain by more than eps. values + k is linear between the breakpoints and the kink u = s, so
 * the maximum lies at one of those or at an end of the range.
 */
export function bestMove(values: PwlSeries, stage: number, s: number, kernel: Kernel, direction: 1 | -1, eps: number): number {
  const from = values.start[stage]!;
  const n = values.count[stage]!;
  const xs = values.xs;
  const vs = values.vs;
  const reachLo = direction === 1 ? s + kernel.lower.from : s - kernel.upper.to;
  const reachHi = direction === 1 ? s + kernel.upper.to : s - kernel.lower.from;
  const lo = Math.max(xs[from]!, reachLo);
  const hi = Math.min(xs[from + n - 1]!, reachHi);
  if (lo > hi + eps) return Number.NaN;
  let bestU = lo;
  let best = values.at(stage, lo) + kernelValue(kernel, direction * (lo - s));
  for (let c = -2; c < n; c++) {
    const u = c === -2 ? hi : c === -1 ? s : xs[from + c]!;
    if (!(u > lo && (u < hi || c === -2))) continue;
    // A breakpoint's value is stored; only the range end and the kink need interpolating.
    const v = (c >= 0 ? vs[from + c]! : values.at(stage, u)) + kernelValue(kernel, direction * (u - s));
    if (v > best) {
      best = v;
      bestU = u;
    }
  }
  return bestU;
}

/** Where a walk through value functions starts: the stage, the state there, and the direction. */
export interface WalkStart {
  readonly stage: number;
  readonly state: number;
  /** 1: forwards to the end of the day through backward values; -1: backwards to the start through forward values. */
  readonly direction: 1 | -1;
}

/**
 * Follows value functions from a state, one period at a time, to the neighbouring state that
 * maximises the period's value plus the values there (bestMove): forwards from stage `stage`, each
 * period t moving to the s_t that maximises k_t(s_t - s_{t-1}) + values_{t+1}(s_t); or backwards
 * from stage `stage` to the start, each period t coming from the s_{t-1} that maximises
 * values_{t-1}(s_{t-1}) + k_t(s_t - s_{t-1}). One signed move per period, so x_t y_t = 0. Writes x_t,
 * y_t into `out` and adds their value and discharged energy to out.value and out.discharged (going
 * forwards, also V s_T). Returns the state where the walk ends, or NaN when a period cannot reach the
 * next stage's domain.
 */
export function followValues(run: ProgramRun, values: PwlSeries, start: WalkStart, kernel: Kernel, out: StoredSchedule): number {
  const { day } = run;
  const { direction } = start;
  const eps = day.window.eps;
  let state = start.state;
  let value = out.value;
  let discharged = out.discharged;
  const first = direction === 1 ? start.stage : start.stage - 1;
  for (let t = first; direction === 1 ? t < day.periods : t >= 0; t += direction) {
    periodKernel(run, t, 'forward', kernel);
    const next = bestMove(values, direction === 1 ? t + 1 : t, state, kernel, direction, eps);
    if (Number.isNaN(next)) return Number.NaN;
    const w = direction * (next - state);
    const x = w > 0 ? w : 0;
    const y = w < 0 ? -w : 0;
    out.x[t] = x;
    out.y[t] = y;
    value += day.dischargePrice[t]! * y - day.chargePrice[t]! * x;
    discharged += y;
    state = next;
  }
  out.value = direction === 1 ? value + day.terminalValuePerMwh * state : value;
  out.discharged = discharged;
  return state;
}
