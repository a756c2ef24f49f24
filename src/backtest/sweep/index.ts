/** The sweep engine: grids of settings, a worker pool running a task module, a resume journal. */
export { parseExactDecimal, exactDecimalText, parseDecimalRange } from './decimalRange.js';
export { parseNumberAxis, parseWordAxis, parseAxes, axisValueText, AXIS_DEFAULTS } from './sweepAxis.js';
export type { AxisValue, SweepAxis, NumberAxisOptions } from './sweepAxis.js';
export { expandGrid, settingKey, GRID_DEFAULTS } from './sweepGrid.js';
export type { GridPoint, Setting } from './sweepGrid.js';
export type { RowCell, SweepRow, TaskModule } from './taskModule.js';
export { runPool, defaultThreads } from './workerPool.js';
export type { PoolJob, PoolOptions, PoolStatus } from './workerPool.js';
export { runSweep, interruptedMessage, journalName, SWEEP_DEFAULTS } from './runSweep.js';
export type { SweepOptions, SweepOutcome, SweepResult } from './runSweep.js';
export { readJournal } from './sweepJournal.js';
export type { JournalHeader, JournalEntry } from './sweepJournal.js';
export { sweepFingerprint, canonicalJson } from './sweepFingerprint.js';
export { stopOnSigint } from './stopOnSigint.js';
