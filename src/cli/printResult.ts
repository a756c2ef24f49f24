import { printedText, type Done, type Interrupted } from '../app/commandResult.js';
import { terminalJson, terminalText } from '../errors/shownText.js';
import type { CliIo } from './cliIo.js';

/** Exit codes of a grid command stopped by Ctrl-C and by SIGTERM (128 + the signal's number, the shell's convention). */
export const EXIT_INTERRUPTED = 130;
export const EXIT_TERMINATED = 143;

/**
 * Prints what a use case returned: the summary as JSON with `--json`, else the human summary, on
 * stdout. A stopped grid says how to resume on stderr and ends the process with exit code 130, or 143
 * after SIGTERM (`exit`, injectable for tests): main() maps only 0, 1 and 2, and nothing is left to write.
 */
export function printResult(io: CliIo, result: Done<unknown> | Interrupted, json: boolean, exit: (code: number) => never = (code) => process.exit(code)): void {
  if (result.status === 'interrupted') {
    io.stderr(terminalText(result.message));
    exit(result.signal === 'SIGTERM' ? EXIT_TERMINATED : EXIT_INTERRUPTED);
  }
  // Inputs reach the summaries (a currency label, paths): nothing they hold may act on the terminal.
  const text = printedText(result, json);
  io.stdout(json ? terminalJson(text) : terminalText(text));
}
