import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { DRIVER, importCompiledGrid, priceFolder, wholeLines } from './gridHarness.js';

// The driver is a separate Node process running the compiled engine, as the CLI would.
beforeAll(async () => {
  await importCompiledGrid();
});

interface Exit {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
}

interface DriverArgs {
  readonly outDir: string;
  readonly dataFile: string;
  readonly threads: number;
  readonly spinMs: number;
  readonly callLog?: string;
  readonly alphas?: string;
  readonly policies?: string;
  readonly restart?: boolean;
}

/**
 * Runs the driver (default 24 alphas x 2 policies). Once the journal holds `stop.after` settings, the
 * first signal is sent; any others once the driver has said that it is stopping (signals sent close
 * together may arrive as one).
 */
function driver(args: DriverArgs, stop?: { readonly after: number; readonly signals: readonly NodeJS.Signals[] }): Promise<Exit> {
  const child = spawn(process.execPath, [DRIVER, JSON.stringify({ alphas: '0.02:0.48:0.02', policies: 'quantile,median', ...args })], { stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  let afterStopping: NodeJS.Signals[] = [];
  child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => {
    stderr += chunk.toString();
    if (stderr.includes('stopping:')) afterStopping.splice(0).forEach((signal) => child.kill(signal));
  });
  const journal = join(args.outDir, '.sweep-journal.jsonl');
  const poll = setInterval(() => {
    if (stop === undefined || !existsSync(journal) || wholeLines(readFileSync(journal, 'utf8')).length - 1 < stop.after) return;
    clearInterval(poll);
    const [first, ...others] = stop.signals;
    afterStopping = others;
    child.kill(first);
  }, 2);
  return new Promise((resolve) => {
    child.on('close', (code, signal) => {
      clearInterval(poll);
      resolve({ code, signal, stdout, stderr });
    });
  });
}

function journalKeys(outDir: string): string[] {
  return wholeLines(readFileSync(join(outDir, '.sweep-journal.jsonl'), 'utf8'))
    .slice(1)
    .map((line) => (JSON.parse(line) as { key: string }).key);
}

/** Runs the stopped sweep again to the end: it resumes the kept settings and writes the clean run's bytes. */
async function expectResumeMatchesClean(dir: string, dataFile: string, kept: readonly string[], callLog?: string): Promise<void> {
  const outDir = join(dir, 'run');
  const rerun = await driver({ outDir, dataFile, threads: 2, spinMs: 0, ...(callLog === undefined ? {} : { callLog }) });
  expect(rerun).toMatchObject({ code: 0, stdout: `complete: 48 settings, ${kept.length} resumed\n` });
  expect(readFileSync(join(outDir, 'sweep.csv'), 'utf8')).toBe(readFileSync(join(dir, 'clean', 'sweep.csv'), 'utf8'));
  expect(existsSync(join(outDir, '.sweep-journal.jsonl'))).toBe(false);
}

describe('a sweep process stopped part-way', () => {
  it('killed with SIGKILL: the re-run computes only the settings not journalled and writes the bytes of an uninterrupted run', async () => {
    const { dir, dataFile } = priceFolder('sigkill');
    const clean = await driver({ outDir: join(dir, 'clean'), dataFile, threads: 1, spinMs: 0 });
    expect(clean).toMatchObject({ code: 0, stdout: 'complete: 48 settings, 0 resumed\n' });

    const outDir = join(dir, 'run');
    const killed = await driver({ outDir, dataFile, threads: 2, spinMs: 20 }, { after: 8, signals: ['SIGKILL'] });
    expect(killed.signal).toBe('SIGKILL');
    expect(existsSync(join(outDir, 'sweep.csv'))).toBe(false);
    const kept = journalKeys(outDir);
    expect(kept.length).toBeGreaterThanOrEqual(8);
    expect(kept.length).toBeLessThan(48);

    const callLog = join(dir, 'calls.txt');
    await expectResumeMatchesClean(dir, dataFile, kept, callLog);
    const calls = wholeLines(readFileSync(callLog, 'utf8'));
    expect(calls).toHaveLength(48 - kept.length);
    expect(calls.filter((key) => kept.includes(key))).toEqual([]);
  });

  it('stopped with Ctrl-C (SIGINT): running settings finish, exit code 130, a message on how to resume', async () => {
    const { dir, dataFile } = priceFolder('sigint');
    await driver({ outDir: join(dir, 'clean'), dataFile, threads: 1, spinMs: 0 });
    const outDir = join(dir, 'run');
    const stopped = await driver({ outDir, dataFile, threads: 2, spinMs: 20 }, { after: 4, signals: ['SIGINT'] });
    expect(stopped.code).toBe(130);
    const kept = journalKeys(outDir);
    expect(stopped.stderr).toContain('stopping: no new settings start, the running ones finish and are kept; press Ctrl-C again to stop at once.\n');
    expect(stopped.stderr).toContain(`stopped after ${kept.length} of 48 settings; the finished ones are kept in ${join(outDir, '.sweep-journal.jsonl')}.\nRun the same command again to resume (or add --restart to start over).\n`);
    expect(kept.length).toBeLessThan(48);
    await expectResumeMatchesClean(dir, dataFile, kept);
  });

  it('a second Ctrl-C stops at once: the running settings are lost, the journal stays whole', async () => {
    const { dir, dataFile } = priceFolder('sigint-twice');
    await driver({ outDir: join(dir, 'clean'), dataFile, threads: 1, spinMs: 0 });
    const outDir = join(dir, 'run');
    // Each setting takes 300 to 900 ms, so the two running at the first Ctrl-C are still running at the second.
    const stopped = await driver({ outDir, dataFile, threads: 2, spinMs: 300 }, { after: 1, signals: ['SIGINT', 'SIGINT'] });
    expect(stopped.signal).toBe('SIGINT');
    expect(stopped.stderr).toContain('press Ctrl-C again to stop at once');
    expect(stopped.stderr).not.toContain('stopped after');
    const kept = journalKeys(outDir);
    expect(kept.length).toBeLessThan(48);
    await expectResumeMatchesClean(dir, dataFile, kept);
  });

  it('a journal of other arguments is refused with exit code 2, and --restart runs afresh', async () => {
    const { dir, dataFile } = priceFolder('refuse');
    const outDir = join(dir, 'run');
    await driver({ outDir, dataFile, threads: 2, spinMs: 20 }, { after: 2, signals: ['SIGKILL'] });
    const other = { outDir, dataFile, alphas: '0.1', policies: 'quantile', threads: 1, spinMs: 0 };
    const refused = await driver(other);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain('--restart: holds');
    expect((await driver({ ...other, restart: true })).code).toBe(0);
    expect(readFileSync(join(outDir, 'sweep.csv'), 'utf8').split('\n')).toHaveLength(3);
  });
});
