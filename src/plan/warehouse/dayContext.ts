import { sweepLine, SweepWorkspace, type SweepObserver } from './lineSweep.js';
import type { StageStatus } from './stageStatus.js';
import type { StoredDay } from './storedDay.js';
import { StoredSchedule } from './storedSchedule.js';

/**
 * The inner problem of the cycle-cap search (cycleCapMultiplier.ts): the loaded day solved at a
 * multiplier mu on discharged energy, with per-period modes, into `out`.
 */
export interface MultiplierSolver {
  /** `sweep` (lineSweep.ts): convex periods on their chord, whose flows may be simultaneous; `program` (valueProgram.ts): one mode per period, exactly. */
  readonly method: 'sweep' | 'program';
  solveAt(mu: number, modes: Int8Array, out: StoredSchedule): StageStatus;
}

/** One step of the cycle-cap search, as an observer sees it (cycleCapMultiplier.ts). */
export interface MultiplierStep {
  /** `zero`: the solve at mu = 0; `idle`: the do-nothing schedule taken as the first low side; `high`: the solve at muHigh; `trial`: a solve at the crossing of the two sides' lines. */
  readonly kind: 'zero' | 'idle' | 'high' | 'trial';
  readonly mu: number;
  readonly status: StageStatus;
  /** The solution's value (without the multiplier term) and discharged energy [MWh stored]. */
  readonly value: number;
  readonly discharged: number;
}

/** One node of the branching, as an observer sees it (arbitrageBranching.ts). */
export interface BranchNode {
  readonly modes: Int8Array;
  readonly status: StageStatus;
  /** The node's bound (its relaxation's value), NaN unless the status is ok. */
  readonly bound: number;
  /** What the node led to: pruned by the incumbent, a new incumbent, split on a period, or infeasible. */
  readonly outcome: 'pruned' | 'incumbent' | 'split' | 'infeasible';
  /** The split period, or -1. */
  readonly split: number;
  /** The node's relaxed schedule (read it during the call; the branching reuses it). */
  readonly schedule: StoredSchedule;
}

/** Looks at a solve as it goes (docs/day-solver.md traces a day with one); the solver runs without. */
export interface SolveObserver {
  readonly sweep?: SweepObserver;
  multiplierStep?(step: MultiplierStep): void;
  branchNode?(node: BranchNode): void;
}

/** The chord sweep as a MultiplierSolver. */
export class SweepSolver implements MultiplierSolver {
  readonly method = 'sweep';
  readonly workspace: SweepWorkspace;
  private day: StoredDay | null = null;
  private observer: SweepObserver | undefined;

  constructor(capacity: number) {
    this.workspace = new SweepWorkspace(capacity);
  }

  load(day: StoredDay, observer?: SweepObserver): this {
    this.day = day;
    this.observer = observer;
    return this;
  }

  solveAt(mu: number, modes: Int8Array, out: StoredSchedule): StageStatus {
    return sweepLine(this.day!, mu, modes, this.workspace, out, this.observer);
  }
}

/** One day's problem, its inner solver, and the scratch schedules of the cycle-cap search and the branching. */
export class DayContext {
  /** The two sides of the cap and a trial (cycleCapMultiplier.ts). */
  readonly above: StoredSchedule;
  readonly below: StoredSchedule;
  readonly trial: StoredSchedule;
  /** A node's relaxation and its netted copy (arbitrageBranching.ts). */
  readonly node: StoredSchedule;
  readonly netted: StoredSchedule;
  /** The root's modes (all free); the branching reuses it for one child. */
  readonly rootModes: Int8Array;
  /** muHigh, computed on first use for the loaded day (NaN until then). */
  private highMultiplier = Number.NaN;
  day!: StoredDay;
  solver!: MultiplierSolver;
  observer: SolveObserver | undefined;

  constructor(capacity: number) {
    this.above = new StoredSchedule(capacity);
    this.below = new StoredSchedule(capacity);
    this.trial = new StoredSchedule(capacity);
    this.node = new StoredSchedule(capacity);
    this.netted = new StoredSchedule(capacity);
    this.rootModes = new Int8Array(capacity);
  }

  load(day: StoredDay, solver: MultiplierSolver, observer?: SolveObserver): this {
    this.day = day;
    this.solver = solver;
    this.observer = observer;
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
