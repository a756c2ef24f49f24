import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { LOCK_NAME } from '../../src/io/outputLock.js';
import { DEMO_SCENARIO, folderFiles, ROOT, runCliProcess, slowRenamePreload, startCli } from './cliProcess.js';
import { FIXTURES } from './corpusRunner.js';

/**
 * Two runs into one --out folder, interleaved by force: the first is held at a chosen point (paused in
 * its output renames by a preload, or stopped with SIGSTOP while it holds the folder's lock), the second
 * runs to its end meanwhile, then the first goes on. The second must refuse with exit code 2 naming the
 * first's process, change nothing, and the first must finish with exactly the outputs of a run alone.
 * Before the lock, the renames of two such runs interleaved into a mixed set, both ending with 0.
 */
const scratch = mkdtempSync(join(tmpdir(), 'quantbid-concurrent-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

const planArgs = (out: string) => [
  'plan', '--market', join(FIXTURES, 'base/market.json'), '--battery', join(FIXTURES, 'base/battery.json'),
  '--forecast', join(FIXTURES, 'base/quantilesWide.csv'), '--day', '2027-06-15', '--out', out, '--force',
];
const sweepArgs = (out: string) => [
  'sweep', '--scenario', DEMO_SCENARIO, '--from', '2026-03-01', '--to', '2026-03-02', '--alphas', '0.1,0.2', '--policies', 'quantile',
  '--threads', '1', '--quiet', '--out', out, '--force',
];

/** Waits until `ready` holds, polling every 10 ms (bounded by the test's timeout). */
async function until(ready: () => boolean): Promise<void> {
  while (!ready()) await new Promise((resolve) => setTimeout(resolve, 10));
}

describe('two runs into one output folder', () => {
  it('plan: a second run while the first renames its outputs into place is refused; the first writes its set alone', async () => {
    const alone = join(scratch, 'plan-alone');
    expect((await runCliProcess(planArgs(alone))).code).toBe(0);
    const out = join(scratch, 'plan-both');
    let renaming = false;
    const first = startCli(planArgs(out), { nodeArgs: slowRenamePreload(400), onStderr: (text) => (renaming ||= text.includes('test-rename')) });
    await until(() => renaming);
    const second = await runCliProcess(planArgs(out));
    expect(second.code).toBe(2);
    expect(second.stdout).toBe('');
    expect(second.stderr).toMatch(new RegExp(`^${out}: --out: is in use by another quantbid run \\(plan, process ${first.child.pid}, started [^)]+\\); wait for that run to finish, or choose another --out folder; if no quantbid run has process id ${first.child.pid}, delete ${join(out, LOCK_NAME)}\\nnothing was written\\.\\n$`));
    const done = await first.exit;
    expect(done.code, done.stderr).toBe(0);
    expect(folderFiles(out)).toEqual(folderFiles(alone));
    // Then a third run goes ahead as usual.
    expect((await runCliProcess(planArgs(out))).code).toBe(0);
    expect(folderFiles(out)).toEqual(folderFiles(alone));
  }, 120_000);

  it('sweep: a second sweep while the first is stopped holding the folder is refused; the first finishes with its outputs alone', async () => {
    const alone = join(scratch, 'sweep-alone');
    expect((await runCliProcess(sweepArgs(alone))).code).toBe(0);
    const out = join(scratch, 'sweep-both');
    const first = startCli(sweepArgs(out));
    await until(() => existsSync(join(out, LOCK_NAME)) || first.child.exitCode !== null);
    first.child.kill('SIGSTOP');
    try {
      const second = await runCliProcess(sweepArgs(out));
      expect(second.code).toBe(2);
      expect(second.stderr).toContain(`: --out: is in use by another quantbid run (sweep, process ${first.child.pid}, started `);
    } finally {
      first.child.kill('SIGCONT');
    }
    const done = await first.exit;
    expect(done.code, done.stderr).toBe(0);
    expect(folderFiles(out)).toEqual(folderFiles(alone));
  }, 180_000);

  it('a lock left by a run that was killed is stale: the next run takes the folder', async () => {
    const out = join(scratch, 'plan-stale');
    const killed = startCli(planArgs(out), { nodeArgs: slowRenamePreload(2000), onStderr: (text) => text.includes('test-rename') && killed.child.kill('SIGKILL') });
    expect((await killed.exit).signal).toBe('SIGKILL');
    expect(readdirSync(out)).toContain(LOCK_NAME);
    const next = await runCliProcess(planArgs(out));
    expect(next.code, next.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['orders.csv', 'plan.json', 'schedule.csv']);
  }, 120_000);
});

/**
 * Processes that take one lock at the same instant: each child waits for a start time, takes the lock
 * (from the compiled module, as the CLI does), says whether it got it, and holds it for a while. Of the
 * children exactly one gets it, for a fresh folder and for a stale lock that all of them recover.
 */
describe('the output lock under a race of processes', () => {
  const moduleUrl = pathToFileURL(join(ROOT, 'dist/io/outputLock.js')).href;
  const child = (out: string, startAt: number) =>
    [
      `const { OutputLock } = await import(${JSON.stringify(moduleUrl)});`,
      `while (Date.now() < ${startAt}) {}`,
      `try { const lock = OutputLock.take(${JSON.stringify(out)}, 'race'); process.stdout.write('got'); await new Promise((r) => setTimeout(r, 400)); lock.release(); }`,
      `catch (err) { process.stdout.write(err.name === 'InputError' && /is in use by another quantbid run/.test(err.message) ? 'refused' : 'fault ' + err.message); }`,
    ].join('\n');

  async function race(out: string, runners: number): Promise<string[]> {
    const startAt = Date.now() + 1500;
    const runs = Array.from({ length: runners }, () => {
      const proc = spawn(process.execPath, ['--input-type=module', '-e', child(out, startAt)], { stdio: ['ignore', 'pipe', 'pipe'] });
      let said = '';
      proc.stdout.on('data', (chunk: Buffer) => (said += chunk.toString()));
      proc.stderr.on('data', (chunk: Buffer) => (said += chunk.toString()));
      return new Promise<string>((resolve) => proc.on('close', () => resolve(said)));
    });
    return Promise.all(runs);
  }

  it('of 6 processes taking a fresh folder at once, exactly one gets it', async () => {
    const out = join(scratch, 'race-fresh');
    const said = await race(out, 6);
    expect(said.filter((s) => s === 'got'), said.join(' | ')).toHaveLength(1);
    expect(said.filter((s) => s === 'refused'), said.join(' | ')).toHaveLength(5);
    // Nothing is left in it (the folder itself may stay: the run that made it may not be the one that got the lock).
    expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
  });

  it('of 6 processes recovering one stale lock at once, exactly one gets it', async () => {
    const out = join(scratch, 'race-stale');
    mkdirSync(out);
    const dead = spawn(process.execPath, ['-e', '0']);
    await new Promise((resolve) => dead.on('close', resolve));
    writeFileSync(join(out, LOCK_NAME), `${JSON.stringify({ pid: dead.pid, command: 'sweep', started: '2027-06-15T10:00:00.000Z', token: 'stale' })}\n`);
    const said = await race(out, 6);
    expect(said.filter((s) => s === 'got'), said.join(' | ')).toHaveLength(1);
    expect(said.filter((s) => s === 'refused'), said.join(' | ')).toHaveLength(5);
    expect(readdirSync(out)).toEqual([]);
  });
});
