import { existsSync, mkdirSync, renameSync, rmdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { InputError, type InputProblem } from './inputError.js';

/** One output file: its name inside the output folder and its full text. */
export interface OutputFile {
  readonly name: string;
  readonly text: string;
}

/**
 * Writes a set of output files into `outDir` so that none is ever half-written: each file goes to a
 * temporary name in the same folder first, and only when every file is written are they renamed into
 * place (a rename within one file system is atomic). Existing outputs are kept unless `force`. When
 * anything fails, the temporary files and any folder this call created are removed, and the failure
 * is an input error naming --out.
 */
export function writeOutputs(outDir: string, files: readonly OutputFile[], force: boolean): string[] {
  checkOutputFolder(outDir, files.map((f) => f.name), force);
  const temporary = files.map((file) => ({ ...file, tmp: join(outDir, `.${file.name}.tmp-${process.pid}`) }));
  let created: string[] = [];
  try {
    created = makeFolders(outDir);
    for (const file of temporary) writeFileSync(file.tmp, file.text);
    for (const file of temporary) renameSync(file.tmp, join(outDir, file.name));
  } catch (err) {
    for (const file of temporary) rmSync(file.tmp, { force: true });
    removeEmptyFolders(created);
    const problem = writeProblem(outDir, (err as NodeJS.ErrnoException).code);
    if (problem === null) throw err;
    throw new InputError([problem]);
  }
  return files.map((f) => join(outDir, f.name));
}

/**
 * Fails before any work is done when the outputs cannot be written: the folder, or a folder above it,
 * is a file, or outputs exist and `force` is not set.
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
  if (force) return;
  const present = names.filter((name) => existsSync(join(outDir, name)));
  if (present.length > 0) {
    throw new InputError([
      { file: join(outDir, present[0] as string), field: '--out', message: `${present.length > 1 ? `${present.length} outputs` : 'the output'} already exist${present.length > 1 ? '' : 's'} (${present.join(', ')})`, fix: 'choose another --out folder or add --force to overwrite' },
    ]);
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
