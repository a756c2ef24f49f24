import type { QuantileDay } from '../types.js';
import type { SparseLpSolver } from '../curves/linearProgram.js';
import type { ScenarioSet } from '../scenarios/scenarioSet.js';

/**
 * A day's scenarios: planning paths, on which curves are fitted; validation paths, drawn apart from
 * them, on which the curves' strength is chosen; and fresh paths, drawn apart from both, on which every
 * candidate is scored (docs/design.md section 4.7). Scoring on the paths a choice was made on would
 * flatter whatever was fitted to them.
 */
export interface DayScenarios {
  readonly planning: ScenarioSet;
  readonly validation: ScenarioSet;
  readonly fresh: ScenarioSet;
}

/** Makes the scenarios of a delivery day from its quantile forecast (the app decides how: paths and seeds). */
export type DayScenarioSource = (forecast: QuantileDay) => DayScenarios;

/** What the `curve` and `auto` policies need besides a day's forecast. */
export interface ScenarioPlanning {
  readonly scenarios: DayScenarioSource;
  readonly solver: SparseLpSolver;
  /** Most steps of a period's curve [-]. */
  readonly curveSteps: number;
  /** lambda >= 0 of the criterion mean + lambda x CVaR 5 % (scenarios/criterion.ts). */
  readonly riskWeight: number;
  /** The alphas of the quantile and median candidates of `auto` (each with 1 - alpha in the forecast's levels). */
  readonly alphas: readonly number[];
  /**
   * z [-]: `auto` leaves price-taking only for a candidate whose advantage over it on the fresh paths
   * exceeds z standard errors of the paired difference (winner's-curse control).
   */
  readonly switchStandardErrors: number;
}

/**
 * Defaults of scenario planning, measured on the known-distribution bench across all its settings
 * (docs/scenario-bids.md, bench/scenarioBids/dayTrials.js): the curves' value did not change with the
 * steps (2, 4, 8) and came closer to price-taking's with more planning paths (50 to 400) at a cost in
 * time about proportional to them, so 100 paths (the timing goal's) and 4 steps. z = 3: `auto` decides
 * every day of a year, and a candidate no better than price-taking passes a one-sided test at z with
 * probability 1 - Phi(z) on each day: 2.3 % at z = 2, about 8 noise switches a year, 0.13 % at z = 3,
 * about one every two years (the per-comparison against the family-wise error rate of repeated tests,
 * e.g. Hochberg and Tamhane 1987, chapter 1). On the bench's spiky market under follow-plan, z = 2
 * switched on 7 to 14 days in each of four independent years, and those switches summed to -959 to +375
 * over the true law: noise, with a cost; at z = 3 the advantages that are real (median at alpha 0.05
 * under follow-accepted, up to z = 9) are kept but for 3 % of their value (docs/scenario-bids.md). The
 * same z decides whether the curves' validation keeps a penalty's curves (curves/planCurves.ts).
 */
export const SCENARIO_DEFAULTS = Object.freeze({
  planningPaths: 100,
  freshPaths: 1000,
  curveSteps: 4,
  riskWeight: 0,
  alphas: Object.freeze([0.05, 0.1, 0.2, 0.3, 0.4]),
  switchStandardErrors: 3,
});
