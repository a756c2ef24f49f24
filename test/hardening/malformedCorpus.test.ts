import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { InputError, formatProblem } from '../../src/errors/inputError.js';
import { readPriceHistory } from '../../src/io/readPriceHistory.js';
import { readMarketSpec } from '../../src/io/readSpecs.js';
import {
  EARLIER_OUTPUTS,
  FIXTURES,
  caseArgv,
  lineMatcher,
  loadManifest,
  prepareOut,
  runCli,
  scratchFolder,
  snapshot,
  type CorpusCase,
  type StderrLine,
} from './corpusRunner.js';

/**
 * The malformed-input corpus (test/fixtures/malformed/cases.json), each case run through
 * main(argv, io) with captured output. For every case: the exit code; every stderr line in order
 * (file, line, field, what is wrong, what to do; all problems of a file together); and the --out path
 * byte for byte and time for time as it was (exit 2), or the outputs in place (exit 0).
 */
const manifest = loadManifest();
const PLAN_OUTPUTS = EARLIER_OUTPUTS;

/** Expands `{ repeat, line }` entries into that many copies of the line. */
function expectedLines(entries: readonly StderrLine[]): string[] {
  return entries.flatMap((entry) => (typeof entry === 'string' ? [entry] : Array.from({ length: entry.repeat }, () => entry.line)));
}

function expectLines(actual: string, expected: readonly StderrLine[], out: string): void {
  const lines = actual.split('\n');
  expect(lines.pop(), 'stderr ends with a line break').toBe('');
  const patterns = expectedLines(expected);
  expect(lines.length, `stderr:\n${actual}`).toBe(patterns.length);
  lines.forEach((line, k) => expect(lineMatcher(patterns[k] as string, out)(line), `line ${k + 1} of stderr:\n${line}\nexpected:\n${patterns[k]}`).toBe(true));
}

/** Every line of an input error follows `FILE[:LINE]: [FIELD: ]what is wrong; what to do`, then the closing line. */
function expectProblemTemplate(stderr: string): void {
  const lines = stderr.trimEnd().split('\n');
  expect(lines.pop()).toBe('nothing was written.');
  for (const line of lines) expect(line).toMatch(/^[^:]+(:\d+)?: .+; .+$/);
}

let fixturesBefore: Record<string, string> = {};
beforeAll(() => {
  fixturesBefore = snapshot(FIXTURES);
});
afterAll(() => {
  // No case writes into its inputs.
  expect(snapshot(FIXTURES)).toEqual(fixturesBefore);
});

describe('the malformed-input manifest', () => {
  it('holds at least 50 command-line cases and 10 history cases, each name once', () => {
    expect(manifest.cases.length).toBeGreaterThanOrEqual(50);
    expect(manifest.historyCases.length).toBeGreaterThanOrEqual(10);
    const names = [...manifest.cases, ...manifest.historyCases].map((c) => c.name);
    expect(new Set(names).size).toBe(names.length);
  });

  it('uses every fixture file, and names only files that exist (but the one meant to be missing)', () => {
    const used = new Set<string>([...Object.values(manifest.defaults.inputs), ...manifest.historyCases.map((c) => c.file)]);
    for (const c of manifest.cases) for (const file of Object.values(c.inputs ?? {})) if (file !== null) used.add(file);
    for (const c of manifest.cases) for (const arg of c.argv ?? []) if (arg.startsWith('{F}/')) used.add(arg.slice('{F}/'.length));
    const present = listFiles(FIXTURES).filter((f) => f.includes('/'));
    expect(present.filter((f) => !used.has(f))).toEqual([]);
    expect([...used].filter((f) => statSync(join(FIXTURES, f), { throwIfNoEntry: false }) === undefined)).toEqual(['market/nowhere.json']);
  });
});

describe('quantbid plan on malformed input', () => {
  it.each(manifest.cases.map((c) => [c.name, c] as const))('%s', async (_name, c: CorpusCase) => {
    const scratch = scratchFolder();
    try {
      const mode = c.out ?? 'fresh';
      const { out } = prepareOut(mode, scratch.path);
      const before = snapshot(out);
      const run = await runCli(caseArgv(manifest, c, out));
      expect(run.code, run.stderr).toBe(c.exit);
      expect(run.stderr).not.toMatch(/^\s+at /m); // never a stack trace
      if (c.stderr !== undefined) expectLines(run.stderr, c.stderr, out);
      for (const pattern of c.stderrHas ?? []) expect(run.stderr.split('\n').some(lineMatcher(pattern, out)), pattern).toBe(true);
      if (c.exit === 2) {
        expect(snapshot(out), 'the --out path is untouched').toEqual(before);
        expect(run.stdout).toBe('');
        if (run.stderr.includes('nothing was written.')) expectProblemTemplate(run.stderr);
        else expect(run.stderr).toMatch(/^Usage: quantbid/);
      } else {
        const written = readdirSync(out).sort();
        expect(written).toEqual([...PLAN_OUTPUTS].sort());
        for (const name of PLAN_OUTPUTS) expect(readFileSync(join(out, name), 'utf8')).not.toMatch(/^earlier/);
        expect(run.stdout).toMatch(/^plan for \d{4}-\d{2}-\d{2} /);
      }
    } finally {
      scratch.done();
    }
  });
});

describe('items shown by other tests (processes, signals, races, a full disk)', () => {
  it.each(manifest.elsewhere.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const text = readFileSync(join(FIXTURES, '../../..', c.test), 'utf8');
    expect(text, `${c.test} holds a test titled "${c.title}"`).toContain(c.title);
  });
});

describe('the price-history reader on malformed input', () => {
  const market = readMarketSpec(join(FIXTURES, manifest.defaults.inputs.market as string));
  it.each(manifest.historyCases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const read = () => readPriceHistory(join(FIXTURES, c.file), market);
    if (c.problems !== undefined) {
      let error: unknown;
      try {
        read();
      } catch (err) {
        error = err;
      }
      expect(error).toBeInstanceOf(InputError);
      const lines = (error as InputError).problems.map(formatProblem);
      expect(lines.length, lines.join('\n')).toBe(c.problems.length);
      lines.forEach((line, k) => expect(lineMatcher(c.problems?.[k] as string, '')(line), `${line}\nexpected:\n${c.problems?.[k]}`).toBe(true));
      return;
    }
    const history = read();
    expect(history.days.map((d) => d.day)).toEqual(c.days);
    expect(history.incompleteDays.map((d) => `${d.day}: ${d.reason}`)).toEqual(c.incompleteDays);
  });
});

function listFiles(root: string): string[] {
  const out: string[] = [];
  const visit = (at: string) => {
    for (const name of readdirSync(at)) {
      const path = join(at, name);
      if (statSync(path).isDirectory()) visit(path);
      else out.push(relative(root, path));
    }
  };
  visit(root);
  return out;
}
