import { DayContext, SweepSolver } from './dayContext.js';
import type { StoredDayArrays } from './storedDay.js';
import { StoredSchedule } from './storedSchedule.js';
import { ValueProgram } from './valueProgram.js';

/**
 * Every scratch array of the warehouse solver for days of up to `capacity` periods: the stored
 * prices, the sweep's segments, the dynamic program's value functions and bounds, the cycle-cap
 * search's and the branching's schedules. Allocating one costs about twice a typical 96-period
 * solve (measured: about 80 us against 38 us), so a caller that solves day after day keeps one and
 * hands it to each solve; the solver is synchronous and every stage overwrites what it reads, so an
 * answer never depends on what an earlier solve left behind.
 */
export class DayWorkspace {
  readonly capacity: number;
  readonly prices: StoredDayArrays;
  readonly sweep: SweepSolver;
  readonly program: ValueProgram;
  readonly context: DayContext;
  /** The branching's best schedule. */
  readonly best: StoredSchedule;

  constructor(capacity = 100) {
    this.capacity = capacity;
    this.prices = { chargePrice: new Float64Array(capacity), dischargePrice: new Float64Array(capacity), arbitrage: new Uint8Array(capacity) };
    this.sweep = new SweepSolver(capacity);
    this.program = new ValueProgram(capacity);
    this.context = new DayContext(capacity);
    this.best = new StoredSchedule(capacity);
  }
}
