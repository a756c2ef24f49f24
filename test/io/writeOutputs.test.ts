import { spawnSync } from 'node:child_process';
import fs, { existsSync, linkSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { syncBuiltinESMExports } from 'node:module';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { checkOutputFolder, COMMIT_PREFIX, OutputStage, PARTIAL_PREFIX, recoverOutputs, writeOutputs } from '../../src/io/writeOutputs.js';

/**
 * The output-set protocol of writeOutputs.ts on folders laid out as a killed run leaves them. The
 * states are made by hand here; test/hardening/killedRuns.test.ts kills real runs.
 */
const scratch = mkdtempSync(join(tmpdir(), 'quantbid-write-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

let count = 0;
function folder(files: Record<string, string>): string {
  const dir = join(scratch, `case-${++count}`);
  mkdirSync(dir);
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
  return dir;
}

/** The id of a process that has ended (a Node process started and waited for). */
function endedPid(): number {
  const run = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
  return Number(run.stdout);
}

/** Every entry of a folder: a file's text, or `<folder>`. */
function contents(dir: string): Record<string, string> {
  const entry = (path: string): string => (lstatSync(path).isSymbolicLink() ? '<link>' : statSync(path).isDirectory() ? '<folder>' : readFileSync(path, 'utf8'));
  return Object.fromEntries(readdirSync(dir).sort().map((name) => [name, entry(join(dir, name))]));
}

describe('writeOutputs', () => {
  it('with --force, an optional output of an earlier run that this run does not write goes with the old set', () => {
    const dir = folder({ 'a.csv': 'old a', 'report.html': 'old report', 'notes.txt': 'mine' });
    writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }], true, ['report.html']);
    expect(contents(dir)).toEqual({ 'a.csv': 'new a', 'notes.txt': 'mine' });
  });

  it('a commit folder left with a retired output is finished by the next write: the stale file goes', () => {
    const dir = folder({ 'a.csv': 'old a', 'report.html': 'old report' });
    const committed = join(dir, `${COMMIT_PREFIX}${endedPid()}-x`);
    mkdirSync(committed);
    writeFileSync(join(committed, 'a.csv'), 'new a');
    writeFileSync(join(committed, '.retired-report.html'), '');
    recoverOutputs(dir);
    expect(contents(dir)).toEqual({ 'a.csv': 'new a' });
  });

  it('replaces the old set with the new one and leaves nothing else; other files stay', () => {
    const dir = folder({ 'a.csv': 'old a', 'b.json': 'old b', 'notes.txt': 'mine' });
    expect(writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }, { name: 'b.json', text: 'new b' }], true)).toEqual([join(dir, 'a.csv'), join(dir, 'b.json')]);
    expect(contents(dir)).toEqual({ 'a.csv': 'new a', 'b.json': 'new b', 'notes.txt': 'mine' });
  });

  it('finishes a set that a killed run had committed but not yet moved into place (roll forward)', () => {
    const dir = folder({ 'a.csv': 'new a', 'b.json': 'old b' });
    const committed = join(dir, `${COMMIT_PREFIX}${endedPid()}-abc123`);
    mkdirSync(committed);
    writeFileSync(join(committed, 'b.json'), 'new b');
    recoverOutputs(dir);
    expect(contents(dir)).toEqual({ 'a.csv': 'new a', 'b.json': 'new b' });
  });

  it('discards a set that a killed run was still writing; the old set stays', () => {
    const dir = folder({ 'a.csv': 'old a', 'b.json': 'old b', [`.sweep-journal.jsonl.tmp-${endedPid()}`]: '{' });
    const partial = join(dir, `${PARTIAL_PREFIX}${endedPid()}-abc123`);
    mkdirSync(partial);
    writeFileSync(join(partial, 'a.csv'), 'new a, cut sh');
    writeOutputs(dir, [{ name: 'c.txt', text: 'c' }], false);
    expect(contents(dir)).toEqual({ 'a.csv': 'old a', 'b.json': 'old b', 'c.txt': 'c' });
  });

  it('leaves alone the stage of a process that still runs (this test runner is one)', () => {
    const dir = folder({});
    const live = join(dir, `${PARTIAL_PREFIX}${process.ppid}-abc123`);
    mkdirSync(live);
    recoverOutputs(dir);
    expect(existsSync(live)).toBe(true);
  });

  it('refuses an output name taken by a folder, even with --force, before writing anything', () => {
    const dir = folder({ 'b.json': 'old b' });
    mkdirSync(join(dir, 'a.csv'));
    expect(() => writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }, { name: 'b.json', text: 'new b' }], true)).toThrow(InputError);
    expect(() => writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }], true)).toThrow(/a\.csv: --out: is a folder where this output file should go/);
    expect(readdirSync(dir).sort()).toEqual(['a.csv', 'b.json']);
    expect(readFileSync(join(dir, 'b.json'), 'utf8')).toBe('old b');
  });
});

describe('leftover sets and inputs', () => {
  const commitOf = (dir: string, files: Record<string, string>): string => {
    const committed = join(dir, `${COMMIT_PREFIX}${endedPid()}-left`);
    mkdirSync(committed);
    for (const [name, text] of Object.entries(files)) writeFileSync(join(committed, name), text);
    return committed;
  };

  it('counts the files of a leftover set as existing outputs: without --force nothing moves', () => {
    const dir = folder({ 'notes.txt': 'mine' });
    const committed = commitOf(dir, { 'a.csv': 'left a' });
    const before = contents(dir);
    expect(() => writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }], false)).toThrow(/\.quantbid-commit-\d+-left: --out: holds outputs of an earlier run that stopped while moving them into place \(a\.csv\)/);
    expect(contents(dir)).toEqual(before);
    expect(contents(committed)).toEqual({ 'a.csv': 'left a' });
    // With --force the leftover set is finished, then replaced.
    writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }], true);
    expect(contents(dir)).toEqual({ 'a.csv': 'new a', 'notes.txt': 'mine' });
  });

  it('a leftover set of other names is finished beside the new outputs', () => {
    const dir = folder({});
    commitOf(dir, { 'b.json': 'left b' });
    writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }], false);
    expect(contents(dir)).toEqual({ 'a.csv': 'new a', 'b.json': 'left b' });
  });

  it('refuses a commit folder quantbid cannot have left, before anything moves, even with --force', () => {
    const crafted: [string, (dir: string) => void][] = [
      ['a folder inside', (dir) => mkdirSync(join(commitOf(dir, { 'b.json': 'x' }), 'a.csv'))],
      ['a link inside', (dir) => symlinkSync('/etc/hostname', join(commitOf(dir, {}), 'a.csv'))],
      ['a hidden name', (dir) => commitOf(dir, { '.quantbid-lock': 'x' })],
      ['over a folder', (dir) => { commitOf(dir, { 'sub': 'x' }); mkdirSync(join(dir, 'sub')); }],
      ['a link as the commit folder', (dir) => symlinkSync(scratch, join(dir, `${COMMIT_PREFIX}${endedPid()}-link`))],
    ];
    for (const [what, make] of crafted) {
      const dir = folder({ 'a.csv': 'old a' });
      make(dir);
      const before = contents(dir);
      expect(() => writeOutputs(dir, [{ name: 'a.csv', text: 'new a' }], true), what).toThrow(/: --out: is not an output set quantbid left \(/);
      expect(() => recoverOutputs(dir), what).toThrow(InputError);
      expect(contents(dir), what).toEqual(before);
    }
  });

  it('refuses an output that is one of the run\'s inputs: the same path, a link to it, a hard link of it', () => {
    const dir = folder({ 'history.csv': 'prices', 'other.csv': 'x' });
    const input = [{ path: join(dir, 'history.csv'), what: 'the history file' }];
    expect(() => checkOutputFolder(dir, ['history.csv'], true, input)).toThrow(`${join(dir, 'history.csv')}: --out: would be written over the history file ${join(dir, 'history.csv')}, an input of this run`);
    symlinkSync(join(dir, 'history.csv'), join(dir, 'linked.csv'));
    linkSync(join(dir, 'history.csv'), join(dir, 'hard.csv'));
    expect(() => checkOutputFolder(dir, ['linked.csv'], true, input)).toThrow(/would be written over the history file/);
    expect(() => checkOutputFolder(dir, ['hard.csv'], true, input)).toThrow(/would be written over the history file/);
    expect(() => checkOutputFolder(dir, ['other.csv', 'new.csv'], true, input)).not.toThrow();
    expect(readFileSync(join(dir, 'history.csv'), 'utf8')).toBe('prices');
  });
});

describe('OutputStage', () => {
  it('writes a file piece by piece and commits it with the others', () => {
    const dir = folder({ 'a.csv': 'old a' });
    const stage = OutputStage.begin(dir, ['a.csv', 'b.json'], true);
    const a = stage.open('a.csv');
    a.append('x,y\n');
    a.append('1,2\n');
    stage.write('b.json', '{}');
    const during = Object.entries(contents(dir));
    expect(during.filter(([name]) => !name.startsWith('.'))).toEqual([['a.csv', 'old a']]);
    expect(during.filter(([name]) => name.startsWith(PARTIAL_PREFIX))).toHaveLength(1);
    stage.commit();
    expect(contents(dir)).toEqual({ 'a.csv': 'x,y\n1,2\n', 'b.json': '{}' });
  });

  it('discarded (the work failed): the old set as it was, and a folder it made is removed', () => {
    const dir = folder({ 'a.csv': 'old a' });
    const stage = OutputStage.begin(dir, ['a.csv'], true);
    stage.open('a.csv').append('half');
    stage.discard();
    expect(contents(dir)).toEqual({ 'a.csv': 'old a' });
    const fresh = join(scratch, 'fresh', 'out');
    OutputStage.begin(fresh, ['a.csv'], false).discard();
    expect(existsSync(join(scratch, 'fresh'))).toBe(false);
  });

  it('flushes a file on a thread of the pool while the others are written, and commits every byte of it', async () => {
    const dir = folder({});
    const stage = OutputStage.begin(dir, ['a.csv', 'b.json'], false);
    const a = stage.open('a.csv');
    a.append('x,y\n');
    a.append(new TextEncoder().encode('1,2\n'));
    const flushed = a.flush();
    stage.write('b.json', '{}');
    await flushed;
    stage.commit();
    expect(contents(dir)).toEqual({ 'a.csv': 'x,y\n1,2\n', 'b.json': '{}' });
  });

  it('a flush that fails (a full disk) discards the stage and names --out, as a failed append does', async () => {
    const dir = folder({ 'a.csv': 'old a' });
    const stage = OutputStage.begin(dir, ['a.csv'], true);
    const a = stage.open('a.csv');
    a.append('half');
    const real = fs.fdatasync;
    // The disk fills up under the flush: fdatasync answers ENOSPC (ext4 reports delayed allocation's failures there).
    fs.fdatasync = ((_fd: number, done: (err: NodeJS.ErrnoException | null) => void) => done(Object.assign(new Error('ENOSPC: no space left on device, fdatasync'), { code: 'ENOSPC' }))) as typeof fs.fdatasync;
    syncBuiltinESMExports();
    let failure: unknown;
    try {
      failure = await a.flush().catch((err: unknown) => err);
    } finally {
      fs.fdatasync = real;
      syncBuiltinESMExports();
    }
    expect(failure).toBeInstanceOf(InputError);
    expect((failure as InputError).message).toBe(`${dir}: --out: the disk is full; free some space or choose another folder`);
    expect(contents(dir)).toEqual({ 'a.csv': 'old a' });
    await expect(a.flush()).rejects.toThrow(/a\.csv is closed/);
  });

  it('refuses to commit a set with an output never written', () => {
    const dir = folder({});
    const stage = OutputStage.begin(dir, ['a.csv', 'b.json'], false);
    stage.write('a.csv', 'a');
    expect(() => stage.commit()).toThrow(/b\.json not written/);
    stage.discard();
    expect(readdirSync(dir)).toEqual([]);
  });
});
