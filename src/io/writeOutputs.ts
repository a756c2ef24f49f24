import { closeSync, existsSync, fsyncSync, mkdirSync, mkdtempSync, openSync, readdirSync, renameSync, rmdirSync, rmSync, statSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { InputError, type InputProblem } from '../errors/inputError.js';

/** One output file: its name inside the output folder and its full text. */
export interface OutputFile {
  readonly name: string;
  readonly text: string;
}

/** Prefix of a folder holding a new output set that is still being written (discarded when found). */
export const PARTIAL_PREFIX = '.quantbid-partial-';
/** Prefix of a folder holding a complete new output set that is being moved into place (finished when found). */
export const COMMIT_PREFIX = '.quantbid-commit-';
/** Marker, inside a commit folder, of an optional output that the install removes. */
const RETIRED_PREFIX = '.retired-';

/**
 * Writes a set of output files into `outDir` so that the folder holds either the old set or the new
 * one, never a mix, and no file is ever half-written. A file system renames one name at a time, so a
 * set of files cannot be replaced in one step; instead the set is written like a database commit with
 * a redo record (write-ahead logging, common practice in databases):
 *
 * 1. stage: every file is written, and flushed to disk, into a new folder `.quantbid-partial-<pid>-*`
 *    inside `outDir` (the same file system, so the renames below are atomic). A process killed here
 *    leaves the old set untouched;
 * 2. commit: that folder is renamed to `.quantbid-commit-<pid>-*` in one atomic step. From here on the
 *    new set is the outputs;
 * 3. install: each file is renamed from the commit folder over its old version (an atomic replace),
 *    then the empty commit folder is removed;
 * 4. recover: every write into a folder first removes the partial folders and finishes (rolls forward)
 *    the commit folders that processes no longer running left behind, and removes their stray
 *    `.sweep-journal.jsonl.tmp-<pid>` files (a journal being created, gridJournal.ts).
 *
 * So a run killed at any moment leaves the old set (killed before the commit), or the new set (after
 * the install), or, killed during the install's few renames, a commit folder that holds the rest of the
 * new set: the next quantbid write into the folder finishes it before doing anything else. A script
 * that reads the outputs while quantbid may be writing them should wait while a `.quantbid-commit-*`
 * entry exists. Leftovers only ever carry these dot-names, never an output's name. One writer per
 * folder at a time: a folder whose process still runs is left alone.
 *
 * Existing outputs are kept unless `force`. Files of `outDir` that are not in the set are not touched,
 * except, with `force`, the command's `optional` outputs this run does not write (e.g. a report.html
 * of an earlier run with --report): they go in the install step, through an empty marker file
 * `.retired-<name>` in the commit folder, so a stale optional output never stands beside a new set.
 * When staging fails, the staged files and any folder this call created are removed, and the failure
 * is an input error naming --out. OutputStage does the same for a set written piece by piece.
 */
export function writeOutputs(outDir: string, files: readonly OutputFile[], force: boolean, optional: readonly string[] = []): string[] {
  const stage = OutputStage.begin(outDir, files.map((f) => f.name), force, optional);
  for (const file of files) stage.write(file.name, file.text);
  return stage.commit();
}

/** A file of an OutputStage written piece by piece. */
export interface StagedFile {
  /**
   * Appends text, written at once: pieces are not gathered in memory, where a long run's pieces would
   * outlive the young generation of the garbage collector and pile up (pass pieces of some kilobytes).
   * Bytes are written as they are (UTF-8 text).
   */
  append(text: string | Uint8Array): void;
}

/**
 * An output set being staged (writeOutputs, steps 1 and 2), for outputs too large to build as one text:
 * `begin` checks the folder, recovers leftovers and makes the staging folder; `write` and `open` put
 * files into it; `commit` makes them the outputs; `discard` removes the stage and any folder `begin`
 * created (call it when the work fails). A file-system failure discards the stage and throws the
 * input error naming --out.
 */
export class OutputStage {
  private readonly openFiles = new Map<string, number>();
  private done = false;

  private constructor(
    readonly outDir: string,
    private readonly names: readonly string[],
    private readonly staging: string,
    private readonly created: readonly string[],
    private readonly retired: readonly string[],
  ) {}

  /** `optional`: the command's other outputs, removed with `force` when this set does not hold them. */
  static begin(outDir: string, names: readonly string[], force: boolean, optional: readonly string[] = []): OutputStage {
    checkOutputFolder(outDir, names, force);
    let created: string[] = [];
    try {
      created = makeFolders(outDir);
      recoverOutputs(outDir);
      const retired = force ? optional.filter((name) => !names.includes(name)) : [];
      return new OutputStage(outDir, names, mkdtempSync(join(outDir, `${PARTIAL_PREFIX}${process.pid}-`)), created, retired);
    } catch (err) {
      removeEmptyFolders(created);
      throw asInputError(outDir, err);
    }
  }

  /** Writes a whole file into the stage. */
  write(name: string, text: string): void {
    this.guard(() => writeFileSync(this.path(name), text, { flush: true }));
  }

  /** Opens a file of the stage to be written piece by piece. */
  open(name: string): StagedFile {
    const fd = this.guard(() => openSync(this.path(name), 'w'));
    this.openFiles.set(name, fd);
    return {
      append: (text: string | Uint8Array) => {
        if (this.done) throw new RangeError(`OutputStage: ${name} is closed`);
        this.guard(() => {
          if (typeof text === 'string') writeSync(fd, text);
          else for (let written = 0; written < text.length; ) written += writeSync(fd, text, written, text.length - written);
        });
      },
    };
  }

  /** Steps 2 and 3: every file flushed to disk, the stage committed and installed; the paths written. */
  commit(): string[] {
    const missing = this.names.filter((name) => !existsSync(join(this.staging, name)));
    if (missing.length > 0) throw new RangeError(`OutputStage: ${missing.join(', ')} not written`);
    let committed = '';
    this.guard(() => {
      for (const [name, fd] of [...this.openFiles]) {
        fsyncSync(fd);
        this.openFiles.delete(name);
        closeSync(fd);
      }
      for (const name of this.retired) if (existsSync(join(this.outDir, name))) writeFileSync(join(this.staging, `${RETIRED_PREFIX}${name}`), '');
      syncFolder(this.staging);
      committed = join(this.outDir, `${COMMIT_PREFIX}${this.staging.slice(this.staging.lastIndexOf(PARTIAL_PREFIX) + PARTIAL_PREFIX.length)}`);
      renameSync(this.staging, committed);
    });
    this.done = true;
    installCommitted(this.outDir, committed);
    return this.names.map((name) => join(this.outDir, name));
  }

  /** Removes the stage and the folders `begin` created; the old outputs stay as they were. */
  discard(): void {
    if (this.done) return;
    this.done = true;
    for (const fd of this.openFiles.values()) {
      try {
        closeSync(fd);
      } catch {
        // Closed already, or the disk is gone: the stage is removed below either way.
      }
    }
    this.openFiles.clear();
    rmSync(this.staging, { recursive: true, force: true });
    removeEmptyFolders(this.created);
  }

  private path(name: string): string {
    if (this.done || !this.names.includes(name)) throw new RangeError(`OutputStage: ${name} is not an open output of this stage`);
    return join(this.staging, name);
  }

  /** Runs a file-system step; on failure discards the stage and throws the error naming --out. */
  private guard<T>(step: () => T): T {
    try {
      return step();
    } catch (err) {
      this.discard();
      throw asInputError(this.outDir, err);
    }
  }
}

/** A file-system failure as the input error naming --out; any other error unchanged. */
function asInputError(outDir: string, err: unknown): unknown {
  const problem = writeProblem(outDir, (err as NodeJS.ErrnoException).code);
  return problem === null ? err : new InputError([problem]);
}

/**
 * Step 4 of writeOutputs: removes the partial folders and stray temporary files, and finishes the
 * commit folders, that processes no longer running left in `outDir`. Does nothing when `outDir` does
 * not exist.
 */
export function recoverOutputs(outDir: string): void {
  if (!existsSync(outDir)) return;
  const names = readdirSync(outDir).sort();
  for (const name of names) {
    const pid = leftoverPid(name);
    if (pid === null || isRunning(pid)) continue;
    const path = join(outDir, name);
    if (name.startsWith(COMMIT_PREFIX)) installCommitted(outDir, path);
    else rmSync(path, { recursive: true, force: true });
  }
}

/** The process id in a name that writeOutputs or the sweep journal leaves while writing, else null. */
function leftoverPid(name: string): number | null {
  const match = /^\.quantbid-(?:partial|commit)-(\d+)-/.exec(name) ?? /^\.[\w.-]+-journal\.jsonl\.tmp-(\d+)$/.exec(name);
  return match === null ? null : Number(match[1]);
}

/**
 * Whether another process with this id runs. This process's own leftovers are from an earlier write
 * that failed: writes are synchronous, so none of ours is in flight.
 */
function isRunning(pid: number): boolean {
  if (pid === process.pid) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: it runs, as another user; ESRCH: no such process.
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Step 3: moves every file of a commit folder over its old version in `outDir`, then removes the folder. */
function installCommitted(outDir: string, committed: string): void {
  for (const name of readdirSync(committed).sort()) {
    if (name.startsWith(RETIRED_PREFIX)) {
      rmSync(join(outDir, name.slice(RETIRED_PREFIX.length)), { force: true });
      unlinkSync(join(committed, name));
    } else {
      renameSync(join(committed, name), join(outDir, name));
    }
  }
  rmdirSync(committed);
  syncFolder(outDir);
}

/** Flushes a folder's entries (new names, renames) to disk where the system allows it. */
function syncFolder(folder: string): void {
  let fd: number | null = null;
  try {
    fd = openSync(folder, 'r');
    fsyncSync(fd);
  } catch {
    // Some systems cannot open or flush a folder; the renames are still atomic, only less durable.
  } finally {
    if (fd !== null) closeSync(fd);
  }
}

/**
 * Fails before any work is done when the outputs cannot be written: the folder, or a folder above it,
 * is a file; an output's name is taken by a folder; or outputs exist and `force` is not set.
 */
export function checkOutputFolder(outDir: string, names: readonly string[], force: boolean): void {
  const existing = nearestExisting(outDir);
  if (existing !== null && !statSync(existing).isDirectory()) {
    throw new InputError([
      existing === resolve(outDir)
        ? { file: outDir, field: '--out', message: 'is a file, not a folder', fix: 'give a folder for the outputs' }
        : { file: outDir, field: '--out', message: `cannot be made: ${existing} is a file, not a folder`, fix: 'give a folder for the outputs' },
    ]);
  }
  const folders = names.filter((name) => isFolder(join(outDir, name)));
  if (folders.length > 0) {
    throw new InputError(
      folders.map((name) => ({ file: join(outDir, name), field: '--out', message: 'is a folder where this output file should go', fix: 'move or rename that folder, or choose another --out folder' })),
    );
  }
  if (force) return;
  const present = names.filter((name) => existsSync(join(outDir, name)));
  if (present.length > 0) {
    throw new InputError([
      { file: join(outDir, present[0] as string), field: '--out', message: `${present.length > 1 ? `${present.length} outputs` : 'the output'} already exist${present.length > 1 ? '' : 's'} (${present.join(', ')})`, fix: 'choose another --out folder or add --force to overwrite' },
    ]);
  }
}

function isFolder(path: string): boolean {
  try {
    return statSync(path).isDirectory();
  } catch {
    return false;
  }
}

/** The path itself or its nearest ancestor that exists (absolute), or null when none does. */
function nearestExisting(path: string): string | null {
  for (let at = resolve(path); ; at = dirname(at)) {
    if (existsSync(at)) return at;
    if (dirname(at) === at) return null;
  }
}

/**
 * Creates `outDir` and any missing folders above it, one level at a time (a recursive mkdir can loop
 * forever under some virtual file systems); returns the folders created, outermost first.
 */
function makeFolders(outDir: string): string[] {
  const missing: string[] = [];
  for (let at = resolve(outDir); !existsSync(at); at = dirname(at)) {
    missing.unshift(at);
    if (dirname(at) === at) break;
  }
  const created: string[] = [];
  try {
    for (const folder of missing) {
      mkdirSync(folder);
      created.push(folder);
    }
  } catch (err) {
    removeEmptyFolders(created);
    throw err;
  }
  return created;
}

/** Removes folders, innermost first, leaving any that are not empty. */
function removeEmptyFolders(outermostFirst: readonly string[]): void {
  for (const folder of [...outermostFirst].reverse()) {
    try {
      rmdirSync(folder);
    } catch {
      return;
    }
  }
}

function writeProblem(outDir: string, code: string | undefined): InputProblem | null {
  const problem = (message: string, fix: string): InputProblem => ({ file: outDir, field: '--out', message, fix });
  switch (code) {
    case 'EACCES':
    case 'EPERM':
    case 'EROFS':
      return problem('the output folder is not writable', 'choose a folder you may write to');
    case 'ENOTDIR':
    case 'EEXIST':
      return problem('cannot be made: a file stands where a folder should be', 'give a folder for the outputs');
    case 'ENOENT':
      return problem('cannot be made here', 'give a folder on a normal, writable disk');
    case 'ENOSPC':
    case 'EDQUOT':
      return problem('the disk is full', 'free some space or choose another folder');
    case 'ENAMETOOLONG':
    case 'EINVAL':
    case 'ERR_INVALID_ARG_VALUE':
      return problem('is not a valid folder name here (too long, or a character the file system refuses)', 'choose a shorter, plain folder name');
    default:
      // Any other error of the file system is still about the folder; a fault of our own has no code.
      return code?.startsWith('E') === true ? problem(`cannot be written (${code})`, 'check the folder and the disk') : null;
  }
}
