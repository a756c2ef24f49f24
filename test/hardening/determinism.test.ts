import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_SCENARIO, folderFiles, runCliProcess } from './cliProcess.js';

/**
 * The same inputs give the same bytes (docs/design.md section 7): the demo's plan, backtest, sweep and size
 * outputs, through the CLI on short ranges of the demo scenario, are byte-identical across two runs,
 * and for sweep and size across 1 and 2 threads (--threads), for sweep 3 as well. Each run writes into its own
 * folder; no output may name its folder, the clock or the thread count.
 */
let scratch = '';

beforeAll(() => {
  scratch = mkdtempSync(join(tmpdir(), 'quantbid-determinism-'));
});
afterAll(() => {
  rmSync(scratch, { recursive: true, force: true });
});

interface Outputs {
  readonly files: ReadonlyMap<string, Buffer>;
  /** Notes on stderr (e.g. crossing quantiles repaired): they must repeat too. */
  readonly stderr: string;
}

/** Runs the command into a fresh folder `name` and returns its files (the run must succeed). */
async function outputs(name: string, args: readonly string[]): Promise<Outputs> {
  const out = join(scratch, name);
  const run = await runCliProcess([...args, '--out', out]);
  expect(run.code, run.stderr).toBe(0);
  return { files: folderFiles(out), stderr: run.stderr };
}

/** Every file of `b` byte-equal to the same file of `a`, the same names, the same notes. */
function expectSameBytes(a: Outputs, b: Outputs, names: readonly string[]): void {
  expect([...a.files.keys()]).toEqual(names);
  expect([...b.files.keys()]).toEqual(names);
  for (const name of names) expect((b.files.get(name) as Buffer).equals(a.files.get(name) as Buffer), `${name} differs`).toBe(true);
  expect(b.stderr).toBe(a.stderr);
}

const SCENARIO = ['--scenario', DEMO_SCENARIO];
const SHORT = ['--from', '2026-06-01', '--to', '2026-06-04'];

describe('the demo gives byte-identical outputs', () => {
  it('plan: two runs, with the default policy (auto, on seeded paths) and with the quantile policy', async () => {
    const args = ['plan', ...SCENARIO, '--day', '2026-06-02'];
    expectSameBytes(await outputs('plan-a', args), await outputs('plan-b', args), ['orders.csv', 'plan.json']);
    const quantile = [...args, '--policy', 'quantile'];
    expectSameBytes(await outputs('plan-q-a', quantile), await outputs('plan-q-b', quantile), ['orders.csv', 'plan.json', 'schedule.csv']);
  }, 300_000);

  it('backtest: two runs', async () => {
    const args = ['backtest', ...SCENARIO, ...SHORT];
    expectSameBytes(await outputs('backtest-a', args), await outputs('backtest-b', args), ['days.csv', 'ledger.csv', 'summary.json']);
  }, 300_000);

  it('sweep: two runs on 1 thread, and on 2 and 3 threads', async () => {
    // Threads keep to one unaccepted rule each (the reference rows run as settings): the order in
    // which settings run differs with the thread count, the bytes may not.
    const args = ['sweep', ...SCENARIO, ...SHORT, '--alphas', '0.05:0.25:0.1', '--policies', 'quantile,median', '--unaccepted', 'follow-plan,follow-accepted', '--quiet'];
    const one = await outputs('sweep-1a', [...args, '--threads', '1']);
    expectSameBytes(one, await outputs('sweep-1b', [...args, '--threads', '1']), ['summary.json', 'sweep.csv']);
    expectSameBytes(one, await outputs('sweep-2', [...args, '--threads', '2']), ['summary.json', 'sweep.csv']);
    expectSameBytes(one, await outputs('sweep-3', [...args, '--threads', '3']), ['summary.json', 'sweep.csv']);
  }, 600_000);

  it('size: two runs on 1 thread, and on 2 threads', async () => {
    const args = [
      'size', ...SCENARIO, ...SHORT, '--energy-mwh', '5,10', '--power-mw', '2.5,5', '--policy', 'quantile,point',
      '--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--life-years', '15', '--discount-rate', '0.07', '--quiet',
    ];
    const one = await outputs('size-1a', [...args, '--threads', '1']);
    expectSameBytes(one, await outputs('size-1b', [...args, '--threads', '1']), ['size.csv', 'summary.json']);
    expectSameBytes(one, await outputs('size-2', [...args, '--threads', '2']), ['size.csv', 'summary.json']);
  }, 600_000);
});
