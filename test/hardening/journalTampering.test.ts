import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkBuild, quantbid, quantbidStoppedAfter, writeScenario, type Scenario } from '../cli/sweepScenario.js';

/**
 * The sweep journal read back like any input: a sweep stopped with Ctrl-C keeps its finished settings
 * in `.sweep-journal.jsonl`; a journal line edited afterwards (an empty row, a value that is not a
 * number, a huge profit, a formula or markup text) is refused as damaged with exit code 2 and the way
 * out (--restart), the journal and the folder stay as they were, and no edited value reaches sweep.csv.
 */
let scenario: Scenario;
beforeAll(() => {
  checkBuild();
  scenario = writeScenario('journal-tampering', { days: 4 });
});

const sweepArgs = (out: string, extra: readonly string[] = []) => ['sweep', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--alphas', '0.05:0.45:0.1', '--threads', '1', '--out', out, ...extra];

describe('a hand-edited sweep journal', () => {
  it('is refused as damaged (exit code 2, --restart named) whatever the edit; --restart then runs afresh', async () => {
    const out = join(scenario.dir, 'tampered');
    const journal = join(out, '.sweep-journal.jsonl');
    const stopped = await quantbidStoppedAfter(sweepArgs(out), journal, 1, 'SIGINT');
    expect(stopped.code).toBe(130);
    const [header, first] = readFileSync(journal, 'utf8').split('\n') as [string, string];
    const entry = JSON.parse(first) as { key: string; row: Record<string, unknown>; digest: string };
    const edits: Record<string, object> = {
      'an empty row': { ...entry, row: {} },
      'a text for a number': { ...entry, row: { ...entry.row, profit: 'lots' } },
      'a huge profit': { ...entry, row: { ...entry.row, profit: 999999999 } },
      'a formula': { ...entry, row: { ...entry.row, profit: '=cmd|x' } },
      'markup': { ...entry, row: { ...entry.row, profit: '<script>' } },
      'no digest': { key: entry.key, row: entry.row },
    };
    for (const [what, edited] of Object.entries(edits)) {
      const text = `${header}\n${JSON.stringify(edited)}\n`;
      writeFileSync(journal, text);
      const run = quantbid(sweepArgs(out));
      expect(run.code, what).toBe(2);
      expect(run.stderr, what).toMatch(new RegExp(`^${journal}:2: the journal is damaged: [^\\n]+; add --restart to discard it and start over\\nnothing was written\\.\\n$`));
      expect(readFileSync(journal, 'utf8'), what).toBe(text);
      expect(existsSync(join(out, 'sweep.csv')), what).toBe(false);
    }
    const restarted = quantbid(sweepArgs(out, ['--restart']));
    expect(restarted.code, restarted.stderr).toBe(0);
    const table = readFileSync(join(out, 'sweep.csv'), 'utf8');
    for (const injected of ['999999999', '=cmd', '<script>', 'lots']) expect(table).not.toContain(injected);
  }, 180_000);
});
