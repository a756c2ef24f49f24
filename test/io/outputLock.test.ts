import { spawnSync } from 'node:child_process';
import { existsSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { LOCK_NAME, OutputLock, readHolder } from '../../src/io/outputLock.js';

/**
 * The lock of an output folder (io/outputLock.ts): one holder at a time, the holder named to the
 * second run, a stale lock (its process gone) taken over, anything else at the lock's name refused.
 * Races between processes: test/hardening/concurrentRuns.test.ts.
 */
const scratch = mkdtempSync(join(tmpdir(), 'quantbid-lock-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
let folders = 0;
const folder = () => join(scratch, `out${++folders}`);

/** The id of a process that has ended (a child run to its end). */
function deadPid(): number {
  const child = spawnSync(process.execPath, ['-e', '0']);
  return child.pid as number;
}

function lockFile(out: string, holder: object | string): void {
  mkdirSync(out, { recursive: true });
  writeFileSync(join(out, LOCK_NAME), typeof holder === 'string' ? holder : `${JSON.stringify(holder)}\n`);
}

function refusal(take: () => unknown): string {
  try {
    take();
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    return (err as InputError).message;
  }
  throw new Error('expected the lock to be refused');
}

describe('OutputLock', () => {
  it('gives every holder its own token, safe in a file name, in this process and in others', () => {
    const tokens = new Set<string>();
    const out = folder();
    for (let i = 0; i < 200; i++) {
      const lock = OutputLock.take(out, 'plan');
      expect(lock.holder.token).toMatch(/^[0-9a-z-]+$/);
      tokens.add(lock.holder.token);
      lock.release();
    }
    // Other processes started at once: each takes the lock of a folder of its own and prints its token.
    const script = `import { OutputLock } from ${JSON.stringify(join(process.cwd(), 'dist', 'io', 'outputLock.js'))}; const lock = OutputLock.take(process.argv[1], 'plan'); console.log(lock.holder.token); lock.release();`;
    for (let i = 0; i < 4; i++) {
      const child = spawnSync(process.execPath, ['--input-type=module', '-e', script, folder()], { encoding: 'utf8' });
      expect(child.status, child.stderr).toBe(0);
      tokens.add(child.stdout.trim());
    }
    expect(tokens.size).toBe(204);
  });

  it('writes the holder (pid, command, start, token), and release removes it and the folder it made', () => {
    const out = join(folder(), 'deeper');
    const lock = OutputLock.take(out, 'plan', () => new Date('2027-06-15T10:00:00Z'));
    const holder = readHolder(out);
    expect(holder).toEqual({ pid: process.pid, command: 'plan', started: '2027-06-15T10:00:00.000Z', token: lock.holder.token });
    expect(readdirSync(out)).toEqual([LOCK_NAME]);
    lock.release();
    expect(existsSync(out)).toBe(false);
    expect(existsSync(join(out, '..'))).toBe(false);
  });

  it('keeps a folder that holds something, and a folder it did not make', () => {
    const out = folder();
    mkdirSync(out);
    OutputLock.take(out, 'plan').release();
    expect(readdirSync(out)).toEqual([]);
    const made = folder();
    const lock = OutputLock.take(made, 'plan');
    writeFileSync(join(made, 'orders.csv'), 'x\n');
    lock.release();
    expect(readdirSync(made)).toEqual(['orders.csv']);
  });

  it('refuses a second run in this process while the first holds the folder, naming the holder', () => {
    const out = folder();
    const first = OutputLock.take(out, 'sweep', () => new Date('2027-06-15T10:00:00Z'));
    expect(refusal(() => OutputLock.take(out, 'sweep'))).toBe(
      `${out}: --out: is in use by another quantbid run (sweep, process ${process.pid}, started 2027-06-15T10:00:00.000Z); wait for that run to finish, or choose another --out folder; if no quantbid run has process id ${process.pid}, delete ${join(out, LOCK_NAME)}`,
    );
    first.release();
    OutputLock.take(out, 'plan').release();
  });

  it('refuses the lock of another process that runs, and leaves its file as it was', () => {
    const out = folder();
    const holder = { pid: process.ppid, command: 'backtest', started: '2027-06-15T10:00:00.000Z', token: 'other' };
    lockFile(out, holder);
    const before = readFileSync(join(out, LOCK_NAME), 'utf8');
    expect(refusal(() => OutputLock.take(out, 'plan'))).toContain(`is in use by another quantbid run (backtest, process ${process.ppid}, started 2027-06-15T10:00:00.000Z)`);
    expect(readFileSync(join(out, LOCK_NAME), 'utf8')).toBe(before);
  });

  it('takes over a stale lock (its process has ended), and a lock of this process it does not hold', () => {
    for (const pid of [deadPid(), process.pid]) {
      const out = folder();
      lockFile(out, { pid, command: 'sweep', started: '2027-06-15T10:00:00.000Z', token: 'stale' });
      const lock = OutputLock.take(out, 'plan');
      expect(readHolder(out)).toMatchObject({ pid: process.pid, command: 'plan', token: lock.holder.token });
      lock.release();
      expect(readdirSync(out)).toEqual([]);
    }
  });

  it('refuses what is not a lock quantbid wrote: garbage, a process id no process has, a link, a folder', () => {
    const cases: [string, (out: string) => void][] = [
      ['garbage', (out) => lockFile(out, 'not json at all')],
      ['empty', (out) => lockFile(out, '')],
      ['pid 0', (out) => lockFile(out, { pid: 0, command: 'x', started: 'y', token: 'z' })],
      ['pid -1', (out) => lockFile(out, { pid: -1, command: 'x', started: 'y', token: 'z' })],
      ['pid 1.5', (out) => lockFile(out, { pid: 1.5, command: 'x', started: 'y', token: 'z' })],
      ['link', (out) => { mkdirSync(out); symlinkSync('/nonexistent', join(out, LOCK_NAME)); }],
      ['folder', (out) => mkdirSync(join(out, LOCK_NAME), { recursive: true })],
    ];
    for (const [name, make] of cases) {
      const out = folder();
      make(out);
      expect(refusal(() => OutputLock.take(out, 'plan')), name).toBe(
        `${join(out, LOCK_NAME)}: --out: is not a lock file quantbid wrote (damaged, or something else took its name); if no quantbid run writes into this folder, delete it and run again`,
      );
      expect(lstatSync(join(out, LOCK_NAME)), name).toBeDefined();
    }
  });

  it('verify fails once the lock file was replaced or removed', () => {
    const out = folder();
    const lock = OutputLock.take(out, 'plan');
    expect(() => lock.verify()).not.toThrow();
    writeFileSync(join(out, LOCK_NAME), `${JSON.stringify({ ...lock.holder, token: 'someone else' })}\n`);
    expect(() => lock.verify()).toThrow(/the lock .* of this run was removed or replaced while it ran/);
    rmSync(join(out, LOCK_NAME));
    expect(() => lock.verify()).toThrow(InputError);
    lock.release();
  });

  it('fails as an input error naming --out where the folder cannot be made', () => {
    const file = join(folder());
    writeFileSync(file, 'a file\n');
    expect(refusal(() => OutputLock.take(join(file, 'out'), 'plan'))).toBe(`${join(file, 'out')}: --out: cannot be made: a file stands where a folder should be; give a folder for the outputs`);
  });
});
