import { z } from 'zod';
import { batteryModel } from '../../battery/batteryModel.js';
import { backtestMetrics, type BacktestMetrics } from '../../backtest/backtestMetrics.js';
import { exchangeSteps, withoutExchangeSteps } from '../../plan/exchangeRounding.js';
import type { UnacceptedRule } from '../../settle/settleDay.js';
import { BACKTEST_POLICIES, DEFAULT_BACKTEST_POLICIES, usesScenarios, type BacktestPolicy } from '../../backtest/backtestPolicy.js';
import { BACKTEST_DEFAULTS, runBacktest, type BacktestDay, type BacktestInput } from '../../backtest/runBacktest.js';
import { daysBetween } from '../../market/calendar.js';
import { LEDGER_COLUMNS, daysCsv, ledgerRowBytes } from '../../io/backtestOutputs.js';
import { jsonText } from '../../io/planOutputs.js';
import type { OutputLock } from '../../io/outputLock.js';
import type { BacktestInputPaths } from '../../io/readBacktestInputs.js';
import { checkOutputFolder, OutputStage } from '../../io/writeOutputs.js';
import { backtestReport } from '../../report/backtestReport.js';
import type { Done } from '../commandResult.js';
import { runInputFiles } from '../inputFiles.js';
import { lockedRun } from '../lockedRun.js';
import { forecastMaker, inputsShown, type ModelForecastSummary } from '../modelForecast.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { runScenarioPaths } from '../scenarios/quantilePaths.js';
import { requireCurvesOffered, scenarioPlanningOf, type ScenarioTools } from '../scenarios/scenarioPlanningOf.js';
import { scenarioSettingsSchema } from '../scenarios/scenarioSettings.js';
import { readRunInputs, requireCoveredDay, runInputPaths } from '../runInputs.js';
import { alphaSchema, checkSpan, daySchema, inputSourcesSchema, modelSettingsSchema, outFolderSchema, unacceptedRuleSchema, validSettings } from '../settingSchemas.js';
import { backtestSummary, backtestSummaryText } from './backtestSummary.js';

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

export type BacktestSummary = ReturnType<typeof backtestSummary> & {
  readonly forecastModel?: ModelForecastSummary;
  /** With curve or auto: where the whole-day paths came from (app/scenarios/quantilePaths.ts). */
  readonly scenarioPaths?: string;
};

const BACKTEST_OUTPUTS = ['ledger.csv', 'days.csv', 'summary.json'] as const;

/**
 * `quantbid backtest`: replays the policies day by day over the span (runBacktest) and writes
 * ledger.csv (day by day as the days are settled), days.csv, summary.json and, when asked, report.html
 * into `out` as one output set.
 */
export function backtestUseCase(settings: BacktestSettings, hooks: RunHooks = QUIET_HOOKS, tools: ScenarioTools = {}): Done<BacktestSummary> {
  const s = validSettings(backtestSettingsSchema, settings, 'backtest');
  const paths = runInputPaths(s.inputs, s.model);
  const outputs = s.report ? [...BACKTEST_OUTPUTS, 'report.html'] : BACKTEST_OUTPUTS;
  checkOutputFolder(s.out, outputs, s.force, runInputFiles(s.inputs, paths));
  return lockedRun(s.out, 'backtest', (lock) => backtestRun(s, paths, outputs, lock as OutputLock, hooks, tools));
}

/** The backtest of the checked settings, from reading the inputs to the outputs, under the output folder's lock. */
function backtestRun(s: z.output<typeof backtestSettingsSchema>, paths: BacktestInputPaths, outputs: readonly string[], lock: OutputLock, hooks: RunHooks, tools: ScenarioTools): Done<BacktestSummary> {
  // With --model the forecasts are made here, day by day from the history (through the forecast cache).
  const maker = forecastMaker(s.model, paths.history, s, hooks);
  const data = readRunInputs(paths, { policies: s.policies, alphas: [s.alpha], alphaOption: '--alpha', policyOption: '--policies' }, maker, hooks);
  requireCurvesOffered(s.policies, data.market, paths.market);
  const model = maker?.made();
  // A span without a covered day is bad input, as for sweep and size: an all-zero table would look like a result.
  requireCoveredDay(data, paths, s.from, s.to);
  const { market, history, forecast } = data;
  const battery = batteryModel(data.batterySpec);
  const progress = hooks.progress('backtest', daysBetween(s.from, s.to).length);
  const onDay = ({ done }: { done: number }): void => progress.update(done);
  // ledger.csv goes into the output stage day by day (writeOutputs.ts): ten years keep no ledger in memory.
  const stage = OutputStage.begin(s.out, outputs, s.force, ['report.html'], lock);
  try {
    const ledger = stage.open('ledger.csv');
    ledger.append(`${LEDGER_COLUMNS.join(',')}\n`);
    const onLedgerDay = (day: BacktestDay): void => ledger.append(ledgerRowBytes(day));
    // curve and auto: the --paths file, or paths made from the quantile file and the history (quantilePaths.ts).
    const needing = s.policies.filter(usesScenarios);
    const settings = needing.length === 0 ? null : (s.scenarios ?? scenarioSettingsSchema.parse({}));
    const scenarioPaths = settings === null ? null : runScenarioPaths(settings, { market, history, forecastDays: forecast.days, days: daysBetween(s.from, s.to), policies: needing });
    const scenarioPlanning = settings === null || scenarioPaths === null ? null : scenarioPlanningOf(settings, { market, history, forecast, tools, paths: scenarioPaths.paths });
    const result = runBacktest({ market, battery, history, forecast, from: s.from, to: s.to }, { alpha: s.alpha, unaccepted: s.unaccepted, policies: s.policies, onDay, keepLedger: false, onLedgerDay, scenarioPlanning });
    progress.finish();
    const metrics = backtestMetrics(result, battery);
    const unrounded = unroundedMetrics(s, { market, battery, history, forecast }, hooks);
    const inputs = inputsShown(paths, s.model);
    const context = { market, battery, inputs, ...(unrounded === undefined ? {} : { unrounded }) };
    const summary: BacktestSummary = { ...backtestSummary(result, metrics, context), ...(model === undefined ? {} : { forecastModel: model.summary }), ...(scenarioPaths === null ? {} : { scenarioPaths: scenarioPaths.source }) };
    stage.write('days.csv', daysCsv(result));
    stage.write('summary.json', jsonText(summary));
    if (s.report) stage.write('report.html', backtestReport({ result, metrics, market, battery, inputs }));
    stage.commit();
    if (summary.yearlyFigures.warning !== null) hooks.note(`warning: ${summary.yearlyFigures.warning}\n`);
    return { status: 'done', summary, text: `${backtestSummaryText(result, metrics, market, s.out, outputs, unrounded, scenarioPaths === null ? [] : [`  paths: ${scenarioPaths.source}`])}${model?.note ?? ''}` };
  } finally {
    stage.discard();
  }
}

/**
 * With order steps in the market spec the backtest's orders are rounded to them; the same backtest on the
 * market spec without the steps (orders as planned) gives the reference for the loss from rounding. None
 * without steps (nothing is run twice).
 */
function unroundedMetrics(
  s: { readonly from: string; readonly to: string; readonly alpha: number; readonly unaccepted: UnacceptedRule; readonly policies: readonly BacktestPolicy[] },
  data: Omit<BacktestInput, 'from' | 'to'>,
  hooks: RunHooks,
): BacktestMetrics | undefined {
  // Auto would choose among other candidates (curves too) on the unrounded market: only the schedule policies compare.
  const policies = s.policies.filter((p) => !usesScenarios(p));
  if (exchangeSteps(data.market) === null || policies.length === 0) return undefined;
  const progress = hooks.progress('backtest without rounding', daysBetween(s.from, s.to).length);
  const result = runBacktest(
    { ...data, market: withoutExchangeSteps(data.market), from: s.from, to: s.to },
    { alpha: s.alpha, unaccepted: s.unaccepted, policies, keepLedger: false, onDay: ({ done }) => progress.update(done) },
  );
  progress.finish();
  return backtestMetrics(result, data.battery);
}
