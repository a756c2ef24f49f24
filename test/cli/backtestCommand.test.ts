import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkBuild } from '../distBuild.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

// `quantbid backtest` run as users run it: the compiled CLI (dist/, built by `npm run build`) in a child
// process, on the shipped fictional scenario.

const ROOT = new URL('../../', import.meta.url).pathname;
const SCENARIO = 'scenarios/halvorn/scenario.json';
const OUTPUTS = ['ledger.csv', 'days.csv', 'summary.json'];
const POLICIES = ['quantile', 'median', 'point', 'price-taking', 'perfect-foresight'];

interface Run {
  readonly code: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

function quantbid(args: readonly string[]): Run {
  const result = spawnSync(process.execPath, ['bin/quantbid.js', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 300_000 });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

function snapshot(dir: string): Record<string, { text: string; mtimeMs: number }> {
  return Object.fromEntries(readdirSync(dir).map((name) => [name, { text: readFileSync(join(dir, name), 'utf8'), mtimeMs: statSync(join(dir, name)).mtimeMs }]));
}

function csvRows(text: string): string[][] {
  return text.trimEnd().split('\n').map((line) => line.split(','));
}

let work = '';
let out = '';
let first: Run;

beforeAll(() => {
  checkBuild();
  work = mkdtempSync(join(tmpdir(), 'quantbid-backtest-'));
  out = join(work, 'feb');
  first = quantbid(['backtest', '--scenario', SCENARIO, '--from', '2026-02-01', '--to', '2026-02-28', '--out', out]);
}, 300_000);

describe('quantbid backtest on the demo scenario, February 2026', () => {
  it('exits 0, writes ledger.csv, days.csv and summary.json, and prints a short summary', () => {
    // 28 days of February are not a year: the yearly figures say so (365.25 / 28 = 13.04).
    expect(first.stderr).toBe(
      'warning: profitPerMwYear and profitPerMwhYear are extrapolated to a year: scaled x 365.25 / 28 = 13.04 from 28 covered days in 1 month (2026-02); January, March, April, May, June, July, August, September, October, November and December are missing, so their prices never entered these figures (seasonal bias)\n',
    );
    expect(first.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual([...OUTPUTS].sort());
    expect(first.stdout).toMatch(/^backtest 2026-02-01 to 2026-02-28: 28 days covered, 0 skipped/);
    for (const policy of POLICIES) expect(first.stdout).toContain(policy);
    expect(first.stdout).toMatch(/imbalance price: the history's imbalance_price column/);
  });

  it('summary.json holds profit and capture ratio per policy, the edge test, skipped days, the imbalance source and the months', () => {
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    for (const policy of POLICIES) {
      expect(typeof summary.policies[policy].profit).toBe('number');
      expect(typeof summary.policies[policy].captureRatio).toBe('number');
    }
    expect(summary.policies['perfect-foresight'].captureRatio).toBe(1);
    expect(summary.edge).toMatchObject({ tested: 'quantile', reference: 'point', n: 28, horizon: 1 });
    expect(summary.skippedDays).toEqual([]);
    expect(summary.imbalanceSource.kind).toBe('history');
    expect(summary.months.map((m: { month: string }) => m.month)).toEqual(['2026-02']);
  });

  it('tests quantile against every other policy and headlines the stronger of point and price-taking, from days.csv', () => {
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    const rows = csvRows(readFileSync(join(out, 'days.csv'), 'utf8')).slice(1);
    const daily = (policy: string) => rows.filter((r) => r[1] === policy).map((r) => Number(r[2]));
    const total = (policy: string) => daily(policy).reduce((a, b) => a + b, 0);
    expect(summary.tested).toBe('quantile');
    expect(summary.edges.map((e: { reference: string }) => e.reference)).toEqual(['median', 'point', 'price-taking', 'perfect-foresight']);
    for (const edge of summary.edges as { reference: string; meanDifference: number }[]) {
      // The mean of the daily differences, recomputed from days.csv (6 decimals per cell).
      const d = daily('quantile').map((q, i) => q - (daily(edge.reference)[i] as number));
      expect(edge.meanDifference).toBeCloseTo(d.reduce((a, b) => a + b, 0) / d.length, 4);
    }
    const stronger = total('price-taking') > total('point') ? 'price-taking' : 'point';
    expect(summary.baseline.policy).toBe(stronger);
    expect(summary.baseline.testedLoses).toBe(total('quantile') < total(stronger));
    const word = summary.baseline.testedLoses ? 'LOSES' : 'beats it';
    expect(first.stdout).toContain(`against the strongest simple baseline, ${stronger} (the more profitable of point and price-taking): quantile ${word}`);
    expect(first.stdout).toMatch(/quantile earns [\d.]+ HLV per day (more|LESS) than perfect-foresight \(Diebold-Mariano\/HLN/);
  });

  it('days.csv keeps the contract columns, one row per day and policy, and sums to the summary', () => {
    const rows = csvRows(readFileSync(join(out, 'days.csv'), 'utf8'));
    expect(rows[0]?.slice(0, 9)).toEqual(['day', 'policy', 'profit', 'soc_start_mwh', 'soc_end_mwh', 'buys_accepted', 'buys', 'sells_accepted', 'sells']);
    expect(rows).toHaveLength(1 + 28 * POLICIES.length);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    for (const policy of POLICIES) {
      const total = rows.slice(1).filter((r) => r[1] === policy).reduce((sum, r) => sum + Number(r[2]), 0);
      expect(total).toBeCloseTo(summary.policies[policy].profit, 3);
    }
  });

  it('ledger.csv has one row per period and policy; its cash agrees with the clearing price and the days', () => {
    const rows = csvRows(readFileSync(join(out, 'ledger.csv'), 'utf8'));
    const header = rows[0] as string[];
    const col = (name: string) => header.indexOf(name);
    const periods = ['2026-02-01', '2026-02-28'].map((d) => deliveryPeriods(d, 'Europe/Berlin', 15).length);
    expect(periods).toEqual([96, 96]);
    expect(rows).toHaveLength(1 + 28 * 96 * POLICIES.length);
    const byDay = new Map<string, number>();
    for (const r of rows.slice(1)) {
      // An accepted order trades quantity x 0.25 h at the clearing price: - for a buy, + for a sell
      // (the file keeps 6 decimals, so the product is checked to that rounding).
      if (r[col('accepted')] === 'true') {
        const sign = r[col('side')] === 'buy' ? -1 : 1;
        const clearing = Number(r[col('clearing_price')]);
        const expected = sign * clearing * Number(r[col('quantity_mw')]) * 0.25;
        expect(Math.abs(Number(r[col('auction_cash')]) - expected)).toBeLessThanOrEqual(1e-6 * (1 + Math.abs(clearing)));
      }
      const key = `${r[0]},${r[1]}`;
      byDay.set(key, (byDay.get(key) ?? 0) + Number(r[col('profit')]));
    }
    for (const r of csvRows(readFileSync(join(out, 'days.csv'), 'utf8')).slice(1)) expect(byDay.get(`${r[0]},${r[1]}`)).toBeCloseTo(Number(r[2]), 3);
  });

  it('refuses to run again into the same folder without --force: exit 2, nothing changed', () => {
    const before = snapshot(out);
    const again = quantbid(['backtest', '--scenario', SCENARIO, '--from', '2026-02-01', '--to', '2026-02-28', '--out', out]);
    expect(again.code).toBe(2);
    expect(again.stderr).toMatch(/already exist.*add --force to overwrite/);
    expect(again.stderr).toMatch(/nothing was written/);
    expect(snapshot(out)).toEqual(before);
  });

  it('with --force and --json: the same bytes again, and the summary on stdout', () => {
    const before = snapshot(out);
    const again = quantbid(['backtest', '--scenario', SCENARIO, '--from', '2026-02-01', '--to', '2026-02-28', '--out', out, '--force', '--json']);
    expect(again.code).toBe(0);
    for (const name of OUTPUTS) expect(readFileSync(join(out, name), 'utf8')).toBe(before[name]?.text);
    expect(again.stdout).toBe(before['summary.json']?.text);
  }, 300_000);
});

describe('quantbid backtest rejects bad input with exit code 2 and writes nothing', () => {
  it.each([
    [['--to', '2026-02-02'], /--from: no --from given/],
    [['--from', '2026-02-03', '--to', '2026-02-02'], /--to 2026-02-02 is before --from 2026-02-03/],
    [['--from', '2026-02-01', '--to', '2026-02-02', '--policies', 'quantile,oracle'], /"oracle" is not a policy/],
    [['--from', '2026-02-01', '--to', '2026-02-02', '--unaccepted', 'ignore'], /"ignore" must be one of follow-plan, follow-accepted/],
    [['--from', '2026-02-01', '--to', '2026-02-02', '--alpha', '0.02'], /levels 0.02 and 0.98, outside the forecast's levels \[0.05, 0.95\]/],
  ])('%j', (args, message) => {
    const dir = join(work, `bad-${args.join('').replace(/[^a-z0-9]/gi, '')}`);
    const run = quantbid(['backtest', '--scenario', SCENARIO, ...args, '--out', dir]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(existsSync(join(dir, 'summary.json'))).toBe(false);
  });

  it('asks for an imbalance price when neither the history nor the market spec has one', () => {
    const market = JSON.parse(readFileSync(join(ROOT, 'scenarios/halvorn/market.json'), 'utf8'));
    delete market.imbalance;
    writeFileSync(join(work, 'market.json'), JSON.stringify(market));
    const lines = ['period_start,price', ...deliveryPeriods('2026-02-01', 'Europe/Berlin', 15).map((p, t) => `${p.start},${50 + (t % 7)}`)];
    writeFileSync(join(work, 'history.csv'), `${lines.join('\n')}\n`);
    const dir = join(work, 'no-imbalance');
    const run = quantbid([
      'backtest', '--scenario', SCENARIO, '--market', join(work, 'market.json'), '--history', join(work, 'history.csv'),
      '--from', '2026-02-01', '--to', '2026-02-01', '--out', dir,
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/history\.csv: imbalance_price: the history has no imbalance_price column and the market spec has no imbalance rule; add an imbalance_price column/);
    expect(existsSync(dir)).toBe(false);
  });

  it('--help shows examples', () => {
    const help = quantbid(['backtest', '--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/Examples:\n {2}quantbid backtest --scenario/);
  });
});

describe('quantbid backtest with the exchange\'s order steps in market.json', () => {
  it('rounds the orders and reports the loss as the difference against the same backtest unrounded', () => {
    const market = JSON.parse(readFileSync(join(ROOT, 'scenarios/halvorn/market.json'), 'utf8'));
    const stepped = join(work, 'market-steps.json');
    writeFileSync(stepped, JSON.stringify({ ...market, quantityStepMw: 0.1, minimumQuantityMw: 0.1, priceTickPerMwh: 0.01 }));
    const span = ['--scenario', SCENARIO, '--from', '2026-02-01', '--to', '2026-02-03', '--policies', 'quantile,perfect-foresight'];
    const rounded = quantbid(['backtest', ...span, '--market', stepped, '--out', join(work, 'steps')]);
    const plain = quantbid(['backtest', ...span, '--out', join(work, 'no-steps')]);
    expect([rounded.code, plain.code]).toEqual([0, 0]);
    const summary = (dir: string) => JSON.parse(readFileSync(join(work, dir, 'summary.json'), 'utf8'));
    const [withSteps, without] = [summary('steps'), summary('no-steps')];
    expect('orderSteps' in without).toBe(false);
    for (const policy of ['quantile', 'perfect-foresight']) {
      expect(withSteps.orderSteps.profitWithoutRounding[policy]).toBe(without.policies[policy].profit);
      expect(withSteps.orderSteps.roundingLoss[policy]).toBeCloseTo(without.policies[policy].profit - withSteps.policies[policy].profit, 5);
    }
    expect(rounded.stdout).toMatch(/profit lost to rounding the orders to the exchange's steps \(against the same backtest unrounded\): quantile -?\d+, perfect-foresight -?\d+/);
    // The rounded orders in ledger.csv are whole numbers of 0.1 MW with limits on the 0.01 tick.
    const ledger = csvRows(readFileSync(join(work, 'steps', 'ledger.csv'), 'utf8'));
    const [q, l] = [ledger[0]?.indexOf('quantity_mw') as number, ledger[0]?.indexOf('limit_price') as number];
    for (const row of ledger.slice(1).filter((r) => r[q] !== '')) {
      expect(Math.abs(Number(row[q]) * 10 - Math.round(Number(row[q]) * 10))).toBeLessThan(1e-6);
      expect(Math.abs(Number(row[l]) * 100 - Math.round(Number(row[l]) * 100))).toBeLessThan(1e-6);
    }
  });
});
