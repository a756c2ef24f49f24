import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkBuild, csvRows, quantbid } from './sweepScenario.js';

// The forecaster's paths feed the scenario policies as they come: `quantbid forecast --paths` writes
// paths.csv beside quantiles.csv, and `quantbid plan --policy auto --paths` reads both, on the demo's
// invented market (its history carries imbalance prices, from which the paths' imbalance prices come).

const SCENARIO = 'scenarios/halvorn/scenario.json';
const DAY = '2026-12-07';

describe('quantbid forecast --paths into quantbid plan --policy auto', () => {
  it('plans the day on the forecast\'s own paths: 20 planning and 20 fresh of 40, every candidate scored, orders written', () => {
    checkBuild();
    const dir = mkdtempSync(join(tmpdir(), 'quantbid-paths-auto-'));
    const forecast = quantbid(['forecast', '--scenario', SCENARIO, '--from', DAY, '--to', DAY, '--paths', '40', '--out', join(dir, 'fc'), '--quiet']);
    expect(forecast.code, forecast.stderr).toBe(0);
    const header = readFileSync(join(dir, 'fc', 'paths.csv'), 'utf8').split('\n', 1)[0];
    expect(header).toBe('period_start,path,price');
    const out = join(dir, 'plan');
    const plan = quantbid([
      'plan', '--scenario', SCENARIO, '--forecast', join(dir, 'fc', 'quantiles.csv'), '--day', DAY, '--policy', 'auto',
      '--paths', join(dir, 'fc', 'paths.csv'), '--planning-paths', '20', '--unaccepted', 'follow-accepted', '--out', out,
    ]);
    expect(plan.code, plan.stderr).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect(summary.scenarios).toMatchObject({ planningPaths: 20, freshPaths: 20 });
    expect(summary.candidates.map((c: { name: string }) => c.name)).toEqual(expect.arrayContaining(['price-taking', 'point', 'curve']));
    expect(summary.inputs.paths).toBe(join(dir, 'fc', 'paths.csv'));
    expect(csvRows(readFileSync(join(out, 'orders.csv'), 'utf8')).length - 1).toBe(summary.orders.rows);
    // That forecast file holds the planned day only, so no past day has a forecast to measure the
    // surprise from: the imbalance spread is resampled without it.
    expect(summary.scenarios.imbalance).toMatch(/resampled whole \(too few past forecast days/);
    // With the scenario's own two-year quantile file, its past days give the surprise the spread is fitted on.
    const withPast = quantbid([
      'plan', '--scenario', SCENARIO, '--day', DAY, '--policy', 'auto', '--paths', join(dir, 'fc', 'paths.csv'),
      '--planning-paths', '20', '--unaccepted', 'follow-accepted', '--json',
    ]);
    expect(withPast.code, withPast.stderr).toBe(0);
    expect(JSON.parse(withPast.stdout).scenarios.imbalance).toMatch(/^history's imbalance - clearing spread on the surprise, fitted on \d+ days/);
  }, 300_000);
});
