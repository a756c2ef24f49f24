import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runMain } from './runMain.js';

// --quiet: no progress bar and no notes on stderr even when stderr is a terminal; without it a
// terminal gets the bar (progress.ts), so the flag is what silences it.

const S = 'scenarios/halvorn/scenario.json';

const onTerminal = (argv: readonly string[]) => runMain(argv, { stderrIsTerminal: true });

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
