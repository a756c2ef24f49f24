import { describe, expect, it } from 'vitest';
import type { CliIo } from '../../src/cli/cliIo.js';
import { HELP_WIDTH, main } from '../../src/cli/main.js';

/** The help of `args` (every command's --help, and the program's), as printed. */
async function help(args: string[]): Promise<string> {
  let stdout = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: () => undefined, stderrIsTerminal: false };
  await main(['node', 'quantbid', ...args, '--help'], io);
  return stdout;
}

// The README promises help wrapped at 80 columns whatever the terminal: options (wrapped by commander
// at HELP_WIDTH) and the texts after them (wrapped by hand), examples included.
describe('every --help fits in 80 columns', () => {
  it('the width is 80', () => expect(HELP_WIDTH).toBe(80));
  for (const command of ['', 'plan', 'backtest', 'sweep', 'size', 'forecast', 'score', 'demo']) {
    it(`quantbid ${command} --help`, async () => {
      const text = await help(command === '' ? [] : [command]);
      expect(text.length).toBeGreaterThan(200);
      const long = text.split('\n').filter((line) => line.length > 80);
      expect(long, `${long.length} lines longer than 80 columns`).toEqual([]);
    });
  }
});
