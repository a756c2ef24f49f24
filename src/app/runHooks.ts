/**
 * What a use case tells the person running it while it works, handed in by the caller: the CLI
 * writes to stderr (cli/cliHooks.ts), a library caller may pass QUIET_HOOKS or its own. A use case
 * never writes to the terminal itself.
 */
export interface RunHooks {
  /** A note that --quiet silences, e.g. that crossing quantiles were sorted; text ends with a line break. */
  note(text: string): void;
  /** A message the person must see even with --quiet, e.g. how to resume a stopped grid. */
  warn(text: string): void;
  /** A progress display for `total` units of work, labelled `label` (e.g. `sweep`). */
  progress(label: string, total: number): ProgressDisplay;
}

/** A progress display: updated with the units done, finished once. */
export interface ProgressDisplay {
  update(done: number): void;
  finish(): void;
}

const NO_PROGRESS: ProgressDisplay = Object.freeze({ update: () => undefined, finish: () => undefined });

/** Hooks that say nothing and show no progress. */
export const QUIET_HOOKS: RunHooks = Object.freeze({ note: () => undefined, warn: () => undefined, progress: () => NO_PROGRESS });
