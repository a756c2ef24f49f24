import type { GridAxis } from '../grid/gridAxis.js';
import type { SettingOf } from '../grid/expandGrid.js';
import type { GridRow } from '../grid/taskModule.js';
import { interruptedMessage, runGrid, type GridOptions, type GridOutcome } from '../grid/runGrid.js';
import { stopOnSigint } from '../grid/stopOnSigint.js';
import type { Interrupted } from './commandResult.js';
import type { RunHooks } from './runHooks.js';

/**
 * Runs a grid of a command (runGrid) with a progress display and Ctrl-C handling: the first Ctrl-C
 * lets the running settings finish and keeps them in the journal; the run then returns `interrupted`
 * with how to resume (the CLI ends with exit code 130).
 */
export async function runCommandGrid<const Axes extends readonly GridAxis[], Input, Row extends GridRow>(
  hooks: RunHooks,
  label: string,
  options: Omit<GridOptions<Axes, Input, Row>, 'signal' | 'onProgress'>,
): Promise<Extract<GridOutcome<SettingOf<Axes>, Row>, { status: 'complete' }> | Interrupted> {
  const total = options.axes.reduce((product, axis) => product * axis.values.length, 1);
  const progress = hooks.progress(label, total);
  const stop = stopOnSigint((text) => hooks.warn(text));
  let outcome: GridOutcome<SettingOf<Axes>, Row>;
  try {
    outcome = await runGrid<Axes, Input, Row>({ ...options, signal: stop.signal, onProgress: (done) => progress.update(done) });
  } finally {
    stop.dispose();
    progress.finish();
  }
  if (outcome.status === 'interrupted') return { status: 'interrupted', message: interruptedMessage(outcome) };
  return outcome;
}
