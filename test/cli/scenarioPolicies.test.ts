import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { daysBetween } from '../../src/market/calendar.js';
import { checkBuild, csvRows, quantbid, SCENARIO_LEVELS, writeScenario, type Run, type Scenario } from './sweepScenario.js';

// The curve and auto policies in backtest, sweep and size as users run them: the compiled CLI in a
// child process, on the tiny invented hourly scenario of sweepScenario.ts with whole-day paths drawn
// from its quantile forecast (seeded). The three commands share one settlement and one scenario
// planning, so the same policy, rule and battery must earn the same in each.

const PATHS_PER_DAY = 40;
let scenario: Scenario;
let pathsFile = '';
let backtest: { policies: Record<string, { profit: number }> };

/** Lehmer generator, uniform in (0, 1). */
function lehmer(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

/** Paths from the forecast's quantile rows: per path a day-wide level shared by all hours, mixed with an hourly one, read off the row linearly. */
function writePaths(quantilesCsv: string, out: string): void {
  const random = lehmer(20261);
  const rows = csvRows(readFileSync(quantilesCsv, 'utf8')).slice(1);
  const byDay = new Map<string, string[][]>();
  for (const row of rows) {
    const day = (row[0] as string).slice(0, 10);
    byDay.set(day, [...(byDay.get(day) ?? []), row]);
  }
  const lines = ['period_start,path,price'];
  for (const [, dayRows] of byDay) {
    for (let path = 1; path <= PATHS_PER_DAY; path++) {
      const dayLevel = random();
      for (const row of dayRows) {
        const level = Math.min(0.95, Math.max(0.05, 0.6 * dayLevel + 0.4 * random()));
        const values = row.slice(1).map(Number);
        const k = Math.max(1, SCENARIO_LEVELS.findIndex((l) => l >= level)) - 1;
        const [l0, l1] = [SCENARIO_LEVELS[k] as number, SCENARIO_LEVELS[k + 1] as number];
        const price = (values[k] as number) + ((values[k + 1] as number) - (values[k] as number)) * ((level - l0) / (l1 - l0));
        lines.push(`${row[0]},${path},${price.toFixed(2)}`);
      }
    }
  }
  writeFileSync(out, `${lines.join('\n')}\n`);
}

/** Exit code 0; stderr holds at most the warning that a few days are extrapolated to a year. */
function expectDone(run: Run): void {
  expect(run.code, run.stderr).toBe(0);
  expect(run.stderr.split('\n').filter((line) => line !== '' && !line.startsWith('warning: ') && !line.includes('extrapolated'))).toEqual([]);
}

beforeAll(() => {
  checkBuild();
  scenario = writeScenario('scenario-policies', { days: 3 });
  pathsFile = join(scenario.dir, 'paths.csv');
  writePaths(join(scenario.dir, 'quantiles.csv'), pathsFile);
  const out = join(scenario.dir, 'backtest');
  const run = quantbid(['backtest', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--policies', 'price-taking,curve,auto', '--paths', pathsFile, '--planning-paths', '20', '--out', out]);
  expectDone(run);
  backtest = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
}, 300_000);

describe('curve and auto in sweep and size', () => {
  it('sweep runs them beside quantile: one row per alpha, the same at every alpha, and the profit backtest reports', () => {
    const out = join(scenario.dir, 'sweep');
    const run = quantbid(['sweep', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--alphas', '0.1,0.3', '--policies', 'quantile,curve,auto', '--paths', pathsFile, '--planning-paths', '20', '--threads', '2', '--out', out, '--quiet']);
    expectDone(run);
    const rows = csvRows(readFileSync(join(out, 'sweep.csv'), 'utf8'));
    const header = rows[0] as string[];
    const profitOf = (alpha: string, policy: string) => Number((rows.find((r) => r[0] === alpha && r[1] === policy) as string[])[header.indexOf('profit')]);
    // The grid, then the reference rows (point, price-taking, perfect foresight) of the one rule.
    expect(rows).toHaveLength(1 + 2 * 3 + 3);
    for (const policy of ['curve', 'auto']) {
      expect(profitOf('0.1', policy)).toBe(profitOf('0.3', policy));
      // Both files keep 6 decimals at most (formatNumber).
      expect(profitOf('0.1', policy)).toBeCloseTo(backtest.policies[policy]?.profit as number, 5);
    }
    expect(Number(rows[1]?.[header.indexOf('days')])).toBe(daysBetween(scenario.from, scenario.to).length);
  });

  it('size scores curve on the scenario battery\'s own size with the profit backtest reports; no alpha', () => {
    const out = join(scenario.dir, 'size');
    const run = quantbid([
      'size', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--energy-mwh', '10', '--power-mw', '5', '--policy', 'curve',
      '--capex-per-mwh', '100000', '--capex-per-mw', '50000', '--life-years', '10', '--discount-rate', '0.07', '--paths', pathsFile, '--planning-paths', '20', '--threads', '1', '--out', out, '--quiet',
    ]);
    expectDone(run);
    const rows = csvRows(readFileSync(join(out, 'size.csv'), 'utf8'));
    const header = rows[0] as string[];
    const curve = rows.find((r) => r[3] === 'curve') as string[];
    expect(curve[header.indexOf('alpha')]).toBe('');
    expect(Number(curve[header.indexOf('profit')])).toBeCloseTo(backtest.policies.curve?.profit as number, 5);
  });

  it('plan --policy auto writes orders.csv and plan.json with every candidate scored on the fresh paths, price-taking first', () => {
    const out = join(scenario.dir, 'plan-auto');
    const run = quantbid(['plan', '--scenario', scenario.scenario, '--day', scenario.to, '--policy', 'auto', '--paths', pathsFile, '--planning-paths', '20', '--unaccepted', 'follow-accepted', '--out', out]);
    expectDone(run);
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect(plan.scenarios).toMatchObject({ planningPaths: 20, validationPaths: (PATHS_PER_DAY - 20) / 2, freshPaths: (PATHS_PER_DAY - 20) / 2 });
    expect(plan.candidates[0]).toMatchObject({ name: 'price-taking', advantageOverPriceTaking: 0 });
    expect(plan.candidates.map((c: { name: string }) => c.name)).toEqual(expect.arrayContaining(['point', 'quantile 0.1', 'median 0.1', 'curve']));
    expect(plan.candidates.map((c: { name: string }) => c.name)).toContain(plan.submitted);
    const rows = csvRows(readFileSync(join(out, 'orders.csv'), 'utf8'));
    expect(rows[0]).toEqual(['period_start', 'period_end', 'side', 'quantity_mw', 'limit_price', 'quantile_level']);
    expect(plan.orders.rows).toBe(rows.length - 1);
  });

  it('on a market with order steps, plan --policy curve is refused (exit 2, naming market.json), auto runs without the curve', () => {
    const market = JSON.parse(readFileSync(join(scenario.dir, 'market.json'), 'utf8'));
    const stepped = join(scenario.dir, 'market-steps.json');
    writeFileSync(stepped, JSON.stringify({ ...market, quantityStepMw: 0.1 }));
    const base = ['plan', '--scenario', scenario.scenario, '--market', stepped, '--day', scenario.to, '--paths', pathsFile, '--planning-paths', '20', '--unaccepted', 'follow-accepted'];
    const refused = quantbid([...base, '--policy', 'curve']);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain('market-steps.json');
    expect(refused.stderr).toContain('order steps');
    const auto = quantbid([...base, '--policy', 'auto', '--json']);
    expectDone(auto);
    expect(JSON.parse(auto.stdout).candidates.map((c: { name: string }) => c.name)).not.toContain('curve');
  });

  it('without --paths on a history too short to learn the dependence from, a sweep of auto is refused with exit code 2 and names the option to give', () => {
    const run = quantbid(['sweep', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--policies', 'auto', '--out', join(scenario.dir, 'none')]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('--paths');
  });

  it('without --paths, sweep and size plan auto on paths made from the quantile file and the history, earning what backtest reports on them', () => {
    const longer = writeScenario('scenario-policies-quantile-paths', { days: 10 });
    const span = ['--from', '2026-03-10', '--to', '2026-03-11'];
    const backtestOut = join(longer.dir, 'backtest');
    expectDone(quantbid(['backtest', '--scenario', longer.scenario, ...span, '--policies', 'price-taking,auto', '--planning-paths', '10', '--out', backtestOut, '--quiet']));
    const backtestSummary = JSON.parse(readFileSync(join(backtestOut, 'summary.json'), 'utf8'));
    // 8 and 9 history days before the two days, of which 1 and 2 have a day 7 days before them.
    const source = 'quantile file + history, Schaake shuffle with the seasonal naive errors template of 1 to 2 past days on 2 days, 30 paths per day, seed 1';
    expect(backtestSummary.scenarioPaths).toBe(source);
    const sweepOut = join(longer.dir, 'sweep');
    const sweep = quantbid(['sweep', '--scenario', longer.scenario, ...span, '--alphas', '0.1', '--policies', 'auto', '--planning-paths', '10', '--threads', '1', '--out', sweepOut, '--quiet']);
    expectDone(sweep);
    expect(sweep.stdout).toContain(`paths of curve and auto: ${source}`);
    expect(JSON.parse(readFileSync(join(sweepOut, 'summary.json'), 'utf8')).scenarioPaths).toBe(source);
    const rows = csvRows(readFileSync(join(sweepOut, 'sweep.csv'), 'utf8'));
    const header = rows[0] as string[];
    const auto = rows.find((r) => r[1] === 'auto') as string[];
    expect(Number(auto[header.indexOf('profit')])).toBeCloseTo(backtestSummary.policies.auto.profit as number, 5);
    const sizeOut = join(longer.dir, 'size');
    const size = quantbid([
      'size', '--scenario', longer.scenario, ...span, '--energy-mwh', '10', '--power-mw', '5', '--policy', 'auto',
      '--capex-per-mwh', '100000', '--capex-per-mw', '50000', '--life-years', '10', '--discount-rate', '0.07', '--planning-paths', '10', '--threads', '1', '--out', sizeOut, '--quiet',
    ]);
    expectDone(size);
    expect(JSON.parse(readFileSync(join(sizeOut, 'summary.json'), 'utf8')).scenarioPaths).toBe(source);
    const sizeRows = csvRows(readFileSync(join(sizeOut, 'size.csv'), 'utf8'));
    const sizeAuto = sizeRows.find((r) => r[3] === 'auto') as string[];
    expect(Number(sizeAuto[(sizeRows[0] as string[]).indexOf('profit')])).toBeCloseTo(backtestSummary.policies.auto.profit as number, 5);
  }, 300_000);
});
