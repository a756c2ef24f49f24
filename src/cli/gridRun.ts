import { interruptedMessage, runSweep, type SweepOptions, type SweepOutcome } from '../backtest/sweep/runSweep.js';
import { stopOnSigint } from '../backtest/sweep/stopOnSigint.js';
import type { CliIo } from './cliIo.js';
import { createProgress } from './progress.js';

/** Exit code of a grid command stopped by Ctrl-C (128 + SIGINT, the shell's convention). */
export const EXIT_INTERRUPTED = 130;

export type CompleteSweep = Extract<SweepOutcome, { status: 'complete' }>;

/**
 * Runs a grid (runSweep) with a progress bar on stderr (only on a terminal, not with `quiet`) and
 * Ctrl-C handling: the first Ctrl-C lets the running settings finish and keeps them in the journal,
 * prints how to resume, and ends the process with exit code 130 (`exit`, injectable for tests).
 */
export async function runGrid(
  io: CliIo,
  label: string,
  quiet: boolean,
  options: Omit<SweepOptions, 'signal' | 'onProgress'>,
  exit: (code: number) => never = (code) => process.exit(code),
): Promise<CompleteSweep> {
  const total = options.axes.reduce((product, axis) => product * axis.values.length, 1);
  const progress = createProgress(io, { total, label, quiet });
  const stop = stopOnSigint((text) => io.stderr(text));
  let outcome: SweepOutcome;
  try {
    outcome = await runSweep({ ...options, signal: stop.signal, onProgress: (done) => progress.update(done) });
  } finally {
    stop.dispose();
    progress.finish();
  }
  if (outcome.status === 'interrupted') {
    io.stderr(interruptedMessage(outcome));
    // main() maps only 0, 1 and 2; the interrupted run has nothing left to write, so it ends here.
    return exit(EXIT_INTERRUPTED);
  }
  return outcome;
}
