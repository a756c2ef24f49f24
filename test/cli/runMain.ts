import type { CliIo } from '../../src/cli/cliIo.js';
import { main } from '../../src/cli/main.js';

/** What one in-process CLI run returned and printed. */
export interface MainRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

/** Runs `quantbid ...argv` in this process through main() with captured output (stderr a terminal or not). */
export async function runMain(argv: readonly string[], options: { readonly stderrIsTerminal?: boolean } = {}): Promise<MainRun> {
  let stdout = '';
  let stderr = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: options.stderrIsTerminal === true };
  const code = await main(['node', 'quantbid', ...argv], io);
  return { code, stdout, stderr };
}

/** Every command of the CLI, in the order its help lists them. */
export const COMMANDS = ['plan', 'backtest', 'sweep', 'size', 'forecast', 'score', 'demo'] as const;
