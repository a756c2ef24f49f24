import { OutputLock } from '../io/outputLock.js';

/**
 * Runs `body` holding the lock of the output folder `out` (io/outputLock.ts) from start to end, so that
 * a second run into the folder is refused while this one reads, computes and writes; the lock is
 * released however `body` ends (for a promise, when it settles). Without `out` (nothing is written)
 * no lock is taken.
 */
export function lockedRun<T>(out: string | undefined, command: string, body: (lock: OutputLock | undefined) => T): T {
  if (out === undefined) return body(undefined);
  const lock = OutputLock.take(out, command);
  let result: T;
  try {
    result = body(lock);
  } catch (err) {
    lock.release();
    throw err;
  }
  if (result instanceof Promise) return result.finally(() => lock.release()) as T;
  lock.release();
  return result;
}
