import { existsSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import type { StoredDayForecast } from '../../src/forecast/storedForecastRange.js';
import { ForecastCache } from '../../src/io/forecastCache.js';

// The on-disk forecast cache: entries round-trip exactly, damaged entries are refused (and counted),
// two threads writing one key never leave a torn entry, and a cache that cannot be written is a note,
// not a failure. Values are invented inputs, never check values.

const KEY = 'ab'.repeat(32);
const DAY = '2031-03-01';
/** A day of 24 periods x 5 levels with non-round prices (exact float round trip through JSON). */
function value(shift: number): StoredDayForecast {
  return { outcome: 'forecast', prices: Array.from({ length: 24 }, (_, t) => [0.1, 0.3, 0.5, 0.7, 0.9].map((tau) => shift + t / 3 + tau * Math.PI)) };
}

const fresh = (): string => mkdtempSync(join(tmpdir(), 'quantbid-fc-cache-'));

describe('ForecastCache', () => {
  it('gives back exactly what it kept, from <dir>/<2 hex>/<key>.json, and nothing for an unknown key', () => {
    const cache = new ForecastCache(join(fresh(), 'nested', 'forecasts'));
    expect(cache.recall(KEY, DAY)).toBeUndefined();
    cache.keep(KEY, DAY, value(1));
    expect(cache.entryPath(KEY)).toBe(join(cache.dir, 'ab', `${KEY}.json`));
    expect(existsSync(cache.entryPath(KEY))).toBe(true);
    expect(new ForecastCache(cache.dir).recall(KEY, DAY)).toEqual(value(1));
    expect(cache.recall('cd'.repeat(32), DAY)).toBeUndefined();
    expect(cache.rejected).toBe(0);
    expect(readdirSync(join(cache.dir, 'ab'))).toEqual([`${KEY}.json`]);
  });

  const damage: [string, (text: string) => string][] = [
    ['cut in half (a partial write)', (text) => text.slice(0, Math.floor(text.length / 2))],
    ['empty', () => ''],
    ['not JSON', () => 'garbage\n'],
    ['a price changed without its checksum', (text) => text.replace(/"prices":\[\[(\d)/, (_m, d: string) => `"prices":[[${(Number(d) + 1) % 10}`)],
    ['for another day', (text) => text.replace(DAY, '2031-03-02')],
    ['of another format version', (text) => text.replace('"version":1', '"version":99')],
  ];
  it.each(damage)('refuses an entry %s, counts it, and takes a new one written over it', (_name, spoil) => {
    const cache = new ForecastCache(fresh());
    cache.keep(KEY, DAY, value(2));
    const text = readFileSync(cache.entryPath(KEY), 'utf8');
    const spoilt = spoil(text);
    expect(spoilt).not.toBe(text);
    writeFileSync(cache.entryPath(KEY), spoilt);
    expect(cache.recall(KEY, DAY)).toBeUndefined();
    expect(cache.rejected).toBe(1);
    cache.keep(KEY, DAY, value(2));
    expect(cache.recall(KEY, DAY)).toEqual(value(2));
    expect(readFileSync(cache.entryPath(KEY), 'utf8')).toBe(text);
  });

  it('an entry stored under another key is refused (the key inside must match the file name)', () => {
    const cache = new ForecastCache(fresh());
    const other = 'ab'.padEnd(64, '0');
    cache.keep(other, DAY, value(3));
    writeFileSync(cache.entryPath(KEY), readFileSync(cache.entryPath(other)));
    expect(cache.recall(KEY, DAY)).toBeUndefined();
    expect(cache.rejected).toBe(1);
  });

  it('a cache that cannot be written warns once and goes on', () => {
    const dir = fresh();
    const blocker = join(dir, 'file');
    writeFileSync(blocker, 'not a folder');
    const notes: string[] = [];
    const cache = new ForecastCache(join(blocker, 'forecasts'), (note) => notes.push(note));
    expect(() => {
      cache.keep(KEY, DAY, value(4));
      cache.keep('cd'.repeat(32), DAY, value(4));
    }).not.toThrow();
    expect(notes).toHaveLength(1);
    expect(notes[0]).toMatch(/cannot be written .*--no-forecast-cache/);
    expect(cache.recall(KEY, DAY)).toBeUndefined();
    expect(cache.written).toBe(0);
  });

  it('two worker threads writing one key over and over never leave a torn entry for a reader', async () => {
    // Needs the compiled module (npm run build): worker threads load JavaScript.
    const built = new URL('../../dist/io/forecastCache.js', import.meta.url);
    const source = new URL('../../src/io/forecastCache.ts', import.meta.url);
    if (!existsSync(built) || statSync(built).mtimeMs < statSync(source).mtimeMs) throw new Error('dist/io/forecastCache.js is missing or older than its source: run `npm run build` first');
    const dir = fresh();
    const done = new Int32Array(new SharedArrayBuffer(4));
    const writes = 300;
    // Each worker writes its own whole value; a reader must only ever see one of them, whole.
    const code = `
      const { workerData } = require('node:worker_threads');
      import(workerData.module).then(({ ForecastCache }) => {
        const cache = new ForecastCache(workerData.dir);
        for (let i = 0; i < workerData.writes; i++) cache.keep(workerData.key, workerData.day, workerData.value);
        Atomics.add(workerData.done, 0, 1);
      });`;
    const workers = [value(10), value(20)].map(
      (v) => new Worker(code, { eval: true, workerData: { module: pathToFileURL(built.pathname).href, dir, writes, key: KEY, day: DAY, value: v, done } }),
    );
    const exited = Promise.all(workers.map((w) => new Promise((resolve, reject) => w.on('exit', resolve).on('error', reject))));
    const reader = new ForecastCache(dir);
    const seen = new Set<number>();
    let reads = 0;
    while (Atomics.load(done, 0) < 2) {
      const got = reader.recall(KEY, DAY);
      reads++;
      if (got === undefined) continue;
      expect([value(10), value(20)]).toContainEqual(got);
      seen.add(got.outcome === 'forecast' ? Math.round(got.prices[0]![0]! - 0.1 * Math.PI) : -1);
    }
    await exited;
    expect(reader.rejected).toBe(0);
    expect(reads).toBeGreaterThan(0);
    // Values must have been read while the writers ran, or the check below would hold of nothing.
    expect(seen.size).toBeGreaterThan(0);
    expect([...seen].every((s) => s === 10 || s === 20)).toBe(true);
    expect([value(10), value(20)]).toContainEqual(reader.recall(KEY, DAY));
    expect(readdirSync(join(dir, 'ab'))).toEqual([`${KEY}.json`]); // no temporary file left behind
  }, 60_000);
});
