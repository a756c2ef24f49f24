import { type Pwl, valueAt } from './pwl.js';

/**
 * The value functions of a dynamic program, one per stage, kept back to back in two growing arrays
 * (breakpoints xs and values vs): stage t holds count[t] breakpoints from start[t]. Reused between
 * runs, so a run allocates nothing once the arrays are large enough.
 */
export class PwlSeries {
  xs: Float64Array;
  vs: Float64Array;
  readonly start: Int32Array;
  readonly count: Int32Array;
  private used = 0;

  constructor(stages: number, breakpointsPerStage: number) {
    this.xs = new Float64Array(breakpointsPerStage * stages);
    this.vs = new Float64Array(breakpointsPerStage * stages);
    this.start = new Int32Array(stages);
    this.count = new Int32Array(stages);
  }

  /** Forgets every stored stage. */
  clear(): void {
    this.used = 0;
  }

  /** Stores a copy of f as stage t. */
  store(t: number, f: Pwl): void {
    const used = this.used;
    if (used + f.n > this.xs.length) {
      const xs = new Float64Array(2 * (used + f.n));
      const vs = new Float64Array(2 * (used + f.n));
      xs.set(this.xs.subarray(0, used));
      vs.set(this.vs.subarray(0, used));
      this.xs = xs;
      this.vs = vs;
    }
    // A plain loop: subarray() would allocate two views per stage.
    const { xs, vs } = this;
    for (let i = 0; i < f.n; i++) {
      xs[used + i] = f.xs[i]!;
      vs[used + i] = f.vs[i]!;
    }
    this.start[t] = used;
    this.count[t] = f.n;
    this.used = used + f.n;
  }

  /** Stage t's value at x (clamped into its domain). */
  at(t: number, x: number): number {
    return valueAt(this.xs, this.vs, this.start[t]!, this.count[t]!, x);
  }

  /** The left end of stage t's domain. */
  domainLo(t: number): number {
    return this.xs[this.start[t]!]!;
  }

  /** The right end of stage t's domain. */
  domainHi(t: number): number {
    return this.xs[this.start[t]! + this.count[t]! - 1]!;
  }
}
