import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_SCENARIO, diskFullPreload, folderFiles, runCliProcess, startCli } from './cliProcess.js';

/**
 * A sweep on a disk that fills up: the journal keeps the settings finished before, the run ends with
 * exit code 2, says the disk is full, that those settings are kept and how to resume (not "nothing was
 * written"), and the next run resumes to the bytes of a run that never met a full disk. The full disk
 * is a preload that fails writes with ENOSPC (cliProcess.ts); nothing else of the run changes.
 */
const scratch = mkdtempSync(join(tmpdir(), 'quantbid-full-disk-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

const SETTINGS = 4;
const sweepArgs = (out: string) => [
  'sweep', '--scenario', DEMO_SCENARIO, '--from', '2026-03-01', '--to', '2026-03-02', '--alphas', '0.1,0.2,0.3,0.4', '--policies', 'quantile',
  '--threads', '1', '--quiet', '--out', out,
];

describe('a sweep that meets a full disk', () => {
  it('while journalling: says the finished settings are kept and how to resume; the next run resumes them', async () => {
    const alone = join(scratch, 'alone');
    expect((await runCliProcess(sweepArgs(alone))).code).toBe(0);
    const out = join(scratch, 'journal-full');
    const full = await startCli(sweepArgs(out), { nodeArgs: diskFullPreload({ journalAppends: 2 }) }).exit;
    const journal = join(out, '.sweep-journal.jsonl');
    expect(full.code).toBe(2);
    expect(full.stderr).toBe(`${out}: --out: the disk is full; free some space on that disk\nthe 2 finished settings are kept in ${journal}; when the problem is solved, run the same command again to resume.\n`);
    expect(readdirSync(out).sort()).toEqual(['.sweep-journal.jsonl']);
    const again = await runCliProcess(sweepArgs(out));
    expect(again.code, again.stderr).toBe(0);
    expect(again.stdout).toContain(`${SETTINGS} settings (2 resumed from the journal)`);
    expect(folderFiles(out)).toEqual(folderFiles(alone));
  }, 180_000);

  it('while writing the outputs: every setting is kept, no output is written, the next run writes them without recomputing', async () => {
    const alone = join(scratch, 'alone');
    const out = join(scratch, 'outputs-full');
    const full = await startCli(sweepArgs(out), { nodeArgs: diskFullPreload({ stagedWrites: true }) }).exit;
    expect(full.code).toBe(2);
    expect(full.stderr).toBe(`${out}: --out: the disk is full; free some space on that disk\nthe ${SETTINGS} finished settings are kept in ${join(out, '.sweep-journal.jsonl')}; when the problem is solved, run the same command again to resume.\n`);
    expect(existsSync(join(out, 'sweep.csv'))).toBe(false);
    const again = await runCliProcess(sweepArgs(out));
    expect(again.code, again.stderr).toBe(0);
    expect(again.stdout).toContain(`${SETTINGS} settings (${SETTINGS} resumed from the journal)`);
    expect(folderFiles(out)).toEqual(folderFiles(alone));
  }, 180_000);
});
