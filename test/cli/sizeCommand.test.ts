import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkBuild, csvRows, journalKeys, quantbid, quantbidStoppedAfter, writeScenario, type Scenario } from './sweepScenario.js';
import { stripYearWarning, withoutYearWarning } from './yearWarning.js';

// `quantbid size` as users run it: the compiled CLI (dist/) in a child process, on a tiny invented
// hourly scenario written into a temporary folder (sweepScenario.ts).

const CONTRACT = ['energy_mwh', 'power_mw', 'round_trip_efficiency', 'policy', 'alpha', 'profit', 'profit_per_year', 'npv', 'irr'];
const ECONOMICS = ['--capex-per-mwh', '150000', '--capex-per-mw', '50000', '--fixed-om-per-mw-year', '2000', '--life-years', '15', '--discount-rate', '0.07'];

let scenario: Scenario;
let fixed = '';

function sizeArgs(out: string, extra: readonly string[]): string[] {
  return ['size', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--out', out, ...extra];
}

const FIXED_GRID = ['--energy-mwh', '5,10', '--power-mw', '2.5:5:2.5', '--efficiency', '0.82,0.88', ...ECONOMICS, '--threads', '2'];

function table(dir: string): { header: string[]; rows: string[][] } {
  const [header, ...rows] = csvRows(readFileSync(join(dir, 'size.csv'), 'utf8'));
  return { header: header as string[], rows };
}

beforeAll(() => {
  checkBuild();
  scenario = writeScenario('size-cli', { days: 8 });
  fixed = join(scenario.dir, 'fixed');
  expect(withoutYearWarning(quantbid(sizeArgs(fixed, FIXED_GRID)))).toMatchObject({ code: 0, stderr: '' });
}, 300_000);

describe('quantbid size with a fixed alpha', () => {
  it('writes one row per size and policy, price-taking and perfect-foresight rows included, in grid order, contract columns first', () => {
    expect(readdirSync(fixed).sort()).toEqual(['size.csv', 'summary.json']);
    const { header, rows } = table(fixed);
    expect(header.slice(0, CONTRACT.length)).toEqual(CONTRACT);
    expect(header).toEqual(expect.arrayContaining(['capture_ratio', 'profit_per_mwh', 'profit_per_mw', 'cycles_per_year', 'throughput_mwh_per_year', 'capex', 'simple_payback_years', 'discounted_payback_years', 'revenue_per_mw_year', 'revenue_per_mwh_year', 'spread_per_mwh_discharged']));
    const expected = ['5', '10'].flatMap((e) => ['2.5', '5'].flatMap((p) => ['0.82', '0.88'].flatMap((eff) => ['quantile', 'price-taking', 'perfect-foresight'].map((policy) => [e, p, eff, policy]))));
    expect(rows.map((r) => r.slice(0, 4))).toEqual(expected);
    for (const r of rows) expect(r[4]).toBe(r[3] === 'quantile' ? '0.1' : '');
  });

  it('values each row as capex plus an annuity of its yearly profit (no --life-cycles: no replacement)', () => {
    const { header, rows } = table(fixed);
    const cell = (r: string[], name: string) => Number(r[header.indexOf(name)]);
    // Annuity factor (1 - 1.07^-15) / 0.07 (Brealey, Myers and Allen, Principles of Corporate Finance).
    const annuity = (1 - 1.07 ** -15) / 0.07;
    for (const r of rows) {
      const [energy, power] = [Number(r[0]), Number(r[1])];
      expect(cell(r, 'days')).toBe(8);
      expect(cell(r, 'profit_per_year')).toBeCloseTo((cell(r, 'profit') * 365.25) / 8, 4);
      expect(cell(r, 'capex')).toBe(150_000 * energy + 50_000 * power);
      const npv = -cell(r, 'capex') + (cell(r, 'profit_per_year') - 2000 * power) * annuity;
      expect(Math.abs(cell(r, 'npv') - npv)).toBeLessThanOrEqual(1e-5 * Math.max(1, Math.abs(npv)));
      expect(cell(r, 'profit_per_mwh')).toBeCloseTo(cell(r, 'profit') / energy, 5);
      expect(r[header.indexOf('irr')]).toMatch(/^(-?\d+(\.\d+)?|none)$/);
    }
  });

  it('summary.json names, per policy, the size with the highest NPV and the one with the highest IRR, with the NPV of their neighbours', () => {
    const summary = JSON.parse(readFileSync(join(fixed, 'summary.json'), 'utf8'));
    const { header, rows } = table(fixed);
    const cell = (r: string[], name: string) => r[header.indexOf(name)] as string;
    expect(summary.best.map((b: { policy: string }) => b.policy)).toEqual(['quantile', 'price-taking', 'perfect-foresight']);
    for (const best of summary.best) {
      const mine = rows.filter((r) => r[3] === best.policy);
      // The chosen size's value is the column's maximum (sizes of equal value at the file's 6 decimals,
      // such as a size and its double in energy and power for the IRR, may tie).
      const top = (name: string, rows: string[][]) => Math.max(...rows.map((r) => Number(cell(r, name))));
      const rowOf = (pick: { energyMwh: number; powerMw: number; roundTripEfficiency: number }) =>
        mine.find((r) => r[0] === String(pick.energyMwh) && r[1] === String(pick.powerMw) && r[2] === String(pick.roundTripEfficiency)) as string[];
      expect(Number(cell(rowOf(best.highestNpv), 'npv'))).toBe(top('npv', mine));
      const withIrr = mine.filter((r) => cell(r, 'irr') !== 'none');
      if (withIrr.length === 0) expect(best.highestIrr).toBeNull();
      else expect(Number(cell(rowOf(best.highestIrr), 'irr'))).toBe(top('irr', withIrr));
      // In a 2 x 2 grid every other size of the same efficiency is a neighbour.
      expect(best.highestNpv.neighbours).toHaveLength(3);
      for (const n of best.highestNpv.neighbours) {
        const row = mine.find((r) => r[0] === String(n.energyMwh) && r[1] === String(n.powerMw) && r[2] === String(best.highestNpv.roundTripEfficiency)) as string[];
        expect(n.npv).toBeCloseTo(Number(cell(row, 'npv')), 4);
        expect(n.npvChange).toBeLessThanOrEqual(0);
      }
    }
    expect(summary.alpha).toMatchObject({ method: 'fixed', alpha: 0.1, scored: { from: scenario.from, to: scenario.to } });
  });

  it('killed with SIGKILL part-way, it resumes from .size-journal.jsonl to the bytes of an uninterrupted run', async () => {
    const out = join(scenario.dir, 'killed');
    const journal = join(out, '.size-journal.jsonl');
    const killed = await quantbidStoppedAfter(sizeArgs(out, FIXED_GRID), journal, 2, 'SIGKILL');
    expect(killed.signal).toBe('SIGKILL');
    const kept = journalKeys(journal);
    expect(kept.length).toBeLessThan(24);
    const resumed = quantbid(sizeArgs(out, FIXED_GRID));
    expect(withoutYearWarning(resumed)).toMatchObject({ code: 0, stderr: '' });
    expect(resumed.stdout).toContain(`24 settings (${kept.length} resumed from the journal)`);
    for (const name of ['size.csv', 'summary.json']) expect(readFileSync(join(out, name), 'utf8')).toBe(readFileSync(join(fixed, name), 'utf8'));
  });
});

describe('quantbid size: one spelling for lists of policies', () => {
  const grid = ['--energy-mwh', '10', '--power-mw', '5', ...ECONOMICS, '--threads', '1'];
  it('--policies, and --policy as its former name with a note: the same size.csv; price-taking is not added twice', () => {
    const now = join(scenario.dir, 'policies-new');
    const then = join(scenario.dir, 'policies-old');
    expect(withoutYearWarning(quantbid(sizeArgs(now, [...grid, '--policies', 'quantile,price-taking'])))).toMatchObject({ code: 0, stderr: '' });
    const old = quantbid(sizeArgs(then, [...grid, '--policy', 'quantile,price-taking']));
    expect(old.code).toBe(0);
    expect(stripYearWarning(old.stderr)).toBe('note: --policy is read as --policies (one spelling for lists of policies, as in backtest and sweep); write --policies\n');
    expect(readFileSync(join(then, 'size.csv'), 'utf8')).toBe(readFileSync(join(now, 'size.csv'), 'utf8'));
    expect(table(now).rows.map((r) => r[3])).toEqual(['quantile', 'price-taking', 'perfect-foresight']);
  });

  it('both spellings at once is bad usage', () => {
    const out = join(scenario.dir, 'policies-both');
    const run = quantbid(sizeArgs(out, [...grid, '--policies', 'quantile', '--policy', 'median']));
    expect(run).toMatchObject({ code: 2, stderr: expect.stringMatching(/--policy: was given with --policies, its new name; give the policies once, as --policies/) });
    expect(existsSync(out)).toBe(false);
  });
});

describe('quantbid size --alpha best', () => {
  it('chooses on the first half and scores on the second only: the days listed never overlap', () => {
    const out = join(scenario.dir, 'best');
    const run = quantbid(sizeArgs(out, ['--energy-mwh', '5,10', '--power-mw', '5', '--alpha', 'best', '--alphas', '0.1:0.4:0.1', ...ECONOMICS, '--json']));
    expect(withoutYearWarning(run)).toMatchObject({ code: 0, stderr: '' });
    const summary = JSON.parse(run.stdout);
    const { choose, scored } = summary.alpha;
    expect(summary.alpha.method).toBe('best');
    expect(choose.days).toEqual(['2026-03-02', '2026-03-03', '2026-03-04', '2026-03-05']);
    expect(scored.days).toEqual(['2026-03-06', '2026-03-07', '2026-03-08', '2026-03-09']);
    expect(choose.days.filter((d: string) => scored.days.includes(d))).toEqual([]);
    const { header, rows } = table(out);
    for (const r of rows) {
      expect(Number(r[header.indexOf('days')])).toBe(scored.days.length);
      if (r[3] === 'quantile') expect(['0.1', '0.2', '0.3', '0.4']).toContain(r[4]);
    }
  });
});

describe('quantbid size without capital cost', () => {
  it('gives irr "none" (the flows never change sign) and a payback of 0 years', () => {
    const out = join(scenario.dir, 'free');
    const run = quantbid(sizeArgs(out, ['--energy-mwh', '10', '--power-mw', '5', '--capex-per-mwh', '0', '--capex-per-mw', '0', '--life-years', '10', '--discount-rate', '0.07']));
    expect(withoutYearWarning(run)).toMatchObject({ code: 0, stderr: '' });
    const { header, rows } = table(out);
    const pf = rows.find((r) => r[3] === 'perfect-foresight') as string[];
    expect(Number(pf[header.indexOf('profit')])).toBeGreaterThan(0);
    expect(pf[header.indexOf('irr')]).toBe('none');
    expect(pf[header.indexOf('simple_payback_years')]).toBe('0');
  });
});

describe('quantbid size: yearly figures from 8 days, and cells replaced during the life', () => {
  it('warns on stderr and in summary.json that the yearly figures are extrapolated (x 365.25 / 8 = 45.66)', () => {
    const out = join(scenario.dir, 'year-warning');
    const run = quantbid(sizeArgs(out, ['--energy-mwh', '10', '--power-mw', '5', ...ECONOMICS]));
    expect(run.code).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.yearlyFigures).toMatchObject({ days: 8, extrapolated: true, monthsCovered: ['2026-03'] });
    expect(summary.yearlyFigures.monthsMissing).toHaveLength(11);
    expect(summary.yearlyFigures.warning).toMatch(/^profit_per_year, .* are extrapolated to a year: scaled x 365\.25 \/ 8 = 45\.66 from 8 covered days in 1 month \(2026-03\); January, February, April, .* and December are missing/);
    expect(summary.warnings[0]).toBe(summary.yearlyFigures.warning);
    expect(run.stderr).toBe(`warning: ${summary.yearlyFigures.warning as string}\n`);
  });

  it('a replacement carries its residual value into the last year: RV = capexPerMwh x E x (k + 1 - L x cycles_per_year / lifeCycles)', () => {
    // With --life-cycles 600 over 15 years a set lasts 600 / cycles_per_year years; the residual is of the
    // set in use at the end of life (projectCashFlows.ts, worked by hand in test/economics).
    const out = join(scenario.dir, 'residual');
    const run = quantbid(sizeArgs(out, ['--energy-mwh', '10', '--power-mw', '5', '--life-cycles', '600', ...ECONOMICS]));
    expect(run.code).toBe(0);
    const { header, rows } = table(out);
    const cell = (r: string[], name: string) => Number(r[header.indexOf(name)]);
    let replaced = 0;
    for (const r of rows) {
      const k = cell(r, 'replacements');
      const used = (15 * cell(r, 'cycles_per_year')) / 600;
      expect(k).toBe(Math.max(0, Math.ceil(used) - 1));
      const expected = k === 0 ? 0 : 150_000 * 10 * (k + 1 - used);
      expect(Math.abs(cell(r, 'residual_value') - expected)).toBeLessThanOrEqual(1e-4 * Math.max(1, expected));
      if (k > 0) replaced++;
    }
    expect(replaced).toBeGreaterThan(0);
  });
});

describe('quantbid size rejects bad input with exit code 2 and writes nothing', () => {
  const grid = ['--energy-mwh', '10', '--power-mw', '5'];
  it.each([
    [['--energy-mwh', '10:5:1', '--power-mw', '5', ...ECONOMICS], /--energy-mwh: the start of "10:5:1" is above its end/],
    [['--energy-mwh', '10', '--power-mw', '0:5:2.5', ...ECONOMICS], /--power-mw: 0 is not a power in \[0.001, 100000\] MW/],
    [[...grid, ...ECONOMICS, '--capex-per-mwh', '-5'], /"-5" must be a number in \[0, 1000000000\]/],
    [[...grid, ...ECONOMICS, '--life-years', '0'], /"0" must be a whole number in \[1, 100\]/],
    [[...grid, ...ECONOMICS, '--life-years', '2.5'], /"2.5" must be a whole number in \[1, 100\]/],
    [[...grid, ...ECONOMICS, '--discount-rate', '-1'], /"-1" must be a number in \[-0.5, 1\]/],
    [[...grid, ...ECONOMICS, '--policy', 'oracle'], /--policy: "oracle" is not one of quantile, median, point, price-taking/],
    [[...grid, ...ECONOMICS, '--efficiency', '1.2'], /--efficiency: 1.2 is not an efficiency in \[0.05, 1\]/],
    [[...grid, ...ECONOMICS, '--alphas', '0.1,0.2'], /--alphas: is used only with --alpha best/],
    [[...grid, ...ECONOMICS, '--alpha', 'best', '--alphas', '0.02,0.1'], /--alphas: alpha 0.02 needs the levels 0.02 and 0.98, outside the forecast's levels/],
    [grid, /--capex-per-mwh: no --capex-per-mwh given[\s\S]*--capex-per-mw: no[\s\S]*--life-years: no[\s\S]*--discount-rate: no/],
  ])('%j', (extra, message) => {
    const out = join(scenario.dir, `bad-${extra.join('').replace(/[^a-z0-9]/gi, '')}`);
    const run = quantbid(sizeArgs(out, extra));
    expect(run).toMatchObject({ code: 2, stderr: expect.stringMatching(message) });
    expect(existsSync(out)).toBe(false);
  });

  it('--help shows examples', () => {
    const help = quantbid(['size', '--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/Examples:\n {2}quantbid size --scenario/);
  });
});
