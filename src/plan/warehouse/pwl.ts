/**
 * Continuous piecewise-linear functions on an interval, not necessarily concave, with the three
 * operations an exact dynamic program over one stored-energy state needs: the sliding maximum
 * (sup-convolution with one linear piece), the pointwise maximum of two functions and the
 * restriction to an interval. All are exact up to rounding: breakpoints come from the inputs,
 * their shifts by the piece's ends and the crossings of two lines.
 *
 * Notes. A function is its breakpoints (x_0 < ... < x_{n-1}, v_i), linear in between; n = 1 is a
 * point. Sliding maximum (Gil and Werman 1993 treat its discrete form, "Computing 2-D min, median
 * and max filters", IEEE TPAMI 15(5), doi:10.1109/34.211471):
 *   G(s) = max_{w in [a, b]} F(s - w) + sigma w = sigma s + max_{u in [s - b, s - a]} H(u),
 *   H(u) = F(u) - sigma u.
 * For r = s - a the window is [r - L, r], L = b - a, and its maximum is the largest of H(r), H(r - L)
 * and H at the breakpoints inside, so between consecutive points of {x_i} u {x_i + L} it is the upper
 * envelope of at most two lines and a constant (the breakpoint maximum, kept by a monotone deque).
 * Points closer than a relative 1e-13 merge; collinear neighbours (slopes within a relative 1e-13)
 * are dropped, which keeps the number of breakpoints small.
 */
/** A linear piece of a period's value: value `slope` x w for a move w in [from, to]. */
export interface Piece {
  from: number;
  to: number;
  slope: number;
}

/**
 * A period's value of its move as two linear pieces: `lower` (value lower.slope x w on [lower.from,
 * lower.to]) and `upper`, which continues it from lower.to with slope upper.slope up to upper.to.
 * The day solver's kernels meet at w = 0 (lower.to = upper.from = 0), so both values read slope x w.
 * Concave when lower.slope >= upper.slope. The solver refills one kernel per period (periodShape.ts).
 */
export interface Kernel {
  readonly lower: Piece;
  readonly upper: Piece;
}

export function newKernel(): Kernel {
  return { lower: { from: 0, to: 0, slope: 0 }, upper: { from: 0, to: 0, slope: 0 } };
}

/** The interval [lo, hi] a function is restricted to, and how far outside its ends still counts as meeting it. */
export interface Window {
  readonly lo: number;
  readonly hi: number;
  readonly eps: number;
}

/**
 * Breakpoints a function and the scratch arrays hold before they grow. Growing replaces an array, and
 * the engine then compiles again every optimised function that read the old one; the program's value
 * functions stay within its first budget (400 breakpoints) and a slide of one at most about doubles
 * it, so the usual day never grows them (a year's backtest: no growth, three fewer compilations of
 * the slides). 1024 breakpoints are 16 KiB per function.
 */
const INITIAL_BREAKPOINTS = 1024;

/**
 * Scratch arrays of the operations below, grown on demand and handed in by the caller (the solver
 * keeps one in its workspace): results never depend on what a previous call left in them.
 */
export class PwlScratch {
  /** Index deque of slideMax. */
  deque = new Int32Array(INITIAL_BREAKPOINTS);
  /** Values of at most three lines at both ends of one elementary interval (slideMax). */
  readonly lineStart = new Float64Array(3);
  readonly lineEnd = new Float64Array(3);
  /** Breakpoints of a concave step before its restriction (concaveStep). */
  stepXs = new Float64Array(INITIAL_BREAKPOINTS);
  stepVs = new Float64Array(INITIAL_BREAKPOINTS);
  /** Point stack of upperHull. */
  hull = new Int32Array(INITIAL_BREAKPOINTS);
}

export class Pwl {
  xs: Float64Array;
  vs: Float64Array;
  n = 0;

  constructor(capacity = INITIAL_BREAKPOINTS) {
    this.xs = new Float64Array(capacity);
    this.vs = new Float64Array(capacity);
  }

  clear(): void {
    this.n = 0;
  }

  /** Appends a breakpoint to the right, merging near-equal points and collinear neighbours. */
  push(x: number, v: number): void {
    const n = this.n;
    if (n > 0) {
      const lastX = this.xs[n - 1]!;
      if (x - lastX <= 1e-13 * (1 + Math.abs(x))) {
        if (v > this.vs[n - 1]!) this.vs[n - 1] = v;
        return;
      }
      if (n > 1) {
        const x0 = this.xs[n - 2]!;
        const v0 = this.vs[n - 2]!;
        const v1 = this.vs[n - 1]!;
        const s1 = (v1 - v0) / (lastX - x0);
        const s2 = (v - v1) / (x - lastX);
        if (Math.abs(s1 - s2) <= 1e-13 * (1 + Math.abs(s1) + Math.abs(s2))) {
          this.xs[n - 1] = x;
          this.vs[n - 1] = v;
          return;
        }
      }
    }
    if (n === this.xs.length) this.grow();
    this.xs[n] = x;
    this.vs[n] = v;
    this.n = n + 1;
  }

  private grow(): void {
    const xs = new Float64Array(2 * this.xs.length);
    const vs = new Float64Array(2 * this.xs.length);
    xs.set(this.xs);
    vs.set(this.vs);
    this.xs = xs;
    this.vs = vs;
  }

  /** F(x) for x in the domain (clamped to it). */
  at(x: number): number {
    return valueAt(this.xs, this.vs, 0, this.n, x);
  }
}

/** Value at x of the function stored in xs, vs [from, from + n) (x clamped into its domain). */
export function valueAt(xs: Float64Array, vs: Float64Array, from: number, n: number, x: number): number {
  const last = from + n - 1;
  if (x <= xs[from]!) return vs[from]!;
  if (x >= xs[last]!) return vs[last]!;
  let lo = from;
  let hi = last;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (xs[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const x0 = xs[lo]!;
  return vs[lo]! + ((vs[hi]! - vs[lo]!) * (x - x0)) / (xs[hi]! - x0);
}

/**
 * Pushes the upper envelope over [e0, e1] of lines 0..count-1, given by their values at both ends
 * (scratch.lineStart, scratch.lineEnd), shifted right by `shift` and tilted by `tilt` (the point at e0 included).
 */
function pushEnvelope(out: Pwl, e0: number, e1: number, count: number, shift: number, tilt: number, scratch: PwlScratch): void {
  const { lineStart: startValue, lineEnd: endValue } = scratch;
  const width = e1 - e0;
  let top = 0;
  for (let k = 1; k < count; k++) {
    const a = startValue[k]!;
    const b = startValue[top]!;
    if (a > b || (a === b && endValue[k]! > endValue[top]!)) top = k;
  }
  let from = 0;
  out.push(e0 + shift, startValue[top]! + tilt * (e0 + shift));
  for (let guard = 0; guard < count; guard++) {
    let next = -1;
    let at = 1;
    const topSlope = endValue[top]! - startValue[top]!;
    for (let k = 0; k < count; k++) {
      if (k === top) continue;
      const slope = endValue[k]! - startValue[k]!;
      if (!(slope > topSlope)) continue;
      const f = (startValue[top]! - startValue[k]!) / (slope - topSlope);
      if (f > from && (f < at || (f === at && next >= 0 && slope > endValue[next]! - startValue[next]!))) {
        at = f;
        next = k;
      }
    }
    if (next < 0) return;
    const e = e0 + at * width;
    out.push(e + shift, startValue[top]! + at * topSlope + tilt * (e + shift));
    top = next;
    from = at;
  }
}

/**
 * out = the sliding maximum G(s) = max_{w in [a, b]} F(s - w) + sigma w on [x_0 + a, x_{n-1} + b],
 * for the piece (a, b, sigma) = (from, to, slope). `out` must differ from `f`.
 */
export function slideMax(f: Pwl, piece: Piece, scratch: PwlScratch, out: Pwl): void {
  const { from: a, to: b, slope: sigma } = piece;
  const { lineStart: startValue, lineEnd: endValue } = scratch;
  out.clear();
  const n = f.n;
  const xs = f.xs;
  const vs = f.vs;
  const L = b - a;
  // H(x_i) = v_i - sigma x_i is written out where needed (a closure here measured slower).
  if (L <= 0 || n === 0) {
    for (let i = 0; i < n; i++) out.push(xs[i]! + a, f.vs[i]! + sigma * a);
    return;
  }
  if (scratch.deque.length < n) scratch.deque = new Int32Array(2 * n);
  const deque = scratch.deque;
  let head = 0;
  let tail = 0;
  let i = 0; // next breakpoint of H to enter at r = x_i
  let j = 0; // next breakpoint of H(r - L) at r = x_j + L
  let e0 = xs[0]!;
  const last = n - 1;
  const end = xs[last]! + L;
  while (e0 < end) {
    while (i < n && xs[i]! <= e0) {
      const hi = vs[i]! - sigma * xs[i]!;
      while (tail > head && vs[deque[tail - 1]!]! - sigma * xs[deque[tail - 1]!]! <= hi) tail--;
      deque[tail++] = i++;
    }
    while (j < n && xs[j]! + L <= e0) j++;
    const e1 = Math.min(i < n ? xs[i]! : Infinity, j < n ? xs[j]! + L : Infinity);
    while (tail > head && xs[deque[head]!]! + L < e1) head++;
    let count = 0;
    if (i < n) {
      // H(r) on the piece [x_{i-1}, x_i], where F has the slope dv
      const k = i - 1;
      const dv = (vs[i]! - vs[k]!) / (xs[i]! - xs[k]!);
      startValue[count] = vs[k]! + dv * (e0 - xs[k]!) - sigma * e0;
      endValue[count++] = vs[k]! + dv * (e1 - xs[k]!) - sigma * e1;
    }
    if (j > 0) {
      // H(r - L) on the piece [x_{j-1}, x_j]
      const k = j - 1;
      const dv = (vs[j]! - vs[k]!) / (xs[j]! - xs[k]!);
      startValue[count] = vs[k]! + dv * (e0 - L - xs[k]!) - sigma * (e0 - L);
      endValue[count++] = vs[k]! + dv * (e1 - L - xs[k]!) - sigma * (e1 - L);
    }
    if (tail > head) {
      const top = deque[head]!;
      startValue[count] = endValue[count] = vs[top]! - sigma * xs[top]!;
      count++;
    }
    pushEnvelope(out, e0, e1, count, a, sigma, scratch);
    e0 = e1;
  }
  out.push(end + a, vs[last]! - sigma * xs[last]! + sigma * (end + a));
}

/**
 * out = max(f, g) on the union of their domains (which must overlap). On each interval between
 * consecutive breakpoints of either function both are linear, so the maximum is the larger start
 * and, when the order of the two lines flips inside, their crossing.
 */
export function maxOf(f: Pwl, g: Pwl, out: Pwl): void {
  out.clear();
  const fx = f.xs;
  const gx = g.xs;
  const fLast = f.n - 1;
  const gLast = g.n - 1;
  let i = 0;
  let j = 0;
  let e0 = Math.min(fx[0]!, gx[0]!);
  const end = Math.max(fx[fLast]!, gx[gLast]!);
  while (e0 < end) {
    while (i < fLast && fx[i + 1]! <= e0) i++;
    while (j < gLast && gx[j + 1]! <= e0) j++;
    let e1 = end;
    if (fx[i]! > e0) e1 = Math.min(e1, fx[i]!);
    else if (i < fLast) e1 = Math.min(e1, fx[i + 1]!);
    if (gx[j]! > e0) e1 = Math.min(e1, gx[j]!);
    else if (j < gLast) e1 = Math.min(e1, gx[j + 1]!);
    const inF = fx[0]! <= e0 && e1 <= fx[fLast]!;
    const inG = gx[0]! <= e0 && e1 <= gx[gLast]!;
    if (inF && inG) {
      const a0 = lerp(fx, f.vs, i, e0);
      const a1 = lerp(fx, f.vs, i, e1);
      const b0 = lerp(gx, g.vs, j, e0);
      const b1 = lerp(gx, g.vs, j, e1);
      const d0 = a0 - b0;
      const d1 = a1 - b1;
      out.push(e0, d0 > 0 || (d0 === 0 && d1 >= 0) ? a0 : b0);
      if ((d0 > 0 && d1 < 0) || (d0 < 0 && d1 > 0)) {
        // The lines cross at the fraction d0 / (d0 - d1) of the interval; the value is taken on
        // the line that was on top before the crossing.
        const at = d0 / (d0 - d1);
        // The line on top picked first, then one formula: an arm of its own for g on top, first met
        // late, would throw the compiled program away.
        const top0 = d0 > 0 ? a0 : b0;
        const top1 = d0 > 0 ? a1 : b1;
        out.push(e0 + at * (e1 - e0), top0 + at * (top1 - top0));
      }
    } else if (inF) {
      out.push(e0, lerp(fx, f.vs, i, e0));
    } else if (inG) {
      out.push(e0, lerp(gx, g.vs, j, e0));
    }
    e0 = e1;
  }
  out.push(end, Math.max(fx[fLast]! === end ? f.vs[fLast]! : -Infinity, gx[gLast]! === end ? g.vs[gLast]! : -Infinity));
}

/** out = f restricted to the window; false when they do not meet (within window.eps). */
export function clip(f: Pwl, window: Window, out: Pwl): boolean {
  const { lo, hi, eps } = window;
  out.clear();
  const xs = f.xs;
  const last = f.n - 1;
  if (xs[0]! > hi + eps || xs[last]! < lo - eps) return false;
  const from = Math.min(Math.max(lo, xs[0]!), hi);
  const to = Math.max(Math.min(hi, xs[last]!), from);
  out.push(from, f.at(from));
  for (let i = 0; i <= last; i++) if (xs[i]! > from && xs[i]! < to) out.push(xs[i]!, f.vs[i]!);
  out.push(to, f.at(to));
  return true;
}

/** Linear interpolation on the piece [x_k, x_{k+1}] (the caller keeps k + 1 inside the function). */
function lerp(xs: Float64Array, vs: Float64Array, k: number, x: number): number {
  const x0 = xs[k]!;
  const x1 = xs[k + 1]!;
  if (x <= x0) return vs[k]!;
  return vs[k]! + ((vs[k + 1]! - vs[k]!) * (x - x0)) / (x1 - x0);
}

/**
 * out = max_{w in [a, b]} f(s - w) + sigma w for a concave f and the piece (a, b, sigma) = (from,
 * to, slope): the sup-convolution of two concave functions merges their slope sequences
 * (Rockafellar 1970, Convex Analysis, section 5), so the piece of slope sigma and length b - a goes
 * between f's pieces steeper than sigma (shifted by a) and the rest (shifted by b). Exact and
 * linear in the breakpoints, with no new ones but two.
 */
export function concaveSlide(f: Pwl, piece: Piece, out: Pwl): void {
  const { from: a, to: b, slope: sigma } = piece;
  out.clear();
  const xs = f.xs;
  const vs = f.vs;
  const n = f.n;
  let k = n - 1; // the piece of slope sigma starts at breakpoint k
  for (let i = 0; i < n - 1; i++) {
    if ((vs[i + 1]! - vs[i]!) / (xs[i + 1]! - xs[i]!) < sigma) {
      k = i;
      break;
    }
  }
  for (let i = 0; i <= k; i++) out.push(xs[i]! + a, vs[i]! + sigma * a);
  for (let i = k; i < n; i++) out.push(xs[i]! + b, vs[i]! + sigma * b);
}

/** Whether f's slopes never increase from left to right (exactly, no tolerance). */
export function isConcave(f: Pwl): boolean {
  const xs = f.xs;
  const vs = f.vs;
  let previous = Infinity;
  for (let i = 0; i + 1 < f.n; i++) {
    const slope = (vs[i + 1]! - vs[i]!) / (xs[i + 1]! - xs[i]!);
    if (slope > previous) return false;
    previous = slope;
  }
  return true;
}

/** slideMax, by the slope merge of concaveSlide when f is concave (the same function, far cheaper). */
export function slide(f: Pwl, piece: Piece, scratch: PwlScratch, out: Pwl): void {
  if (isConcave(f)) concaveSlide(f, piece, out);
  else slideMax(f, piece, scratch, out);
}

/**
 * out = (f (+) kernel) restricted to the window, for a concave f and a concave kernel (lower.slope
 * = s1 >= upper.slope = s2): slope s1 on [a, a + len1], then s2 on the next len2 (kernel value s1 a
 * at a). This is concaveSlide for each piece and then clip, in one pass: f's pieces steeper than
 * s1 are shifted by (a, s1 a), those between s1 and s2 by the end of the first piece, the rest by
 * the end of the second (the slope merge of concaveSlide). False when the result misses the window
 * by more than window.eps.
 */
export function concaveStep(f: Pwl, kernel: Kernel, window: Window, scratch: PwlScratch, out: Pwl): boolean {
  const { lo, hi, eps } = window;
  const a = kernel.lower.from;
  const len1 = kernel.lower.to - a;
  const s1 = kernel.lower.slope;
  const len2 = kernel.upper.to - kernel.upper.from;
  const s2 = kernel.upper.slope;
  const xs = f.xs;
  const vs = f.vs;
  const n = f.n;
  let k1 = n - 1;
  let k2 = n - 1;
  for (let i = 0; i < n - 1; i++) {
    const slope = (vs[i + 1]! - vs[i]!) / (xs[i + 1]! - xs[i]!);
    if (k1 === n - 1 && slope < s1) k1 = i;
    if (slope < s2) {
      k2 = i;
      break;
    }
  }
  if (scratch.stepXs.length < n + 2) {
    scratch.stepXs = new Float64Array(2 * (n + 2));
    scratch.stepVs = new Float64Array(2 * (n + 2));
  }
  const px = scratch.stepXs;
  const pv = scratch.stepVs;
  const shiftX2 = a + len1;
  const shiftV1 = s1 * a;
  const shiftV2 = shiftV1 + s1 * len1;
  const shiftX3 = shiftX2 + len2;
  const shiftV3 = shiftV2 + s2 * len2;
  let m = 0;
  for (let i = 0; i <= k1; i++, m++) {
    px[m] = xs[i]! + a;
    pv[m] = vs[i]! + shiftV1;
  }
  for (let i = k1; i <= k2; i++, m++) {
    px[m] = xs[i]! + shiftX2;
    pv[m] = vs[i]! + shiftV2;
  }
  for (let i = k2; i < n; i++, m++) {
    px[m] = xs[i]! + shiftX3;
    pv[m] = vs[i]! + shiftV3;
  }
  out.clear();
  if (px[0]! > hi + eps || px[m - 1]! < lo - eps) return false;
  const from = Math.min(Math.max(lo, px[0]!), hi);
  const to = Math.max(Math.min(hi, px[m - 1]!), from);
  out.push(from, valueAt(px, pv, 0, m, from));
  for (let j = 0; j < m; j++) if (px[j]! > from && px[j]! < to) out.push(px[j]!, pv[j]!);
  out.push(to, valueAt(px, pv, 0, m, to));
  return true;
}

/**
 * out >= f with at most `most` breakpoints: f's breakpoints are cut into pieces of equal count that
 * share their end points, and each piece is replaced by its upper concave hull (Andrew 1979, the
 * monotone chain), which passes through the piece's end points, so out is continuous and at or
 * above f everywhere. Fewer, longer pieces until the result fits; one piece gives the concave hull.
 */
export function upperHulls(f: Pwl, most: number, scratch: PwlScratch, out: Pwl): void {
  const n = f.n;
  for (let pieces = Math.max(1, most >> 2); ; pieces = pieces >> 1) {
    out.clear();
    const size = Math.ceil((n - 1) / pieces);
    for (let from = 0; from < n - 1; from += size) {
      const to = Math.min(n - 1, from + size);
      upperHull(f, from, to, scratch, out);
    }
    if (out.n <= most || pieces === 1) return;
  }
}

/** Appends the upper concave hull of f's breakpoints from..to (inclusive) to out. */
function upperHull(f: Pwl, from: number, to: number, scratch: PwlScratch, out: Pwl): void {
  const { xs, vs } = f;
  if (scratch.hull.length < to - from + 1) scratch.hull = new Int32Array(2 * (to - from + 1));
  const hull = scratch.hull;
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
