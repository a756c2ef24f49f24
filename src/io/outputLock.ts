import { closeSync, existsSync, linkSync, lstatSync, mkdirSync, openSync, readFileSync, renameSync, rmdirSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { InputError, type InputProblem } from '../errors/inputError.js';
import { outFolderWriteProblem } from './outFolderWriteProblem.js';
import { isRunning } from './processAlive.js';

/** Name of the lock file inside an output folder. */
export const LOCK_NAME = '.quantbid-lock';
/** Prefix of the temporary files a lock is written to before it is linked into place (removed as leftovers). */
export const LOCK_TEMP_PREFIX = `${LOCK_NAME}.tmp-`;
/** Name of the short-lived lock a run holds while it removes a stale lock (removeStale). */
export const RECOVERY_NAME = `${LOCK_NAME}.recover`;

/** What a lock file holds: who holds the folder, for the message a second run prints. */
export interface LockHolder {
  readonly pid: number;
  /** The command, e.g. `sweep`. */
  readonly command: string;
  /** When the holder took the lock, ISO 8601. */
  readonly started: string;
  /** Random, unique per lock: tells this lock from a later one of the same process id. */
  readonly token: string;
}

/** Tokens of the locks this process holds now (two runs in one process are refused like two processes). */
const heldTokens = new Set<string>();

/** Attempts to take a lock that was in the way (a stale lock removed, or one released meanwhile). */
const MAX_ATTEMPTS = 200;


/**
 * The lock of an output folder, held for the whole run of a command that writes into it, so that two
 * runs cannot mix their outputs, append to one journal, or check the folder while the other writes.
 *
 * Taking it: the lock file `.quantbid-lock` (JSON: process id, command, start, a random token) is
 * written whole under a temporary name, then hard-linked to its name: link(2) fails with EEXIST when the
 * name exists ("If newpath exists, it will not be overwritten", Linux man-pages link(2); POSIX.1-2017
 * link()), so of two runs exactly one gets it, and the file is never seen half-written. On a file
 * system without hard links the file is created with O_EXCL instead (open(2), the same guarantee).
 *
 * A lock in the way whose process runs (signal 0 reaches it) refuses the run: an input error naming the
 * holder. A lock whose process no longer runs (killed, power cut) is stale: it is renamed away (one
 * atomic step, so of two runs recovering it only one moves it), checked to be that same stale lock by
 * its token, deleted, and the lock taken anew. A folder the lock had to create is removed again on
 * release when the run left nothing in it.
 *
 * The process id alone names the holder: a stale lock whose id a new, unrelated process got is taken
 * for a live one, and the message says to delete the file when no quantbid run has that id.
 */
export class OutputLock {
  private released = false;

  private constructor(
    readonly outDir: string,
    readonly holder: LockHolder,
    private readonly created: readonly string[],
  ) {}

  /** Takes the lock of `outDir` for `command`, creating the folder (and missing ones above it) when needed. */
  static take(outDir: string, command: string, now: () => Date = () => new Date()): OutputLock {
    const holder: LockHolder = { pid: process.pid, command, started: now().toISOString(), token: newToken() };
    const created = fileStep(outDir, () => makeFolders(outDir));
    try {
      for (let attempt = 1; ; attempt++) {
        if (fileStep(outDir, () => tryCreate(outDir, LOCK_NAME, holder))) break;
        const found = readHolder(outDir);
        if (found === 'gone') continue;
        if (found === 'unreadable') throw new InputError([unreadableProblem(outDir)]);
        if (heldTokens.has(found.token) || (found.pid !== process.pid && isRunning(found.pid)) || attempt >= MAX_ATTEMPTS) throw new InputError([heldProblem(outDir, found)]);
        fileStep(outDir, () => removeStale(outDir, found, holder));
      }
    } catch (err) {
      removeEmptyFolders(created);
      throw err;
    }
    heldTokens.add(holder.token);
    return new OutputLock(outDir, holder, created);
  }

  /** Whether the lock file is still this lock (an input error naming --out otherwise). */
  verify(): void {
    const found = readHolder(this.outDir);
    if (this.released || found === 'gone' || found === 'unreadable' || found.token !== this.holder.token) {
      throw new InputError([
        {
          file: this.outDir,
          field: '--out',
          message: `the lock ${join(this.outDir, LOCK_NAME)} of this run was removed or replaced while it ran, so another run may be writing here`,
          fix: 'run one quantbid command per --out folder at a time, then run this one again',
        },
      ]);
    }
  }

  /** Removes the lock file (when it is still ours) and the folders `take` created that are empty. */
  release(): void {
    if (this.released) return;
    this.released = true;
    heldTokens.delete(this.holder.token);
    const found = readHolder(this.outDir);
    if (found !== 'gone' && found !== 'unreadable' && found.token === this.holder.token) {
      try {
        unlinkSync(join(this.outDir, LOCK_NAME));
      } catch {
        // Gone already, or the disk is gone: the next run finds it stale.
      }
    }
    removeEmptyFolders(this.created);
  }
}

/** Creates the lock file `name` in `outDir` with `holder`; false when a file of that name is in the way. */
function tryCreate(outDir: string, name: string, holder: LockHolder): boolean {
  const path = join(outDir, name);
  const text = `${JSON.stringify(holder)}\n`;
  const temporary = join(outDir, `${LOCK_TEMP_PREFIX}${process.pid}-${holder.token}`);
  writeFileSync(temporary, text, { flush: true });
  try {
    linkSync(temporary, path);
    return true;
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code === 'EEXIST') return false;
    if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'ENOSYS') throw err;
    return createExclusive(path, text);
  } finally {
    unlinkSync(temporary);
  }
}

/** The lock created with O_EXCL, for file systems without hard links; false when one is in the way. */
function createExclusive(path: string, text: string): boolean {
  let fd: number;
  try {
    fd = openSync(path, 'wx');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw err;
  }
  try {
    writeSync(fd, text);
  } finally {
    closeSync(fd);
  }
  return true;
}

/** The holder named by the lock file of `outDir`: `gone` when there is none, `unreadable` when it is not a lock quantbid wrote. */
export function readHolder(outDir: string, name = LOCK_NAME): LockHolder | 'gone' | 'unreadable' {
  const path = join(outDir, name);
  let text: string;
  try {
    // A lock is a small regular file; a folder, a link or a large file at its name is not one of ours.
    const stat = lstatSync(path);
    if (!stat.isFile() || stat.size > 4096) return 'unreadable';
    text = readFileSync(path, 'utf8');
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'ENOENT' ? 'gone' : 'unreadable';
  }
  return parseHolder(text) ?? 'unreadable';
}

function parseHolder(text: string): LockHolder | null {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    return null;
  }
  const h = value as Partial<LockHolder> | null;
  const valid =
    typeof h === 'object' && h !== null &&
    typeof h.pid === 'number' && Number.isInteger(h.pid) && h.pid >= 1 &&
    typeof h.command === 'string' && typeof h.started === 'string' && typeof h.token === 'string' && h.token.length > 0;
  return valid ? { pid: h.pid as number, command: h.command as string, started: h.started as string, token: h.token as string } : null;
}

/**
 * Removes the stale lock `stale`, under the recovery lock `.quantbid-lock.recover` (taken like the lock
 * itself, by a hard link), so that of several runs recovering it at once one removes it: holding the
 * recovery lock, a run reads the lock again and deletes it only when it is still that stale lock (no
 * other run can replace a lock that exists, or delete one without the recovery lock). A recovery lock
 * of a run that is gone is moved away and checked by its token (moveStale); one of a run that runs
 * makes this one wait a moment and try again.
 */
function removeStale(outDir: string, stale: LockHolder, self: LockHolder): void {
  if (!tryCreate(outDir, RECOVERY_NAME, self)) {
    const recovering = readHolder(outDir, RECOVERY_NAME);
    if (recovering === 'gone') return;
    if (recovering !== 'unreadable' && recovering.pid !== process.pid && !isRunning(recovering.pid)) moveStale(outDir, RECOVERY_NAME, recovering);
    else pause(5);
    return;
  }
  try {
    const now = readHolder(outDir);
    if (now !== 'gone' && now !== 'unreadable' && now.token === stale.token) unlinkSync(join(outDir, LOCK_NAME));
  } finally {
    const mine = readHolder(outDir, RECOVERY_NAME);
    if (mine !== 'gone' && mine !== 'unreadable' && mine.token === self.token) unlinkSync(join(outDir, RECOVERY_NAME));
  }
}

/** Tokens made by this thread [-]. */
let tokensMade = 0;

/**
 * A token no other lock holder has, safe in a file name: this process's id, the monotonic clock [ns],
 * a count and a random part (Math.random, seeded per thread by the engine). It is not a secret, only
 * distinct (the lock is cooperative), so it is made without the crypto module, whose loading cost a
 * plan's start about 5 ms of CPU.
 */
function newToken(): string {
  return `${process.pid.toString(36)}-${process.hrtime.bigint().toString(36)}-${(tokensMade++).toString(36)}-${Math.random().toString(36).slice(2)}`;
}

/**
 * Removes the file `name` that held `stale`: renamed to a name of this run's own (atomic: of two runs
 * only one moves it), then deleted when it is still that stale file; a live one moved by mistake (it
 * replaced the stale one between the read and the rename) is linked back unless its name is taken again.
 */
function moveStale(outDir: string, name: string, stale: LockHolder): void {
  const path = join(outDir, name);
  const moved = join(outDir, `${LOCK_TEMP_PREFIX}${process.pid}-stale-${newToken()}`);
  try {
    renameSync(path, moved);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return;
    throw err;
  }
  let movedHolder: LockHolder | null = null;
  try {
    movedHolder = parseHolder(readFileSync(moved, 'utf8'));
  } catch {
    movedHolder = null;
  }
  if (movedHolder !== null && movedHolder.token !== stale.token) {
    try {
      linkSync(moved, path);
    } catch {
      // Taken again meanwhile: the moved file's holder finds it gone when it checks (OutputLock.verify).
    }
  }
  unlinkSync(moved);
}

/** Waits `ms` milliseconds without giving up the thread (the lock is taken synchronously). */
function pause(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

function heldProblem(outDir: string, holder: LockHolder): InputProblem {
  return {
    file: outDir,
    field: '--out',
    message: `is in use by another quantbid run (${holder.command}, process ${holder.pid}, started ${holder.started})`,
    fix: `wait for that run to finish, or choose another --out folder; if no quantbid run has process id ${holder.pid}, delete ${join(outDir, LOCK_NAME)}`,
  };
}

function unreadableProblem(outDir: string): InputProblem {
  return {
    file: join(outDir, LOCK_NAME),
    field: '--out',
    message: 'is not a lock file quantbid wrote (damaged, or something else took its name)',
    fix: 'if no quantbid run writes into this folder, delete it and run again',
  };
}

/** Runs a file-system step of the lock; its failure becomes the input error naming --out. */
function fileStep<T>(outDir: string, step: () => T): T {
  try {
    return step();
  } catch (err) {
    if (err instanceof InputError) throw err;
    const code = (err as NodeJS.ErrnoException).code;
    const problem = outFolderWriteProblem(outDir, code);
    if (problem === null) throw err;
    throw new InputError([problem]);
  }
}

/**
 * Creates `outDir` and any missing folders above it, one level at a time; returns the folders created,
 * outermost first. A folder another run creates at the same moment (EEXIST on a folder) is no failure.
 */
export function makeFolders(outDir: string): string[] {
  const missing: string[] = [];
  for (let at = resolve(outDir); !existsSync(at); at = dirname(at)) {
    missing.unshift(at);
    if (dirname(at) === at) break;
  }
  const created: string[] = [];
  try {
    for (const folder of missing) {
      try {
        mkdirSync(folder);
        created.push(folder);
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code !== 'EEXIST' || !lstatSync(folder).isDirectory()) throw err;
      }
    }
  } catch (err) {
    removeEmptyFolders(created);
    throw err;
  }
  return created;
}

/** Removes folders, innermost first, leaving any that are not empty. */
export function removeEmptyFolders(outermostFirst: readonly string[]): void {
  for (const folder of [...outermostFirst].reverse()) {
    try {
      rmdirSync(folder);
    } catch {
      return;
    }
  }
}
