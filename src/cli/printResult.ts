import { printedText, type Done, type Interrupted } from '../app/commandResult.js';
import type { CliIo } from './cliIo.js';

/** Exit code of a grid command stopped by Ctrl-C (128 + SIGINT, the shell's convention). */
export const EXIT_INTERRUPTED = 130;

/**
 * Prints what a use case returned: the summary as JSON with `--json`, else the human summary, on
 * stdout. A stopped grid says how to resume on stderr and ends the process with exit code 130
 * (`exit`, injectable for tests): main() maps only 0, 1 and 2, and nothing is left to write.
 */
export function printResult(io: CliIo, result: Done<unknown> | Interrupted, json: boolean, exit: (code: number) => never = (code) => process.exit(code)): void {
  if (result.status === 'interrupted') {
    io.stderr(result.message);
    exit(EXIT_INTERRUPTED);
  }
  io.stdout(printedText(result, json));
}
