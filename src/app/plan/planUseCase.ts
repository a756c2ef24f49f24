import { z } from 'zod';
import { readPriceHistory } from '../../io/readPriceHistory.js';
import { readScenario } from '../../io/readScenario.js';
import { readBatterySpec, readMarketSpec } from '../../io/readSpecs.js';
import { planReport } from '../../report/planReport.js';
import { PLAN_COMMAND_POLICIES, PLAN_DEFAULTS, type PlanCommandPolicy } from '../commandDefaults.js';
import type { Done } from '../commandResult.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import type { ScenarioTools } from '../scenarios/scenarioPlanningOf.js';
import { noPathsProblem } from '../scenarios/quantilePaths.js';
import { scenarioSettingsSchema } from '../scenarios/scenarioSettings.js';
import { RUN_LIMITS } from '../settingRules.js';
import { alphaSchema, boundedNumber, daySchema, inputSourcesSchema, outFolderSchema, unacceptedRuleSchema, validSettings } from '../settingSchemas.js';
import { planRun, type PlanParts, type PlanSummary } from './planRun.js';
import { SCENARIO_PLAN_OUTPUTS, scenarioPlan } from './scenarioPlan.js';

export { PLAN_COMMAND_POLICIES, PLAN_DEFAULTS, type PlanCommandPolicy } from '../commandDefaults.js';

/** The settings of `quantbid plan`, checked once when the plan starts. */
export const planSettingsSchema = z.strictObject({
  /** The market, battery and forecast files, or a scenario naming them. */
  inputs: inputSourcesSchema,
  /** Delivery day to plan, YYYY-MM-DD; default the scenario's demoDay. */
  day: daySchema.optional(),
  /** Tail level: buys limited at q(1 - alpha), sells at q(alpha); default 0.1. */
  alpha: alphaSchema.default(PLAN_DEFAULTS.alpha),
  /** Planning policy; default auto, or price-taking when there are neither --paths nor a history (planRun.ts). */
  policy: z.enum(PLAN_COMMAND_POLICIES as readonly PlanCommandPolicy[] as [PlanCommandPolicy, ...PlanCommandPolicy[]]).optional(),
  /** Paths and settings of the curve and auto policies; without paths they are made from the forecast file and the history. */
  scenarios: scenarioSettingsSchema.optional(),
  /** What the battery does about unaccepted orders: auto scores its candidates under it. Default follow-plan. */
  unaccepted: unacceptedRuleSchema.default(PLAN_DEFAULTS.unaccepted),
  /**
   * State of charge at the start of the day [MWh]; default socInitialFraction x energyMwh. Outside the
   * battery's window it is accepted with a warning, and the plan first comes back into the window
   * (not with curve or auto, which start inside it).
   */
  socStartMwh: boundedNumber(RUN_LIMITS.socStartMwh).optional(),
  /** Folder for orders.csv, schedule.csv, plan.json (and report.html); none: nothing is written. */
  out: outFolderSchema.optional(),
  /** Overwrite existing outputs. */
  force: z.boolean().default(false),
  /** Also write report.html (needs `out`). */
  report: z.boolean().default(false),
  /** List every order in the printed summary (the demo does). */
  listOrders: z.boolean().default(false),
});

export type PlanSettings = z.input<typeof planSettingsSchema>;

export type { PlanSummary } from './planRun.js';

/** The schema's type, for planRun's checked settings. */
export type PlanSettingsSchema = typeof planSettingsSchema;

/** What a plan may need besides its settings: the LP solver of the curve and auto policies. */
export type PlanTools = ScenarioTools;

/**
 * `quantbid plan`: one delivery day's orders and schedule from the quantile forecast (planDay), written
 * as orders.csv, schedule.csv, plan.json and, when asked, report.html into `out` as one output set.
 * The settings are checked with their schema, the scenario and spec files with theirs (planRun).
 */
export function planUseCase(settings: PlanSettings, hooks: RunHooks = QUIET_HOOKS, tools: PlanTools = {}): Done<PlanSummary> {
  return planRun(validSettings(planSettingsSchema, settings, 'plan'), PLAN_PARTS, hooks, tools);
}

/** Every part a plan may need, loaded with this module. */
export const PLAN_PARTS: PlanParts = {
  readScenario,
  readMarketSpec,
  readBatterySpec,
  scenarioPlanning: {
    outputs: SCENARIO_PLAN_OUTPUTS,
    noPathsProblem,
    plan: (request, hooks) => scenarioPlan({ ...request, scenarios: request.scenarios ?? scenarioSettingsSchema.parse({}) }, hooks),
  },
  planReport,
  readPriceHistory,
};
