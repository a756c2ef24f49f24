import type { BatteryModel, MarketSpec } from '../types.js';
import type { PeriodBid, PeriodOrder } from '../settle/periodBid.js';
import { evaluateBids } from '../scenarios/evaluateBids.js';
import { criterionTerms, pathMeanPrices, valuesLessShortfall } from '../scenarios/pathValues.js';
import { CVAR_SHARE, profitDistribution, type ProfitDistribution } from '../scenarios/profitDistribution.js';
import type { ScenarioSet } from '../scenarios/scenarioSet.js';
import { pairedDifference, type PairedDifference } from '../stats/pairedDifference.js';
import { solveCurveProgram } from './curveProgram.js';
import type { SparseLpSolver } from './linearProgram.js';
import { curvePricePoints } from './pricePoints.js';
import { curveStack, netSoldFromStored, storedFromNetSold, type StepCurve } from './stepCurve.js';
import { bidOrders } from '../settle/periodBid.js';

/** Relative difference of two values below which they are the same value, rounding apart [-]. */
export const VALUE_TOLERANCE = 1e-9;

/** Share of the flat bids' mean absolute value per path below which an advantage is not material [-]. */
export const MATERIAL_SHARE = 1e-6;

/**
 * The penalties of the proximal term that pulls the curves towards the flat bids (curveProgram.ts), as
 * multiples of the day's price scale sigma / sqrt(S): sigma the mean over periods of the planning prices'
 * standard deviation, so sigma / sqrt(S) the standard error of a period's mean planning price, the size
 * of the noise the program would otherwise chase. 0 is the program itself. The validation paths choose
 * one, or the flat bids.
 */
export const PROXIMAL_MULTIPLES: readonly number[] = Object.freeze([0, 0.5, 1, 2, 4]);

export interface CurvePlanRequest {
  /** Planning paths (never the paths a choice between bids is scored on: those are fresh). */
  readonly planning: ScenarioSet;
  /** Validation paths, drawn apart from the planning paths: they choose the curves' strength. */
  readonly validation: ScenarioSet;
  /** z [-]: a strength above 0 is kept only when its advantage on the validation paths exceeds z standard errors. */
  readonly switchStandardErrors: number;
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
      /** `curves` when a strength above 0 beat the flat bids on the validation paths, else `flat`. */
      readonly chosen: 'curves' | 'flat';
      /** The penalty rho of the curves kept [currency/MWh] (null when the flat bids were chosen). */
      readonly penaltyPerMwh: number | null;
      /** Each penalty of the family: its paired advantage over the flat bids on the validation paths. */
      readonly validated: readonly { readonly penaltyPerMwh: number; readonly advantage: PairedDifference }[];
      /** The curves at the chosen penalty (the program's own, rho = 0, when the flat bids were chosen), and the same as stacks of limit orders. */
      readonly curves: readonly StepCurve[];
      readonly curveBids: readonly (readonly PeriodOrder[])[];
      /** The program's own curves (rho = 0, before validation) as stacks of limit orders: what overfitting looks like. */
      readonly programCurveBids: readonly (readonly PeriodOrder[])[];
      /** These curves and the flat bids settled on the planning paths. */
      readonly plannedCurves: ProfitDistribution;
      readonly plannedFlat: ProfitDistribution;
      /** The program: its optimum, solves and rows added lazily. */
      readonly program: { readonly objective: number; readonly rounds: number; readonly lazyRows: number };
    }
  | { readonly status: 'infeasible' | 'unbounded' | 'failed'; readonly reason: string };

/**
 * A day of step bid curves from the planning paths (docs/design.md section 4.7): price points per
 * period (curvePricePoints), then the stochastic program (solveCurveProgram) with a proximal term
 * towards the flat bids at each penalty rho of a family (PROXIMAL_MULTIPLES of the day's price scale;
 * rho = 0 is the program itself), and the penalty chosen out of sample. Fitted to S planning paths the
 * program's curves overfit them (they always look at least as good as the flat bids there, and are often
 * worse on fresh paths); the penalty keeps only the deviations from the flat bids that the planning
 * paths pay for by more than their noise. Each member is settled on the validation paths, drawn apart
 * from the planning paths, against the flat bids (under follow-accepted: a curve moves with what clears,
 * the flat bids are always accepted), each path's value less any shortfall below the end-of-day floor,
 * by the criterion's per-path terms (scenarios/pathValues.ts). The member with the highest mean
 * advantage among those whose advantage exceeds z standard errors is kept; with none, `chosen` is
 * `flat`. This is the validation step of sample average approximation (Kleywegt, Shapiro and
 * Homem-de-Mello 2002; Shapiro, Dentcheva and Ruszczynski 2009, chapter 5): a candidate solution is
 * judged on a sample independent of the one it was fitted on. Fresh paths, apart from both, then score
 * what is kept (backtest/autoChoice.ts).
 */
export function planCurves(request: CurvePlanRequest): CurvePlan {
  const { planning, market, battery, socStartMwh } = request;
  const periodHours = market.periodMinutes / 60;
  const points = curvePricePoints(planning, request.steps);
  const towardsStoredMwh = request.flatBids.map((bid) => storedFromNetSold(bidOrders(bid).reduce((y, o) => y + (o.side === 'sell' ? o.quantityMw : -o.quantityMw), 0), battery, periodHours));
  const scale = priceScale(planning);
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
    proximal: { towardsStoredMwh, penaltiesPerMwh: PROXIMAL_MULTIPLES.map((m) => m * scale) },
  });
  if (outcome.status !== 'optimal') return outcome;
  const curvesOf = (storedMwh: readonly Float64Array[]): StepCurve[] =>
    storedMwh.map((stored, t) => ({
      breakpoints: Array.from((points[t] as (typeof points)[number]).breakpoints),
      netSoldMw: Array.from(stored, (e) => netSoldFromStored(e, battery, periodHours)),
    }));
  const { validation, riskWeight } = request;
  const meanPrice = pathMeanPrices(validation);
  const floorMwh = Math.max(battery.socMinMwh, request.socEndMinMwh);
  const validationTerms = (bids: readonly PeriodBid[]): Float64Array => {
    const outcomes = evaluateBids({ bids, scenarios: validation, battery, periodHours, socStartMwh, unaccepted: 'follow-accepted' });
    return criterionTerms(valuesLessShortfall(outcomes, meanPrice, floorMwh, battery.chargeEfficiency).values, riskWeight);
  };
  const flatTerms = validationTerms(request.flatBids);
  // An advantage below a millionth of the flat bids' mean absolute value is the solver's tolerance, not a gain.
  const tolerance = MATERIAL_SHARE * Math.max(1, meanAbsolute(flatTerms));
  let kept = -1;
  let bestMean = 0;
  const validated = outcome.family.map((member, i) => {
    const advantage = pairedDifference(validationTerms(curvesOf(member.storedMwh).map((c) => curveStack(c, market))), flatTerms);
    if (advantage.mean > tolerance && advantage.mean > request.switchStandardErrors * advantage.standardError && advantage.mean > bestMean) {
      kept = i;
      bestMean = advantage.mean;
    }
    return { penaltyPerMwh: member.penaltyPerMwh, advantage };
  });
  const curves = curvesOf((outcome.family[Math.max(0, kept)] as (typeof outcome.family)[number]).storedMwh);
  const stacks = curves.map((curve) => curveStack(curve, market));
  const settle = (b: readonly PeriodBid[]): ProfitDistribution =>
    profitDistribution(evaluateBids({ bids: b, scenarios: planning, battery, periodHours, socStartMwh, unaccepted: 'follow-accepted' }));
  return {
    status: 'optimal',
    chosen: kept >= 0 ? 'curves' : 'flat',
    penaltyPerMwh: kept >= 0 ? (validated[kept] as (typeof validated)[number]).penaltyPerMwh : null,
    validated,
    curves,
    curveBids: stacks,
    programCurveBids: curvesOf((outcome.family[0] as (typeof outcome.family)[number]).storedMwh).map((c) => curveStack(c, market)),
    plannedCurves: settle(stacks),
    plannedFlat: settle(request.flatBids),
    program: { objective: outcome.objective, rounds: outcome.rounds, lazyRows: outcome.lazyRows },
  };
}

/** sigma / sqrt(S): sigma the mean over periods of the planning prices' standard deviation [currency/MWh]. */
function priceScale(planning: ScenarioSet): number {
  const S = planning.pathCount;
  if (S < 2) return 0;
  let sum = 0;
  for (let t = 0; t < planning.periodCount; t++) {
    const prices = planning.clearingPricePerMwh.subarray(t * S, (t + 1) * S);
    let m = 0;
    for (const p of prices) m += p;
    m /= S;
    let squares = 0;
    for (const p of prices) squares += (p - m) * (p - m);
    sum += Math.sqrt(squares / (S - 1));
  }
  return sum / planning.periodCount / Math.sqrt(S);
}

function meanAbsolute(x: Float64Array): number {
  let sum = 0;
  for (const v of x) sum += Math.abs(v);
  return x.length === 0 ? 0 : sum / x.length;
}
