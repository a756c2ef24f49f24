import { closeSync, existsSync, ftruncateSync, mkdtempSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FIXTURES, runCli } from './corpusRunner.js';

/**
 * Huge inputs fail with bounded work and memory: a file over the size limit is refused from its size
 * alone, and a large file that is binary or has a wrong header is refused from its first bytes. The
 * bytes read are counted (under 8 MiB, modules loaded on the way included, of files of 400 MiB and
 * more). The files are sparse (a hole after a short written start), so making them takes no time and
 * no disk.
 */
const GIB = 1024 * 1024 * 1024;
const MIB = 1024 * 1024;
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'quantbid-huge-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

/** A sparse file of `size` bytes that starts with `start`, the rest zero bytes that take no disk. */
function sparseFile(name: string, size: number, start: string | Buffer = ''): string {
  const path = join(dir, name);
  const fd = openSync(path, 'w');
  try {
    if (start.length > 0) writeSync(fd, typeof start === 'string' ? Buffer.from(start) : start);
    ftruncateSync(fd, size);
  } finally {
    closeSync(fd);
  }
  return path;
}

/**
 * Bytes this process has read from files and pipes so far (`rchar` of /proc/self/io, Linux
 * proc(5)): the work a run did reading, counted, not timed (a loaded machine changes the time only).
 */
function bytesRead(): number {
  return Number(/^rchar: (\d+)$/m.exec(readFileSync('/proc/self/io', 'utf8'))?.[1]);
}

/** Runs `quantbid plan` with one input replaced, and measures the bytes read and the resident memory growth. */
async function planWith(input: 'market' | 'battery' | 'forecast', path: string) {
  const inputs = { market: join(FIXTURES, 'base/market.json'), battery: join(FIXTURES, 'base/battery.json'), forecast: join(FIXTURES, 'base/quantilesWide.csv'), [input]: path };
  const out = join(dir, 'out');
  const rssBefore = process.memoryUsage().rss;
  const readBefore = bytesRead();
  const run = await runCli(['plan', '--market', inputs.market, '--battery', inputs.battery, '--forecast', inputs.forecast, '--day', '2027-06-15', '--out', out]);
  const readMib = (bytesRead() - readBefore) / MIB;
  const rssGrowthMib = (process.memoryUsage().rss - rssBefore) / MIB;
  expect(existsSync(out)).toBe(false);
  return { ...run, readMib, rssGrowthMib };
}

const header = 'period_start,q0.05,q0.1,q0.5,q0.9,q0.95\n';
/** Text garbage long enough to fill the bytes looked at (so no zero byte is among them). */
const textGarbage = (firstLine: string) => `${firstLine}\n${'lorem,ipsum,dolor\n'.repeat(5000)}`;

describe('huge inputs', () => {
  it('a 1 GiB forecast is refused from its size, before any byte is read', async () => {
    const path = sparseFile('huge.csv', GIB, header);
    const run = await planWith('forecast', path);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`${path}: is 1024 MiB, more than the 500 MiB this input may have; check that this is the right file; split a long history by year\nnothing was written.\n`);
    expect(run.readMib).toBeLessThan(8);
    expect(run.rssGrowthMib).toBeLessThan(64);
  });

  it('a 400 MiB forecast of zero bytes is refused as binary from its first bytes', async () => {
    const run = await planWith('forecast', sparseFile('zeros.csv', 400 * MIB));
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/zeros\.csv: holds binary data, not text \(a zero byte at byte 1\)/);
    expect(run.readMib).toBeLessThan(8);
    expect(run.rssGrowthMib).toBeLessThan(64);
  });

  it('a 400 MiB forecast of text garbage is refused from its header, the rest never read', async () => {
    const path = sparseFile('garbage.csv', 400 * MIB, textGarbage('lorem,ipsum,dolor'));
    const run = await planWith('forecast', path);
    expect(run.code).toBe(2);
    expect(run.stderr.split('\n')).toEqual([
      `${path}:1: lorem: the first column is "lorem", expected "period_start"; use the header period_start,q0.05,...,q0.95 (wide) or period_start,level,price (long)`,
      `${path}:1: ipsum: column 2 is "ipsum", not a level header; name quantile columns q<level> with the level in (0, 1), e.g. q0.05`,
      `${path}:1: dolor: column 3 is "dolor", not a level header; name quantile columns q<level> with the level in (0, 1), e.g. q0.05`,
      'nothing was written.',
      '',
    ]);
    expect(run.readMib).toBeLessThan(8);
    expect(run.rssGrowthMib).toBeLessThan(64);
  });

  it('a 400 MiB file whose first line never ends is not taken for a CSV header', async () => {
    const path = sparseFile('oneLine.csv', 400 * MIB, 'x'.repeat(80 * 1024));
    const run = await planWith('forecast', path);
    expect(run.stderr).toContain(`${path}:1: line 1 is longer than 65536 bytes: this is not a CSV file with a header line`);
    expect(run.readMib).toBeLessThan(8);
  });

  it('a 400 MiB market spec is refused from its size (a spec may have 1 MiB)', async () => {
    const path = sparseFile('market.json', 400 * MIB, '{"timeZone": "Europe/Berlin"');
    const run = await planWith('market', path);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(`${path}: is 400 MiB, more than the 1 MiB this input may have`);
    expect(run.readMib).toBeLessThan(8);
  });

  it('a gzip forecast with a wrong header is refused from its first compressed bytes', async () => {
    const path = join(dir, 'garbage.csv.gz');
    const fd = openSync(path, 'w');
    writeSync(fd, gzipSync(textGarbage('time,price')));
    closeSync(fd);
    const run = await planWith('forecast', path);
    expect(run.stderr).toContain(`${path}:1: time: the first column is "time", expected "period_start"`);
  });
});
