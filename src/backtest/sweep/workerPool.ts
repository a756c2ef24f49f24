/**
 * Runs a task module for many settings, on worker threads or in this thread.
 *
 * Task-module contract (what a sweep task, e.g. one backtest per setting, must provide):
 * - It is an ES module file of compiled JavaScript, named by path or file URL, that a worker thread
 *   can import on its own: it may import anything, but must not rely on state set up by the caller.
 * - `export function run(setting, context): row` (or a Promise of a row). `setting` is one grid point,
 *   e.g. `{ alpha: 0.02, policy: 'quantile', unaccepted: 'follow-plan' }` (numbers as numbers, words
 *   as strings). `row` is a plain object of result columns: names in lower snake case that differ from
 *   the axis names, the same names in the same order for every setting, cells finite numbers, strings
 *   without commas, quotes or line breaks, booleans or null. Numbers are written with formatNumber (6
 *   decimals at most).
 * - `run` must be deterministic: it may depend only on the setting and the context (seeded generators
 *   only, no clock). Then the output is the same for any number of threads and after a resume.
 * - `export function loadContext(input): context` (optional, may be async) is called once per worker
 *   thread (once in all with one thread) with the sweep's `contextInput`, before any `run`: read and
 *   parse the input files there, not in `run`. Without it the context is `contextInput` itself.
 *   `contextInput` is copied into each worker by structured clone: pass paths and flags, not big data.
 * - To reject a setting as bad input (e.g. an alpha outside the forecast's levels), throw an
 *   InputError: it reaches the CLI as such (exit code 2). Any other throw is a fault naming the setting.
 *   Either stops the sweep: no new settings start, running ones finish and are kept.
 *
 * Results are handed to `onResult` in the order the settings finish (not grid order), one at a time,
 * in this thread. After `signal` aborts, no new setting starts; the running ones finish and are handed
 * over, then the pool reports `stopped`.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { loadTask, taskModuleUrl, type SweepRow } from './taskModule.js';
import { serialiseError, settingError, type SerialisedError } from './taskError.js';
import type { Setting } from './sweepGrid.js';

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
  /** Worker threads [-], >= 1; 1 runs in this thread without workers. Default os.availableParallelism(). */
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
  | { readonly type: 'done'; readonly id: number; readonly row: SweepRow }
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
export async function runPool(jobs: readonly PoolJob[], options: PoolOptions, onResult: (job: PoolJob, row: SweepRow) => void): Promise<PoolStatus> {
  const url = taskModuleUrl(options.taskModule);
  const threads = Math.min(options.threads ?? defaultThreads(), jobs.length);
  if (jobs.length === 0) return 'finished';
  if (threads <= 1) return runInThisThread(jobs, url, options, onResult);
  return runOnWorkers(jobs, url, threads, options, onResult);
}

async function runInThisThread(jobs: readonly PoolJob[], url: string, options: PoolOptions, onResult: (job: PoolJob, row: SweepRow) => void): Promise<PoolStatus> {
  const task = await loadTask(url, options.contextInput);
  for (const job of jobs) {
    if (options.signal?.aborted === true) return 'stopped';
    let row: SweepRow;
    try {
      row = await task.run(job.setting);
    } catch (err) {
      throw settingError(serialiseError(err), job.key);
    }
    onResult(job, row);
    // Let signals and timers in between settings.
    await new Promise((resolve) => setImmediate(resolve));
  }
  return 'finished';
}

function runOnWorkers(jobs: readonly PoolJob[], url: string, threads: number, options: PoolOptions, onResult: (job: PoolJob, row: SweepRow) => void): Promise<PoolStatus> {
  return new Promise((resolvePool, rejectPool) => {
    const init: WorkerInit = { taskModuleUrl: url, contextInput: options.contextInput };
    const running = new Map<Worker, number>(); // worker -> position in jobs of the job it runs
    let next = 0;
    let failure: { readonly position: number; readonly error: Error } | undefined;
    let settled = false;
    const workers: Worker[] = [];

    const settleIfIdle = (): void => {
      if (settled || running.size > 0) return;
      if (failure === undefined && next < jobs.length && options.signal?.aborted !== true) return;
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
    const dispatch = (worker: Worker): void => {
      const job = jobs[next];
      if (failure !== undefined || options.signal?.aborted === true || job === undefined) return settleIfIdle();
      running.set(worker, next++);
      worker.postMessage({ id: job.id, setting: job.setting } satisfies RunMessage);
    };
    const finished = (worker: Worker, message: ResultMessage): void => {
      const position = running.get(worker) as number;
      const job = jobs[position] as PoolJob;
      running.delete(worker);
      try {
        if (message.type === 'done') onResult(job, message.row);
        else fail(position, settingError(message.error, job.key));
      } catch (err) {
        fail(position, err instanceof Error ? err : new Error(String(err)));
      }
      dispatch(worker);
    };
    const lost = (worker: Worker, reason: string): void => {
      const position = running.get(worker);
      if (position === undefined) return;
      running.delete(worker);
      fail(position, new Error(`a sweep worker thread ${reason} while running setting ${jobs[position]?.key}`));
      settleIfIdle();
    };

    for (let i = 0; i < threads; i++) {
      const worker = new Worker(new URL('./poolWorker.js', import.meta.url), { workerData: init });
      workers.push(worker);
      worker.on('message', (message: ResultMessage) => finished(worker, message));
      worker.on('error', (err) => lost(worker, `failed (${err.message})`));
      worker.on('exit', (code) => lost(worker, `stopped with exit code ${code}`));
      dispatch(worker);
    }
  });
}
