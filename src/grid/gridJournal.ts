/**
 * The resume journal of a grid (a sweep or a sizing): a JSON Lines file in the output folder. The first line is a header
 * naming the grid by a fingerprint of its arguments and inputs; each further line is one finished
 * setting, `{"key":...,"row":{...}}`, written in one call and flushed to disk (fsync) before the next
 * setting is recorded. A process killed mid-write leaves at most a torn last line without its line
 * break: reading ignores it, and resuming cuts it off before appending.
 */
import { closeSync, existsSync, fsyncSync, openSync, readFileSync, renameSync, truncateSync, writeFileSync, writeSync } from 'node:fs';
import { InputError } from '../errors/inputError.js';
import type { GridRow } from './taskModule.js';

export const JOURNAL_FORMAT = 'quantbid-sweep-journal';
export const JOURNAL_VERSION = 1;

export interface JournalHeader {
  readonly format: typeof JOURNAL_FORMAT;
  readonly version: typeof JOURNAL_VERSION;
  /** sha256 of the arguments and inputs (gridFingerprint.ts), hex. */
  readonly fingerprint: string;
  /** Settings in the grid [-]. */
  readonly settings: number;
  /** When the sweep was first started, ISO 8601 (for messages only). */
  readonly started: string;
}

export interface JournalEntry {
  readonly key: string;
  readonly row: GridRow;
}

export type JournalContent =
  | { readonly status: 'absent' }
  | {
      readonly status: 'found';
      readonly header: JournalHeader;
      /** Finished settings in the order they finished. */
      readonly entries: readonly JournalEntry[];
      /** Bytes up to the end of the last whole line; a torn tail lies beyond. */
      readonly wholeBytes: number;
    };

/** One journal line, with its line break. */
export function journalLine(value: JournalHeader | JournalEntry): string {
  return `${JSON.stringify(value)}\n`;
}

/**
 * Reads a journal. `absent` when there is no file or not even a whole header line (killed while
 * creating it). A line that is whole but not a journal entry is an InputError naming the line.
 */
export function readJournal(path: string): JournalContent {
  if (!existsSync(path)) return { status: 'absent' };
  const bytes = readFileSync(path);
  const wholeBytes = bytes.lastIndexOf(0x0a) + 1;
  const lines = bytes.subarray(0, wholeBytes).toString('utf8').split('\n').slice(0, -1);
  if (lines.length === 0) return { status: 'absent' };
  const corrupt = (line: number, what: string) =>
    new InputError([{ file: path, line, message: `${what}; the file was changed by something other than quantbid`, fix: 'add --restart to discard it and run the whole sweep again' }]);
  const header = parseLine(lines[0] as string);
  if (!isHeader(header)) throw corrupt(1, 'is not a quantbid sweep journal');
  const entries = lines.slice(1).map((line, i) => {
    const entry = parseLine(line);
    if (!isEntry(entry)) throw corrupt(i + 2, 'is not a finished setting');
    return entry;
  });
  return { status: 'found', header, entries, wholeBytes };
}

/** Appends lines to a journal, each written whole and flushed to disk before append returns. */
export class JournalWriter {
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

  append(line: string): void {
    const bytes = Buffer.from(line, 'utf8');
    let written = 0;
    while (written < bytes.length) written += writeSync(this.fd, bytes, written, bytes.length - written);
    fsyncSync(this.fd);
  }

  close(): void {
    closeSync(this.fd);
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
  return header?.format === JOURNAL_FORMAT && header.version === JOURNAL_VERSION && typeof header.fingerprint === 'string';
}

function isEntry(value: unknown): value is JournalEntry {
  const entry = value as Partial<JournalEntry> | undefined;
  return typeof entry?.key === 'string' && typeof entry.row === 'object' && entry.row !== null;
}
