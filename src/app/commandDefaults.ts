/**
 * The defaults of every command as its help shows them, in one light module: the CLI builds every
 * command's options and help from here without loading a use case (their schemas, the readers and the
 * domain load only when a command runs). Each use case takes its defaults from here.
 */
import { join } from 'node:path';
import { SWEEP_POLICIES } from '../backtest/backtestPolicy.js';
import { DEFAULT_METHOD, DEFAULT_PATH_SEED } from '../forecast/forecastMethods.js';
import { PLAN_POLICIES } from '../plan/alpha.js';
import type { UnacceptedRule } from '../settle/unacceptedRule.js';
import type { PlanPolicy } from '../types.js';

/** The policies of `quantbid plan`: the schedule policies, and curve and auto on whole-day scenarios. */
export const PLAN_COMMAND_POLICIES = Object.freeze([...PLAN_POLICIES, 'curve', 'auto'] as const);
export type PlanCommandPolicy = PlanPolicy | 'curve' | 'auto';

/**
 * Defaults of `quantbid plan`: the auto policy (the day's candidates scored on whole-day paths, the
 * best submitted, price-taking unless another is clearly ahead); without --paths and without a history
 * there are no paths to score on, and the plan is price-taking's (PLAN_FALLBACK_POLICY, said in a note).
 * Alpha 0.1 for the quantile and median policies; candidates are scored under follow-plan.
 */
export const PLAN_DEFAULTS = Object.freeze({ alpha: 0.1, policy: 'auto' as PlanCommandPolicy, unaccepted: 'follow-plan' as UnacceptedRule });

/** The default policy's fallback when the day has no paths to score candidates on: auto's own fallback. */
export const PLAN_FALLBACK_POLICY = 'price-taking' as const satisfies PlanCommandPolicy;

/**
 * The policy of a plan: the one given; else the default (auto), which scores its candidates on the
 * day's paths (the --paths file, or made from the quantile file and the history); with neither there
 * is nothing to score on and the plan is auto's own fallback, price-taking.
 */
export function planPolicy(given: PlanCommandPolicy | undefined, hasPaths: boolean, hasHistory: boolean): PlanCommandPolicy {
  if (given !== undefined) return given;
  return hasPaths || hasHistory ? PLAN_DEFAULTS.policy : PLAN_FALLBACK_POLICY;
}

/** Defaults of `quantbid forecast`: the method of docs/forecast-quality.md, 19 levels, no paths, path seed 1. */
export const FORECAST_DEFAULTS = Object.freeze({ method: DEFAULT_METHOD, paths: 0, pathSeed: DEFAULT_PATH_SEED });

/** The levels `quantbid forecast` and --model forecast by default, as written in the help. */
export const DEFAULT_LEVELS_TEXT = '0.05:0.95:0.05';

/** Default folder of the forecast cache (io/forecastCache.ts), relative to the working folder. */
export const DEFAULT_FORECAST_CACHE_DIR = join('.quantbid-cache', 'forecasts');

/** Defaults of --model: the levels of `quantbid forecast`, the cache in `.quantbid-cache/forecasts` of the working folder. */
export const MODEL_DEFAULTS = Object.freeze({ levels: DEFAULT_LEVELS_TEXT, cacheDir: DEFAULT_FORECAST_CACHE_DIR });

/** Defaults of the axes as written in the help: alphas the demo forecast's levels (0.05 to 0.95) allow, both alpha policies, follow-plan. */
export const SWEEP_DEFAULTS = Object.freeze({ alphas: '0.05:0.45:0.05', policies: SWEEP_POLICIES.filter((p) => p === 'quantile' || p === 'median').join(','), unaccepted: 'follow-plan' });

/** Defaults of `quantbid size`: the quantile policy at alpha 0.1, the grid of `--alpha best`, follow-plan, no fixed O&M. */
export const SIZE_DEFAULTS = Object.freeze({
  policies: 'quantile',
  alpha: 0.1,
  alphas: '0.05:0.45:0.05',
  unaccepted: 'follow-plan' as const,
  fixedOmPerMwYear: 0,
});
