import { existsSync, mkdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { InputError } from './inputError.js';

/** One output file: its name inside the output folder and its full text. */
export interface OutputFile {
  readonly name: string;
  readonly text: string;
}

/**
 * Writes a set of output files into `outDir` so that none is ever half-written: each file goes to a
 * temporary name in the same folder first, and only when every file is written are they renamed into
 * place (a rename within one file system is atomic). Existing outputs are kept unless `force`.
 */
export function writeOutputs(outDir: string, files: readonly OutputFile[], force: boolean): string[] {
  checkOutputFolder(outDir, files.map((f) => f.name), force);
  mkdirSync(outDir, { recursive: true });
  const temporary = files.map((file) => ({ ...file, tmp: join(outDir, `.${file.name}.tmp-${process.pid}`) }));
  try {
    for (const file of temporary) writeFileSync(file.tmp, file.text);
    for (const file of temporary) renameSync(file.tmp, join(outDir, file.name));
  } catch (err) {
    for (const file of temporary) rmSync(file.tmp, { force: true });
    const code = (err as NodeJS.ErrnoException).code;
    if (code === 'EACCES' || code === 'EPERM' || code === 'EROFS') {
      throw new InputError([{ file: outDir, field: '--out', message: 'the output folder is not writable', fix: 'choose a folder you may write to' }]);
    }
    throw err;
  }
  return files.map((f) => join(outDir, f.name));
}

/**
 * Fails before any work is done when the outputs cannot be written: the folder is a file, or outputs
 * exist and `force` is not set.
 */
export function checkOutputFolder(outDir: string, names: readonly string[], force: boolean): void {
  if (existsSync(outDir) && !statSync(outDir).isDirectory()) {
    throw new InputError([{ file: outDir, field: '--out', message: 'is a file, not a folder', fix: 'give a folder for the outputs' }]);
  }
  if (force) return;
  const existing = names.filter((name) => existsSync(join(outDir, name)));
  if (existing.length > 0) {
    throw new InputError([
      { file: join(outDir, existing[0] as string), field: '--out', message: `${existing.length > 1 ? `${existing.length} outputs` : 'the output'} already exist${existing.length > 1 ? '' : 's'} (${existing.join(', ')})`, fix: 'choose another --out folder or add --force to overwrite' },
    ]);
  }
}
