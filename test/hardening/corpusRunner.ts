import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, readlinkSync, rmSync, symlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { LOCK_NAME } from '../../src/io/outputLock.js';
import { COMMIT_PREFIX } from '../../src/io/writeOutputs.js';

/** The corpus folder, as the CLI is given it: relative to the working folder, like a user's path. */
export const FIXTURES = relative(process.cwd(), fileURLToPath(new URL('../fixtures/malformed', import.meta.url))) || '.';

/**
 * Where `--out` points and what is there before the run:
 * - fresh: a folder that does not exist yet;
 * - existing: a folder holding earlier outputs (no --force added);
 * - existing-force: the same, and --force is added, so only the inputs can stop the run;
 * - file: a plain file stands at the path;
 * - under-file: the path runs through a plain file (`file/plan`);
 * - read-only: a place no one may write to (see readOnlyPlace);
 * - locked: a folder whose lock file names a process that runs (this test process's parent);
 * - stale-lock: a folder whose lock file names a process that has ended;
 * - leftover-set: a folder holding only the commit folder of a run that ended while installing the
 *   three plan outputs (add --force with `args` to let the run replace them);
 * - crafted-leftover: a folder with earlier outputs and a commit folder holding a folder orders.csv;
 * - dangling-link: a symbolic link to a folder that does not exist;
 * - link-loop: a symbolic link that points to itself;
 * - none: no --out at all.
 */
export type OutMode =
  | 'fresh' | 'existing' | 'existing-force' | 'file' | 'under-file' | 'read-only'
  | 'locked' | 'stale-lock' | 'leftover-set' | 'crafted-leftover' | 'dangling-link' | 'link-loop' | 'none';

/** A stderr line pattern, or one repeated `repeat` times (a problem found on many rows). */
export type StderrLine = string | { readonly repeat: number; readonly line: string };

export interface CorpusCase {
  readonly name: string;
  /** What the case is about, and why the answer is right. */
  readonly what: string;
  /** Input files (relative to the corpus folder) over the defaults; null leaves the flag out. */
  readonly inputs?: Readonly<Record<string, string | null>>;
  /** Delivery day, default the manifest's; null leaves --day out. */
  readonly day?: string | null;
  /** Extra arguments after the inputs. */
  readonly args?: readonly string[];
  /** The whole argument list instead of the built one ({F}: corpus folder, {OUT}: out path). */
  readonly argv?: readonly string[];
  readonly out?: OutMode;
  readonly exit: 0 | 2;
  /** Every stderr line in order: exact text, or `re:` and a regular expression ({F} and {OUT} filled in). */
  readonly stderr?: readonly StderrLine[];
  /** Lines stderr must hold somewhere (help texts too long to spell out). */
  readonly stderrHas?: readonly string[];
}

export interface ReaderCase {
  readonly name: string;
  readonly what: string;
  /** The file, relative to the corpus folder. */
  readonly file: string;
  /** Problem lines (formatted as the CLI prints them), as in CorpusCase.stderr; absent: the file is accepted. */
  readonly problems?: readonly string[];
  /** For an accepted file: the days it holds, and the incomplete days with their reasons (patterns). */
  readonly days?: readonly string[];
  readonly incompleteDays?: readonly string[];
}

/** An item of the hardening work that no single run of main() can show, with the test file that shows it. */
export interface ElsewhereCase {
  readonly name: string;
  readonly what: string;
  /** The test file, relative to the repository. */
  readonly test: string;
  /** A title of a test in that file (a part of it). */
  readonly title: string;
}

export interface Manifest {
  readonly defaults: { readonly day: string; readonly inputs: Readonly<Record<string, string>> };
  readonly cases: readonly CorpusCase[];
  readonly historyCases: readonly ReaderCase[];
  readonly elsewhere: readonly ElsewhereCase[];
}

export function loadManifest(): Manifest {
  return JSON.parse(readFileSync(join(FIXTURES, 'cases.json'), 'utf8')) as Manifest;
}

export { runCli, type CliRun as Run } from '../report/planFixtures.js';

/** The argument list of a case, with {F} and {OUT} filled in. */
export function caseArgv(manifest: Manifest, c: CorpusCase, out: string): string[] {
  const fill = (s: string) => s.replaceAll('{F}', FIXTURES).replaceAll('{OUT}', out);
  if (c.argv !== undefined) return c.argv.map(fill);
  const argv = ['plan'];
  const inputs = { ...manifest.defaults.inputs, ...c.inputs };
  for (const [name, file] of Object.entries(inputs)) if (file !== null) argv.push(`--${name}`, join(FIXTURES, file));
  const day = c.day === undefined ? manifest.defaults.day : c.day;
  if (day !== null) argv.push('--day', day);
  // The quantile policy unless a case names one: the default (auto) needs a history, which the corpus lacks.
  const args = (c.args ?? []).map(fill);
  if (!args.includes('--policy')) argv.push('--policy', 'quantile');
  argv.push(...args);
  const mode = c.out ?? 'fresh';
  if (mode !== 'none') argv.push('--out', out);
  if (mode === 'existing-force') argv.push('--force');
  return argv;
}

/** A pattern line of a case: exact text or `re:` regular expression, with {F} and {OUT} filled in. */
export function lineMatcher(pattern: string, out: string): (line: string) => boolean {
  if (pattern.startsWith('re:')) {
    const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    const re = new RegExp(`^(?:${pattern.slice(3).replaceAll('{F}', escape(FIXTURES)).replaceAll('{OUT}', escape(out))})$`);
    return (line) => re.test(line);
  }
  const exact = pattern.replaceAll('{F}', FIXTURES).replaceAll('{OUT}', out);
  return (line) => line === exact;
}

/** Earlier outputs put in place for the `existing` modes: plain text, an old modification time. */
export const EARLIER_OUTPUTS = ['orders.csv', 'schedule.csv', 'plan.json'] as const;

/**
 * Prepares the --out path of a case inside `scratch` and says how it was done (for read-only, which
 * depends on the user running the tests).
 */
export function prepareOut(mode: OutMode, scratch: string): { out: string; how: string } {
  const out = join(scratch, 'out');
  switch (mode) {
    case 'existing':
    case 'existing-force':
      mkdirSync(out);
      for (const name of EARLIER_OUTPUTS) {
        writeFileSync(join(out, name), `earlier ${name}\n`);
        utimesSync(join(out, name), new Date('2001-02-03T04:05:06Z'), new Date('2001-02-03T04:05:06Z'));
      }
      return { out, how: 'a folder with earlier outputs' };
    case 'file':
      writeFileSync(out, 'a plain file\n');
      return { out, how: 'a plain file' };
    case 'under-file':
      writeFileSync(out, 'a plain file\n');
      return { out: join(out, 'plan'), how: 'a path through a plain file' };
    case 'read-only':
      return readOnlyPlace(scratch);
    case 'locked':
    case 'stale-lock': {
      mkdirSync(out);
      const pid = mode === 'locked' ? process.ppid : endedProcessId();
      writeFileSync(join(out, LOCK_NAME), `${JSON.stringify({ pid, command: 'sweep', started: '2027-06-15T10:00:00.000Z', token: 'corpus' })}\n`);
      return { out, how: mode === 'locked' ? `a lock of process ${pid}, which runs` : `a lock of process ${pid}, which has ended` };
    }
    case 'leftover-set':
    case 'crafted-leftover': {
      mkdirSync(out);
      const commit = join(out, `${COMMIT_PREFIX}${endedProcessId()}-corpus`);
      mkdirSync(commit);
      if (mode === 'leftover-set') for (const name of EARLIER_OUTPUTS) writeFileSync(join(commit, name), `leftover ${name}\n`);
      else {
        for (const name of EARLIER_OUTPUTS) writeFileSync(join(out, name), `earlier ${name}\n`);
        mkdirSync(join(commit, 'orders.csv'));
        writeFileSync(join(commit, 'plan.json'), 'crafted\n');
      }
      return { out, how: mode === 'leftover-set' ? 'a leftover commit folder of an ended run' : 'a crafted commit folder' };
    }
    case 'dangling-link':
      symlinkSync(join(scratch, 'nowhere'), out);
      return { out, how: 'a link to a folder that does not exist' };
    case 'link-loop':
      symlinkSync(out, out);
      return { out, how: 'a link to itself' };
    default:
      return { out, how: 'a new folder' };
  }
}

/**
 * A folder path no one may create or write into. For an ordinary user, a folder without write rights
 * (mode 555). For root, whom mode bits do not stop, a path under /sys, where the kernel refuses new
 * folders to everyone (EPERM, or EROFS where /sys is mounted read-only).
 */
export function readOnlyPlace(scratch: string): { out: string; how: string } {
  if (process.getuid?.() === 0) return { out: `/sys/quantbid-corpus-${process.pid}/out`, how: 'root: a path under /sys' };
  const locked = join(scratch, 'locked');
  mkdirSync(locked);
  chmodSync(locked, 0o555);
  return { out: join(locked, 'out'), how: 'a folder with mode 555' };
}

/** The id of a process that has ended (a child run to its end). */
export function endedProcessId(): number {
  return spawnSync(process.execPath, ['-e', '0']).pid as number;
}

/** Every file and folder under `path` (or the path itself) with size, modification time and content hash. */
export function snapshot(path: string): Record<string, string> {
  const result: Record<string, string> = {};
  const visit = (at: string) => {
    if (!existsSync(at) && !isLink(at)) return;
    const stat = lstatSync(at);
    const key = relative(path, at) || '.';
    if (stat.isSymbolicLink()) {
      result[key] = `link ${readlinkSync(at)}`;
    } else if (stat.isDirectory()) {
      result[key] = 'folder';
      for (const name of readdirSync(at).sort()) visit(join(at, name));
    } else {
      result[key] = `${stat.size} ${stat.mtimeMs} ${createHash('sha256').update(readFileSync(at)).digest('hex')}`;
    }
  };
  visit(path);
  return result;
}

function isLink(path: string): boolean {
  try {
    return lstatSync(path).isSymbolicLink();
  } catch {
    return false;
  }
}

/** A scratch folder for one case, removed (with any mode bits undone) by `done`. */
export function scratchFolder(): { path: string; done: () => void } {
  const path = mkdtempSync(join(tmpdir(), 'quantbid-corpus-'));
  return {
    path,
    done: () => {
      const locked = join(path, 'locked');
      if (existsSync(locked)) chmodSync(locked, 0o755);
      rmSync(path, { recursive: true, force: true });
    },
  };
}
