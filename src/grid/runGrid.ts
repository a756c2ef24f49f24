import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { InputError, type InputProblem } from '../errors/inputError.js';
import { outFolderWriteProblem } from '../io/outFolderWriteProblem.js';
import { OutputLock } from '../io/outputLock.js';
import { checkOutputFolder, writeOutputs, type OutputFile } from '../io/writeOutputs.js';
import { checkRow } from './checkRow.js';
import { gridCsv, type TableRow } from './gridCsv.js';
import { gridFingerprint } from './gridFingerprint.js';
import { expandGrid, GRID_DEFAULTS, type GridPoint, type Setting, type SettingOf } from './expandGrid.js';
import { checkJournalEntry, damagedJournal, entryLine, JOURNAL_FORMAT, JOURNAL_VERSION, journalGridId, JournalWriter, MAX_JOURNAL_LINE_BYTES, readJournal, type JournalLineEntry } from './gridJournal.js';
import { taskModuleUrl, type GridRow } from './taskModule.js';
import { defaultThreads, runPool, type PoolJob, type PoolStatus, type PoolWorkers } from './workerPool.js';
import { axisValueText, type AxisValue, type GridAxis } from './gridAxis.js';

/**
 * The options of runGrid. `Axes` gives the settings' type (SettingOf), `Input` the contextInput's and
 * `Row` the rows': what the task module's run returns, which runGrid checks against the row contract
 * (checkRow.ts) but takes the caller's word for beyond it.
 */
export interface GridOptions<Axes extends readonly GridAxis[] = readonly GridAxis[], Input = unknown, Row extends GridRow = GridRow> {
  /** Folder for the table and, while the grid runs, its journal. Required. */
  readonly outDir: string;
  /** The grid's axes, in grid order (expandGrid.ts); their types give the settings' type. Required. */
  readonly axes: Axes;
  /** Compiled task module, path or file URL (contract in workerPool.ts). Required. */
  readonly taskModule: string | URL;
  /** Handed to the task's loadContext once per thread that runs settings. Default undefined. */
  readonly contextInput?: Input;
  /**
   * Everything besides the axes, inputs and task that decides the rows (command name, version, options),
   * as JSON-able data; it goes into the journal's fingerprint. Leave out what does not change rows:
   * --threads, --out, --quiet, --force, --restart. Default null.
   */
  readonly identity?: unknown;
  /** Input files whose contents the rows depend on (fingerprinted). Default none. */
  readonly inputFiles?: readonly string[];
  /** Threads [-], a whole number >= 1, this one included: n runs settings here and on n - 1 workers. Default os.availableParallelism(). */
  readonly threads?: number;
  /** Discard a journal found in outDir instead of resuming or refusing it. Default false. */
  readonly restart?: boolean;
  /** Overwrite an existing table. Default false. */
  readonly force?: boolean;
  /** File name of the table. Default `sweep.csv`; the journal is `.sweep-journal.jsonl` beside it. */
  readonly csvName?: string;
  /**
   * Further outputs made from the finished results (e.g. `summary.json`), written in one set with the
   * table, so that a run killed while writing leaves the old outputs or all the new ones. Default none.
   */
  readonly moreOutputs?: (results: readonly GridResult<SettingOf<Axes>, Row>[], more: readonly TableRow[]) => readonly OutputFile[];
  /**
   * Settings besides the grid's, e.g. a sweep's reference policies (which no axis varies: alpha null,
   * an empty cell): run by the task like the grid's (on any thread, journalled, resumed), their lines
   * after the grid's in this order, each row checked like a setting's. Default none.
   */
  readonly moreSettings?: readonly MoreSetting[];
  /**
   * The group of a setting (grid's or more): settings of one group share work that a thread does once
   * and keeps, e.g. a sweep's reference runs of one unaccepted rule, and the pool keeps each thread on
   * one group while it can (jobSchedule.ts). Default: all settings one group.
   */
  readonly groupOf?: (setting: MoreSetting) => string;
  /**
   * Workers started ahead for the task module (startPoolWorkers, workerPool.ts), booting while the
   * caller read the inputs; runGrid runs on them and stops them however it ends. Default none.
   */
  readonly workers?: PoolWorkers;
  /** Outputs the command writes only on request (e.g. report.html): removed with --force when not written. */
  readonly optionalOutputs?: readonly string[];
  /** Most settings a grid may have [-]. Default 100,000. */
  readonly maxSettings?: number;
  /**
   * The lock of outDir when the caller holds it (io/outputLock.ts); without it runGrid takes the lock
   * itself for its run. Default none.
   */
  readonly lock?: OutputLock;
  /** Abort (e.g. on SIGINT) to stop starting settings; the running ones finish and are kept. */
  readonly signal?: AbortSignal;
  /** Called with the grid's settings done (resumed ones included; the more settings not counted) once before work and after each one. */
  readonly onProgress?: (done: number, total: number) => void;
  /** The clock for the journal header's start time. Default `() => new Date()`. */
  readonly now?: () => Date;
}

export const GRID_RUN_DEFAULTS = Object.freeze({
  identity: null as unknown,
  inputFiles: Object.freeze([]) as readonly string[],
  restart: false,
  force: false,
  csvName: 'sweep.csv',
  maxSettings: GRID_DEFAULTS.maxSettings,
  now: (): Date => new Date(),
});

/** A setting outside the grid's product: a value or null (an empty cell) per axis. */
export type MoreSetting = Readonly<Record<string, AxisValue | null>>;

/** A setting with its row, in grid order. */
export interface GridResult<S extends Setting = Setting, Row extends GridRow = GridRow> extends GridPoint<S> {
  readonly row: Row;
}

export type GridOutcome<S extends Setting = Setting, Row extends GridRow = GridRow> =
  | {
      readonly status: 'complete';
      readonly total: number;
      /** Settings taken from a journal of an earlier, interrupted run [-]. */
      readonly resumed: number;
      readonly results: readonly GridResult<S, Row>[];
      /** The rows of the more settings, in their order. */
      readonly more: readonly TableRow[];
      /** Paths written (the table, then the further outputs). */
      readonly files: readonly string[];
    }
  | {
      readonly status: 'interrupted';
      readonly total: number;
      readonly done: number;
      /** Path of the journal that keeps the finished settings. */
      readonly journal: string;
    };

/** `.sweep-journal.jsonl` for `sweep.csv`, `.size-journal.jsonl` for `size.csv`. */
export function journalName(csvName: string): string {
  return `.${csvName.replace(/\.csv$/, '')}-journal.jsonl`;
}

/**
 * Runs a task for every setting of the grid and writes the table, resuming an interrupted run.
 *
 * Steps: expand the grid (problems before any work); check the output folder; fingerprint the
 * arguments and inputs; take the finished settings from a journal with the same fingerprint (a
 * different one is refused unless `restart`); run the rest on the pool, appending each row to the
 * journal as it finishes; when all are done, write the table in grid order and the further outputs as
 * one set with writeOutputs (the old set or the new one, never a mix) and remove the journal. Rows
 * pass through the journal's JSON either way, so a resumed run writes the same bytes as an
 * uninterrupted one. Interrupted by `signal`, it returns `interrupted` and keeps the journal.
 */
export async function runGrid<const Axes extends readonly GridAxis[], Input = unknown, Row extends GridRow = GridRow>(options: GridOptions<Axes, Input, Row>): Promise<GridOutcome<SettingOf<Axes>, Row>> {
  try {
    const o = { ...GRID_RUN_DEFAULTS, ...options };
    // Workers started ahead build their context while this thread checks the folder and the journal.
    o.workers?.sendContext(o.contextInput);
    const threads = checkedThreads(o.threads ?? defaultThreads());
    const grid = expandGrid(o.axes, { maxSettings: o.maxSettings });
    const more = morePoints(o.axes, grid.length, o.moreSettings ?? []);
    checkOutputFolder(o.outDir, [o.csvName], o.force);
    const taskUrl = taskModuleUrl(o.taskModule);
    // The more settings count only where there are some, so that a grid without them keeps its fingerprint.
    const identity = more.length === 0 ? o.identity : { grid: o.identity, moreSettings: more.map((point) => point.key) };
    const fingerprint = gridFingerprint({ identity, axes: o.axes, inputFiles: o.inputFiles, taskModuleUrl: taskUrl });
    const lock = options.lock ?? OutputLock.take(o.outDir, o.csvName.replace(/\.csv$/, ''));
    try {
      if (options.lock !== undefined) lock.verify();
      return await runLockedGrid(o, { grid, more, threads, taskUrl, fingerprint, lock });
    } finally {
      if (options.lock === undefined) lock.release();
    }
  } finally {
    await options.workers?.stop();
  }
}

/** A more setting with its place after the grid's settings and its key (`alpha=|policy=point|...`: empty for null). */
interface MorePoint {
  readonly index: number;
  readonly key: string;
  readonly setting: MoreSetting;
}

function morePoints(axes: readonly GridAxis[], gridSize: number, settings: readonly MoreSetting[]): MorePoint[] {
  const points = settings.map((setting, i) => ({
    index: gridSize + i,
    key: axes.map((axis) => `${axis.name}=${setting[axis.name] === null || setting[axis.name] === undefined ? '' : axisValueText(setting[axis.name] as AxisValue)}`).join('|'),
    setting,
  }));
  const keys = points.map((point) => point.key);
  const twice = keys.find((key, i) => keys.indexOf(key) !== i);
  if (twice !== undefined) throw new Error(`runGrid: the more setting ${twice} is given twice`);
  return points;
}

/** runGrid's work once the folder is locked: the journal, the pool, the outputs. */
async function runLockedGrid<const Axes extends readonly GridAxis[], Input, Row extends GridRow>(
  o: GridOptions<Axes, Input, Row> & { readonly restart: boolean; readonly force: boolean; readonly csvName: string; readonly now: () => Date },
  run: { readonly grid: readonly GridPoint<SettingOf<Axes>>[]; readonly more: readonly MorePoint[]; readonly threads: number; readonly taskUrl: string; readonly fingerprint: string; readonly lock: OutputLock },
): Promise<GridOutcome<SettingOf<Axes>, Row>> {
  const { grid, more, fingerprint } = run;
  const points: readonly (GridPoint | MorePoint)[] = [...grid, ...more];
  const journal = join(o.outDir, journalName(o.csvName));
  const rows: (GridRow | undefined)[] = new Array<GridRow | undefined>(points.length);
  const indexOf = new Map(points.map((point) => [point.key, point.index]));
  let columns: readonly string[] | undefined;
  const keep = (key: string, row: GridRow): void => {
    checkRow(row, key, o.axes, columns);
    columns ??= Object.keys(row);
    rows[indexOf.get(key) as number] = row;
  };
  const { writer, entries } = diskStep(o.outDir, journal, 0, () => openJournal(journal, fingerprint, points, o));
  for (const entry of entries) {
    try {
      keep(entry.key, entry.row);
    } catch (err) {
      throw damagedJournal(journal, err instanceof Error ? err.message.replace(/^the sweep task returned /, 'a row with ') : String(err), entry.line);
    }
  }
  // Progress, resumes and messages count the grid's settings; the more settings run after them.
  const inGrid = (key: string): boolean => (indexOf.get(key) as number) < grid.length;
  const resumed = entries.filter((entry) => inGrid(entry.key)).length;
  let done = resumed;
  o.onProgress?.(done, grid.length);

  const jobs: PoolJob[] = points
    .filter((point) => rows[point.index] === undefined)
    .map((point) => ({ id: point.index, key: point.key, setting: point.setting as GridPoint['setting'], ...(o.groupOf === undefined ? {} : { group: o.groupOf(point.setting) }) }));
  let status: PoolStatus;
  try {
    const pool = { taskModule: run.taskUrl, contextInput: o.contextInput, threads: run.threads, signal: o.signal, ...(o.workers === undefined ? {} : { workers: o.workers }) };
    status = await runPool(jobs, pool, (job, row) => {
      checkRow(row, job.key, o.axes, columns);
      const line = entryLine(fingerprint, job.key, row);
      diskStep(o.outDir, journal, done, () => writer.append(line));
      // Kept as the journal holds it, so a resumed run writes the same bytes as an uninterrupted one.
      keep(job.key, (JSON.parse(line) as JournalLineEntry).row);
      if (!inGrid(job.key)) return;
      done++;
      o.onProgress?.(done, grid.length);
    });
  } finally {
    await writer.close();
  }
  if (status === 'stopped') return { status: 'interrupted', total: grid.length, done, journal };

  // Every row passed checkRow; that it has the columns of `Row` is the task module's contract with the caller.
  const complete = rows as Row[];
  const results = grid.map((point) => ({ ...point, row: complete[point.index] as Row }));
  const moreRows: TableRow[] = more.map((point) => ({ setting: point.setting, row: complete[point.index] as Row }));
  const outputs = [{ name: o.csvName, text: gridCsv(o.axes, grid, complete, moreRows) }, ...(o.moreOutputs?.(results, moreRows) ?? [])];
  const files = diskStep(o.outDir, journal, done, () => writeOutputs(o.outDir, outputs, o.force, o.optionalOutputs ?? [], run.lock));
  // Killed before this line, a re-run finds every setting in the journal and writes the same bytes.
  rmSync(journal, { force: true });
  return { status: 'complete', total: grid.length, resumed, results, more: moreRows, files };
}

/**
 * A write of the grid's journal or outputs. A full disk (or another failure of the file system) is bad
 * input naming --out, and when the journal holds finished settings the message says they are kept and
 * how to resume, instead of "nothing was written".
 */
function diskStep<T>(outDir: string, journal: string, kept: number, step: () => T): T {
  try {
    return step();
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const problem = err instanceof InputError ? null : outFolderWriteProblem(outDir, code);
    if (!(err instanceof InputError) && problem === null) throw err;
    const problems = err instanceof InputError ? err.problems : [problem as InputProblem];
    if (kept === 0) throw err instanceof InputError ? err : new InputError(problems);
    // Another folder would start over: the finished settings are in this one.
    const here = problems.map((p) => (p.message === 'the disk is full' ? { ...p, fix: 'free some space on that disk' } : p));
    throw new InputError(here, { kept: `the ${kept} finished settings are kept in ${journal}; when the problem is solved, run the same command again to resume.` });
  }
}

/** The message for an interrupted sweep: what is kept and how to go on. */
export function interruptedMessage(outcome: Extract<GridOutcome, { status: 'interrupted' }>): string {
  return `stopped after ${outcome.done} of ${outcome.total} settings; the finished ones are kept in ${outcome.journal}.\nRun the same command again to resume (or add --restart to start over).\n`;
}

function openJournal(path: string, fingerprint: string, grid: readonly { readonly key: string }[], o: { readonly restart: boolean; readonly now: () => Date }): { writer: JournalWriter; entries: JournalLineEntry[] } {
  const found = o.restart ? ({ status: 'absent' } as const) : readJournal(path, (grid.length + 1) * MAX_JOURNAL_LINE_BYTES);
  if (found.status === 'absent') {
    const header = { format: JOURNAL_FORMAT, version: JOURNAL_VERSION, grid: journalGridId(fingerprint), settings: grid.length, started: o.now().toISOString() } as const;
    try {
      return { writer: JournalWriter.create(path, header), entries: [] };
    } catch (err) {
      rmSync(`${path}.tmp-${process.pid}`, { force: true });
      throw err;
    }
  }
  if (found.header.grid !== journalGridId(fingerprint)) {
    throw new InputError([
      {
        file: path,
        field: '--restart',
        message: `holds ${found.entries.length} finished settings of a sweep started ${found.header.started} with other arguments or input files`,
        fix: 'run that sweep\'s command again to resume it, or add --restart to discard the journal and start this one',
      },
    ]);
  }
  if (found.header.settings !== grid.length) throw damagedJournal(path, `its header counts ${found.header.settings} settings, the grid has ${grid.length}`, 1);
  const keys = new Set(grid.map((point) => point.key));
  const seen = new Set<string>();
  const entries: JournalLineEntry[] = [];
  for (const entry of found.entries) {
    checkJournalEntry(path, fingerprint, entry);
    if (!keys.has(entry.key)) throw damagedJournal(path, `${entry.key} is not a setting of this grid`, entry.line);
    if (seen.has(entry.key)) continue;
    seen.add(entry.key);
    entries.push(entry);
  }
  return { writer: JournalWriter.resume(path, found.wholeBytes), entries };
}

function checkedThreads(threads: number): number {
  if (Number.isInteger(threads) && threads >= 1) return threads;
  throw new InputError([{ file: 'command line', field: '--threads', message: `${threads} is not a whole number of threads >= 1`, fix: 'give --threads 1 or more (1 runs without worker threads)' }]);
}
