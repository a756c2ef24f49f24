import type { GridAxis } from '../grid/gridAxis.js';
import type { TableRow } from '../grid/gridCsv.js';
import type { SettingOf } from '../grid/expandGrid.js';
import { interruptedMessage, runGrid, type GridOptions, type GridOutcome, type GridResult, type MoreSetting } from '../grid/runGrid.js';
import type { PoolWorkers } from '../grid/workerPool.js';
import { stopOnSignals } from '../grid/stopOnSignals.js';
import type { GridRow } from '../grid/taskModule.js';
import type { BacktestInputData, BacktestInputPaths } from '../io/readBacktestInputs.js';
import { jsonText } from '../io/planOutputs.js';
import type { OutputLock } from '../io/outputLock.js';
import { checkOutputFolder } from '../io/writeOutputs.js';
import { runInputFiles } from './inputFiles.js';
import { lockedRun } from './lockedRun.js';
import type { LevelUse } from './forecastLevels.js';
import type { Done, Interrupted } from './commandResult.js';
import type { ModelForecast } from './modelForecast.js';
import { packageVersion } from './packageInfo.js';
import type { RunHooks } from './runHooks.js';
import { readRunInputs, requireCoveredDay, runInputPaths } from './runInputs.js';
import type { InputSources, ModelSettings } from './settingSchemas.js';

/**
 * Runs a grid (runGrid) with a progress display and Ctrl-C and SIGTERM handling: the first of them
 * lets the running settings finish and keeps them in the journal; the run then returns `interrupted`
 * with how to resume and the signal (the CLI ends with exit code 130 after Ctrl-C, 143 after SIGTERM).
 */
export async function runCommandGrid<const Axes extends readonly GridAxis[], Input, Row extends GridRow>(
  hooks: RunHooks,
  label: string,
  options: Omit<GridOptions<Axes, Input, Row>, 'signal' | 'onProgress'>,
): Promise<Extract<GridOutcome<SettingOf<Axes>, Row>, { status: 'complete' }> | Interrupted> {
  const total = options.axes.reduce((product, axis) => product * axis.values.length, 1);
  const progress = hooks.progress(label, total);
  const stop = stopOnSignals((text) => hooks.warn(text));
  let outcome: GridOutcome<SettingOf<Axes>, Row>;
  try {
    outcome = await runGrid<Axes, Input, Row>({ ...options, signal: stop.signal, onProgress: (done) => progress.update(done) });
  } finally {
    stop.dispose();
    progress.finish();
  }
  if (outcome.status === 'interrupted') return { status: 'interrupted', message: interruptedMessage(outcome), signal: stop.received() ?? 'SIGINT' };
  return outcome;
}

/** What a grid command (sweep, size) runs: its grid, its task, and how it sums up the finished grid. */
export interface GridCommand<Axes extends readonly GridAxis[], Input, Row extends GridRow, Summary> {
  /** `sweep` or `size`: the progress label, the table `<command>.csv`, the fingerprint's command. */
  readonly command: 'sweep' | 'size';
  readonly run: { readonly out: string; readonly force: boolean; readonly restart: boolean; readonly report: boolean; readonly threads?: number | undefined };
  /** The lock of the output folder, held by the caller (lockedGridRun). */
  readonly lock: OutputLock;
  readonly axes: Axes;
  /** The compiled task module beside the use case, e.g. `new URL('./sweepTask.js', import.meta.url)`. */
  readonly taskModule: URL;
  readonly contextInput: Input;
  /** What decides the rows besides the axes, inputs and task (fingerprinted with the command and version). */
  readonly identity: Readonly<Record<string, unknown>>;
  readonly paths: BacktestInputPaths;
  /** Input files besides those of `paths` whose bytes decide the rows (the paths file of curve and auto). */
  readonly moreInputFiles?: readonly string[];
  /** The forecasts --model made, or undefined. */
  readonly model: ModelForecast | undefined;
  /** The summary of the finished grid and of the rows of moreSettings. */
  readonly summary: (results: readonly GridResult<SettingOf<Axes>, Row>[], more: readonly TableRow[]) => Summary;
  /** Settings besides the grid's (runGrid's moreSettings), e.g. the sweep's reference policies. */
  readonly moreSettings?: readonly MoreSetting[];
  /** The group of a setting (runGrid's groupOf), e.g. the sweep's unaccepted rule. */
  readonly groupOf?: (setting: MoreSetting) => string;
  /** Workers started ahead (startPoolWorkers), which runGrid runs on and stops. */
  readonly workers?: PoolWorkers;
  readonly report: (results: readonly GridResult<SettingOf<Axes>, Row>[], summary: Summary) => string;
  readonly summaryText: (summary: Summary, resumed: number, files: readonly string[]) => string;
}

/**
 * A grid command from its grid to its outputs: the table, summary.json and (when asked) report.html
 * written as one output set (a run killed while writing leaves the old outputs or all the new ones),
 * the summary made once for the files and the human summary.
 */
export async function runGridCommand<const Axes extends readonly GridAxis[], Input, Row extends GridRow, Summary>(
  spec: GridCommand<Axes, Input, Row, Summary>,
  hooks: RunHooks,
): Promise<Done<Summary> | Interrupted> {
  type Results = readonly GridResult<SettingOf<Axes>, Row>[];
  let made: { readonly results: Results; readonly summary: Summary } | undefined;
  const summaryOf = (results: Results, more: readonly TableRow[]): Summary => {
    if (made?.results !== results) made = { results, summary: spec.summary(results, more) };
    return made.summary;
  };
  const { run, model } = spec;
  const outcome = await runCommandGrid<Axes, Input, Row>(hooks, spec.command, {
    outDir: run.out,
    axes: spec.axes,
    taskModule: spec.taskModule,
    contextInput: spec.contextInput,
    identity: { command: spec.command, version: packageVersion(), ...spec.identity, ...(model === undefined ? {} : { forecastModel: model.identity }) },
    inputFiles: [...inputFilesOf(spec.paths), ...(spec.moreInputFiles ?? [])],
    ...(run.threads === undefined ? {} : { threads: run.threads }),
    restart: run.restart,
    force: run.force,
    lock: spec.lock,
    csvName: `${spec.command}.csv`,
    optionalOutputs: ['report.html'],
    ...(spec.moreSettings === undefined ? {} : { moreSettings: spec.moreSettings }),
    ...(spec.groupOf === undefined ? {} : { groupOf: spec.groupOf }),
    ...(spec.workers === undefined ? {} : { workers: spec.workers }),
    moreOutputs: (results, more) => [
      { name: 'summary.json', text: jsonText(summaryOf(results, more)) },
      ...(run.report ? [{ name: 'report.html', text: spec.report(results, summaryOf(results, more)) }] : []),
    ],
  });
  if (outcome.status === 'interrupted') return outcome;
  const summary = summaryOf(outcome.results, outcome.more);
  return { status: 'done', summary, text: `${spec.summaryText(summary, outcome.resumed, outcome.files)}${model?.note ?? ''}` };
}

/** The inputs of a grid command, read and checked (readGridInputs). */
export interface GridInputs {
  readonly paths: BacktestInputPaths;
  readonly data: BacktestInputData;
  readonly model: ModelForecast | undefined;
}

/** The settings of a grid command that readGridInputs and lockedGridRun use. */
type GridInputSettings = { readonly inputs: InputSources; readonly model?: ModelSettings | undefined; readonly from: string; readonly to: string; readonly out: string; readonly force: boolean; readonly report: boolean };

/**
 * A grid command run under the lock of its output folder (io/outputLock.ts) from the first input read
 * to the last output written: the input paths and the output folder are checked (the table,
 * summary.json and, when asked, report.html; none of them an input), the lock is taken, the inputs are
 * read (readGridInputs) and `body` runs the grid; the lock is released when it ends.
 */
export function lockedGridRun<R>(settings: GridInputSettings, command: 'sweep' | 'size', use: LevelUse, hooks: RunHooks, body: (inputs: GridInputs, lock: OutputLock) => Promise<R>): Promise<R> {
  const paths = runInputPaths(settings.inputs, settings.model);
  checkOutputFolder(settings.out, [`${command}.csv`, 'summary.json', ...(settings.report ? ['report.html'] : [])], settings.force, runInputFiles(settings.inputs, paths));
  return lockedRun(settings.out, command, async (lock) => body(await readGridInputs(settings, paths, use, hooks), lock as OutputLock));
}

/** The input files a grid's resume fingerprint covers: the forecast file only when one is read. */
function inputFilesOf(paths: BacktestInputPaths): string[] {
  return [paths.market, paths.battery, paths.history, ...(paths.forecast === undefined ? [] : [paths.forecast])];
}

/**
 * The inputs of a grid command, read and checked in this thread before any setting runs: every input
 * file and the levels the grid reads (readRunInputs, remembered for a one-thread grid's task), a span
 * with at least one covered day; with --model the forecasts are made here, once, before the workers
 * start.
 */
async function readGridInputs(settings: GridInputSettings, paths: BacktestInputPaths, use: LevelUse, hooks: RunHooks): Promise<GridInputs> {
  // The forecasting code loads only for --model: a grid on a forecast file starts without it.
  const maker = settings.model === undefined ? undefined : (await import('./modelForecast.js')).forecastMaker(settings.model, paths.history, settings, hooks);
  const data = readRunInputs(paths, use, maker, hooks, true);
  requireCoveredDay(data, paths, settings.from, settings.to);
  return { paths, data, model: maker?.made() };
}
