import { PERIOD_MODE } from '../periodMode.js';
import { solveWithCap } from './cycleCapMultiplier.js';
import type { BranchNode, DayContext } from './dayContext.js';
import type { StageStatus } from './stageStatus.js';
import { netPeriod, revalue, type StoredSchedule } from './storedSchedule.js';

/**
 * Exact complementarity in arbitrage periods by branch and bound over those periods only
 * (Land and Doig 1960, "An automatic method of solving discrete programming problems",
 * Econometrica 28(3), doi:10.2307/1910129).
 *
 * Notes. A node fixes some arbitrage periods to charge-only (y_t = 0) or discharge-only
 * (x_t = 0). With the chord sweep every other arbitrage period is relaxed to the convex hull of
 * its two modes (storedDay.ts); with the dynamic program (valueProgram.ts) every single-multiplier
 * solution already has one mode per period and only the cycle-cap mix can put both flows in an
 * arbitrage period. Either way the node's value (cycleCapMultiplier.ts) is an upper bound on every
 * feasible schedule of the node: it is at least the Lagrangian value z(mu*), and netting outside
 * arbitrage periods only raises it. A node whose solution has x_t, y_t > 0 only outside arbitrage
 * periods is feasible after that netting, so its value is also attained: it is optimal. Else the
 * arbitrage period with the largest min(x_t / X, y_t / Y) is split into its two modes, explored
 * depth-first, the side with the larger share first. Netting every period of a node's solution
 * gives a feasible schedule (it keeps every s_t and lowers cycle use), used as an incumbent.
 * Nodes whose bound does not beat the incumbent by more than 1e-12 relative are pruned; the two
 * modes cover every feasible schedule, so the search ends at the optimum of the day problem.
 * Shares of at most 1e-12 are netted in place instead of split (a change below 1e-12 x p_t Y).
 */
export interface BranchOutcome {
  /**
   * `ok`: `best` holds the optimum; an infeasible status: the root node has no schedule;
   * `too-many-breakpoints` or `node-budget-spent`: the search gave up.
   */
  readonly status: StageStatus;
  readonly nodes: number;
  /** Whether `best` holds a feasible schedule (always when ok; the best found so far when the search gave up). */
  readonly incumbent: boolean;
}

const TINY_SHARE = 1e-12;

export function branchOnArbitrage(ctx: DayContext, maxNodes: number, best: StoredSchedule): BranchOutcome {
  const { day, node, netted } = ctx;
  const observed = ctx.observer?.branchNode !== undefined;
  ctx.rootModes.fill(PERIOD_MODE.free);
  const stack: Int8Array[] = [ctx.rootModes];
  let bestValue = -Infinity;
  let nodes = 0;
  while (stack.length > 0) {
    if (nodes >= maxNodes) return { status: 'node-budget-spent', nodes, incumbent: bestValue > -Infinity };
    const modes = stack.pop()!;
    nodes++;
    const status = solveWithCap(ctx, modes, node);
    if (status === 'too-many-breakpoints') return { status, nodes, incumbent: bestValue > -Infinity };
    if (status !== 'ok') {
      if (observed) report(ctx, modes, status, Number.NaN, 'infeasible', -1);
      if (nodes === 1) return { status, nodes, incumbent: false };
      continue;
    }
    if (node.value <= bestValue + 1e-12 * Math.max(1, Math.abs(bestValue))) {
      if (observed) report(ctx, modes, status, node.value, 'pruned', -1);
      continue;
    }
    const split = mostSimultaneous(ctx, node);
    if (split < 0) {
      if (observed) report(ctx, modes, status, node.value, 'incumbent', -1);
      best.copyFrom(node);
      bestValue = node.value;
      continue;
    }
    if (observed) report(ctx, modes, status, node.value, 'split', split);
    netted.copyFrom(node);
    revalue(day, netted, 'every');
    if (netted.value > bestValue) {
      best.copyFrom(netted);
      bestValue = netted.value;
    }
    const chargeFirst = node.x[split]! / day.chargeStepMwh >= node.y[split]! / day.dischargeStepMwh;
    const chargeOnly = modes.slice();
    chargeOnly[split] = PERIOD_MODE.chargeOnly;
    const dischargeOnly = modes;
    dischargeOnly[split] = PERIOD_MODE.dischargeOnly;
    if (chargeFirst) stack.push(dischargeOnly, chargeOnly);
    else stack.push(chargeOnly, dischargeOnly);
  }
  return { status: 'ok', nodes, incumbent: true };
}

/** Shows a node to the observer. */
function report(ctx: DayContext, modes: Int8Array, status: StageStatus, bound: number, outcome: BranchNode['outcome'], split: number): void {
  ctx.observer?.branchNode?.({ modes: modes.slice(0, ctx.day.periods), status, bound, outcome, split, schedule: ctx.node });
}

/** The arbitrage period with the largest simultaneous share, or -1; nets negligible shares. */
function mostSimultaneous(ctx: DayContext, schedule: StoredSchedule): number {
  const { day } = ctx;
  let split = -1;
  let largest = TINY_SHARE;
  let netted = false;
  for (let t = 0; t < day.periods; t++) {
    if (day.arbitrage[t] === 0) continue;
    const share = Math.min(schedule.x[t]! / day.chargeStepMwh, schedule.y[t]! / day.dischargeStepMwh);
    if (share <= 0) continue;
    if (share <= TINY_SHARE) {
      netPeriod(schedule, t);
      netted = true;
    } else if (share > largest) {
      largest = share;
      split = t;
    }
  }
  if (netted && split < 0) revalue(day, schedule);
  return split;
}
