import { relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Done } from '../commandResult.js';
import { packageRoot } from '../packageInfo.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { PLAN_DEFAULTS, planUseCase, type PlanSummary, type PlanTools } from './planUseCase.js';

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

/**
 * `quantbid demo`: the plan of the shipped fictional market's demo day (planUseCase with the
 * defaults: auto, its candidates scored on paths made from the scenario's forecast and history), with
 * every order listed, and the next command to try: a backtest against the simple baselines over the
 * first quarter of 2026. `tools` holds the LP solver auto's curves need (loadHighsSolver).
 */
export function demoUseCase(settings: DemoSettings, hooks: RunHooks = QUIET_HOOKS, tools: PlanTools = {}): Done<PlanSummary> {
  const scenario = demoScenarioPath();
  hooks.note(`demo: fictional market Halvorn (${scenario})\n`);
  const { alpha, unaccepted } = PLAN_DEFAULTS;
  const done = planUseCase({ inputs: { scenario }, alpha, unaccepted, ...settings, listOrders: true }, hooks, tools);
  return { ...done, text: `${done.text}${demoNextSteps(scenario)}` };
}

/** What to try after the demo: the backtest that says whether auto beats the simple baselines. */
export function demoNextSteps(scenario: string): string {
  return [
    'next: does auto beat the simple baselines over many days? Replay it (each day scored on paths: it takes a while):',
    `  quantbid backtest --scenario ${scenario} --from 2026-01-01 --to 2026-03-31 --policies auto,price-taking,quantile,perfect-foresight --out runs/demo-q1 --report`,
    '',
  ].join('\n');
}
