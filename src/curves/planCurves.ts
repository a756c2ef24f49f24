import type { BatteryModel, MarketSpec } from '../types.js';
import type { PeriodBid, PeriodOrder } from '../settle/periodBid.js';
import { riskAdjustedValue } from '../scenarios/criterion.js';
import { evaluateBids } from '../scenarios/evaluateBids.js';
import { CVAR_SHARE, profitDistribution, type ProfitDistribution } from '../scenarios/profitDistribution.js';
import type { ScenarioSet } from '../scenarios/scenarioSet.js';
import { solveCurveProgram } from './curveProgram.js';
import type { SparseLpSolver } from './linearProgram.js';
import { curvePricePoints } from './pricePoints.js';
import { curveStack, netSoldFromStored, type StepCurve } from './stepCurve.js';

/** Relative difference of two values below which they are the same value, rounding apart [-]. */
export const VALUE_TOLERANCE = 1e-9;

export interface CurvePlanRequest {
  /** Planning paths (never the paths a choice between bids is scored on: those are fresh). */
  readonly planning: ScenarioSet;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** State of charge at the start of the day [MWh]. */
  readonly socStartMwh: number;
  /** Least state of charge at the end of the day [MWh]. */
  readonly socEndMinMwh: number;
  /** Most steps per period's curve [-]. */
  readonly steps: number;
  /** lambda >= 0 of the criterion mean + lambda x CVaR (scenarios/criterion.ts). */
  readonly riskWeight: number;
  /** The price-taking plan's bids (the median schedule at the floor and cap): the flat curve. */
  readonly flatBids: readonly PeriodBid[];
  readonly solver: SparseLpSolver;
}

export type CurvePlan =
  | {
      readonly status: 'optimal';
      /** `curves` when the program's curves value the planning paths higher than the flat bids, else `flat`. */
      readonly chosen: 'curves' | 'flat';
      /** The program's curves, and the same as stacks of limit orders (also when the flat bids were chosen). */
      readonly curves: readonly StepCurve[];
      readonly curveBids: readonly (readonly PeriodOrder[])[];
      /** The curves and the flat bids settled on the planning paths. */
      readonly plannedCurves: ProfitDistribution;
      readonly plannedFlat: ProfitDistribution;
      /** The program: its optimum, solves and rows added lazily. */
      readonly program: { readonly objective: number; readonly rounds: number; readonly lazyRows: number };
    }
  | { readonly status: 'infeasible' | 'unbounded' | 'failed'; readonly reason: string };

/**
 * A day of step bid curves from the planning paths (docs/design.md section 4.7): price points per
 * period (curvePricePoints), the stochastic program (solveCurveProgram), the net stored energy of each
 * step turned into net MW sold, and the curves as stacks of limit orders. Both the curves and the flat
 * bids are then settled on the planning paths (under follow-accepted: a curve moves with what clears,
 * and the flat bids are always accepted); `chosen` is `flat` when the curves do not value the planning
 * paths higher by the criterion, so what is chosen is never worse than price-taking on the paths it was
 * planned on. On fresh paths it can be (backtest/autoChoice.ts scores it there).
 */
export function planCurves(request: CurvePlanRequest): CurvePlan {
  const { planning, market, battery, socStartMwh } = request;
  const periodHours = market.periodMinutes / 60;
  const points = curvePricePoints(planning, request.steps);
  const outcome = solveCurveProgram({
    scenarios: planning,
    points,
    battery,
    periodHours,
    socStartMwh,
    socEndMinMwh: request.socEndMinMwh,
    riskWeight: request.riskWeight,
    cvarShare: CVAR_SHARE,
    solver: request.solver,
  });
  if (outcome.status !== 'optimal') return outcome;
  const curves: StepCurve[] = outcome.storedMwh.map((stored, t) => ({
    breakpoints: Array.from((points[t] as (typeof points)[number]).breakpoints),
    netSoldMw: Array.from(stored, (e) => netSoldFromStored(e, battery, periodHours)),
  }));
  const stacks = curves.map((curve) => curveStack(curve, market));
  const settle = (b: readonly PeriodBid[]): ProfitDistribution =>
    profitDistribution(evaluateBids({ bids: b, scenarios: planning, battery, periodHours, socStartMwh, unaccepted: 'follow-accepted' }));
  const plannedCurves = settle(stacks);
  const plannedFlat = settle(request.flatBids);
  const flatValue = riskAdjustedValue(plannedFlat, request.riskWeight);
  // Better by more than rounding: a curve that is the flat bids in all but name is not chosen.
  const better = riskAdjustedValue(plannedCurves, request.riskWeight) > flatValue + VALUE_TOLERANCE * Math.max(1, Math.abs(flatValue));
  return {
    status: 'optimal',
    chosen: better ? 'curves' : 'flat',
    curves,
    curveBids: stacks,
    plannedCurves,
    plannedFlat,
    program: { objective: outcome.objective, rounds: outcome.rounds, lazyRows: outcome.lazyRows },
  };
}
