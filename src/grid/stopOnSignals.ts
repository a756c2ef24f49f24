/** The signals that stop a long run gently: Ctrl-C (SIGINT) and the polite kill (SIGTERM, kill(1)'s default, a service manager's stop). */
export type StopSignal = 'SIGINT' | 'SIGTERM';

/** What a gently stopped run is told: which signal stopped it, for its exit code (128 + the signal's number). */
export interface SignalStop {
  readonly signal: AbortSignal;
  /** The first signal received, or undefined while none was. */
  received(): StopSignal | undefined;
  dispose(): void;
}

/**
 * Ctrl-C and SIGTERM for long runs: the first of them aborts the returned signal (a grid then starts no
 * new setting, lets the running ones finish and keeps them, and says how to resume); a second stops
 * the process at once, as if no handler were installed, after saying that the settings finished
 * before are kept (the settings running then are lost; the journal stays whole, because each of its
 * lines is written in one call). Call `dispose` when the run is over.
 */
export function stopOnSignals(say: (text: string) => void): SignalStop {
  const controller = new AbortController();
  let first: StopSignal | undefined;
  const on = (signal: StopSignal) => (): void => {
    if (first === undefined) {
      first = signal;
      controller.abort();
      const how = signal === 'SIGINT' ? 'press Ctrl-C again' : 'send SIGTERM again';
      say(`\nstopping: no new settings start, the running ones finish and are kept; ${how} to stop at once.\n`);
      return;
    }
    say('stopped at once: the settings finished before are kept in the journal in --out; run the same command again to resume.\n');
    dispose();
    process.kill(process.pid, signal);
  };
  const handlers = { SIGINT: on('SIGINT'), SIGTERM: on('SIGTERM') } as const;
  const dispose = (): void => {
    process.off('SIGINT', handlers.SIGINT);
    process.off('SIGTERM', handlers.SIGTERM);
  };
  process.on('SIGINT', handlers.SIGINT);
  process.on('SIGTERM', handlers.SIGTERM);
  return { signal: controller.signal, received: () => first, dispose };
}
