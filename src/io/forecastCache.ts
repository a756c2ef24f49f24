import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { threadId } from 'node:worker_threads';
import type { DayForecastStore, StoredDayForecast } from '../forecast/storedForecastRange.js';

const ENTRY_FORMAT = 'quantbid-day-forecast';
const ENTRY_VERSION = 1;

/**
 * Day forecasts kept on disk, one JSON file per key: `<dir>/<first two hex digits>/<key>.json` holding
 * the format, version, key, day, the stored value, and the SHA-256 of key, day and value. An entry is
 * trusted only when it parses and every one of these matches; otherwise (a partial write from a killed
 * process, a damaged disk, a hand edit) it is counted in `rejected` and the day is made again and
 * written over it.
 *
 * Writes go to a temporary file named after the process, thread and a counter in the same folder and
 * are renamed into place (atomic within one file system), so a reader sees a whole entry or none, and
 * two threads writing the same key leave one whole entry (both hold the same value). A cache that
 * cannot be written is not an error: the run goes on and `onWarning` is called once.
 */
export class ForecastCache implements DayForecastStore {
  /** Entries found but not trusted [-]. */
  rejected = 0;
  /** Entries written [-]. */
  written = 0;
  private writeCounter = 0;
  private warned = false;

  constructor(
    readonly dir: string,
    private readonly onWarning: (message: string) => void = () => undefined,
  ) {}

  /** The path of a key's entry. */
  entryPath(key: string): string {
    return join(this.dir, key.slice(0, 2), `${key}.json`);
  }

  recall(key: string, day: string): StoredDayForecast | undefined {
    let text: string;
    try {
      text = readFileSync(this.entryPath(key), 'utf8');
    } catch {
      return undefined;
    }
    const value = trustedValue(text, key, day);
    if (value === undefined) this.rejected++;
    return value;
  }

  keep(key: string, day: string, value: StoredDayForecast): void {
    const path = this.entryPath(key);
    const tmp = `${path}.${process.pid}-${threadId}-${this.writeCounter++}.tmp`;
    const entry = { format: ENTRY_FORMAT, version: ENTRY_VERSION, key, day, value, sha256: checksum(key, day, value) };
    try {
      makeFolders(dirname(path));
      writeFileSync(tmp, `${JSON.stringify(entry)}\n`);
      renameSync(tmp, path);
      this.written++;
    } catch (err) {
      try {
        rmSync(tmp, { force: true });
      } catch {
        // nothing to remove where the folder could not be made
      }
      if (!this.warned) {
        this.warned = true;
        this.onWarning(`note: the forecast cache ${this.dir} cannot be written (${(err as NodeJS.ErrnoException).code ?? String(err)}); going on without it. Give --forecast-cache DIR or --no-forecast-cache.\n`);
      }
    }
  }
}

/** The stored value of an entry's text, or undefined when any part of it does not match. */
function trustedValue(text: string, key: string, day: string): StoredDayForecast | undefined {
  let entry: unknown;
  try {
    entry = JSON.parse(text);
  } catch {
    return undefined;
  }
  if (entry === null || typeof entry !== 'object') return undefined;
  const e = entry as Record<string, unknown>;
  if (e.format !== ENTRY_FORMAT || e.version !== ENTRY_VERSION || e.key !== key || e.day !== day) return undefined;
  const value = e.value as StoredDayForecast | undefined;
  if (value === undefined || e.sha256 !== checksum(key, day, value)) return undefined;
  return value;
}

function checksum(key: string, day: string, value: StoredDayForecast): string {
  return createHash('sha256').update(JSON.stringify([key, day, value])).digest('hex');
}

/** Creates `dir` and the folders above it one level at a time; a folder made meanwhile by another thread is fine. */
function makeFolders(dir: string): void {
  const missing: string[] = [];
  for (let at = resolve(dir); !existsSync(at) && dirname(at) !== at; at = dirname(at)) missing.unshift(at);
  for (const folder of missing) {
    try {
      mkdirSync(folder);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    }
  }
}
