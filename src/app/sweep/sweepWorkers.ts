import { parseNumberAxis } from '../../grid/gridAxis.js';
import { defaultThreads, startPoolWorkers, type PoolWorkers } from '../../grid/workerPool.js';
import { SWEEP_REFERENCE_POLICIES } from '../../backtest/backtestPolicy.js';

/** The sweep's flags that decide how many workers it can use. */
export interface SweepWorkerFlags {
  readonly threads?: number | undefined;
  readonly alphas: string;
  readonly policies: string;
  readonly unaccepted: string;
}

/**
 * The worker threads of a sweep (default: all cores, this one included), started at once: each boots
 * and imports the sweep's task module while this thread loads the use case and reads the inputs, and
 * gets the inputs when the grid starts (sweepUseCase). No more than the sweep has settings for (its grid
 * and reference rows, counted from the flags' text), none when that text is wrong (the use case says
 * what is wrong). Loads nothing but the pool and the axis parser, so a command can start them before
 * it imports anything heavy.
 */
export function startSweepWorkers(flags: SweepWorkerFlags): PoolWorkers {
  const url = new URL('./sweepTask.js', import.meta.url);
  const words = (text: string): number => text.split(',').filter((word) => word.trim() !== '').length;
  let settings: number;
  try {
    const rules = words(flags.unaccepted);
    settings = parseNumberAxis('alpha', '--alphas', flags.alphas).values.length * words(flags.policies) * rules + SWEEP_REFERENCE_POLICIES.length * rules;
  } catch {
    settings = 0;
  }
  return startPoolWorkers(url, Math.min(flags.threads ?? defaultThreads(), settings));
}
