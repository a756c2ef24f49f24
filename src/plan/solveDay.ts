import type { DayOutcome, DayProblem, Schedule } from '../types.js';
import { dayLpModel } from './dayLpModel.js';
import { infeasibilityReason } from './dayFeasibility.js';
import { javascriptLpSolver, type LpSolver } from './lpSolver.js';
import { freeModes, PERIOD_MODE } from './periodMode.js';
import { scheduleValue, socPath } from './scheduleValue.js';
import { isArbitragePeriod, netPeriod } from './simultaneousFlows.js';
import { solveWarehouseDay } from './warehouse/solveWarehouseDay.js';
import type { DayWorkspace } from './warehouse/workspace.js';
import type { DaySolveMemo } from './daySolveMemo.js';

/** Options of solveDay, merged over SOLVE_DAY_DEFAULTS. */
export interface SolveDayOptions {
  /** LP solver behind our interface. Default javascript-lp-solver. */
  readonly lpSolver: LpSolver;
  /** Most branch-and-bound nodes before giving up with an error (never a silent suboptimum). */
  readonly maxNodes: number;
  /** A node is pruned when its bound is within this relative gap of the incumbent [-]. */
  readonly relativeGap: number;
  /**
   * Which path solves the day: `auto` tries the warehouse solver (src/plan/warehouse) and hands the
   * days it does not cover to the LP path; `warehouse` uses the warehouse solver alone (a day it does
   * not cover throws UncoveredDayError); `lp` uses the LP path alone (LP relaxation by `lpSolver`,
   * our branch and bound on arbitrage periods), e.g. to check it. Default `auto`.
   */
  readonly solver: DaySolverChoice;
  /** Scratch arrays of the warehouse solver; a loop over days passes one to skip allocating (src/plan/warehouse/workspace.ts). Default: a shared one. */
  readonly workspace?: DayWorkspace;
  /** Outcomes of problems solved before, reused for an equal problem (daySolveMemo.ts); a backtest keeps one per day. Default none. */
  readonly memo?: DaySolveMemo;
  /** Adds the time spent in solveDay to this counter (benchmarks); the caller hands in the clock. Default none. */
  readonly stopwatch?: SolveStopwatch;
}

/** The paths solveDay can take (SolveDayOptions.solver). */
export type DaySolverChoice = 'auto' | 'warehouse' | 'lp';

/** Time spent solving day problems, read with the caller's clock [ms]. */
export interface SolveStopwatch {
  readonly now: () => number;
  spentMs: number;
  calls: number;
}

export const SOLVE_DAY_DEFAULTS: SolveDayOptions = Object.freeze({
  lpSolver: javascriptLpSolver,
  maxNodes: 5000,
  relativeGap: 1e-10,
  solver: 'auto',
});

/** Thrown by solveDay with `solver: 'warehouse'` on a day the warehouse solver does not cover. */
export class UncoveredDayError extends Error {
  constructor(reason: string) {
    super(`the warehouse solver does not cover this day (${reason}); solve it with solver 'auto' or 'lp'`);
    this.name = 'UncoveredDayError';
  }
}

/** Thrown when the branch and bound cannot prove optimality within its node budget. */
export class NodeLimitError extends Error {
  constructor(nodes: number) {
    super(`no proven optimum after ${nodes} branch-and-bound nodes; the day is unusually hard, please report it`);
    this.name = 'NodeLimitError';
  }
}

interface Candidate {
  readonly chargeMw: number[];
  readonly dischargeMw: number[];
  readonly bound: number;
}

/**
 * Solves the day problem exactly, with no simultaneous charge and discharge in any period.
 *
 * Two exact paths (options.solver picks; docs/day-solver.md). The warehouse solver
 * (src/plan/warehouse) takes every day it covers. The LP path: the LP relaxation (dayLpModel.ts;
 * docs/design.md section 4) is solved by `lpSolver`; simultaneous flows in periods where removing
 * them cannot lower the value are netted out exactly (see simultaneousFlows.ts); in the remaining
 * "arbitrage periods" a depth-first branch and bound fixes the period to charge-only or
 * discharge-only (PERIOD_MODE), with the LP value as the bound (Land and Doig 1960). The incumbent
 * is proven optimal to `relativeGap` when no open node can beat it.
 */
export function solveDay(problem: DayProblem, options: Partial<SolveDayOptions> = {}): DayOutcome {
  const settings: SolveDayOptions = { ...SOLVE_DAY_DEFAULTS, ...options };
  const memo = settings.memo;
  if (memo === undefined) return timedSolve(problem, settings);
  const kept = memo.find(problem, settings);
  if (kept !== undefined) return kept;
  const outcome = timedSolve(problem, settings);
  memo.keep(problem, settings, outcome);
  return outcome;
}

/** solveDayWith, its time added to the settings' stopwatch when there is one. */
function timedSolve(problem: DayProblem, settings: SolveDayOptions): DayOutcome {
  const watch = settings.stopwatch;
  if (watch === undefined) return solveDayWith(problem, settings);
  const started = watch.now();
  try {
    return solveDayWith(problem, settings);
  } finally {
    watch.spentMs += watch.now() - started;
    watch.calls++;
  }
}

function solveDayWith(problem: DayProblem, settings: SolveDayOptions): DayOutcome {
  const reason = infeasibilityReason(problem);
  if (reason !== null) return { status: 'infeasible', reason };
  if (settings.solver !== 'lp') {
    const outcome = settings.workspace === undefined ? solveWarehouseDay(problem) : solveWarehouseDay(problem, undefined, { workspace: settings.workspace });
    if (outcome.status !== 'not-covered') return outcome;
    if (settings.solver === 'warehouse') throw new UncoveredDayError(outcome.reason);
  }
  const periods = problem.buyPricePerMwh.length;
  const flowTolMw = 1e-9 * Math.max(1, problem.battery.chargeMw, problem.battery.dischargeMw);

  let nodes = 0;
  let best: { schedule: Schedule; value: number } | null = null;
  const root = freeModes(periods);
  const stack: Int8Array[] = [root];

  const relax = (modes: Int8Array): Candidate | 'infeasible' | 'unbounded' => {
    nodes++;
    const result = settings.lpSolver.solve(dayLpModel(problem, modes));
    if (result.status !== 'optimal') return result.status;
    const chargeMw: number[] = new Array<number>(periods);
    const dischargeMw: number[] = new Array<number>(periods);
    for (let t = 0; t < periods; t++) {
      chargeMw[t] = clamp(result.values.get(`c${t}`) ?? 0, problem.battery.chargeMw, flowTolMw);
      dischargeMw[t] = clamp(result.values.get(`d${t}`) ?? 0, problem.battery.dischargeMw, flowTolMw);
      if (!isArbitragePeriod(problem, t)) netPeriod(problem, chargeMw, dischargeMw, t);
    }
    return { chargeMw, dischargeMw, bound: result.objective };
  };

  while (stack.length > 0) {
    if (nodes >= settings.maxNodes) throw new NodeLimitError(nodes);
    const modes = stack.pop() as Int8Array;
    const node = relax(modes);
    if (node === 'unbounded') return { status: 'unbounded', reason: 'the day problem is unbounded; check the battery limits' };
    if (node === 'infeasible') {
      if (modes === root) return { status: 'infeasible', reason: 'no schedule keeps the state of charge inside its window and meets the end-of-day floor' };
      continue;
    }
    if (best !== null && node.bound <= best.value + settings.relativeGap * Math.max(1, Math.abs(best.value))) continue;
    const split = mostSimultaneousPeriod(problem, node, flowTolMw);
    if (split < 0) {
      const schedule = { chargeMw: node.chargeMw, dischargeMw: node.dischargeMw, socMwh: socPath(problem, node.chargeMw, node.dischargeMw) };
      const value = scheduleValue(problem, schedule);
      if (best === null || value > best.value) best = { schedule, value };
      continue;
    }
    // Explore first the side that keeps the larger stored-energy flow of the split period.
    const keepCharge = node.chargeMw[split] as number * problem.battery.chargeEfficiency >= (node.dischargeMw[split] as number) / problem.battery.dischargeEfficiency;
    const chargeChild = modes.slice();
    chargeChild[split] = PERIOD_MODE.chargeOnly;
    const dischargeChild = modes.slice();
    dischargeChild[split] = PERIOD_MODE.dischargeOnly;
    stack.push(keepCharge ? dischargeChild : chargeChild, keepCharge ? chargeChild : dischargeChild);
  }
  if (best === null) return { status: 'infeasible', reason: 'no schedule without simultaneous charge and discharge meets the limits' };
  return { status: 'optimal', schedule: best.schedule, objective: best.value, solver: settings.lpSolver.name, nodes };
}

function clamp(value: number, upper: number, tol: number): number {
  if (value <= tol) return 0;
  return value > upper ? upper : value;
}

/** The arbitrage period with the largest simultaneous flow, or -1 when there is none. */
function mostSimultaneousPeriod(problem: DayProblem, node: Candidate, tol: number): number {
  let split = -1;
  let largest = 0;
  for (let t = 0; t < node.chargeMw.length; t++) {
    const both = Math.min(node.chargeMw[t] as number, node.dischargeMw[t] as number);
    if (both > tol && both > largest && isArbitragePeriod(problem, t)) {
      largest = both;
      split = t;
    }
  }
  return split;
}
