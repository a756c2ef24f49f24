import { defaultThreads, startPoolWorkers, type PoolWorkers } from '../../grid/workerPool.js';

/**
 * The worker threads of a sweep on `threads` threads (default all cores), started at once: each boots
 * and imports the sweep's task module while this thread loads the use case and reads the inputs, and
 * gets the inputs when the grid starts (sweepUseCase). Loads nothing but the pool, so a command can
 * start them before it imports anything heavy.
 */
export function startSweepWorkers(threads: number | undefined): PoolWorkers {
  return startPoolWorkers(new URL('./sweepTask.js', import.meta.url), threads ?? defaultThreads());
}
