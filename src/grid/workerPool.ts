/**
 * Runs a task module for many settings, on worker threads or in this thread.
 *
 * Task-module contract (what a grid's task, e.g. one backtest per setting, must provide):
 * - It is an ES module file of compiled JavaScript, named by path or file URL, that a worker thread
 *   can import on its own: it may import anything, but must not rely on state set up by the caller.
 * - `export function run(setting, context): row` (or a Promise of a row). `setting` is one grid point,
 *   e.g. `{ alpha: 0.02, policy: 'quantile', unaccepted: 'follow-plan' }` (numbers as numbers, words
 *   as strings), of the type its axes give (SettingOf, expandGrid.ts): its values were checked when the
 *   axes were, so `run` reads them as they are. `row` is a plain object of result columns: names in lower snake case that differ from
 *   the axis names, the same names in the same order for every setting, cells finite numbers, strings
 *   without commas, quotes or line breaks, booleans or null. Numbers are written with formatNumber (6
 *   decimals at most).
 * - `run` must be deterministic: it may depend only on the setting and the context (seeded generators
 *   only, no clock). Then the output is the same for any number of threads and after a resume.
 * - `export function loadContext(input): context` (optional, may be async) is called once per thread
 *   that runs settings (this one and each worker) with the grid's `contextInput`, before any `run`: read and
 *   parse the input files there, not in `run`. Without it the context is `contextInput` itself.
 *   `contextInput` is copied into each worker by structured clone: pass paths and flags, not big data.
 * - To reject a setting as bad input (e.g. an alpha outside the forecast's levels), throw an
 *   InputError: it reaches the CLI as such (exit code 2). Any other throw is a fault naming the setting.
 *   Either stops the grid: no new settings start, running ones finish and are kept.
 *
 * Results are handed to `onResult` in the order the settings finish (not grid order), one at a time,
 * in this thread. After `signal` aborts, no new setting starts; the running ones finish and are handed
 * over, then the pool reports `stopped`.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { loadTask, taskModuleUrl, type GridRow } from './taskModule.js';
import { serialiseError, settingError, type SerialisedError } from './taskError.js';
import type { Setting } from './expandGrid.js';

/** One setting to run; `id` is the caller's (the grid index). */
export interface PoolJob {
  readonly id: number;
  readonly key: string;
  readonly setting: Setting;
}

export interface PoolOptions {
  /** Compiled task module: a path (absolute, or relative to the working folder) or a file URL. */
  readonly taskModule: string | URL;
  /** Handed to the task's loadContext once per worker, by structured clone. Default undefined. */
  readonly contextInput?: unknown;
  /** Threads [-], >= 1, this one included: n runs settings here and on n - 1 worker threads. Default os.availableParallelism(). */
  readonly threads?: number;
  /** Abort to stop handing out settings. */
  readonly signal?: AbortSignal;
}

export type PoolStatus = 'finished' | 'stopped';

/** Data a worker thread starts with. */
export interface WorkerInit {
  readonly taskModuleUrl: string;
  readonly contextInput: unknown;
}

/** Messages between this thread and a worker. */
export interface RunMessage {
  readonly id: number;
  readonly setting: Setting;
}
export type ResultMessage =
  | { readonly type: 'done'; readonly id: number; readonly row: GridRow }
  | { readonly type: 'failed'; readonly id: number; readonly error: SerialisedError };

export function defaultThreads(): number {
  return availableParallelism();
}

/**
 * Runs `jobs` (in the order given) and hands each result to `onResult` as it finishes. Resolves
 * `finished` when all ran, `stopped` when the signal stopped it first. On a failure (a task error, a
 * worker that died, or an error thrown by onResult) it starts no more jobs, lets the running ones
 * finish, and rejects with the failure of the earliest job in `jobs` order.
 */
export async function runPool(jobs: readonly PoolJob[], options: PoolOptions, onResult: (job: PoolJob, row: GridRow) => void): Promise<PoolStatus> {
  const url = taskModuleUrl(options.taskModule);
  const threads = Math.min(options.threads ?? defaultThreads(), jobs.length);
  if (jobs.length === 0) return 'finished';
  return runOnThreads(jobs, url, Math.max(1, threads), options, onResult);
}

/**
 * This thread runs settings, beside threads - 1 workers (none for one thread), so the first rows
 * come while the workers start (each boots, copies the context input and warms up, about a second on
 * a year of 15-minute data). A worker is handed its next setting ahead while more settings remain than
 * threads, so that it never waits for this thread to finish a setting before it gets more work.
 */
function runOnThreads(jobs: readonly PoolJob[], url: string, threads: number, options: PoolOptions, onResult: (job: PoolJob, row: GridRow) => void): Promise<PoolStatus> {
  return new Promise((resolvePool, rejectPool) => {
    const init: WorkerInit = { taskModuleUrl: url, contextInput: options.contextInput };
    const queued = new Map<Worker, number[]>(); // worker -> positions in jobs handed to it, oldest first
    let next = 0;
    let failure: { readonly position: number; readonly error: Error } | undefined;
    let settled = false;
    let hereBusy = false;
    let hereDone = false;
    const workers: Worker[] = [];

    const mayStart = (): boolean => failure === undefined && options.signal?.aborted !== true && next < jobs.length;
    const settleIfIdle = (): void => {
      if (settled || hereBusy || !hereDone) return;
      for (const positions of queued.values()) if (positions.length > 0) return;
      if (mayStart()) return;
      settled = true;
      void Promise.all(workers.map((w) => w.terminate())).then(() => {
        if (failure !== undefined) rejectPool(failure.error);
        else resolvePool(next < jobs.length ? 'stopped' : 'finished');
      });
    };
    // Jobs start in order, so every job before a failed one has started by then; keeping the earliest
    // failure reports the one a single thread meets first, for any number of threads.
    const fail = (position: number, error: Error): void => {
      if (failure === undefined || position < failure.position) failure = { position, error };
    };
    const hand = (worker: Worker, result: ResultMessage | null): void => {
      const positions = queued.get(worker) as number[];
      if (result !== null) {
        const position = positions.shift() as number;
        const job = jobs[position] as PoolJob;
        try {
          if (result.type === 'done') onResult(job, result.row);
          else fail(position, settingError(result.error, job.key));
        } catch (err) {
          fail(position, err instanceof Error ? err : new Error(String(err)));
        }
      }
      const depth = jobs.length - next > threads ? 2 : 1;
      while (positions.length < depth && mayStart()) {
        const job = jobs[next] as PoolJob;
        positions.push(next++);
        worker.postMessage({ id: job.id, setting: job.setting } satisfies RunMessage);
      }
      settleIfIdle();
    };
    const lost = (worker: Worker, reason: string): void => {
      const positions = queued.get(worker) as number[];
      const position = positions[0];
      if (position === undefined) return;
      positions.length = 0;
      fail(position, new Error(`a sweep worker thread ${reason} while running setting ${jobs[position]?.key}`));
      settleIfIdle();
    };

    for (let i = 1; i < threads; i++) {
      const worker = new Worker(new URL('./poolWorker.js', import.meta.url), { workerData: init });
      workers.push(worker);
      queued.set(worker, []);
      worker.on('message', (message: ResultMessage) => hand(worker, message));
      worker.on('error', (err) => lost(worker, `failed (${err.message})`));
      worker.on('exit', (code) => lost(worker, `stopped with exit code ${code}`));
      hand(worker, null);
    }

    // This thread: one setting at a time, letting the workers' messages in between.
    const task = loadTask(url, options.contextInput);
    // A failed load is reported with this thread's first setting, as a worker does.
    task.catch(() => undefined);
    void (async (): Promise<void> => {
      for (;;) {
        await new Promise((resolve) => setImmediate(resolve));
        if (!mayStart()) break;
        const position = next++;
        const job = jobs[position] as PoolJob;
        hereBusy = true;
        let row: GridRow | undefined;
        try {
          row = await (await task).run(job.setting);
        } catch (err) {
          fail(position, settingError(serialiseError(err), job.key));
        }
        try {
          if (row !== undefined) onResult(job, row);
        } catch (err) {
          fail(position, err instanceof Error ? err : new Error(String(err)));
        }
        hereBusy = false;
      }
      hereDone = true;
      settleIfIdle();
    })();
  });
}
