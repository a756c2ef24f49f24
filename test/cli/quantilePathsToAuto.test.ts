import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkBuild, csvRows, quantbid } from './sweepScenario.js';

// The scenario policies on a vendor's quantile file alone, as users run them: no --paths, the paths made
// from the demo scenario's quantile file and its history (Schaake shuffle), seeded. The compiled CLI in
// a child process; few paths and days to stay quick.

const SCENARIO = 'scenarios/halvorn/scenario.json';
const SOURCE = /^quantile file \+ history, Schaake shuffle with the PIT template of \d+ past days, 60 paths per day, seed 1$/;

let dir = '';
beforeAll(() => {
  checkBuild();
  dir = mkdtempSync(join(tmpdir(), 'quantbid-quantile-paths-'));
});

const planArgs = (out: string, more: readonly string[] = []) => ['plan', '--scenario', SCENARIO, '--policy', 'auto', '--planning-paths', '20', ...more, '--out', out];

describe('curve and auto without --paths', () => {
  it('plan --policy auto on the demo day plans on paths made from the quantile file, the same bytes twice, and says where they came from', () => {
    const first = quantbid(planArgs(join(dir, 'a')));
    const second = quantbid(planArgs(join(dir, 'b')));
    expect(first.code, first.stderr).toBe(0);
    expect(second.code, second.stderr).toBe(0);
    for (const name of ['orders.csv', 'plan.json']) expect(readFileSync(join(dir, 'b', name), 'utf8')).toBe(readFileSync(join(dir, 'a', name), 'utf8'));
    const summary = JSON.parse(readFileSync(join(dir, 'a', 'plan.json'), 'utf8'));
    expect(summary.scenarios).toMatchObject({ planningPaths: 20, validationPaths: 20, freshPaths: 20 });
    expect(summary.scenarios.paths).toMatch(SOURCE);
    expect(summary.inputs.paths).toBeUndefined();
    expect(first.stdout).toContain(`  paths: ${summary.scenarios.paths}\n`);
    expect(csvRows(readFileSync(join(dir, 'a', 'orders.csv'), 'utf8')).length - 1).toBe(summary.orders.rows);
    // Another --path-seed draws other paths, and says so.
    const reseeded = quantbid([...planArgs(join(dir, 'c'), ['--path-seed', '7']), '--json']);
    expect(reseeded.code, reseeded.stderr).toBe(0);
    expect(JSON.parse(reseeded.stdout).scenarios.paths).toMatch(/, seed 7$/);
  }, 300_000);

  it('without --paths and without a history, plan --policy curve is refused (exit 2) naming both ways out', () => {
    const run = quantbid(['plan', '--market', 'scenarios/halvorn/market.json', '--battery', 'scenarios/halvorn/battery.json', '--forecast', 'scenarios/halvorn/quantiles.csv.gz', '--day', '2027-01-01', '--policy', 'curve']);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('--paths FILE');
    expect(run.stderr).toContain('--history FILE');
  }, 300_000);

  it('--path-seed with --paths is refused (exit 2): a paths file is not drawn', () => {
    const run = quantbid([...planArgs(join(dir, 'd'), ['--paths', join(dir, 'none.csv'), '--path-seed', '3'])]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('--path-seed');
  }, 300_000);

  it('backtest --policies auto,price-taking over three days runs on the made paths and records their source', () => {
    const out = join(dir, 'backtest');
    const run = quantbid(['backtest', '--scenario', SCENARIO, '--from', '2026-06-01', '--to', '2026-06-03', '--policies', 'auto,price-taking', '--planning-paths', '20', '--out', out, '--quiet']);
    expect(run.code, run.stderr).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.scenarioPaths).toMatch(/^quantile file \+ history, Schaake shuffle with the PIT template of \d+ past days on 3 days, 60 paths per day, seed 1$/);
    expect(run.stdout).toContain(`paths: ${summary.scenarioPaths}`);
    const days = csvRows(readFileSync(join(out, 'days.csv'), 'utf8'));
    const policy = (days[0] as string[]).indexOf('policy');
    expect(days.slice(1).filter((r) => r[policy] === 'auto')).toHaveLength(3);
    expect(days.slice(1).filter((r) => r[policy] === 'price-taking')).toHaveLength(3);
  }, 300_000);
});
