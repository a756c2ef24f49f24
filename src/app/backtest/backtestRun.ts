import type { BatterySpec, MarketSpec } from '../../types.js';
import type { z } from 'zod';
import { batteryModel } from '../../battery/batteryModel.js';
import { backtestMetrics, type BacktestMetrics } from '../../backtest/backtestMetrics.js';
import { exchangeSteps, withoutExchangeSteps } from '../../plan/exchangeRounding.js';
import type { UnacceptedRule } from '../../settle/settleDay.js';
import { usesScenarios, type BacktestPolicy } from '../../backtest/backtestPolicy.js';
import { runBacktest, type BacktestDay, type BacktestInput } from '../../backtest/runBacktest.js';
import { daysBetween } from '../../market/calendar.js';
import { LEDGER_COLUMNS, daysCsv, ledgerRowBytes } from '../../io/backtestOutputs.js';
import { readInputDataWith, type BacktestInputPaths } from '../../io/backtestInputData.js';
import { jsonText } from '../../io/planOutputs.js';
import type { OutputLock } from '../../io/outputLock.js';
import type { Scenario } from '../../io/scenarioOf.js';
import { checkOutputFolder, OutputStage } from '../../io/writeOutputs.js';
import type { Done } from '../commandResult.js';
import { inputsShown, runInputFiles } from '../inputPaths.js';
import { lockedRun } from '../lockedRun.js';
import type { ModelForecastSummary } from '../modelForecast.js';
import type { RunHooks } from '../runHooks.js';
import { readRunInputsWith, requireCoveredDay, runInputPathsWith } from '../runInputsWith.js';
import type { ScenarioTools } from '../scenarios/scenarioPlanningOf.js';
import type { ScenarioSettings } from '../scenarios/scenarioSettings.js';
import type { BacktestSettingsSchema } from './backtestUseCase.js';
import { backtestSummary, backtestSummaryText } from './backtestSummary.js';

/** The backtest's settings as backtestSettingsSchema returns them (defaults filled in). */
export type CheckedBacktestSettings = z.output<BacktestSettingsSchema>;

export type BacktestSummary = ReturnType<typeof backtestSummary> & {
  readonly forecastModel?: ModelForecastSummary;
  /** With curve or auto: where the whole-day paths came from (app/scenarios/quantilePaths.ts). */
  readonly scenarioPaths?: string;
};

/**
 * What a backtest reads besides its data files, handed in so that this module loads no validation
 * library: the readers of the scenario and spec files (with their schemas, or checked by hand and read
 * before), and the scenario settings of curve and auto when the settings give none (their schema's
 * defaults). backtestUseCase hands in the schema readers; the CLI's fast path (backtestFastPath.ts)
 * readers of the files its checks read.
 */
export interface BacktestParts {
  readonly readScenario: (file: string) => Scenario;
  /** market.json; `note` hears of an old field name read under its new one. */
  readonly readMarketSpec: (path: string, note?: (text: string) => void) => MarketSpec;
  readonly readBatterySpec: (path: string) => BatterySpec;
  readonly defaultScenarioSettings: () => ScenarioSettings;
}

const BACKTEST_OUTPUTS = ['ledger.csv', 'days.csv', 'summary.json'] as const;

/**
 * `quantbid backtest` on checked settings: replays the policies day by day over the span (runBacktest)
 * and writes ledger.csv (day by day as the days are settled), days.csv, summary.json and, when asked,
 * report.html into `out` as one output set. What only some runs need (the forecast models of --model,
 * the scenario paths of curve and auto, the report) is loaded when the run needs it.
 */
export function backtestRun(s: CheckedBacktestSettings, parts: BacktestParts, hooks: RunHooks, tools: ScenarioTools): Promise<Done<BacktestSummary>> {
  const paths = runInputPathsWith(parts.readScenario, s.inputs, s.model);
  const outputs = s.report ? [...BACKTEST_OUTPUTS, 'report.html'] : BACKTEST_OUTPUTS;
  checkOutputFolder(s.out, outputs, s.force, runInputFiles(s.inputs, paths));
  return lockedRun(s.out, 'backtest', (lock) => lockedBacktest(s, parts, paths, outputs, lock as OutputLock, hooks, tools));
}

/** The backtest of the checked settings, from reading the inputs to the outputs, under the output folder's lock. */
async function lockedBacktest(s: CheckedBacktestSettings, parts: BacktestParts, paths: BacktestInputPaths, outputs: readonly string[], lock: OutputLock, hooks: RunHooks, tools: ScenarioTools): Promise<Done<BacktestSummary>> {
  // With --model the forecasts are made here, day by day from the history (through the forecast cache).
  const maker = s.model === undefined ? undefined : (await import('../modelForecast.js')).forecastMaker(s.model, paths.history, s, hooks);
  const read = readInputDataWith.bind(null, parts);
  const data = readRunInputsWith(read, paths, { policies: s.policies, alphas: [s.alpha], alphaOption: '--alpha', policyOption: '--policies' }, maker, hooks);
  const needing = s.policies.filter(usesScenarios);
  const scenarioModules = needing.length === 0 ? null : await scenarioCode();
  scenarioModules?.requireCurvesOffered(s.policies, data.market, paths.market);
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
    const settings = scenarioModules === null ? null : (s.scenarios ?? parts.defaultScenarioSettings());
    const scenarioPaths = settings === null || scenarioModules === null ? null : scenarioModules.runScenarioPaths(settings, { market, history, forecastDays: forecast.days, days: daysBetween(s.from, s.to), policies: needing });
    const scenarioPlanning = settings === null || scenarioPaths === null || scenarioModules === null ? null : scenarioModules.scenarioPlanningOf(settings, { market, history, forecast, tools, paths: scenarioPaths.paths });
    const result = runBacktest({ market, battery, history, forecast, from: s.from, to: s.to }, { alpha: s.alpha, unaccepted: s.unaccepted, policies: s.policies, onDay, keepLedger: false, onLedgerDay, scenarioPlanning });
    progress.finish();
    // The disk writes the ledger while the summary is made.
    const ledgerFlushed = ledger.flush();
    // Looked at before the commit; a run that fails before it discards the stage without asking.
    ledgerFlushed.catch(() => undefined);
    const metrics = backtestMetrics(result, battery);
    const unrounded = unroundedMetrics(s, { market, battery, history, forecast }, hooks);
    const inputs = inputsShown(paths, s.model);
    const context = { market, battery, inputs, ...(unrounded === undefined ? {} : { unrounded }) };
    const summary: BacktestSummary = { ...backtestSummary(result, metrics, context), ...(model === undefined ? {} : { forecastModel: model.summary }), ...(scenarioPaths === null ? {} : { scenarioPaths: scenarioPaths.source }) };
    stage.write('days.csv', daysCsv(result));
    stage.write('summary.json', jsonText(summary));
    if (s.report) {
      const { backtestReport } = await import('../../report/backtestReport.js');
      stage.write('report.html', backtestReport({ result, metrics, market, battery, inputs }));
    }
    await ledgerFlushed;
    stage.commit();
    if (summary.yearlyFigures.warning !== null) hooks.note(`warning: ${summary.yearlyFigures.warning}\n`);
    return { status: 'done', summary, text: `${backtestSummaryText(result, metrics, market, s.out, outputs, unrounded, scenarioPaths === null ? [] : [`  paths: ${scenarioPaths.source}`])}${model?.note ?? ''}` };
  } finally {
    stage.discard();
  }
}

/** The scenario planning code of curve and auto, loaded only for them. */
async function scenarioCode(): Promise<typeof import('../scenarios/quantilePaths.js') & typeof import('../scenarios/scenarioPlanningOf.js')> {
  const [paths, planning] = await Promise.all([import('../scenarios/quantilePaths.js'), import('../scenarios/scenarioPlanningOf.js')]);
  return { ...paths, ...planning };
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
