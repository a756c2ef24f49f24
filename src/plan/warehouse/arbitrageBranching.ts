import { relaxDay, type RelaxStatus } from './cycleCapDual.js';
import type { DayContext } from './dayContext.js';
import { CHARGE_ONLY, DISCHARGE_ONLY, type LineSolution, SWEEP_OK, SWEEP_TOO_LARGE } from './lineSweep.js';
import { netPeriod, revalue } from './netFlows.js';

/**
 * Exact complementarity in arbitrage periods by branch and bound over those periods only
 * (Land and Doig 1960, "An automatic method of solving discrete programming problems",
 * Econometrica 28(3), doi:10.2307/1910129).
 *
 * Notes. A node fixes some arbitrage periods to charge-only (y_t = 0) or discharge-only
 * (x_t = 0). With the chord sweep every other arbitrage period is relaxed to the convex hull of
 * its two modes (storedDay.ts); with the dynamic program (valueDp.ts) every single-multiplier
 * solution already has one mode per period and only the cycle-cap mix can put both flows in an
 * arbitrage period. Either way the node's value (cycleCapDual.ts) is an upper bound on every
 * feasible schedule of the node: it is at least the Lagrangian value z(mu*), and netting outside
 * arbitrage periods only raises it. A node whose solution has x_t, y_t > 0 only outside arbitrage
 * periods is feasible after that netting, so its value is also attained: it is optimal. Else the
 * arbitrage period with the largest min(x_t / X, y_t / Y) is split into its two modes, explored
 * depth-first, the side with the larger share first. Netting every period of a node's solution
 * gives a feasible schedule (it keeps every s_t and lowers cycle use), used as an incumbent.
 * Nodes whose bound does not beat the incumbent by more than 1e-12 relative are pruned; the two
 * modes cover every feasible schedule, so the search ends at the optimum of the day problem.
 * Shares of at most 1e-12 are netted in place instead of split (a change below 1e-12 x p_t Y).
 * When the search gives up, `best` holds its best feasible schedule if `incumbent` is true.
 */
export type BranchOutcome =
  | { readonly status: 'optimal'; readonly nodes: number }
  | { readonly status: 'infeasible'; readonly cause: Exclude<RelaxStatus, typeof SWEEP_OK | typeof SWEEP_TOO_LARGE> }
  | { readonly status: 'gave-up'; readonly nodes: number; readonly why: 'nodes' | 'breakpoints'; readonly incumbent: boolean };

const TINY_SHARE = 1e-12;

export function branchOnArbitrage(ctx: DayContext, maxNodes: number, best: LineSolution): BranchOutcome {
  const { day } = ctx;
  const { node, netted } = ctx;
  ctx.rootModes.fill(0);
  const stack: Int8Array[] = [ctx.rootModes];
  let bestValue = -Infinity;
  let nodes = 0;
  while (stack.length > 0) {
    if (nodes >= maxNodes) return { status: 'gave-up', nodes, why: 'nodes', incumbent: bestValue > -Infinity };
    const modes = stack.pop()!;
    nodes++;
    const status = relaxDay(ctx, modes, node);
    if (status === SWEEP_TOO_LARGE) return { status: 'gave-up', nodes, why: 'breakpoints', incumbent: bestValue > -Infinity };
    if (status !== SWEEP_OK) {
      if (nodes === 1) return { status: 'infeasible', cause: status };
      continue;
    }
    if (node.value <= bestValue + 1e-12 * Math.max(1, Math.abs(bestValue))) continue;
    const split = mostSimultaneous(ctx, node);
    if (split < 0) {
      best.copyFrom(node);
      bestValue = node.value;
      continue;
    }
    netted.copyFrom(node);
    revalue(day, netted, 'every');
    if (netted.value > bestValue) {
      best.copyFrom(netted);
      bestValue = netted.value;
    }
    const chargeFirst = node.x[split]! / day.chargeStepMwh >= node.y[split]! / day.dischargeStepMwh;
    const chargeOnly = modes.slice();
    chargeOnly[split] = CHARGE_ONLY;
    const dischargeOnly = modes;
    dischargeOnly[split] = DISCHARGE_ONLY;
    if (chargeFirst) stack.push(dischargeOnly, chargeOnly);
    else stack.push(chargeOnly, dischargeOnly);
  }
  return { status: 'optimal', nodes };
}

/** The arbitrage period with the largest simultaneous share, or -1; nets negligible shares. */
function mostSimultaneous(ctx: DayContext, sol: LineSolution): number {
  const { day } = ctx;
  let split = -1;
  let largest = TINY_SHARE;
  let netted = false;
  for (let t = 0; t < day.periods; t++) {
    if (day.arbitrage[t] === 0) continue;
    const share = Math.min(sol.x[t]! / day.chargeStepMwh, sol.y[t]! / day.dischargeStepMwh);
    if (share <= 0) continue;
    if (share <= TINY_SHARE) {
      netPeriod(sol, t);
      netted = true;
    } else if (share > largest) {
      largest = share;
      split = t;
    }
  }
  if (netted && split < 0) revalue(day, sol);
  return split;
}
