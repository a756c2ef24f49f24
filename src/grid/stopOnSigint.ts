/**
 * Ctrl-C for long runs: the first SIGINT aborts the returned signal (a grid then starts no new
 * setting, lets the running ones finish and keeps them); a second SIGINT stops the process at once, as
 * if no handler were installed (the settings running then are lost; the journal stays whole, because
 * each of its lines is written in one call). Call `dispose` when the run is over.
 */
export function stopOnSigint(say: (text: string) => void): { readonly signal: AbortSignal; dispose(): void } {
  const controller = new AbortController();
  const onSigint = (): void => {
    if (!controller.signal.aborted) {
      controller.abort();
      say('\nstopping: no new settings start, the running ones finish and are kept; press Ctrl-C again to stop at once.\n');
      return;
    }
    dispose();
    process.kill(process.pid, 'SIGINT');
  };
  const dispose = (): void => {
    process.off('SIGINT', onSigint);
  };
  process.on('SIGINT', onSigint);
  return { signal: controller.signal, dispose };
}
