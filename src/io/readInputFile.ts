import { closeSync, openSync, readFileSync, readSync, statSync, type Stats } from 'node:fs';
import { isUtf8 } from 'node:buffer';
import { constants, gunzipSync } from 'node:zlib';
import { InputError, type InputProblem } from '../errors/inputError.js';
import type { ReadAhead } from './readAhead.js';
import { SNIFF_BYTES, sniffText, type FirstLineCheck } from './sniffText.js';

/**
 * Largest input file read whole [bytes], compressed or not; larger files are refused before reading.
 * Kept below the engine's longest string (2^29 - 24 UTF-16 units), so a file under the limit can
 * always become one string.
 */
export const MAX_INPUT_BYTES = 500 * 1024 * 1024;

export interface ReadInputOptions {
  /** Largest file accepted [bytes], default MAX_INPUT_BYTES (JSON specs pass far less). */
  readonly maxBytes?: number;
  /**
   * Checks the first non-blank line (a CSV header) before the whole file is read, so a wrong file
   * fails in milliseconds whatever its size. Returns the problems found (none: go on).
   */
  readonly firstLine?: FirstLineCheck;
  /**
   * The file's content read and inflated ahead, on a thread of the pool (readAhead.ts): taken instead of
   * reading and inflating the file again when it was read from the file as it is now (same device,
   * inode, size and times) under the same size limit. Every other check runs as without it.
   */
  readonly readAhead?: ReadAhead;
}

/** What tells one state of a file from another: device, inode, size, and modification and change times. */
export function fileIdentity(stat: { readonly dev: number; readonly ino: number; readonly size: number; readonly mtimeMs: number; readonly ctimeMs: number }): string {
  return `${stat.dev}:${stat.ino}:${stat.size}:${stat.mtimeMs}:${stat.ctimeMs}`;
}

/**
 * Reads a text input file (UTF-8, or gzip when the name ends in .gz).
 *
 * Before reading it whole: a missing path, a folder, a device or pipe, a file over the size limit, binary
 * content, UTF-16 text, gzip data under a plain name and (with `firstLine`) a wrong header are input
 * errors that say what to do; only the first SNIFF_BYTES are read to tell.
 */
export function readInputFile(path: string, options: ReadInputOptions = {}): string {
  return checkedBytes(path, options).toString('utf8');
}

/**
 * The bytes of a text input file after every check of readInputFile (UTF-8 included), not yet made a
 * string: for a reader that looks at a small part of a large file (the rows of one day).
 */
export function readInputBytes(path: string, options: ReadInputOptions = {}): Uint8Array {
  return checkedBytes(path, options);
}

function checkedBytes(path: string, options: ReadInputOptions): Buffer {
  const maxBytes = options.maxBytes ?? MAX_INPUT_BYTES;
  const stat = checkedStat(path, maxBytes);
  const size = stat.size;
  const gzip = path.endsWith('.gz');
  const head = readHead(path, SNIFF_BYTES);
  if (head.length > size) {
    // A file of the system (under /proc or /sys) reports 0 bytes and makes up its content as it is read.
    throw new InputError([{ file: path, message: `is a special file of the system: it reports ${size} bytes but holds more`, fix: 'give a regular file; copy it to one first if you mean its content' }]);
  }
  if (gzip) {
    if (size > 0 && !(head[0] === 0x1f && head[1] === 0x8b)) {
      throw new InputError([{ file: path, message: 'is named .gz but is not gzip-compressed', fix: 'decompress it yourself or rename it without .gz' }]);
    }
    const plainHead = gunzipHead(head);
    sniff(path, plainHead.subarray(0, SNIFF_BYTES), plainHead.length > SNIFF_BYTES || size > GZIP_SNIFF_BYTES, options);
  } else {
    sniff(path, head, size > head.length, options);
  }
  const ahead = options.readAhead;
  const plain =
    ahead !== undefined && ahead.path === path && ahead.maxBytes === maxBytes && ahead.identity === fileIdentity(stat)
      ? Buffer.from(ahead.plain.buffer, ahead.plain.byteOffset, ahead.plain.byteLength)
      : readPlain(path, gzip, maxBytes);
  if (!isUtf8(plain)) throw new InputError([notUtf8Problem(path, plain)]);
  return plain;
}

/** The file's bytes, inflated when gzip. */
function readPlain(path: string, gzip: boolean, maxBytes: number): Buffer {
  const bytes = attempt(path, () => readFileSync(path));
  return gzip ? gunzipBytes(path, bytes, maxBytes) : bytes;
}

/**
 * The problem of bytes that are not UTF-8 (RFC 3629): where the first bad byte is, by byte offset and
 * line, so that it is not silently read as U+FFFD and reported later as a strange cell.
 */
function notUtf8Problem(path: string, bytes: Buffer): InputProblem {
  const at = firstBadUtf8Byte(bytes);
  let line = 1;
  for (let i = bytes.indexOf(0x0a); i >= 0 && i < at; i = bytes.indexOf(0x0a, i + 1)) line++;
  const shown = bytes.subarray(at, at + 4).toString('hex').replace(/(..)/g, '$1 ').trim();
  return {
    file: path,
    line,
    message: `is not UTF-8 text: byte ${at + 1} (${shown}...) is not part of a UTF-8 character`,
    fix: 'save the file as UTF-8 (e.g. "CSV UTF-8"); a file in Latin-1 or Windows-1252 shows this',
  };
}

/** Offset of the first byte that does not belong to a well-formed UTF-8 sequence (RFC 3629, table 3-7 of Unicode 15, section 3.9). */
export function firstBadUtf8Byte(bytes: Buffer): number {
  for (let i = 0; i < bytes.length; ) {
    const b = bytes[i] as number;
    if (b < 0x80) {
      i++;
      continue;
    }
    const need = b >= 0xc2 && b <= 0xdf ? 1 : b >= 0xe0 && b <= 0xef ? 2 : b >= 0xf0 && b <= 0xf4 ? 3 : -1;
    if (need < 0) return i;
    const second = bytes[i + 1] ?? 0;
    const low = b === 0xe0 ? 0xa0 : b === 0xf0 ? 0x90 : 0x80;
    const high = b === 0xed ? 0x9f : b === 0xf4 ? 0x8f : 0xbf;
    if (second < low || second > high) return i;
    for (let k = 2; k <= need; k++) if (((bytes[i + k] ?? 0) & 0xc0) !== 0x80) return i;
    i += need + 1;
  }
  return bytes.length;
}

/** Compressed bytes looked at to sniff a gzip file [bytes]: they decompress to a few MiB at most. */
const GZIP_SNIFF_BYTES = 4096;

/**
 * The start of a gzip file's content from its first compressed bytes, without decompressing the rest
 * (a sync flush accepts input cut anywhere). Empty when those bytes do not decompress: the full read
 * then names the damage.
 */
function gunzipHead(compressed: Buffer): Buffer {
  try {
    return gunzipSync(compressed.subarray(0, GZIP_SNIFF_BYTES), { finishFlush: constants.Z_SYNC_FLUSH, maxOutputLength: 16 * 1024 * 1024 });
  } catch {
    return Buffer.alloc(0);
  }
}

function sniff(path: string, head: Buffer, more: boolean, options: ReadInputOptions): void {
  const problems = sniffText(path, head, more, options.firstLine);
  if (problems.length > 0) throw new InputError(problems);
}

/** The status of a regular file within the size limit, or the input error that says why it cannot be read. */
function checkedStat(path: string, maxBytes: number): Stats {
  const stat = attempt(path, () => statSync(path));
  if (stat.isDirectory()) throw new InputError([{ file: path, message: 'is a folder, not a file', fix: 'give the path of the file inside it' }]);
  if (!stat.isFile()) throw new InputError([{ file: path, message: 'is not a regular file (a device, pipe or socket)', fix: 'save the input to a file and give its path' }]);
  if (stat.size > maxBytes) {
    throw new InputError([{ file: path, message: `is ${mebibytes(stat.size)}, more than the ${mebibytes(maxBytes)} this input may have`, fix: 'check that this is the right file; split a long history by year' }]);
  }
  return stat;
}

function readHead(path: string, length: number): Buffer {
  const head = Buffer.alloc(length);
  const fd = attempt(path, () => openSync(path, 'r'));
  try {
    const read = attempt(path, () => readSync(fd, head, 0, length, 0));
    return head.subarray(0, read);
  } finally {
    closeSync(fd);
  }
}

/**
 * Most a gzip input may inflate, as a multiple of its compressed size [-], above INFLATION_FLOOR_BYTES.
 * A price CSV compresses 3 to 20 times (the demo's files: 3.5 and 3.0); a file that inflates a hundred
 * times more is mostly one repeated byte (e.g. blank lines), and is refused after inflating at most
 * this much, in time and memory bounded by the compressed size, not by the size limit.
 */
export const MAX_INFLATION_RATIO = 100;
/** Inflated size always allowed [bytes], whatever the ratio: a small file is cheap however it compresses. */
export const INFLATION_FLOOR_BYTES = 16 * 1024 * 1024;

/** Output chunk of the gzip decompression [bytes] when the file does not tell its inflated size. */
const GUNZIP_CHUNK_BYTES = 1024 * 1024;
/** Largest single output chunk [bytes]: a file that says it inflates to more is inflated in chunks of this. */
const MAX_GUNZIP_CHUNK_BYTES = 64 * 1024 * 1024;

/**
 * The output chunk for inflating `bytes` [bytes]: the inflated size the gzip trailer gives (ISIZE, the
 * size modulo 2^32 of the last member: RFC 1952 section 2.3.1) plus one byte, so that the whole output
 * lands in one buffer and is never copied into another; at most `limit` + 1 and MAX_GUNZIP_CHUNK_BYTES.
 * The trailer only sizes the buffer: a wrong or forged one costs more chunks or a larger allocation
 * within those bounds, never a different result.
 */
function gunzipChunkBytes(bytes: Buffer, limit: number): number {
  if (bytes.length < 18) return GUNZIP_CHUNK_BYTES;
  const inflated = bytes.readUInt32LE(bytes.length - 4);
  return Math.max(GUNZIP_CHUNK_BYTES, Math.min(inflated + 1, limit + 1, MAX_GUNZIP_CHUNK_BYTES));
}

/**
 * The options `bytes` (gzip) are inflated with, under the size limit `maxBytes` [bytes]: at most
 * MAX_INFLATION_RATIO times their size (above INFLATION_FLOOR_BYTES), output in one chunk of the
 * inflated size where the trailer tells it (else a MiB, not 16 KiB): no buffers to join, a quarter less
 * work than in chunks of a MiB.
 */
export function gunzipOptions(compressed: Uint8Array, maxBytes: number): { readonly maxOutputLength: number; readonly chunkSize: number } {
  const bytes = Buffer.from(compressed.buffer, compressed.byteOffset, compressed.byteLength);
  const byRatio = Math.max(INFLATION_FLOOR_BYTES, bytes.length * MAX_INFLATION_RATIO);
  const limit = Math.min(maxBytes, byRatio);
  return { maxOutputLength: limit, chunkSize: gunzipChunkBytes(bytes, limit) };
}

function gunzipBytes(path: string, bytes: Buffer, maxBytes: number): Buffer {
  const options = gunzipOptions(bytes, maxBytes);
  const limit = options.maxOutputLength;
  try {
    return gunzipSync(bytes, options);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE' || err instanceof RangeError) {
      if (limit < maxBytes) {
        throw new InputError([
          {
            file: path,
            message: `inflates more than ${MAX_INFLATION_RATIO} times (past ${mebibytes(limit)} from ${mebibytes(bytes.length)} compressed), far more than a price CSV does: it is mostly one repeated byte, e.g. blank lines`,
            fix: 'check that this is the right file; decompress it and look at it',
          },
        ]);
      }
      throw new InputError([{ file: path, message: `decompresses to more than ${mebibytes(maxBytes)}`, fix: 'check that this is the right file; split a long history by year' }]);
    }
    throw new InputError([{ file: path, message: 'is named .gz but is not a readable gzip file (damaged or cut short)', fix: 'decompress it yourself to check it, or rename it without .gz' }]);
  }
}

/** Runs a file-system call; its error becomes an input error that says what to do. */
function attempt<T>(path: string, run: () => T): T {
  try {
    return run();
  } catch (err) {
    throw new InputError([fileSystemProblem(path, (err as NodeJS.ErrnoException).code)]);
  }
}

function fileSystemProblem(path: string, code: string | undefined): InputProblem {
  switch (code) {
    case 'ENOENT':
      return { file: path, message: 'cannot be read: there is no such file', fix: 'check the path (a relative path starts at the current folder)' };
    case 'ENOTDIR':
      return { file: path, message: 'cannot be read: a part of the path before the name is a file, not a folder', fix: 'check the path' };
    case 'EACCES':
    case 'EPERM':
      return { file: path, message: 'cannot be read: no permission', fix: "check the file's read rights" };
    case 'EISDIR':
      return { file: path, message: 'is a folder, not a file', fix: 'give the path of the file inside it' };
    case 'ENAMETOOLONG':
    case 'ERR_INVALID_ARG_VALUE':
      return { file: path, message: 'is not a valid file name (too long, or a character the file system refuses)', fix: 'check the path' };
    case 'ELOOP':
      return { file: path, message: 'cannot be read: it is a symbolic link that leads back to itself (a loop of links)', fix: 'point the link at the real file, or give the real file\'s path' };
    default:
      return { file: path, message: `cannot be read (${code ?? 'unknown error'})`, fix: 'check the path and the file' };
  }
}

function mebibytes(bytes: number): string {
  return bytes >= 1048576 ? `${Math.round(bytes / 1048576)} MiB` : `${Math.ceil(bytes / 1024)} KiB`;
}
