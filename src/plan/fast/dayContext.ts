import { LineSolution, sweepLine, SweepWorkspace, type SweepStatus } from './lineSweep.js';
import { SegmentOrder, SegmentRanking } from './segmentOrder.js';
import type { StoredDay } from './storedDay.js';
import { ValueDp } from './valueDp.js';

/** Solves the day at a multiplier mu on discharged energy, with per-period modes. */
export interface MuSolver {
  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus;
}

/** The concave sweep (lineSweep.ts) with its orders cached at mu = 0 and at the last mu used. */
export class SweepSolver implements MuSolver {
  private readonly order: SegmentOrder;
  private readonly atZero: SegmentRanking;
  private readonly other: SegmentRanking;
  private readonly workspace: SweepWorkspace;

  constructor(private readonly day: StoredDay) {
    this.order = new SegmentOrder(day);
    this.atZero = new SegmentRanking(day.periods);
    this.order.rank(0, this.atZero);
    this.other = new SegmentRanking(day.periods);
    this.workspace = new SweepWorkspace(day.periods);
  }

  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus {
    let ranking = this.atZero;
    if (mu !== 0) {
      if (this.other.mu !== mu) this.order.rank(mu, this.other);
      ranking = this.other;
    }
    return sweepLine(this.day, ranking, modes, this.workspace, out);
  }
}

/** The exact dynamic program (valueDp.ts). */
export class DpSolver implements MuSolver {
  private readonly dp: ValueDp;

  constructor(day: StoredDay, maxBreakpoints: number) {
    this.dp = new ValueDp(day, maxBreakpoints);
  }

  solveAt(mu: number, modes: Int8Array, out: LineSolution): SweepStatus {
    return this.dp.solveAt(mu, modes, out);
  }
}

/** One day's problem, its solver and the scratch solutions of the cycle-cap search. */
export class DayContext {
  /** The two sides of the cap and a trial (cycleCapDual.ts). */
  readonly above: LineSolution;
  readonly below: LineSolution;
  readonly trial: LineSolution;
  /**
   * A multiplier at which every discharge segment is steeper than every charge and chord segment
   * and than -V: the solution then discharges as little as the window allows.
   */
  readonly muHigh: number;

  constructor(
    readonly day: StoredDay,
    readonly solver: MuSolver,
  ) {
    const n = day.periods;
    this.above = new LineSolution(n);
    this.below = new LineSolution(n);
    this.trial = new LineSolution(n);
    let maxQ = -Infinity;
    let minP = day.terminalValuePerMwh;
    for (let t = 0; t < n; t++) {
      maxQ = Math.max(maxQ, day.dischargePrice[t]!);
      minP = Math.min(minP, day.chargePrice[t]!);
    }
    this.muHigh = 2 * Math.max(0, maxQ - minP) + 1;
  }
}
