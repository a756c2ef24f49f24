/** The grid engine of sweep and size: grids of typed settings, a worker pool running a task module, a resume journal. */
export { parseExactDecimal, exactDecimalText, parseDecimalRange } from './decimalRange.js';
export { parseNumberAxis, parseWordAxis, parseAxes, axisValueText, AXIS_DEFAULTS } from './gridAxis.js';
export type { AxisValue, GridAxis, NumberAxisOptions } from './gridAxis.js';
export { expandGrid, settingKey, GRID_DEFAULTS } from './expandGrid.js';
export type { GridPoint, Setting, SettingOf } from './expandGrid.js';
export type { RowCell, GridRow, TaskModule } from './taskModule.js';
export { runPool, defaultThreads, startPoolWorkers, PoolWorkers } from './workerPool.js';
export type { PoolJob, PoolOptions, PoolStatus } from './workerPool.js';
export { runGrid, interruptedMessage, journalName, GRID_RUN_DEFAULTS } from './runGrid.js';
export type { GridOptions, GridOutcome, GridResult, MoreSetting } from './runGrid.js';
export { readJournal, journalDigest } from './gridJournal.js';
export type { JournalHeader, JournalEntry } from './gridJournal.js';
export { gridFingerprint, canonicalJson } from './gridFingerprint.js';
export { stopOnSignals } from './stopOnSignals.js';
export type { SignalStop, StopSignal } from './stopOnSignals.js';
