import { appendFileSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { JOURNAL_FORMAT, JOURNAL_VERSION, JournalWriter, journalLine, readJournal, type JournalHeader } from '../../src/grid/gridJournal.js';

const HEADER: JournalHeader = Object.freeze({ format: JOURNAL_FORMAT, version: JOURNAL_VERSION, fingerprint: 'f00d', settings: 3, started: '2027-01-01T00:00:00.000Z' });
const ENTRY = Object.freeze({ key: 'alpha=0.1', row: Object.freeze({ profit: 12.5, note: 'edge' }) });

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
    expect(readJournal(path)).toEqual({ status: 'found', header: HEADER, entries: [ENTRY], wholeBytes: Buffer.byteLength(whole) });
  });

  it('counts bytes, not characters, for the cut (a UTF-8 string cell)', () => {
    const path = journalPath();
    const whole = journalLine(HEADER) + journalLine({ key: 'policy=x', row: { note: 'Größe' } });
    writeFileSync(path, `${whole}{"ke`);
    const found = readJournal(path);
    expect(found.status === 'found' && found.wholeBytes).toBe(Buffer.byteLength(whole));
    expect(found.status === 'found' && found.wholeBytes).toBeGreaterThan(whole.length);
  });

  it('refuses a file that is not a journal, or a damaged whole line, naming the line', () => {
    const path = journalPath();
    writeFileSync(path, 'period_start,price\n');
    expect(() => readJournal(path)).toThrow(InputError);
    expect(() => readJournal(path)).toThrow(`${path}:1: is not a quantbid sweep journal; the file was changed by something other than quantbid; add --restart to discard it and run the whole sweep again`);
    writeFileSync(path, `${journalLine(HEADER)}${journalLine(ENTRY)}{"key":1}\n${journalLine(ENTRY)}`);
    expect(() => readJournal(path)).toThrow(`${path}:3: is not a finished setting;`);
  });
});

describe('JournalWriter', () => {
  it('creates a journal holding the header, appends whole lines, and cuts a torn tail before appending', () => {
    const path = journalPath();
    const writer = JournalWriter.create(path, HEADER);
    writer.append(journalLine(ENTRY));
    writer.close();
    appendFileSync(path, '{"key":"alpha=0.3","ro');
    const found = readJournal(path);
    if (found.status !== 'found') throw new Error('journal not found');
    const resumed = JournalWriter.resume(path, found.wholeBytes);
    const second = { key: 'alpha=0.2', row: { profit: -1, note: null } };
    resumed.append(journalLine(second));
    resumed.close();
    expect(readFileSync(path, 'utf8')).toBe(journalLine(HEADER) + journalLine(ENTRY) + journalLine(second));
  });
});
