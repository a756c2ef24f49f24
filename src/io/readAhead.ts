import { readFileSync, statSync } from 'node:fs';
import { gunzip } from 'node:zlib';
import { fileIdentity, gunzipOptions, MAX_INPUT_BYTES } from './readInputFile.js';

/** A file's content as readInputFile reads it (inflated when gzip), read earlier: see its `readAhead` option. */
export interface ReadAhead {
  readonly path: string;
  /** The file's identity when it was read (fileIdentity). */
  readonly identity: string;
  /** The size limit it was inflated under [bytes]. */
  readonly maxBytes: number;
  readonly plain: Uint8Array;
}

/**
 * Largest gzip file read ahead [bytes, compressed]. A read ahead that turns out not to be needed (the
 * run stops on another input's problem first) still runs to its end before the process exits: a few
 * hundred milliseconds at most for a file this size, where a year's forecast is a few MiB.
 */
export const READ_AHEAD_MAX_BYTES = 32 * 1024 * 1024;

/**
 * Starts reading the gzip file `path` and inflating it on a thread of the pool, for readInputFile's
 * `readAhead` option, so that this thread can load code and check other inputs meanwhile. The read
 * itself (a few MiB compressed) is synchronous: the pool gets one piece of work, which goes on while
 * this thread is busy. Resolves to undefined, and the synchronous reader then reads and reports as
 * usual, when the path is not a regular file named .gz within READ_AHEAD_MAX_BYTES, or when anything
 * goes wrong (it never rejects); inflated under the reader's limits, so a file it would refuse costs
 * no more here.
 */
export function readAheadGzip(path: string): Promise<ReadAhead | undefined> {
  if (!path.endsWith('.gz')) return Promise.resolve(undefined);
  let identity: string;
  let bytes: Buffer;
  try {
    const stat = statSync(path);
    if (!stat.isFile() || stat.size > READ_AHEAD_MAX_BYTES) return Promise.resolve(undefined);
    identity = fileIdentity(stat);
    bytes = readFileSync(path);
    if (bytes.length !== stat.size) return Promise.resolve(undefined);
  } catch {
    return Promise.resolve(undefined);
  }
  const maxBytes = MAX_INPUT_BYTES;
  return new Promise((resolve) => {
    gunzip(bytes, gunzipOptions(bytes, maxBytes), (err, plain) => resolve(err === null ? { path, identity, maxBytes, plain } : undefined));
  });
}
