import type { CliIo } from './cliIo.js';

/**
 * A one-line progress bar on stderr for long commands (sweep, size, backtest):
 *
 *   sweep [#########-----------] 43/96  44%  0:12 elapsed  ~0:15 left
 *
 * Drawn only when stderr is a terminal and not `quiet`, so pipes, files and scripts see nothing.
 * Redrawn in place (carriage return, erase to end of line) at most once per `minIntervalMs`.
 *
 * Notes: the estimate of time left is (total - done) x (elapsed since the first update) /
 * (done - done at the first update): work resumed from an earlier run counts as done but not as speed.
 */
export interface ProgressOptions {
  /** Units of work in all [-]. Required. */
  readonly total: number;
  /** Word before the bar, e.g. `sweep`. Default none. */
  readonly label?: string;
  /** Draw nothing (the --quiet flag). Default false. */
  readonly quiet?: boolean;
  /** Least time between two redraws [ms], default 100 (10 redraws a second). */
  readonly minIntervalMs?: number;
  /** Cells of the bar [-], default 20. */
  readonly barWidth?: number;
  /** Clock [ms]. Default `performance.now`. */
  readonly now?: () => number;
}

export const PROGRESS_DEFAULTS = Object.freeze({
  label: '',
  quiet: false,
  minIntervalMs: 100,
  barWidth: 20,
  now: (): number => performance.now(),
});

export interface Progress {
  /** Whether anything is drawn at all. */
  readonly active: boolean;
  /** Reports `done` units finished; redraws when the last draw is old enough. */
  update(done: number): void;
  /** Draws the final state and ends the line (only if anything was drawn). */
  finish(): void;
}

export function createProgress(io: CliIo, options: ProgressOptions): Progress {
  const o = { ...PROGRESS_DEFAULTS, ...options };
  const active = io.stderrIsTerminal && !o.quiet;
  const started = o.now();
  let first: { readonly done: number; readonly at: number } | undefined;
  let done = 0;
  let lastDraw = -Infinity;
  const draw = (at: number): void => {
    lastDraw = at;
    io.stderr(`\r${progressLine(o, done, at - started, timeLeft(at))}\x1b[K`);
  };
  const timeLeft = (at: number): number | undefined => {
    if (first === undefined || done <= first.done) return undefined;
    return ((o.total - done) * (at - first.at)) / (done - first.done);
  };
  return {
    active,
    update(value: number): void {
      done = value;
      if (!active) return;
      const at = o.now();
      first ??= { done: value, at };
      if (at - lastDraw >= o.minIntervalMs) draw(at);
    },
    finish(): void {
      if (!active || lastDraw === -Infinity) return;
      draw(o.now());
      io.stderr('\n');
    },
  };
}

/** The text of the bar for `done` of `total` after `elapsedMs`, with `leftMs` when known. */
export function progressLine(o: { readonly label: string; readonly total: number; readonly barWidth: number }, done: number, elapsedMs: number, leftMs: number | undefined): string {
  const fraction = o.total > 0 ? Math.min(1, done / o.total) : 1;
  const filled = Math.floor(fraction * o.barWidth);
  const bar = `[${'#'.repeat(filled)}${'-'.repeat(o.barWidth - filled)}]`;
  const left = leftMs === undefined ? '' : `  ~${formatDuration(leftMs)} left`;
  return `${o.label === '' ? '' : `${o.label} `}${bar} ${done}/${o.total}  ${Math.floor(fraction * 100)}%  ${formatDuration(elapsedMs)} elapsed${left}`;
}

/** `m:ss` below an hour, `h:mm:ss` from an hour on; whole seconds, rounded down. */
export function formatDuration(ms: number): string {
  const seconds = Math.max(0, Math.floor(ms / 1000));
  const [h, m, s] = [Math.floor(seconds / 3600), Math.floor((seconds % 3600) / 60), seconds % 60];
  const ss = String(s).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}
