import type { BatteryModel, DayOutcome, DayProblem, HistoryDay, MarketSpec, Order, QuantileDay } from '../types.js';
import { planCurves } from '../curves/planCurves.js';
import { exchangeSteps } from '../plan/exchangeRounding.js';
import { planDay, roundForExchange } from '../plan/planDay.js';
import { NodeLimitError, solveDay, type SolveDayOptions } from '../plan/solveDay.js';
import { ordersByPeriod } from '../settle/ordersByPeriod.js';
import type { UnacceptedRule } from '../settle/unacceptedRule.js';
import { chooseAuto, type AutoChoice, type Candidate } from './autoChoice.js';
import type { BacktestPolicy } from './backtestPolicy.js';
import type { DayBid } from './dayBid.js';
import type { DayScenarios, ScenarioPlanning } from './scenarioPlanning.js';

export interface PolicyDayRequest {
  readonly policy: BacktestPolicy;
  /** The day's quantile forecast (the only forecast information a policy sees). */
  readonly forecast: QuantileDay;
  /** The day's realised prices: seen only by `perfect-foresight`; null when planning a day ahead. */
  readonly realised: HistoryDay | null;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** Tail level: buys limited at q(1 - alpha), sells at q(alpha); in (0, 0.5). */
  readonly alpha: number;
  /** State of charge at the start of the day [MWh], carried from the policy's previous day. */
  readonly socStartMwh: number;
  /** Passed to every solveDay call (the place to plug in another solver). */
  readonly solveOptions: Partial<SolveDayOptions>;
  /** The rule for unaccepted orders (auto scores its candidates under it). */
  readonly unaccepted: UnacceptedRule;
  /** Scenario planning, for `curve` and `auto`; null otherwise. */
  readonly scenarioPlanning: ScenarioPlanning | null;
  /** The day's scenarios, made once per day for every policy that needs them. */
  readonly scenarios: (() => DayScenarios) | null;
}

/** A policy's bids for one day, laid out by period, or why it has none. */
export type PolicyDayPlan =
  | {
      readonly status: 'optimal';
      readonly orders: readonly DayBid[];
      /** `curves`: the bids are curves, settled by what clears under either rule. */
      readonly kind: 'schedule' | 'curves';
      /** Objective of the plan at the prices it was scheduled on [currency] (curve, auto: the mean on the fresh paths). */
      readonly plannedValue: number;
      /** For `curve` and `auto`: the candidates scored on the fresh paths and the choice. */
      readonly scenarioReport: ScenarioReport | null;
    }
  | { readonly status: PlanFailure; readonly reason: string; readonly orders: readonly DayBid[] };

/** What the scenario policies saw that day: every candidate scored on the fresh paths, and the choice. */
export interface ScenarioReport {
  readonly choice: AutoChoice;
}

/**
 * Why a policy has no plan for a day: the day problem has no feasible or bounded schedule, the exact
 * solver could not prove an optimum within its node budget, or the curve program failed (never a silent
 * suboptimum: the policy then places no orders, and the backtest lists the day).
 */
export type PlanFailure = 'infeasible' | 'unbounded' | 'node-limit' | 'failed';

/**
 * One policy's orders for one day. `quantile`, `median`, `point` and `price-taking` are planDay
 * itself (the `point` schedule with buys limited at the price cap and sells at the floor is
 * policyPrices' `price-taking`, the same code `quantbid plan --policy price-taking` runs);
 * `perfect-foresight` solves the day problem on the realised prices (buy = sell = clearing) with the
 * same end-of-day floor as planDay (the battery's socFinalMinMwh, else the day's starting state) and
 * bids at the cap and floor; `curve` plans curves on the day's planning paths (planCurves) and submits
 * them when they beat price-taking on the fresh paths by the switching rule, else price-taking's bids;
 * `auto` does the same with every candidate (price-taking, point, quantile and median over the alphas,
 * curve; chooseAuto). Without a plan the policy places no orders that day.
 */
export function planPolicyDay(request: PolicyDayRequest): PolicyDayPlan {
  const periods = request.forecast.periods.length;
  try {
    switch (request.policy) {
      case 'perfect-foresight':
        return perfectForesight(request);
      case 'curve':
      case 'auto':
        return scenarioPolicy(request, request.policy);
      default:
        return fromForecast(request, request.policy, request.alpha);
    }
  } catch (err) {
    if (!(err instanceof NodeLimitError)) throw err;
    return { status: 'node-limit', reason: err.message, orders: new Array<DayBid>(periods).fill(null) };
  }
}

function fromForecast(request: PolicyDayRequest, policy: 'quantile' | 'median' | 'point' | 'price-taking', alpha: number): PolicyDayPlan {
  const { forecast, market, battery, socStartMwh, solveOptions } = request;
  const plan = planDay({ forecast, market, battery, policy, alpha, socStartMwh, solveOptions });
  if (plan.status !== 'optimal') return noPlan(plan, forecast.periods.length);
  return { status: 'optimal', orders: ordersByPeriod(forecast.periods, plan.orders), kind: 'schedule', plannedValue: plan.outcome.objective, scenarioReport: null };
}

function perfectForesight(request: PolicyDayRequest): PolicyDayPlan {
  const { realised, market, battery, socStartMwh } = request;
  if (realised === null) throw new RangeError('planPolicyDay: perfect foresight needs the realised prices');
  const prices = realised.pricePerMwh;
  const problem: DayProblem = {
    periodHours: market.periodMinutes / 60,
    buyPricePerMwh: prices,
    sellPricePerMwh: prices,
    battery,
    socStartMwh,
    socEndMinMwh: battery.socFinalMinMwh ?? socStartMwh,
  };
  const solved = solveDay(problem, request.solveOptions);
  if (solved.status !== 'optimal') return noPlan(solved, prices.length);
  // Bids like price-taking: every buy limited at the cap, every sell at the floor, so every order is accepted.
  const atCapAndFloor = {
    buyPricePerMwh: [...prices],
    sellPricePerMwh: [...prices],
    buyLimitPerMwh: prices.map(() => market.priceCap),
    sellLimitPerMwh: prices.map(() => market.priceFloor),
    buyLevel: null,
    sellLevel: null,
  };
  // With the market's order steps the schedule is rounded to them, as planDay does (planDay.ts).
  const { outcome, orders } = roundForExchange(problem, solved, realised.periods, atCapAndFloor, market);
  return { status: 'optimal', orders: ordersByPeriod(realised.periods, orders), kind: 'schedule', plannedValue: outcome.objective, scenarioReport: null };
}

function scenarioPolicy(request: PolicyDayRequest, policy: 'curve' | 'auto'): PolicyDayPlan {
  const { forecast, market, battery, socStartMwh } = request;
  const planning = request.scenarioPlanning;
  if (planning === null || request.scenarios === null) throw new RangeError(`planPolicyDay: the ${policy} policy needs scenario planning (paths and a solver)`);
  const flat = fromForecast(request, 'price-taking', request.alpha);
  if (flat.status !== 'optimal') return flat;
  const scenarios = request.scenarios();
  const socEndMinMwh = battery.socFinalMinMwh ?? socStartMwh;
  // A curve's quantities and limit prices are not on the exchange's steps (market.json quantityStepMw,
  // minimumQuantityMw, priceTickPerMwh): on such a market curves are not offered (the app refuses `curve`).
  if (exchangeSteps(market) !== null && policy === 'curve') throw new RangeError('planPolicyDay: curves are not offered on a market with order steps');
  const curve =
    exchangeSteps(market) !== null
      ? null
      : planCurves({
          planning: scenarios.planning,
          validation: scenarios.validation,
          switchStandardErrors: planning.switchStandardErrors,
          market,
          battery,
          socStartMwh,
          socEndMinMwh,
          steps: planning.curveSteps,
          riskWeight: planning.riskWeight,
          flatBids: flat.orders,
          solver: planning.solver,
        });
  if (curve !== null && curve.status !== 'optimal') return { status: curve.status, reason: curve.reason, orders: new Array<DayBid>(forecast.periods.length).fill(null) };
  const candidates: Candidate[] = [{ name: 'price-taking', policy: 'price-taking', alpha: null, bids: flat.orders, kind: 'schedule', planned: curve?.plannedFlat ?? null }];
  if (policy === 'auto') {
    const point = fromForecast(request, 'point', request.alpha);
    if (point.status === 'optimal') candidates.push({ name: 'point', policy: 'point', alpha: null, bids: point.orders, kind: 'schedule', planned: null });
    for (const policyName of ['quantile', 'median'] as const) {
      for (const alpha of planning.alphas) {
        const plan = fromForecast(request, policyName, alpha);
        if (plan.status === 'optimal') candidates.push({ name: `${policyName} ${alpha}`, policy: policyName, alpha, bids: plan.orders, kind: 'schedule', planned: null });
      }
    }
  }
  if (curve !== null) {
    const curves = curve.chosen === 'curves';
    candidates.push({ name: 'curve', policy: 'curve', alpha: null, bids: curves ? curve.curveBids : flat.orders, kind: curves ? 'curves' : 'schedule', planned: curves ? curve.plannedCurves : curve.plannedFlat });
  }
  const choice = chooseAuto({
    candidates,
    fresh: scenarios.fresh,
    battery,
    periodHours: market.periodMinutes / 60,
    socStartMwh,
    socEndMinMwh,
    unaccepted: request.unaccepted,
    riskWeight: planning.riskWeight,
    switchStandardErrors: planning.switchStandardErrors,
  });
  const chosen = choice.scores[choice.chosen] as (typeof choice.scores)[number];
  return { status: 'optimal', orders: chosen.candidate.bids, kind: chosen.candidate.kind, plannedValue: chosen.fresh.mean, scenarioReport: { choice } };
}

function noPlan(outcome: Exclude<DayOutcome, { status: 'optimal' }>, periods: number): PolicyDayPlan {
  return { status: outcome.status, reason: outcome.reason, orders: new Array<DayBid>(periods).fill(null) };
}
