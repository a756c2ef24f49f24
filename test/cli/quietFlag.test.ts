import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/cliIo.js';

// --quiet: no progress bar and no notes on stderr even when stderr is a terminal; without it a
// terminal gets the bar (progress.ts), so the flag is what silences it.

const S = 'scenarios/halvorn/scenario.json';

async function onTerminal(argv: readonly string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: true };
  const code = await main(['node', 'quantbid', ...argv], io);
  return { code, stdout, stderr };
}

const out = () => join(mkdtempSync(join(tmpdir(), 'quantbid-quiet-')), 'out');

describe('--quiet on a terminal', () => {
  for (const [name, argv] of [
    ['backtest', ['backtest', '--scenario', S, '--from', '2026-03-01', '--to', '2026-03-02', '--policies', 'quantile']],
    ['forecast', ['forecast', '--scenario', S, '--from', '2026-03-01', '--to', '2026-03-01', '--method', 'naive-hs']],
  ] as const) {
    it(`${name}: a progress bar without --quiet, nothing on stderr with it; stdout the same`, async () => {
      const loud = await onTerminal([...argv, '--out', out()]);
      expect(loud.code).toBe(0);
      expect(loud.stderr).toMatch(new RegExp(`^\\r${name} \\[[#-]+\\] `));
      const quiet = await onTerminal([...argv, '--out', out(), '--quiet']);
      expect(quiet).toMatchObject({ code: 0, stderr: '' });
      expect(quiet.stdout.split('\n').length).toBe(loud.stdout.split('\n').length);
    });
  }
});
