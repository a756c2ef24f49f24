import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FIXTURES, runCli, type Run } from './corpusRunner.js';
import { applyMutations, junkArbitrary, mutationsArbitrary, seedOf } from './mutations.js';

/**
 * `quantbid plan` on mutated and arbitrary inputs and arguments (fast-check, fixed seeds): the exit code
 * is 0 or 2, never 1; stderr never holds a stack trace; on exit 2 every line is a problem in the
 * template (or commander's usage error) and the --out folder is not created; on exit 0 the three
 * outputs are there.
 */
const valid = {
  market: readFileSync(join(FIXTURES, 'base/market.json'), 'utf8'),
  battery: readFileSync(join(FIXTURES, 'base/battery.json'), 'utf8'),
  forecast: readFileSync(join(FIXTURES, 'base/quantilesWide.csv'), 'utf8'),
};
type InputName = keyof typeof valid;
const NAMES: readonly InputName[] = ['market', 'battery', 'forecast'];

let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'quantbid-cli-props-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

/** Writes the three inputs (some mutated) into a fresh case folder; returns their paths and the out path. */
function writeInputs(contents: Record<InputName, string | Uint8Array>): { paths: Record<InputName, string>; out: string } {
  const caseDir = join(dir, 'case');
  rmSync(caseDir, { recursive: true, force: true });
  mkdirSync(caseDir);
  const paths = {} as Record<InputName, string>;
  for (const name of NAMES) {
    paths[name] = join(caseDir, name === 'forecast' ? 'quantiles.csv' : `${name}.json`);
    writeFileSync(paths[name], contents[name]);
  }
  return { paths, out: join(caseDir, 'out') };
}

function expectWellBehaved(run: Run, out: string): void {
  expect([0, 2], run.stderr).toContain(run.code);
  expect(run.stderr).not.toMatch(/^\s+at |internal fault/m);
  if (run.code === 2) {
    expect(existsSync(out), 'nothing written on exit 2').toBe(false);
    const lines = run.stderr.trimEnd().split('\n');
    if (lines[lines.length - 1] === 'nothing was written.') {
      for (const line of lines.slice(0, -1)) expect(line).toMatch(/^[^\n]+?(:\d+)?: .+; .+$/);
    } else {
      expect(run.stderr).toMatch(/^Usage: /);
    }
  } else if (existsSync(out)) {
    expect(readdirSync(out).sort()).toEqual(['orders.csv', 'plan.json', 'schedule.csv']);
  }
}

const planArgs = (paths: Record<InputName, string>, out: string, extra: readonly string[] = []) => [
  'plan', '--market', paths.market, '--battery', paths.battery, '--forecast', paths.forecast, '--day', '2027-06-15', ...extra, '--out', out,
];

describe('quantbid plan on any input', () => {
  it('mutated market, battery and forecast files: exit 0 or 2, never a fault', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...NAMES), fc.subarray([...NAMES]), mutationsArbitrary, async (first, others, mutations) => {
        const contents = { ...valid };
        for (const name of new Set([first, ...others])) contents[name] = applyMutations(valid[name], mutations);
        const { paths, out } = writeInputs(contents);
        expectWellBehaved(await runCli(planArgs(paths, out)), out);
      }),
      { seed: seedOf('plan mutated files'), numRuns: 150 },
    );
  });

  it('arbitrary bytes in place of an input: exit 2 with that file named', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...NAMES), fc.uint8Array({ maxLength: 400 }), async (name, bytes) => {
        const { paths, out } = writeInputs({ ...valid, [name]: bytes });
        const run = await runCli(planArgs(paths, out));
        expectWellBehaved(run, out);
        expect(run.code).toBe(2);
        expect(run.stderr).toContain(paths[name]);
      }),
      { seed: seedOf('plan arbitrary bytes'), numRuns: 100 },
    );
  });

  it('arbitrary option values: exit 0 or 2, never a fault', async () => {
    const options = ['--alpha', '--policy', '--soc-start', '--day'] as const;
    const valueFor = fc.oneof(junkArbitrary, fc.constantFrom('0.1', '0.25', '0.49', 'median', 'point', 'quantile', '0', '5', '9', '2027-06-15', '2027-03-28', '1e-300'));
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(fc.constantFrom(...options), valueFor), { maxLength: 4 }), fc.boolean(), async (pairs, json) => {
        const { paths, out } = writeInputs(valid);
        const extra = [...pairs.flat(), ...(json ? ['--json'] : [])];
        const run = await runCli(planArgs(paths, out, extra));
        expectWellBehaved(run, out);
        if (run.code === 0 && json) expect(() => JSON.parse(run.stdout) as unknown).not.toThrow();
      }),
      { seed: seedOf('plan option values'), numRuns: 150 },
    );
  });
});
