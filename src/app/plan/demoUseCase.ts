import { relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Done } from '../commandResult.js';
import { packageRoot } from '../packageInfo.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { PLAN_DEFAULTS, planUseCase, type PlanSummary } from './planUseCase.js';

/** The settings of `quantbid demo`: where the plan's files go, if anywhere. */
export interface DemoSettings {
  /** Also write the plan's files into this folder. */
  readonly out?: string;
  /** Overwrite existing outputs. */
  readonly force?: boolean;
}

/** The shipped fictional scenario (scenarios/halvorn), relative to the working folder. */
export function demoScenarioPath(): string {
  return relative(process.cwd(), fileURLToPath(new URL('scenarios/halvorn/scenario.json', packageRoot())));
}

/** `quantbid demo`: the plan of the shipped fictional market's demo day (planUseCase with the defaults). */
export function demoUseCase(settings: DemoSettings, hooks: RunHooks = QUIET_HOOKS): Done<PlanSummary> {
  const scenario = demoScenarioPath();
  hooks.note(`demo: fictional market Halvorn (${scenario})\n`);
  return planUseCase({ inputs: { scenario }, ...PLAN_DEFAULTS, ...settings }, hooks);
}
