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
 * A job may name a `group`: jobs of one group share work that a thread does once and keeps in its
 * context (a sweep's reference runs of one unaccepted rule), and the pool keeps each thread on one
 * group while it can (jobSchedule.ts). Workers may be started ahead (startPoolWorkers), so that they
 * boot and import the task module while this thread still reads the inputs.
 *
 * Results are handed to `onResult` in the order the settings finish (not grid order), one at a time,
 * in this thread. After `signal` aborts, no new setting starts; the running ones finish and are handed
 * over, then the pool reports `stopped`.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { JobSchedule } from './jobSchedule.js';
import { loadTask, taskModuleUrl, type GridRow } from './taskModule.js';
import { serialiseError, settingError, type SerialisedError } from './taskError.js';
import type { Setting } from './expandGrid.js';

/** One setting to run; `id` is the caller's (the grid index). */
export interface PoolJob {
  readonly id: number;
  readonly key: string;
  readonly setting: Setting;
  /** Jobs of one group share work a thread does once (jobSchedule.ts); without one, all jobs are one group. */
  readonly group?: string;
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
  /**
   * Workers started ahead for this task module (startPoolWorkers): the pool runs on them (starting more
   * when they are too few) and stops them all when it ends. Default none: the pool starts its own.
   */
  readonly workers?: PoolWorkers;
}

export type PoolStatus = 'finished' | 'stopped';

/** Data a worker thread starts with. */
export interface WorkerInit {
  readonly taskModuleUrl: string;
}

/** Messages from this thread to a worker: its context input once, then settings. */
export type ToWorkerMessage = { readonly type: 'context'; readonly contextInput: unknown } | RunMessage;
export interface RunMessage {
  readonly type: 'run';
  readonly id: number;
  readonly setting: Setting;
}
export type ResultMessage =
  | { readonly type: 'done'; readonly id: number; readonly row: GridRow }
  | { readonly type: 'failed'; readonly id: number; readonly error: SerialisedError };

export function defaultThreads(): number {
  return availableParallelism();
}

/** A worker thread of the pool; a failure or exit is kept until the pool listens. */
class PoolThread {
  // Private, so that the package's declarations do not name node:worker_threads (a typed use of the
  // library must not need Node's types).
  private readonly worker: Worker;
  private lostReason: string | undefined;
  private onLost: ((reason: string) => void) | undefined;
  private onResult: ((message: ResultMessage) => void) | undefined;
  private contextSent = false;
  private contextInput: unknown;

  constructor(taskModuleUrl: string) {
    this.worker = new Worker(new URL('./poolWorker.js', import.meta.url), { workerData: { taskModuleUrl } satisfies WorkerInit });
    // Until a pool runs on it, a worker does not keep the process alive (a run may end before its grid starts).
    this.worker.unref();
    this.worker.on('message', (message: ResultMessage) => this.onResult?.(message));
    this.worker.on('error', (err) => this.lose(`failed (${err.message})`));
    this.worker.on('exit', (code) => this.lose(`stopped with exit code ${code}`));
  }

  /** Sends the context input, once: the worker builds its context while the pool is made ready. */
  sendContext(contextInput: unknown): void {
    if (this.contextSent) {
      if (contextInput !== this.contextInput) throw new Error('a pool worker was given two context inputs');
      return;
    }
    this.contextSent = true;
    this.contextInput = contextInput;
    this.worker.postMessage({ type: 'context', contextInput } satisfies ToWorkerMessage);
  }

  /** Hands the worker to a pool: its context (unless sent already), and where its results and its loss go. */
  attach(contextInput: unknown, onResult: (message: ResultMessage) => void, onLost: (reason: string) => void): void {
    this.worker.ref();
    this.onResult = onResult;
    this.onLost = onLost;
    this.sendContext(contextInput);
    if (this.lostReason !== undefined) onLost(this.lostReason);
  }

  /** Hands the worker a message. */
  post(message: ToWorkerMessage): void {
    this.worker.postMessage(message);
  }

  /** Stops the worker. */
  terminate(): Promise<number> {
    return this.worker.terminate();
  }

  /** Whether the worker failed or exited. */
  get lost(): boolean {
    return this.lostReason !== undefined;
  }

  private lose(reason: string): void {
    if (this.lostReason !== undefined) return;
    this.lostReason = reason;
    this.onLost?.(reason);
  }
}

/** Worker threads started ahead of their pool (startPoolWorkers). */
export class PoolWorkers {
  private readonly threads: PoolThread[];

  constructor(readonly taskModuleUrl: string, count: number) {
    this.threads = Array.from({ length: count }, () => new PoolThread(taskModuleUrl));
  }

  /** Workers started and neither taken by a pool nor stopped. */
  get waiting(): number {
    return this.threads.length;
  }

  /**
   * Sends the workers their context input before their pool runs (runGrid does so as it starts, before
   * it fingerprints the inputs and opens the journal); the pool must run with the same input.
   */
  sendContext(contextInput: unknown): void {
    for (const thread of this.threads) thread.sendContext(contextInput);
  }

  /** Up to `count` of the workers for a pool, started more where too few; the rest are stopped. */
  take(count: number): PoolThread[] {
    const taken = this.threads.splice(0, count);
    while (taken.length < count) taken.push(new PoolThread(this.taskModuleUrl));
    void this.stop();
    return taken;
  }

  /** Stops the workers no pool has taken (a run that ends before its grid). */
  async stop(): Promise<void> {
    const idle = this.threads.splice(0);
    await Promise.all(idle.map((thread) => thread.terminate()));
  }
}

/**
 * Starts the workers of a pool of `threads` threads (threads - 1 workers) for `taskModule` at once:
 * each boots and imports the task module while this thread goes on (reads the inputs, say); the pool
 * then hands them their context. None for one thread, or for a thread count that is not a whole number
 * >= 2 (the grid refuses it later). Pass them to runPool (or runGrid), or stop them.
 */
export function startPoolWorkers(taskModule: string | URL, threads: number): PoolWorkers {
  return new PoolWorkers(taskModuleUrl(taskModule), Number.isInteger(threads) && threads >= 2 ? threads - 1 : 0);
}

/**
 * Runs `jobs` and hands each result to `onResult` as it finishes: in the order given, kept to groups
 * where the jobs have them. Resolves `finished` when all ran, `stopped` when the signal stopped it
 * first. On a failure (a task error, a worker that died, or an error thrown by onResult) it starts
 * only the jobs before the failed one that have not started, lets the running ones finish, and rejects
 * with the failure of the earliest job in `jobs` order.
 */
export async function runPool(jobs: readonly PoolJob[], options: PoolOptions, onResult: (job: PoolJob, row: GridRow) => void): Promise<PoolStatus> {
  const url = taskModuleUrl(options.taskModule);
  if (options.workers !== undefined && options.workers.taskModuleUrl !== url) throw new Error(`runPool: the workers were started for ${options.workers.taskModuleUrl}, not ${url}`);
  const threads = Math.max(1, Math.min(options.threads ?? defaultThreads(), jobs.length));
  if (jobs.length === 0) {
    await options.workers?.stop();
    return 'finished';
  }
  return runOnThreads(jobs, url, threads, options, onResult);
}

/**
 * This thread runs settings, beside threads - 1 workers (none for one thread), so the first rows
 * come while the workers start (each boots, imports the task module and builds its context from the
 * input). A worker is handed its next setting ahead while more settings remain than threads, so that
 * it never waits for this thread to finish a setting before it gets more work.
 */
function runOnThreads(jobs: readonly PoolJob[], url: string, threads: number, options: PoolOptions, onResult: (job: PoolJob, row: GridRow) => void): Promise<PoolStatus> {
  return new Promise((resolvePool, rejectPool) => {
    const schedule = new JobSchedule(jobs.map((job) => job.group), threads);
    const queued: number[][] = []; // per worker: positions in jobs handed to it, oldest first
    let failure: { readonly position: number; readonly error: Error } | undefined;
    let settled = false;
    let hereBusy = false;
    let hereDone = false;
    const workers = (options.workers ?? new PoolWorkers(url, 0)).take(threads - 1);

    // After a failure only the jobs before it start: the earliest failure is then the one a single thread meets first.
    const limit = (): number => (options.signal?.aborted === true ? 0 : (failure?.position ?? jobs.length));
    const next = (thread: number): number | undefined => schedule.take(thread, limit());
    const settleIfIdle = (): void => {
      if (settled || hereBusy || !hereDone) return;
      if (queued.some((positions) => positions.length > 0)) return;
      // Every thread is idle; a job left before the limit would be a fault of the schedule, not a hang.
      if (schedule.anyBefore(limit())) fail(jobs.length, new Error('the grid pool stopped with settings that no thread would run'));
      settled = true;
      void Promise.all(workers.map((thread) => thread.terminate())).then(() => {
        if (failure !== undefined) rejectPool(failure.error);
        else resolvePool(schedule.left > 0 ? 'stopped' : 'finished');
      });
    };
    const fail = (position: number, error: Error): void => {
      if (failure === undefined || position < failure.position) failure = { position, error };
    };
    const hand = (w: number, result: ResultMessage | null): void => {
      const positions = queued[w] as number[];
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
      const depth = schedule.left > threads ? 2 : 1;
      while (positions.length < depth && workers[w]?.lost !== true) {
        const position = next(w + 1);
        if (position === undefined) break;
        positions.push(position);
        const job = jobs[position] as PoolJob;
        workers[w]?.post({ type: 'run', id: job.id, setting: job.setting } satisfies ToWorkerMessage);
      }
      settleIfIdle();
    };
    const lost = (w: number, reason: string): void => {
      if (settled) return; // stopped by the pool itself
      const positions = queued[w] as number[];
      const position = positions[0];
      positions.length = 0;
      // Lost between settings (or before its first): no new setting starts, and the loss is what the pool reports.
      if (position === undefined) fail(-1, new Error(`a sweep worker thread ${reason} between settings`));
      else fail(position, new Error(`a sweep worker thread ${reason} while running setting ${jobs[position]?.key}`));
      settleIfIdle();
    };

    workers.forEach((thread, w) => {
      queued.push([]);
      thread.attach(options.contextInput, (message) => hand(w, message), (reason) => lost(w, reason));
      hand(w, null);
    });

    // This thread: one setting at a time, letting the workers' messages in between.
    const task = loadTask(url, options.contextInput);
    // A failed load is reported with this thread's first setting, as a worker does.
    task.catch(() => undefined);
    void (async (): Promise<void> => {
      for (;;) {
        await new Promise((resolve) => setImmediate(resolve));
        const position = next(0);
        if (position === undefined) break;
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
