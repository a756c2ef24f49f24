import { LineSolution, sweepLine, SweepWorkspace, type SweepStatus } from './lineSweep.js';
import type { StoredDay } from './storedDay.js';
import { ValueDp } from './valueDp.js';

/** Solves the loaded day at a multiplier mu on discharged energy, with per-period modes. */
export interface MuSolver {
  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus;
  /** Whether every solution has x_t y_t = 0 in every period already (nothing to net). */
  readonly complementary: boolean;
}

/** The concave sweep (lineSweep.ts). */
export class SweepSolver implements MuSolver {
  readonly complementary = false;
  private readonly workspace: SweepWorkspace;
  private day: StoredDay | null = null;

  constructor(capacity: number) {
    this.workspace = new SweepWorkspace(capacity);
  }

  load(day: StoredDay): this {
    this.day = day;
    return this;
  }

  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus {
    return sweepLine(this.day!, mu, modes, this.workspace, out);
  }
}

/** The exact dynamic program (valueDp.ts). */
export class DpSolver implements MuSolver {
  readonly complementary = true;
  private readonly dp: ValueDp;

  constructor(capacity: number, maxBreakpoints: number) {
    this.dp = new ValueDp(capacity, maxBreakpoints);
  }

  load(day: StoredDay): this {
    this.dp.load(day);
    return this;
  }

  /** See ValueDp.setIncumbent. */
  setIncumbent(value: number, discharged: number): void {
    this.dp.setIncumbent(value, discharged);
  }

  /** See ValueDp.maxBreakpoints. */
  set maxBreakpoints(count: number) {
    this.dp.maxBreakpoints = count;
  }

  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus {
    return this.dp.solveAt(mu, modes, out);
  }
}

/** One day's problem, its solver and the scratch solutions of the cycle-cap search and the branching. */
export class DayContext {
  /** The two sides of the cap and a trial (cycleCapDual.ts). */
  readonly above: LineSolution;
  readonly below: LineSolution;
  readonly trial: LineSolution;
  /** A node's relaxation and its netted copy (arbitrageBranching.ts). */
  readonly node: LineSolution;
  readonly netted: LineSolution;
  /** The root's modes (all free); the branching reuses it for one child. */
  readonly rootModes: Int8Array;
  /** muHigh, computed on first use for the loaded day (NaN until then). */
  private highMultiplier = Number.NaN;
  day!: StoredDay;
  solver!: MuSolver;

  constructor(capacity: number) {
    this.above = new LineSolution(capacity);
    this.below = new LineSolution(capacity);
    this.trial = new LineSolution(capacity);
    this.node = new LineSolution(capacity);
    this.netted = new LineSolution(capacity);
    this.rootModes = new Int8Array(capacity);
  }

  load(day: StoredDay, solver: MuSolver): this {
    this.day = day;
    this.solver = solver;
    this.highMultiplier = Number.NaN;
    return this;
  }

  /**
   * A multiplier at which every discharge segment is steeper than every charge and chord segment
   * and than -V: the solution then discharges as little as the window allows.
   */
  get muHigh(): number {
    if (Number.isNaN(this.highMultiplier)) {
      const day = this.day;
      let maxQ = -Infinity;
      let minP = day.terminalValuePerMwh;
      for (let t = 0; t < day.periods; t++) {
        maxQ = Math.max(maxQ, day.dischargePrice[t]!);
        minP = Math.min(minP, day.chargePrice[t]!);
      }
      this.highMultiplier = 2 * Math.max(0, maxQ - minP) + 1;
    }
    return this.highMultiplier;
  }
}
