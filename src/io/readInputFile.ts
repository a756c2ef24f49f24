import { readFileSync, statSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { InputError } from './inputError.js';

/** Largest input file read whole [bytes]; larger files are refused before reading. */
export const MAX_INPUT_BYTES = 512 * 1024 * 1024;

/**
 * Reads a text input file (UTF-8, or gzip when the name ends in .gz). Missing files, folders and
 * oversized files are input errors that say what to do.
 */
export function readInputFile(path: string): string {
  let size: number;
  try {
    const stat = statSync(path);
    if (stat.isDirectory()) throw new InputError([{ file: path, message: 'is a folder, not a file', fix: 'give the path of the file inside it' }]);
    size = stat.size;
  } catch (err) {
    if (err instanceof InputError) throw err;
    throw new InputError([{ file: path, message: 'cannot be read (no such file or no permission)', fix: 'check the path and the file\'s read rights' }]);
  }
  if (size > MAX_INPUT_BYTES) {
    throw new InputError([{ file: path, message: `is ${Math.round(size / 1048576)} MiB, more than the ${MAX_INPUT_BYTES / 1048576} MiB an input may have`, fix: 'check that this is the right file; split a long history by year' }]);
  }
  const bytes = readFileSync(path);
  if (!path.endsWith('.gz')) return bytes.toString('utf8');
  try {
    return gunzipSync(bytes, { maxOutputLength: MAX_INPUT_BYTES }).toString('utf8');
  } catch {
    throw new InputError([{ file: path, message: 'is named .gz but is not a readable gzip file', fix: 'decompress it yourself or rename it without .gz' }]);
  }
}
