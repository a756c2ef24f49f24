import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LOCK_NAME, LOCK_TEMP_PREFIX } from '../../src/io/outputLock.js';
import { COMMIT_PREFIX, PARTIAL_PREFIX } from '../../src/io/writeOutputs.js';
import { DEMO_SCENARIO, folderFiles, runCliProcess, seededUniform, slowRenamePreload, startCli, type CliExit } from './cliProcess.js';
import { stripYearWarning } from '../cli/yearWarning.js';

/**
 * A backtest and a sweep of the demo scenario, run with `--force` over the outputs of an earlier run
 * with other arguments, are killed with SIGKILL at seeded random moments. After each kill the output
 * folder must hold the old outputs or the complete new ones, byte for byte as a reference run wrote
 * them, never a mix (writeOutputs.ts explains how). The law rests on one fact: rename(2) replaces an
 * existing name atomically ("If newpath already exists, it will be atomically replaced", POSIX.1-2017,
 * rename(); Linux man-pages rename(2)).
 *
 * Half of the kills fall anywhere in a run (uniform over the reference run's wall time, which is mostly
 * reading inputs and computing). The other half aim at the few milliseconds in which outputs are
 * renamed: the child is started with a preload that pauses before and after every rename in the file
 * system and says so on stderr, and the kill comes while the k-th rename's pauses run (k and the delay
 * seeded). The preload changes timing only; the reference runs are the plain CLI.
 *
 * Leftovers of a kill may only carry writeOutputs' hidden temporary names (`.quantbid-partial-*`,
 * `.quantbid-commit-*`, the folder's lock `.quantbid-lock` and its `.tmp-` names, and for a sweep its
 * journal and the journal's `.tmp-<pid>` name): the next run into the folder removes or finishes them
 * (the lock of a dead process is stale), which the test checks by running again.
 */
const RENAME_PAUSE_MS = 250;
const PRELOAD = slowRenamePreload(RENAME_PAUSE_MS);

const FROM = '2026-03-01';
let scratch = '';

beforeAll(() => {
  scratch = mkdtempSync(join(tmpdir(), 'quantbid-killed-'));
});
afterAll(() => {
  rmSync(scratch, { recursive: true, force: true });
});

type Files = ReadonlyMap<string, Buffer>;

/** What a killed run left: the old set, the new set, or the new set part-installed with its commit folder. */
type Left = 'old' | 'new' | 'installing';

/**
 * Checks the folder after a kill. Outputs (names without a leading dot) are exactly the set's names,
 * each file whole: byte-equal to its old or its new version. Hidden entries are only writeOutputs'
 * partial and commit folders and, for a sweep, its journal (or the journal's temporary name). Without
 * a commit folder the outputs are all old or all new; with one, the outputs with the commit folder's
 * files laid over them are all new (the next write into the folder finishes the install).
 */
function checkLeft(out: string, before: Files, after: Files, journal: string | null): Left {
  const entries = readdirSync(out).sort();
  const outputs = entries.filter((name) => !name.startsWith('.'));
  const hidden = entries.filter((name) => name.startsWith('.'));
  expect(outputs).toEqual([...after.keys()]);
  const allowed = (name: string) =>
    name.startsWith(PARTIAL_PREFIX) || name.startsWith(COMMIT_PREFIX) || name === LOCK_NAME || name.startsWith(LOCK_TEMP_PREFIX) || (journal !== null && (name === journal || name.startsWith(`${journal}.tmp-`)));
  expect(hidden.filter((name) => !allowed(name))).toEqual([]);
  const now = new Map(outputs.map((name) => [name, readFileSync(join(out, name))]));
  for (const [name, bytes] of now) {
    const whole = bytes.equals(before.get(name) as Buffer) || bytes.equals(after.get(name) as Buffer);
    expect(whole, `${name} is neither the old nor the new file`).toBe(true);
  }
  const commits = hidden.filter((name) => name.startsWith(COMMIT_PREFIX));
  expect(commits.length).toBeLessThanOrEqual(1);
  const same = (files: Files) => [...files].every(([name, bytes]) => (now.get(name) as Buffer).equals(bytes));
  if (commits.length === 0) {
    if (same(after)) return 'new';
    expect(same(before), 'the outputs are a mix of old and new files').toBe(true);
    return 'old';
  }
  const rest = folderFiles(join(out, commits[0] as string));
  const laid = new Map([...now, ...rest]);
  expect([...rest.keys()].every((name) => after.has(name))).toBe(true);
  expect([...after].every(([name, bytes]) => (laid.get(name) as Buffer).equals(bytes))).toBe(true);
  return 'installing';
}

/** The folder holds exactly the set, no hidden entries at all. */
function expectExactly(out: string, files: Files): void {
  expect(readdirSync(out).sort()).toEqual([...files.keys()]);
  for (const [name, bytes] of files) expect(readFileSync(join(out, name)).equals(bytes), name).toBe(true);
}

/** A fresh `out` holding the old outputs. */
function resetTo(out: string, from: string): void {
  rmSync(out, { recursive: true, force: true });
  mkdirSync(out);
  for (const name of readdirSync(from)) copyFileSync(join(from, name), join(out, name));
}

interface Kill {
  /** `anywhere`: after `delayMs` from the start; `rename`: `delayMs` after the k-th rename begins. */
  readonly how: 'anywhere' | 'rename';
  readonly delayMs: number;
  readonly renameNumber?: number;
}

/** Runs the CLI and kills it as `kill` says; the exit (a SIGKILL, or a normal exit when it was faster). */
function runAndKill(args: readonly string[], kill: Kill): Promise<CliExit> {
  let timer: NodeJS.Timeout | undefined;
  const killLater = (child: { kill: (signal: NodeJS.Signals) => boolean }) => {
    timer ??= setTimeout(() => child.kill('SIGKILL'), kill.delayMs);
  };
  if (kill.how === 'anywhere') {
    const run = startCli(args);
    killLater(run.child);
    return run.exit.finally(() => clearTimeout(timer));
  }
  let run: ReturnType<typeof startCli> | undefined;
  run = startCli(args, {
    nodeArgs: PRELOAD,
    onStderr: (text) => {
      if (run !== undefined && (text.match(/^test-rename /gm) ?? []).length >= (kill.renameNumber as number)) killLater(run.child);
    },
  });
  return run.exit.finally(() => clearTimeout(timer));
}

/** Seeded kills: even ones anywhere in [0, 1.1 x the reference time], odd ones in a rename's pauses. */
function plannedKills(seed: number, count: number, referenceMs: number, renames: number): Kill[] {
  const uniform = seededUniform(seed);
  return Array.from({ length: count }, (_, i) =>
    i % 2 === 0
      ? { how: 'anywhere', delayMs: Math.round(uniform() * 1.1 * referenceMs) }
      : { how: 'rename', renameNumber: 1 + Math.floor(uniform() * renames), delayMs: Math.round(uniform() * 2 * RENAME_PAUSE_MS) },
  );
}

/** Renames a run makes, counted with the preload on; its outputs must still be the reference's bytes. */
async function countRenames(args: readonly string[], out: string, expected: Files): Promise<number> {
  const run = await startCli(args, { nodeArgs: PRELOAD }).exit;
  expect(run.code).toBe(0);
  expectExactly(out, expected);
  return (run.stderr.match(/^test-rename /gm) ?? []).length;
}

/** Reference run into `dir` (must succeed); its files and wall time. */
async function reference(args: readonly string[], dir: string): Promise<{ files: Files; ms: number }> {
  const run = await runCliProcess(args);
  expect(stripYearWarning(run.stderr)).toBe('');
  expect(run.code).toBe(0);
  return { files: folderFiles(dir), ms: run.ms };
}

describe('runs killed at random moments leave the old outputs or the new ones, never a mix', () => {
  it('backtest: 10 kills with the outputs of another range present (--force)', async () => {
    const backtest = (to: string, out: string) => ['backtest', '--scenario', DEMO_SCENARIO, '--from', FROM, '--to', to, '--out', out, '--force'];
    const oldDir = join(scratch, 'backtest-old');
    const newDir = join(scratch, 'backtest-new');
    const old = await reference(backtest('2026-03-02', oldDir), oldDir);
    const fresh = await reference(backtest('2026-03-04', newDir), newDir);
    expect([...old.files.keys()]).toEqual(['days.csv', 'ledger.csv', 'summary.json']);
    expect([...fresh.files].every(([name, bytes]) => !bytes.equals(old.files.get(name) as Buffer))).toBe(true);

    const out = join(scratch, 'backtest-run');
    resetTo(out, oldDir);
    const renames = await countRenames(backtest('2026-03-04', out), out, fresh.files);
    expect(renames).toBe(4); // the commit, then ledger.csv, days.csv, summary.json

    const seen: string[] = [];
    for (const kill of plannedKills(8101, 10, fresh.ms, renames)) {
      resetTo(out, oldDir);
      const run = await runAndKill(backtest('2026-03-04', out), kill);
      expect(run.signal === 'SIGKILL' || run.code === 0, run.stderr).toBe(true);
      const left = checkLeft(out, old.files, fresh.files, null);
      seen.push(`${kill.how}:${left}`);
      if (readdirSync(out).some((name) => name.startsWith('.'))) {
        // Leftovers carry only the temporary names; the next run into the folder clears them.
        const again = await runCliProcess(backtest('2026-03-04', out));
        expect(again.code).toBe(0);
        expectExactly(out, fresh.files);
      }
    }
    // The rename-aimed kills must have hit the window between the commit and the last rename at least once.
    expect(seen, seen.join(' ')).toContain('rename:installing');
    expect(seen.some((s) => s.endsWith(':old')), seen.join(' ')).toBe(true);
  }, 600_000);

  it('sweep: 10 kills with the outputs of another grid present (--force); the rerun resumes and writes the reference bytes', async () => {
    // One thread: the journal and the outputs are written by the main thread whatever --threads says,
    // and each worker thread would read the two years of inputs again.
    const sweep = (alphas: string, out: string) => ['sweep', '--scenario', DEMO_SCENARIO, '--from', FROM, '--to', '2026-03-03', '--alphas', alphas, '--policies', 'quantile', '--threads', '1', '--quiet', '--out', out, '--force'];
    const alphas = '0.1:0.3:0.05';
    const oldDir = join(scratch, 'sweep-old');
    const newDir = join(scratch, 'sweep-new');
    const old = await reference(sweep('0.1,0.2', oldDir), oldDir);
    const fresh = await reference(sweep(alphas, newDir), newDir);
    expect([...old.files.keys()]).toEqual(['summary.json', 'sweep.csv']);
    expect([...fresh.files].every(([name, bytes]) => !bytes.equals(old.files.get(name) as Buffer))).toBe(true);

    const out = join(scratch, 'sweep-run');
    resetTo(out, oldDir);
    const renames = await countRenames(sweep(alphas, out), out, fresh.files);
    expect(renames).toBe(4); // the journal's creation, the commit, then summary.json and sweep.csv

    const journal = '.sweep-journal.jsonl';
    const seen: string[] = [];
    for (const kill of plannedKills(8102, 10, fresh.ms, renames)) {
      resetTo(out, oldDir);
      const run = await runAndKill(sweep(alphas, out), kill);
      expect(run.signal === 'SIGKILL' || run.code === 0, run.stderr).toBe(true);
      const left = checkLeft(out, old.files, fresh.files, journal);
      seen.push(`${kill.how}:${left}`);
      const journalPath = join(out, journal);
      // Settings of the grid kept; the journal also keeps the reference rows (alpha empty), which are not counted as settings.
      const kept = existsSync(journalPath) ? readFileSync(journalPath, 'utf8').split('\n').slice(1, -1).filter((line) => !line.startsWith('{"key":"alpha=|')).length : 0;
      const again = await runCliProcess(sweep(alphas, out));
      expect(again.code, again.stderr).toBe(0);
      if (run.code !== 0) expect(again.stdout).toContain(`5 settings (${kept} resumed from the journal)`);
      expectExactly(out, fresh.files);
    }
    expect(seen, seen.join(' ')).toContain('rename:installing');
    expect(seen.some((s) => s.endsWith(':old')), seen.join(' ')).toBe(true);
  }, 900_000);
});
