import { z } from 'zod';
import { SCENARIO_DEFAULTS } from '../../backtest/scenarioPlanning.js';
import { upperLevel } from '../../plan/alpha.js';
import { FORECAST_DEFAULTS } from '../commandDefaults.js';
import { RUN_LIMITS } from '../settingRules.js';
import { boundedNumber, pathSchema } from '../settingSchemas.js';

/** The settings of scenario planning shared by plan, backtest, sweep and size (policies curve and auto). */
export const scenarioSettingsSchema = z.strictObject({
  /**
   * Whole-day price paths per day, `period_start,path,price` (quantbid forecast --paths writes them).
   * Without it the paths are made from the quantile file and the history (quantilePaths.ts).
   */
  paths: pathSchema.optional(),
  /** Seed of the paths made without `paths`; each day's from daySeed(pathSeed, day). Default as forecast's --path-seed. */
  pathSeed: z.number().int().min(0).max(2 ** 32 - 1).default(FORECAST_DEFAULTS.pathSeed),
  /** Paths planned on; the day's others are the fresh ones the candidates are scored on. Default 100. */
  planningPaths: boundedNumber(RUN_LIMITS.planningPaths, true).default(SCENARIO_DEFAULTS.planningPaths),
  /** lambda of mean + lambda x CVaR 5 %, >= 0; default 0 (mean profit). */
  riskWeight: boundedNumber(RUN_LIMITS.riskWeight).default(SCENARIO_DEFAULTS.riskWeight),
});

export type ScenarioSettings = z.output<typeof scenarioSettingsSchema>;
export type ScenarioSettingsInput = z.input<typeof scenarioSettingsSchema>;

/** The alphas of auto's quantile and median candidates that a forecast with these levels can read. */
export function autoAlphas(levels: readonly number[]): number[] {
  const lowest = levels[0] ?? Number.NaN;
  const highest = levels[levels.length - 1] ?? Number.NaN;
  const inside = (level: number): boolean => level >= lowest - 1e-9 && level <= highest + 1e-9;
  return SCENARIO_DEFAULTS.alphas.filter((alpha) => inside(alpha) && inside(upperLevel(alpha)));
}

/** Steps of a period's curve: the default, at most the exchange's orders per period (a K-step curve is at most K orders). */
export function curveSteps(maxOrdersPerPeriod: number | undefined): number {
  return maxOrdersPerPeriod === undefined ? SCENARIO_DEFAULTS.curveSteps : Math.min(SCENARIO_DEFAULTS.curveSteps, maxOrdersPerPeriod);
}
