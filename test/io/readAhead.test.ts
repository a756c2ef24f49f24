import { mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { readAheadGzip, READ_AHEAD_MAX_BYTES } from '../../src/io/readAhead.js';
import { readInputFile } from '../../src/io/readInputFile.js';
import { readQuantileForecastDay } from '../../src/io/readQuantileForecastDay.js';
import type { MarketSpec } from '../../src/types.js';

// The read ahead against the text the test compressed itself (what was written is what must come back)
// and against the synchronous reader: a read ahead is taken only while it is the file's content, and
// every problem is the one the reader reports without it.
const folder = mkdtempSync(join(tmpdir(), 'quantbid-read-ahead-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

let files = 0;
function write(content: string | Buffer, name = `f${files++}.csv.gz`): string {
  const path = join(folder, name);
  writeFileSync(path, content);
  return path;
}

/** A CSV text of `rows` rows, each different. */
function csvText(rows: number): string {
  const lines = ['period_start,q0.1,q0.5,q0.9'];
  for (let i = 0; i < rows; i++) lines.push(`2027-01-01T00:00:00+01:00,${i},${i + 0.5},${i + 1.25}`);
  return `${lines.join('\n')}\n`;
}

/** The problems of a read as the CLI prints them, or null when it reads. */
function problemsOf(read: () => unknown): string | null {
  try {
    read();
    return null;
  } catch (err) {
    if (err instanceof InputError) return err.message;
    throw err;
  }
}

describe('readAheadGzip', () => {
  it('inflates a gzip file to the text that was compressed, and the reader takes it', async () => {
    const text = csvText(5000);
    const path = write(gzipSync(Buffer.from(text)));
    const ahead = await readAheadGzip(path);
    expect(ahead).toBeDefined();
    expect(Buffer.from(ahead?.plain ?? []).toString('utf8')).toBe(text);
    expect(readInputFile(path, { ...(ahead === undefined ? {} : { readAhead: ahead }) })).toBe(text);
  });

  it('is undefined for a plain file, a missing file, a folder and damaged gzip: the reader then reads and reports as without it', async () => {
    const plain = write(csvText(3), 'plain.csv');
    const damaged = write(gzipSync(Buffer.from(csvText(2000))).subarray(0, 500));
    for (const path of [plain, join(folder, 'missing.csv.gz'), folder, damaged]) expect(await readAheadGzip(path), path).toBeUndefined();
    expect(problemsOf(() => readInputFile(damaged))).toContain('is named .gz but is not a readable gzip file (damaged or cut short)');
  });

  it('is undefined above READ_AHEAD_MAX_BYTES compressed', async () => {
    // Sound gzip (stored, level 0: as large as its content), one byte over the limit, and one at it.
    const over = write(gzipSync(Buffer.alloc(READ_AHEAD_MAX_BYTES, 0x30), { level: 0 }));
    expect(await readAheadGzip(over)).toBeUndefined();
    const at = write(gzipSync(Buffer.alloc(READ_AHEAD_MAX_BYTES - 64 * 1024, 0x30), { level: 0 }));
    expect((await readAheadGzip(at))?.plain.length).toBe(READ_AHEAD_MAX_BYTES - 64 * 1024);
  });
});

describe('readInputFile with a read ahead', () => {
  it('reads the file again when it changed after the read ahead, or when the read ahead is of another file', async () => {
    const path = write(gzipSync(Buffer.from(csvText(10))));
    const ahead = await readAheadGzip(path);
    if (ahead === undefined) throw new Error('no read ahead');
    const changed = csvText(11);
    writeFileSync(path, gzipSync(Buffer.from(changed)));
    // A change within the same millisecond and size would not show in the times: move them on.
    utimesSync(path, new Date(Date.now() + 5000), new Date(Date.now() + 5000));
    expect(readInputFile(path, { readAhead: ahead })).toBe(changed);
    const other = write(gzipSync(Buffer.from(csvText(12))));
    expect(readInputFile(other, { readAhead: ahead })).toBe(csvText(12));
  });

  it('checks what was read ahead as what it reads itself: bytes that are not UTF-8 are reported with their line', async () => {
    const bad = Buffer.concat([Buffer.from(csvText(3)), Buffer.from([0x32, 0xe9, 0x39, 0x0a])]);
    const path = write(gzipSync(bad));
    const ahead = await readAheadGzip(path);
    expect(ahead).toBeDefined();
    const withAhead = problemsOf(() => readInputFile(path, { ...(ahead === undefined ? {} : { readAhead: ahead }) }));
    expect(withAhead).toContain('is not UTF-8 text');
    expect(withAhead).toBe(problemsOf(() => readInputFile(path)));
  });

  it('refuses a gzip forecast cut short after the planned day, with the read ahead and without (the whole file is checked: docs/design.md)', async () => {
    const market: MarketSpec = Object.freeze({ timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' });
    const rows: string[] = [];
    for (let h = 0; h < 24; h++) rows.push(`2027-01-01T${String(h).padStart(2, '0')}:00:00+01:00,${h},${h + 1},${h + 2}`);
    // The planned day first, then a long tail of later rows; the compressed file loses its last bytes.
    const tail = csvText(20000).split('\n').slice(1).join('\n').replaceAll('2027-01-01T00', '2027-01-02T00');
    const whole = gzipSync(Buffer.from(`period_start,q0.1,q0.5,q0.9\n${rows.join('\n')}\n${tail}`));
    const path = write(whole.subarray(0, whole.length - 2000));
    expect(await readAheadGzip(path)).toBeUndefined();
    expect(problemsOf(() => readQuantileForecastDay(path, market, '2027-01-01'))).toContain('is named .gz but is not a readable gzip file (damaged or cut short)');
  });

  it('gives the day reader the same day and the same problems as without it', async () => {
    const market: MarketSpec = Object.freeze({ timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' });
    const rows: string[] = [];
    for (let h = 0; h < 24; h++) rows.push(`2027-01-01T${String(h).padStart(2, '0')}:00:00+01:00,${h},${h + 1},${h + 2}`);
    const sound = write(gzipSync(Buffer.from(`period_start,q0.1,q0.5,q0.9\n${rows.join('\n')}\n`)));
    const incomplete = write(gzipSync(Buffer.from(`period_start,q0.1,q0.5,q0.9\n${rows.slice(1).join('\n')}\n`)));
    const badNumber = write(gzipSync(Buffer.from(`period_start,q0.1,q0.5,q0.9\n${rows.join('\n')}\n${rows[3]?.replace(',3,', ',3x,')}\n`)));
    for (const path of [sound, incomplete, badNumber]) {
      const ahead = await readAheadGzip(path);
      expect(ahead).toBeDefined();
      const read = (withAhead: boolean) => () => readQuantileForecastDay(path, market, '2027-01-01', withAhead ? ahead : undefined);
      const problems = problemsOf(read(false));
      expect(problemsOf(read(true))).toBe(problems);
      if (path === badNumber) expect(problems).toContain(':26:');
      if (problems === null) expect(read(true)()).toEqual(read(false)());
    }
  });
});
