import type { RunHooks } from '../app/runHooks.js';
import { terminalText } from '../errors/shownText.js';
import type { CliIo } from './cliIo.js';
import { createProgress } from './progress.js';

/**
 * The hooks a use case reports through, on the terminal: notes on stderr unless `quiet`, warnings on
 * stderr always, progress bars on stderr when it is a terminal and not `quiet` (createProgress). Notes
 * and warnings pass through terminalText: what an input put into them cannot act on the terminal.
 */
export function cliHooks(io: CliIo, quiet: boolean): RunHooks {
  return {
    note: (text) => {
      if (!quiet) io.stderr(terminalText(text));
    },
    warn: (text) => io.stderr(terminalText(text)),
    progress: (label, total) => createProgress(io, { total, label, quiet }),
  };
}
