import { appendFileSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { createHmac } from 'node:crypto';
import { checkJournalEntry, entryLine, JOURNAL_FORMAT, JOURNAL_VERSION, journalDigest, journalGridId, JournalWriter, journalLine, readJournal, type JournalHeader } from '../../src/grid/gridJournal.js';

const FINGERPRINT = 'f00d';
const HEADER: JournalHeader = Object.freeze({ format: JOURNAL_FORMAT, version: JOURNAL_VERSION, grid: journalGridId(FINGERPRINT), settings: 3, started: '2027-01-01T00:00:00.000Z' });
const entry = (key: string, row: Record<string, string | number | boolean | null>) => ({ key, row, digest: journalDigest(FINGERPRINT, key, row) });
const ENTRY = Object.freeze(entry('alpha=0.1', Object.freeze({ profit: 12.5, note: 'edge' })));

function journalPath(): string {
  return join(mkdtempSync(join(tmpdir(), 'quantbid-journal-')), '.sweep-journal.jsonl');
}

describe('readJournal', () => {
  it('absent when there is no file, or not even a whole header line', () => {
    const path = journalPath();
    expect(readJournal(path)).toEqual({ status: 'absent' });
    writeFileSync(path, journalLine(HEADER).slice(0, 20));
    expect(readJournal(path)).toEqual({ status: 'absent' });
  });

  it('reads the header and the finished settings; a torn last line is ignored and lies beyond wholeBytes', () => {
    const path = journalPath();
    const whole = journalLine(HEADER) + journalLine(ENTRY);
    writeFileSync(path, `${whole}{"key":"alpha=0.2","row":{"pro`);
    expect(readJournal(path)).toEqual({ status: 'found', header: HEADER, entries: [{ ...ENTRY, line: 2 }], wholeBytes: Buffer.byteLength(whole) });
  });

  it('counts bytes, not characters, for the cut (a UTF-8 string cell)', () => {
    const path = journalPath();
    const whole = journalLine(HEADER) + journalLine(entry('policy=x', { note: 'Größe' }));
    writeFileSync(path, `${whole}{"ke`);
    const found = readJournal(path);
    expect(found.status === 'found' && found.wholeBytes).toBe(Buffer.byteLength(whole));
    expect(found.status === 'found' && found.wholeBytes).toBeGreaterThan(whole.length);
  });

  it('refuses a file that is not a journal, or a damaged whole line, naming the line', () => {
    const path = journalPath();
    writeFileSync(path, 'period_start,price\n');
    expect(() => readJournal(path)).toThrow(InputError);
    expect(() => readJournal(path)).toThrow(`${path}:1: the journal is damaged: line 1 is not the header of a quantbid journal of this version; it was changed by something other than quantbid; add --restart to discard it and start over`);
    writeFileSync(path, `${journalLine(HEADER)}${journalLine(ENTRY)}{"key":1}\n${journalLine(ENTRY)}`);
    expect(() => readJournal(path)).toThrow(`${path}:3: the journal is damaged: the line is not a finished setting;`);
  });

  it('refuses an entry without a digest, with an empty or array row, a header of another version, and a link', () => {
    const path = journalPath();
    const damaged = [
      `{"key":"alpha=0.1","row":{"profit":1}}`,
      `{"key":"alpha=0.1","row":[],"digest":"${'0'.repeat(64)}"}`,
      `{"key":"alpha=0.1","row":{},"digest":"not hex"}`,
      `{"key":"alpha=0.1","row":null,"digest":"${'0'.repeat(64)}"}`,
    ];
    for (const line of damaged) {
      writeFileSync(path, `${journalLine(HEADER)}${line}\n`);
      expect(() => readJournal(path), line).toThrow(`${path}:2: the journal is damaged: the line is not a finished setting`);
    }
    writeFileSync(path, journalLine({ ...HEADER, version: 1 } as unknown as JournalHeader));
    expect(() => readJournal(path)).toThrow(`${path}:1: the journal is damaged`);
    const target = join(dirname(path), 'elsewhere.txt');
    writeFileSync(target, 'a file the journal must never truncate\n');
    rmSync(path);
    symlinkSync(target, path);
    expect(() => readJournal(path)).toThrow(`${path}: the journal is damaged: it is a symbolic link, not the file quantbid wrote`);
  });

  it('refuses a journal larger than the grid allows, before reading it', () => {
    const path = journalPath();
    writeFileSync(path, `${journalLine(HEADER)}${journalLine(ENTRY).repeat(10)}`);
    expect(() => readJournal(path, 500)).toThrow(/the journal is damaged: it has \d+ bytes, more than a journal of this grid can have \(500\)/);
  });
});

describe('the digest of a journal row', () => {
  // HMAC-SHA256 test case 2 of RFC 4231 (2005), section 4.3: key "Jefe", data "what do ya want for nothing?".
  it('is HMAC-SHA256 as RFC 4231 gives it (test case 2)', () => {
    expect(createHmac('sha256', 'Jefe').update('what do ya want for nothing?').digest('hex')).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
  });

  it('is keyed with the fingerprint over key and row: an edited value, another key or another grid do not match', () => {
    const path = journalPath();
    const good = { ...entry('alpha=0.1', { profit: 12.5, note: 'edge' }), line: 2 };
    expect(() => checkJournalEntry(path, FINGERPRINT, good)).not.toThrow();
    const edits = [
      { ...good, row: { profit: 999999999, note: 'edge' } },
      { ...good, row: { profit: 12.5, note: '=cmd|x' } },
      { ...good, row: { profit: 12.5, note: '<script>' } },
      { ...good, row: {} },
      { ...good, key: 'alpha=0.2' },
    ];
    for (const edited of edits) expect(() => checkJournalEntry(path, FINGERPRINT, edited), JSON.stringify(edited)).toThrow(`${path}:2: the journal is damaged: the row of ${edited.key} does not match its digest`);
    expect(() => checkJournalEntry(path, 'another grid', good)).toThrow('does not match its digest');
    expect(entryLine(FINGERPRINT, good.key, good.row)).toBe(journalLine({ key: good.key, row: good.row, digest: good.digest }));
  });
});

describe('JournalWriter', () => {
  it('creates a journal holding the header, appends whole lines, and cuts a torn tail before appending', async () => {
    const path = journalPath();
    const writer = JournalWriter.create(path, HEADER);
    writer.append(journalLine(ENTRY));
    await writer.close();
    appendFileSync(path, '{"key":"alpha=0.3","ro');
    const found = readJournal(path);
    if (found.status !== 'found') throw new Error('journal not found');
    const resumed = JournalWriter.resume(path, found.wholeBytes);
    const second = entry('alpha=0.2', { profit: -1, note: null });
    resumed.append(journalLine(second));
    await resumed.close();
    expect(readFileSync(path, 'utf8')).toBe(journalLine(HEADER) + journalLine(ENTRY) + journalLine(second));
  });
});
