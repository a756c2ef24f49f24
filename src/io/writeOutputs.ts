import { closeSync, existsSync, fdatasync, fsyncSync, lstatSync, mkdtempSync, openSync, readdirSync, readlinkSync, renameSync, rmdirSync, rmSync, statSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { InputError, type InputProblem } from '../errors/inputError.js';
import { LOCK_TEMP_PREFIX, OutputLock } from './outputLock.js';
import { outFolderWriteProblem as writeProblem } from './outFolderWriteProblem.js';
import { isRunning } from './processAlive.js';

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
 * 0. lock: the folder's lock (outputLock.ts) is taken, or the caller's is used, so that one run at a
 *    time writes into the folder; the existing outputs are checked again under it;
 * 1. stage: every file is written, and flushed to disk, into a new folder `.quantbid-partial-<pid>-*`
 *    inside `outDir` (the same file system, so the renames below are atomic). A process killed here
 *    leaves the old set untouched;
 * 2. commit: that folder is renamed to `.quantbid-commit-<pid>-*` in one atomic step. From here on the
 *    new set is the outputs;
 * 3. install: each file is renamed from the commit folder over its old version (an atomic replace),
 *    then the empty commit folder is removed;
 * 4. recover: every write into a folder first removes the partial folders and finishes (rolls forward)
 *    the commit folders that processes no longer running left behind, and removes their stray
 *    temporary files (a journal being created, gridJournal.ts; a lock being written, outputLock.ts).
 *
 * So a run killed at any moment leaves the old set (killed before the commit), or the new set (after
 * the install), or, killed during the install's few renames, a commit folder that holds the rest of the
 * new set: the next quantbid write into the folder finishes it before doing anything else. A script
 * that reads the outputs while quantbid may be writing them should wait while a `.quantbid-commit-*`
 * entry exists. Leftovers only ever carry these dot-names, never an output's name.
 *
 * Existing outputs are kept unless `force`; the files a leftover commit folder would install count as
 * existing (checkOutputFolder), so a leftover set is never installed past that check. A commit folder
 * that quantbid cannot have left (a link, a folder inside it, a hidden name) is refused before anything
 * moves. Files of `outDir` that are not in the set are not touched, except, with `force`, the command's
 * `optional` outputs this run does not write (e.g. a report.html of an earlier run with --report): they
 * go in the install step, through an empty marker file `.retired-<name>` in the commit folder, so a
 * stale optional output never stands beside a new set. When staging fails, the staged files and any
 * folder this call created are removed, and the failure is an input error naming --out. OutputStage
 * does the same for a set written piece by piece.
 */
export function writeOutputs(outDir: string, files: readonly OutputFile[], force: boolean, optional: readonly string[] = [], lock?: OutputLock): string[] {
  const stage = OutputStage.begin(outDir, files.map((f) => f.name), force, optional, lock);
  try {
    for (const file of files) stage.write(file.name, file.text);
    return stage.commit();
  } finally {
    stage.discard();
  }
}

/** A file of an OutputStage written piece by piece. */
export interface StagedFile {
  /**
   * Appends text, written at once: pieces are not gathered in memory, where a long run's pieces would
   * outlive the young generation of the garbage collector and pile up (pass pieces of some kilobytes).
   * Bytes are written as they are (UTF-8 text).
   */
  append(text: string | Uint8Array): void;
  /**
   * Starts flushing what was appended to disk on a thread of the pool, so that the disk works while
   * this thread goes on (commit then has less left to wait for: a year's ledger is 18 MiB); resolves
   * when it is flushed. Await it before the commit: a failure discards the stage and rejects with the
   * input error naming --out, as a failed append does. Append nothing while it runs.
   */
  flush(): Promise<void>;
}

/**
 * An output set being staged (writeOutputs, steps 0 to 2), for outputs too large to build as one text:
 * `begin` checks the folder, takes its lock (unless the caller holds it and passes it), recovers
 * leftovers and makes the staging folder; `write` and `open` put files into it; `commit` makes them the
 * outputs; `discard` removes the stage (call it when the work fails; after a commit it does nothing
 * more). A lock the stage took itself is released by commit or discard. A file-system failure
 * discards the stage and throws the input error naming --out.
 */
export class OutputStage {
  private readonly openFiles = new Map<string, number>();
  private done = false;

  private constructor(
    readonly outDir: string,
    private readonly names: readonly string[],
    private readonly staging: string,
    private readonly retired: readonly string[],
    private readonly lock: OutputLock,
    private readonly ownLock: boolean,
  ) {}

  /** `optional`: the command's other outputs, removed with `force` when this set does not hold them; `lock`: the folder's lock when the caller holds it. */
  static begin(outDir: string, names: readonly string[], force: boolean, optional: readonly string[] = [], lock?: OutputLock): OutputStage {
    checkOutputFolder(outDir, names, force);
    const held = lock ?? OutputLock.take(outDir, 'write');
    try {
      if (lock !== undefined) lock.verify();
      // Under the lock: what another run wrote before it took the lock counts as existing outputs.
      checkOutputFolder(outDir, names, force);
      const retired = force ? optional.filter((name) => !names.includes(name)) : [];
      const staging = attemptIn(outDir, () => {
        recoverOutputs(outDir);
        return mkdtempSync(join(outDir, `${PARTIAL_PREFIX}${process.pid}-`));
      });
      return new OutputStage(outDir, names, staging, retired, held, lock === undefined);
    } catch (err) {
      if (lock === undefined) held.release();
      throw err;
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
      flush: () =>
        new Promise<void>((done, failed) => {
          if (this.done) throw new RangeError(`OutputStage: ${name} is closed`);
          fdatasync(fd, (err) => {
            if (err === null) done();
            else {
              try {
                this.guard(() => {
                  throw err;
                });
              } catch (problem) {
                failed(problem);
              }
            }
          });
        }),
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
      this.lock.verify();
      renameSync(this.staging, committed);
    });
    this.done = true;
    try {
      attemptIn(this.outDir, () => installCommitted(this.outDir, committed));
    } finally {
      if (this.ownLock) this.lock.release();
    }
    return this.names.map((name) => join(this.outDir, name));
  }

  /** Removes the stage; the old outputs stay as they were. Does nothing after a commit. */
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
    if (this.ownLock) this.lock.release();
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

/** Runs a file-system step in `outDir`; its failure becomes the input error naming --out. */
function attemptIn<T>(outDir: string, step: () => T): T {
  try {
    return step();
  } catch (err) {
    throw asInputError(outDir, err);
  }
}

/** A file-system failure as the input error naming --out; any other error unchanged. */
function asInputError(outDir: string, err: unknown): unknown {
  if (err instanceof InputError) return err;
  const problem = writeProblem(outDir, (err as NodeJS.ErrnoException).code);
  return problem === null ? err : new InputError([problem]);
}

/**
 * Step 4 of writeOutputs: removes the partial folders and stray temporary files, and finishes the
 * commit folders, that processes no longer running left in `outDir`. Every commit folder is checked
 * first (leftoverCommitProblems): one that quantbid cannot have left stops the recovery before anything
 * moves. Does nothing when `outDir` does not exist.
 */
export function recoverOutputs(outDir: string): void {
  if (!existsSync(outDir)) return;
  const leftovers = deadLeftovers(outDir);
  const problems = leftovers.filter((name) => name.startsWith(COMMIT_PREFIX)).flatMap((name) => leftoverCommitProblems(outDir, name));
  if (problems.length > 0) throw new InputError(problems);
  for (const name of leftovers) {
    const path = join(outDir, name);
    if (name.startsWith(COMMIT_PREFIX)) installCommitted(outDir, path);
    else rmSync(path, { recursive: true, force: true });
  }
}

/** Names in `outDir` that runs no longer running left while writing, sorted. */
function deadLeftovers(outDir: string): string[] {
  return readdirSync(outDir)
    .sort()
    .filter((name) => {
      const pid = leftoverPid(name);
      return pid !== null && pid !== process.pid ? !isRunning(pid) : pid === process.pid;
    });
}

/** The process id in a name that writeOutputs, the sweep journal or the lock leaves while writing, else null. */
function leftoverPid(name: string): number | null {
  const match =
    /^\.quantbid-(?:partial|commit)-(\d+)-/.exec(name) ??
    /^\.[\w.-]+-journal\.jsonl\.tmp-(\d+)$/.exec(name) ??
    (name.startsWith(LOCK_TEMP_PREFIX) ? /^(\d+)-/.exec(name.slice(LOCK_TEMP_PREFIX.length)) : null);
  return match === null ? null : Number(match[1]);
}

/** An output's name inside a commit folder: no leading dot (hidden names are quantbid's own), no separators. */
const OUTPUT_NAME = /^[^./\\][^/\\]*$/;

/**
 * Why the commit folder `name` in `outDir` is not a set quantbid left, or none: it must be a real
 * folder (not a link) holding only regular files with output names (no leading dot) or empty
 * `.retired-<name>` markers, none of them over a folder of `outDir`.
 */
export function leftoverCommitProblems(outDir: string, name: string): InputProblem[] {
  const path = join(outDir, name);
  const refuse = (what: string): InputProblem[] => [
    { file: path, field: '--out', message: `is not an output set quantbid left (${what})`, fix: 'look at it, then move or delete it; quantbid never installs it' },
  ];
  const stat = lstatSync(path);
  if (!stat.isDirectory()) return refuse(stat.isSymbolicLink() ? 'a symbolic link' : 'not a folder');
  for (const entry of readdirSync(path).sort()) {
    const output = entry.startsWith(RETIRED_PREFIX) ? entry.slice(RETIRED_PREFIX.length) : entry;
    if (!OUTPUT_NAME.test(output)) return refuse(`it holds ${JSON.stringify(entry)}, which is not an output's name`);
    const inside = lstatSync(join(path, entry));
    if (!inside.isFile()) return refuse(`${entry} in it is ${inside.isDirectory() ? 'a folder' : inside.isSymbolicLink() ? 'a symbolic link' : 'not a regular file'}`);
    if (isFolder(join(outDir, output))) return refuse(`it would replace the folder ${output}`);
  }
  return [];
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

/** An input file of a run, for the check that no output is one of them. */
export interface RunInputFile {
  readonly path: string;
  /** What it is, e.g. `--history` or `the scenario's "history"`. */
  readonly what: string;
}

/**
 * Fails before any work is done when the outputs cannot be written: the folder, or a folder above it,
 * is a file, a link to nowhere or a loop of links; an output's name is taken by a folder; an output
 * would replace one of the run's `inputs` (the same file, by name, link or hard link); a leftover
 * commit folder is not quantbid's; or outputs exist (or a leftover set would install some) and `force`
 * is not set.
 */
export function checkOutputFolder(outDir: string, names: readonly string[], force: boolean, inputs: readonly RunInputFile[] = []): void {
  const linkProblem = folderLinkProblem(outDir);
  if (linkProblem !== null) throw new InputError([linkProblem]);
  const existing = nearestExisting(outDir);
  if (existing !== null && !statSync(existing).isDirectory()) {
    throw new InputError([
      existing === resolve(outDir)
        ? { file: outDir, field: '--out', message: 'is a file, not a folder', fix: 'give a folder for the outputs' }
        : { file: outDir, field: '--out', message: `cannot be made: ${existing} is a file, not a folder`, fix: 'give a folder for the outputs' },
    ]);
  }
  const clashes = inputClashes(outDir, names, inputs);
  if (clashes.length > 0) throw new InputError(clashes);
  const folders = names.filter((name) => isFolder(join(outDir, name)));
  if (folders.length > 0) {
    throw new InputError(
      folders.map((name) => ({ file: join(outDir, name), field: '--out', message: 'is a folder where this output file should go', fix: 'move or rename that folder, or choose another --out folder' })),
    );
  }
  const commits = existing === resolve(outDir) ? deadLeftovers(outDir).filter((name) => name.startsWith(COMMIT_PREFIX)) : [];
  const crafted = commits.flatMap((name) => leftoverCommitProblems(outDir, name));
  if (crafted.length > 0) throw new InputError(crafted);
  if (force) return;
  const present = names.filter((name) => existsSync(join(outDir, name)));
  if (present.length > 0) {
    throw new InputError([
      { file: join(outDir, present[0] as string), field: '--out', message: `${present.length > 1 ? `${present.length} outputs` : 'the output'} already exist${present.length > 1 ? '' : 's'} (${present.join(', ')})`, fix: 'choose another --out folder or add --force to overwrite' },
    ]);
  }
  for (const commit of commits) {
    const pending = readdirSync(join(outDir, commit)).filter((entry) => names.includes(entry)).sort();
    if (pending.length > 0) {
      throw new InputError([
        {
          file: join(outDir, commit),
          field: '--out',
          message: `holds outputs of an earlier run that stopped while moving them into place (${pending.join(', ')}); they count as existing outputs`,
          fix: 'choose another --out folder or add --force to overwrite them (the earlier set is finished first)',
        },
      ]);
    }
  }
}

/** The outputs (and the folder's hidden files of this run) that are one of the run's input files. */
function inputClashes(outDir: string, names: readonly string[], inputs: readonly RunInputFile[]): InputProblem[] {
  const ids = inputs.map((input) => ({ input, id: fileId(input.path), at: resolve(input.path) }));
  const problems: InputProblem[] = [];
  for (const name of names) {
    const path = join(outDir, name);
    const id = fileId(path);
    const clash = ids.find((x) => x.at === resolve(path) || (id !== null && x.id === id));
    if (clash !== undefined) {
      problems.push({ file: path, field: '--out', message: `would be written over ${clash.input.what} ${clash.input.path}, an input of this run`, fix: 'choose another --out folder or output name; keep inputs and outputs apart' });
    }
  }
  return problems;
}

/** The device and inode of the file a path names (links followed), or null when there is none. */
function fileId(path: string): string | null {
  try {
    const stat = statSync(path);
    return `${stat.dev}:${stat.ino}`;
  } catch {
    return null;
  }
}

/** A problem when `outDir` (or a folder above it) is a link to nothing or a loop of links, else null. */
function folderLinkProblem(outDir: string): InputProblem | null {
  for (let at = resolve(outDir); ; at = dirname(at)) {
    let isLink = false;
    try {
      isLink = lstatSync(at).isSymbolicLink();
    } catch {
      isLink = false;
    }
    if (isLink) {
      try {
        statSync(at);
      } catch (err) {
        const code = (err as NodeJS.ErrnoException).code;
        const target = safeReadlink(at);
        if (code === 'ELOOP') return { file: outDir, field: '--out', message: `${at} is a symbolic link that leads back to itself (a loop)`, fix: 'give a folder path without that link, or repair the link' };
        if (code === 'ENOENT') return { file: outDir, field: '--out', message: `${at} is a symbolic link to ${target}, which does not exist`, fix: 'create the folder the link points to, repair the link, or give another --out folder' };
      }
    }
    if (dirname(at) === at) return null;
  }
}

function safeReadlink(path: string): string {
  try {
    return readlinkSync(path);
  } catch {
    return '(unreadable)';
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
