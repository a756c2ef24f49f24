/**
 * The resume journal of a grid (a sweep or a sizing): a JSON Lines file in the output folder. The first
 * line is a header naming the grid by a hash of its fingerprint (the arguments and inputs,
 * gridFingerprint.ts); each further line is one finished setting, `{"key":...,"row":{...},"digest":...}`,
 * written in one call as the setting finishes and flushed to disk (fsync) in the background, the lines
 * written meanwhile together by the next flush, and all of them before the journal is closed. A
 * process killed mid-write leaves at most a torn last line without its line break: reading ignores it,
 * and resuming cuts it off before appending. A crash of the machine may lose the lines of the flush
 * in progress, which a resume computes again.
 *
 * The journal is an input like any other: a run reads it back, so a line that is not a header or an
 * entry, a row whose digest does not match, or a file that is not a plain file of sane size is
 * "damaged" (an input error: add --restart). The digest is HMAC-SHA256 (RFC 2104) keyed with the grid's
 * fingerprint over the key and the row's JSON: a row edited by hand, or copied from another grid, does
 * not match, so no value reaches the table that the task did not compute for these arguments and inputs.
 */
import { createHash, createHmac } from 'node:crypto';
import { closeSync, fsync, fsyncSync, lstatSync, openSync, readFileSync, renameSync, truncateSync, writeFileSync, writeSync } from 'node:fs';
import { InputError } from '../errors/inputError.js';
import type { GridRow } from './taskModule.js';

export const JOURNAL_FORMAT = 'quantbid-sweep-journal';
export const JOURNAL_VERSION = 2;

/** Longest journal line accepted [bytes]: a row is some dozens of cells. */
export const MAX_JOURNAL_LINE_BYTES = 64 * 1024;

export interface JournalHeader {
  readonly format: typeof JOURNAL_FORMAT;
  readonly version: typeof JOURNAL_VERSION;
  /** sha256 (hex) of the grid's fingerprint (journalGridId): names the grid without giving away the digests' key. */
  readonly grid: string;
  /** Settings in the grid [-]. */
  readonly settings: number;
  /** When the sweep was first started, ISO 8601 (for messages only). */
  readonly started: string;
}

export interface JournalEntry {
  readonly key: string;
  readonly row: GridRow;
  /** journalDigest of the key and row, hex. */
  readonly digest: string;
}

/** A journal entry with the line it stands on (1-based), for the message when it does not check out. */
export interface JournalLineEntry extends JournalEntry {
  readonly line: number;
}

export type JournalContent =
  | { readonly status: 'absent' }
  | {
      readonly status: 'found';
      readonly header: JournalHeader;
      /** Finished settings in the order they finished. */
      readonly entries: readonly JournalLineEntry[];
      /** Bytes up to the end of the last whole line; a torn tail lies beyond. */
      readonly wholeBytes: number;
    };

/** The header's name of a grid: sha256 of its fingerprint, hex. */
export function journalGridId(fingerprint: string): string {
  return createHash('sha256').update(`quantbid journal grid\n${fingerprint}`).digest('hex');
}

/** HMAC-SHA256 keyed with the grid's fingerprint over the setting's key and its row's JSON, hex. */
export function journalDigest(fingerprint: string, key: string, row: GridRow): string {
  return createHmac('sha256', fingerprint).update(`${key}\n${JSON.stringify(row)}`).digest('hex');
}

/** The journal line of a finished setting, digest included, with its line break. */
export function entryLine(fingerprint: string, key: string, row: GridRow): string {
  return journalLine({ key, row, digest: journalDigest(fingerprint, key, row) });
}

/** One journal line, with its line break. */
export function journalLine(value: JournalHeader | JournalEntry): string {
  return `${JSON.stringify(value)}\n`;
}

/** The input error of a damaged journal: where, what, and that --restart starts over. */
export function damagedJournal(path: string, what: string, line?: number): InputError {
  return new InputError([
    { file: path, ...(line === undefined ? {} : { line }), message: `the journal is damaged: ${what}; it was changed by something other than quantbid`, fix: 'add --restart to discard it and start over' },
  ]);
}

/**
 * Reads a journal. `absent` when there is no file or not even a whole header line (killed while
 * creating it). A journal that is a link, not a plain file, larger than `maxBytes`, or holds a whole
 * line that is not a header or an entry is damaged (damagedJournal). Digests are checked by the caller,
 * who knows the fingerprint (checkJournalEntry).
 */
export function readJournal(path: string, maxBytes = Number.MAX_SAFE_INTEGER): JournalContent {
  let stat;
  try {
    stat = lstatSync(path);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { status: 'absent' };
    throw err;
  }
  // Resuming truncates and appends: never through a link to some other file.
  if (!stat.isFile()) throw damagedJournal(path, stat.isSymbolicLink() ? 'it is a symbolic link, not the file quantbid wrote' : 'it is not a plain file');
  if (stat.size > maxBytes) throw damagedJournal(path, `it has ${stat.size} bytes, more than a journal of this grid can have (${maxBytes})`);
  const bytes = readFileSync(path);
  const wholeBytes = bytes.lastIndexOf(0x0a) + 1;
  const lines = bytes.subarray(0, wholeBytes).toString('utf8').split('\n').slice(0, -1);
  if (lines.length === 0) return { status: 'absent' };
  const header = parseLine(lines[0] as string);
  if (!isHeader(header)) throw damagedJournal(path, 'line 1 is not the header of a quantbid journal of this version', 1);
  const entries = lines.slice(1).map((text, i) => {
    const entry = parseLine(text);
    if (Buffer.byteLength(text) > MAX_JOURNAL_LINE_BYTES || !isEntry(entry)) throw damagedJournal(path, 'the line is not a finished setting', i + 2);
    return { key: entry.key, row: entry.row, digest: entry.digest, line: i + 2 };
  });
  return { status: 'found', header, entries, wholeBytes };
}

/** Throws damagedJournal when the entry's digest is not the one the grid's fingerprint gives its key and row. */
export function checkJournalEntry(path: string, fingerprint: string, entry: JournalLineEntry): void {
  if (journalDigest(fingerprint, entry.key, entry.row) !== entry.digest) {
    throw damagedJournal(path, `the row of ${entry.key} does not match its digest (edited by hand, or copied from another grid)`, entry.line);
  }
}

/**
 * Appends lines to a journal, each written whole before append returns, and flushed to disk (fsync)
 * on the thread pool: a flush takes milliseconds (some 5 ms on a shared virtual disk), which one per
 * setting spent on this thread, beside the settings it runs. At most one flush is in flight; the lines
 * written meanwhile go with the next one.
 */
export class JournalWriter {
  private flushing: Promise<void> | null = null;
  /** Lines written since the last flush began. */
  private unflushed = false;
  private flushError: Error | null = null;

  private constructor(private readonly fd: number) {}

  /** Starts a new journal holding only `header` (written beside it first, then renamed into place). */
  static create(path: string, header: JournalHeader): JournalWriter {
    const temporary = `${path}.tmp-${process.pid}`;
    writeFileSync(temporary, journalLine(header), { flush: true });
    renameSync(temporary, path);
    return new JournalWriter(openSync(path, 'a'));
  }

  /** Reopens a journal to append, first cutting off a torn last line beyond `wholeBytes`. */
  static resume(path: string, wholeBytes: number): JournalWriter {
    truncateSync(path, wholeBytes);
    return new JournalWriter(openSync(path, 'a'));
  }

  /** Writes `line` whole; throws the error of a write, or of a background flush since the last append. */
  append(line: string): void {
    if (this.flushError !== null) throw this.flushError;
    const bytes = Buffer.from(line, 'utf8');
    let written = 0;
    while (written < bytes.length) written += writeSync(this.fd, bytes, written, bytes.length - written);
    this.unflushed = true;
    this.flush();
  }

  /** Waits for the flush in flight, flushes what is left, and closes the file. */
  async close(): Promise<void> {
    try {
      while (this.flushing !== null) await this.flushing;
      if (this.unflushed || this.flushError !== null) fsyncSync(this.fd);
    } finally {
      closeSync(this.fd);
    }
  }

  private flush(): void {
    if (this.flushing !== null || !this.unflushed) return;
    this.unflushed = false;
    this.flushing = new Promise((resolve) => {
      fsync(this.fd, (err) => {
        if (err !== null) this.flushError ??= err;
        this.flushing = null;
        resolve();
        this.flush();
      });
    });
  }
}

function parseLine(line: string): unknown {
  try {
    return JSON.parse(line) as unknown;
  } catch {
    return undefined;
  }
}

function isHeader(value: unknown): value is JournalHeader {
  const header = value as Partial<JournalHeader> | undefined;
  return (
    typeof header === 'object' && header !== null &&
    header.format === JOURNAL_FORMAT && header.version === JOURNAL_VERSION &&
    typeof header.grid === 'string' && /^[0-9a-f]{64}$/.test(header.grid) &&
    typeof header.settings === 'number' && Number.isInteger(header.settings) && header.settings >= 1 &&
    typeof header.started === 'string' && header.started.length <= 40
  );
}

function isEntry(value: unknown): value is JournalEntry {
  const entry = value as Partial<JournalEntry> | undefined;
  return (
    typeof entry === 'object' && entry !== null && !Array.isArray(entry) &&
    typeof entry.key === 'string' && typeof entry.digest === 'string' && /^[0-9a-f]{64}$/.test(entry.digest) &&
    typeof entry.row === 'object' && entry.row !== null && !Array.isArray(entry.row)
  );
}
