import { LineSolution, SweepWorkspace } from './lineSweep.js';
import { SegmentOrder, SegmentRanking } from './segmentOrder.js';
import type { StoredDay } from './storedDay.js';

/**
 * Everything the fast solver keeps for one day: the stored-unit problem, the segment order, the
 * rankings at mu = 0 and at a multiplier high enough to minimise discharge, scratch space.
 */
export class DayContext {
  readonly order: SegmentOrder;
  readonly atZero: SegmentRanking;
  readonly scratch: SegmentRanking;
  readonly workspace: SweepWorkspace;
  /** Solutions used by the cycle-cap search: the two sides of the cap and a trial. */
  readonly above: LineSolution;
  readonly below: LineSolution;
  readonly trial: LineSolution;
  /**
   * A multiplier at which every discharge segment is steeper than every charge and chord segment
   * and than -V: the sweep then discharges as little as the window allows.
   */
  readonly muHigh: number;
  private high: SegmentRanking | null = null;

  constructor(readonly day: StoredDay) {
    const n = day.periods;
    this.order = new SegmentOrder(day);
    this.atZero = new SegmentRanking(n);
    this.order.rank(0, this.atZero);
    this.scratch = new SegmentRanking(n);
    this.workspace = new SweepWorkspace(n);
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

  atHigh(): SegmentRanking {
    if (this.high === null) {
      this.high = new SegmentRanking(this.day.periods);
      this.order.rank(this.muHigh, this.high);
    }
    return this.high;
  }
}
