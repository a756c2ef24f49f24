import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { InputError } from '../errors/inputError.js';
import { axisValueText, type GridAxis } from './gridAxis.js';

export interface FingerprintParts {
  /** What else decides the results: command name, version, options (not --threads, --out, --quiet). */
  readonly identity: unknown;
  readonly axes: readonly GridAxis[];
  /** Input files; their contents count, not their names or times (a touched file still resumes). */
  readonly inputFiles: readonly string[];
  /** File URL of the task module; its contents count, so a rebuilt, changed task starts afresh. */
  readonly taskModuleUrl: string;
}

/**
 * sha256 (hex) over the canonical JSON (object keys sorted) of the identity, the axes with their value
 * texts in order, and the sha256 of each input file and of the task module. Two runs with the same
 * fingerprint compute the same rows, so one may resume the other's journal.
 */
export function gridFingerprint(parts: FingerprintParts): string {
  const content = {
    identity: parts.identity,
    axes: parts.axes.map((axis) => ({ name: axis.name, values: axis.values.map(axisValueText) })),
    inputs: parts.inputFiles.map((path) => fileHash(path, 'the input file')),
    task: fileHash(fileURLToPath(parts.taskModuleUrl), 'the sweep task module'),
  };
  return sha256(canonicalJson(content));
}

/** JSON with object keys sorted at every depth, so equal values give equal text. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    typeof v === 'object' && v !== null && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : v,
  );
}

function fileHash(path: string, name: string): string {
  try {
    return sha256(readFileSync(path));
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code !== 'ENOENT' && code !== 'EACCES' && code !== 'EISDIR') throw err;
    throw new InputError([{ file: path, message: `${name} cannot be read (${code})`, fix: 'give a file that exists and that you may read' }]);
  }
}

function sha256(data: string | Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}
