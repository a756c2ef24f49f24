import { z } from 'zod';
import { BACKTEST_POLICIES, DEFAULT_BACKTEST_POLICIES, type BacktestPolicy } from '../../backtest/backtestPolicy.js';
import { BACKTEST_DEFAULTS } from '../../backtest/backtestOptions.js';
import { readScenario } from '../../io/readScenario.js';
import { readBatterySpec, readMarketSpec } from '../../io/readSpecs.js';
import type { Done } from '../commandResult.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import type { ScenarioTools } from '../scenarios/scenarioPlanningOf.js';
import { scenarioSettingsSchema } from '../scenarios/scenarioSettings.js';
import { alphaSchema, checkSpan, daySchema, inputSourcesSchema, modelSettingsSchema, outFolderSchema, unacceptedRuleSchema, validSettings } from '../settingSchemas.js';
import { backtestRun, type BacktestParts, type BacktestSummary } from './backtestRun.js';

export type { BacktestSummary } from './backtestRun.js';

/** The settings of `quantbid backtest`, checked once when the backtest starts. */
export const backtestSettingsSchema = z
  .strictObject({
    /** The market, battery, history and forecast files, or a scenario naming them. */
    inputs: inputSourcesSchema,
    /** Make the forecasts from the history instead of reading a forecast file. */
    model: modelSettingsSchema.optional(),
    /** First and last delivery day, YYYY-MM-DD, both included. */
    from: daySchema,
    to: daySchema,
    /** Tail level of the quantile and median policies (buys limited at q(1 - alpha), sells at q(alpha)); default 0.1. */
    alpha: alphaSchema.default(BACKTEST_DEFAULTS.alpha),
    /** What the battery does about unaccepted orders; default follow-plan. */
    unaccepted: unacceptedRuleSchema.default(BACKTEST_DEFAULTS.unaccepted),
    /** Policies replayed side by side, each once; default the five that need no scenarios. */
    policies: z
      .array(z.enum(BACKTEST_POLICIES as readonly BacktestPolicy[] as [BacktestPolicy, ...BacktestPolicy[]]))
      .min(1)
      .refine((list) => new Set(list).size === list.length, 'each policy may appear once')
      .default([...DEFAULT_BACKTEST_POLICIES]),
    /** Paths and settings of the curve and auto policies (required by them). */
    scenarios: scenarioSettingsSchema.optional(),
    /** Folder for ledger.csv, days.csv, summary.json (and report.html). */
    out: outFolderSchema,
    /** Overwrite existing outputs. */
    force: z.boolean().default(false),
    /** Also write report.html. */
    report: z.boolean().default(false),
  })
  .superRefine(checkSpan);

export type BacktestSettings = z.input<typeof backtestSettingsSchema>;

/** The schema's type, for backtestRun's checked settings. */
export type BacktestSettingsSchema = typeof backtestSettingsSchema;

/** Every part a backtest may need, with the schemas of the files read. */
export const BACKTEST_PARTS: BacktestParts = {
  readScenario,
  readMarketSpec,
  readBatterySpec,
  defaultScenarioSettings: () => scenarioSettingsSchema.parse({}),
};

/**
 * `quantbid backtest`: the settings checked with their schema, the scenario and spec files with theirs,
 * then backtestRun (replays the policies day by day over the span and writes ledger.csv, days.csv,
 * summary.json and, when asked, report.html into `out` as one output set).
 */
export async function backtestUseCase(settings: BacktestSettings, hooks: RunHooks = QUIET_HOOKS, tools: ScenarioTools = {}): Promise<Done<BacktestSummary>> {
  return backtestRun(validSettings(backtestSettingsSchema, settings, 'backtest'), BACKTEST_PARTS, hooks, tools);
}
