import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkBuild, csvRows, journalKeys, quantbid, quantbidStoppedAfter, writeScenario, type Scenario } from './sweepScenario.js';
import { withoutYearWarning } from './yearWarning.js';

// `quantbid sweep` as users run it: the compiled CLI (dist/) in a child process, on a tiny invented
// hourly scenario written into a temporary folder (sweepScenario.ts).

const ALPHAS = ['0.05', '0.15', '0.25', '0.35', '0.45'];
const POLICIES = ['quantile', 'median'];
const RULES = ['follow-plan', 'follow-accepted'];
const SETTINGS = ALPHAS.length * POLICIES.length * RULES.length;
const REFERENCES = ['point', 'price-taking', 'perfect-foresight'];

let scenario: Scenario;
let oneThread = '';

function sweepArgs(out: string, extra: readonly string[] = []): string[] {
  return ['sweep', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--alphas', '0.05:0.45:0.1', '--unaccepted', RULES.join(','), '--out', out, ...extra];
}

beforeAll(() => {
  checkBuild();
  scenario = writeScenario('sweep-cli', { days: 8 });
  oneThread = join(scenario.dir, 'one-thread');
  const run = quantbid(sweepArgs(oneThread, ['--threads', '1']));
  expect(run).toMatchObject({ code: 0, stderr: '' });
}, 300_000);

describe('quantbid sweep on a small seeded market', () => {
  it('writes sweep.csv with one row per setting in grid order (alpha outermost, unaccepted fastest), then the reference rows per rule, and summary.json', () => {
    expect(readdirSync(oneThread).sort()).toEqual(['summary.json', 'sweep.csv']);
    const rows = csvRows(readFileSync(join(oneThread, 'sweep.csv'), 'utf8'));
    expect(rows[0]?.slice(0, 5)).toEqual(['alpha', 'policy', 'unaccepted', 'days', 'profit']);
    expect(rows[0]).toEqual(expect.arrayContaining(['capture_ratio', 'buy_acceptance_rate', 'sell_acceptance_rate', 'imbalance_mwh', 'imbalance_cash', 'cycles_total', 'cycles_per_day', 'p_value_vs_point', 'price_taking_profit', 'edge_vs_price_taking', 'p_value_vs_price_taking']));
    const expected = ALPHAS.flatMap((a) => POLICIES.flatMap((p) => RULES.map((u) => [a, p, u])));
    const references = RULES.flatMap((u) => REFERENCES.map((p) => ['', p, u]));
    expect(rows.slice(1).map((r) => r.slice(0, 3))).toEqual([...expected, ...references]);
    expect(rows).toHaveLength(1 + SETTINGS + references.length);
  });

  it('agrees with quantbid backtest for the same setting: profit, capture ratio, acceptance, imbalance and the DM/HLN p-value', () => {
    const out = join(scenario.dir, 'backtest');
    const run = quantbid(['backtest', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--alpha', '0.25', '--policies', 'quantile,point,price-taking,perfect-foresight', '--out', out]);
    expect(withoutYearWarning(run)).toMatchObject({ code: 0, stderr: '' });
    const backtest = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    const rows = csvRows(readFileSync(join(oneThread, 'sweep.csv'), 'utf8'));
    const header = rows[0] as string[];
    const row = rows.find((r) => r[0] === '0.25' && r[1] === 'quantile' && r[2] === 'follow-plan') as string[];
    const cell = (name: string) => Number(row[header.indexOf(name)]);
    const q = backtest.policies.quantile;
    // Both files keep 6 decimals at most (formatNumber).
    expect(cell('profit')).toBeCloseTo(q.profit, 5);
    expect(cell('capture_ratio')).toBeCloseTo(q.captureRatio, 5);
    expect(cell('buy_acceptance_rate')).toBeCloseTo(q.buyAcceptanceRate, 5);
    expect(cell('imbalance_cash')).toBeCloseTo(q.imbalanceCash, 5);
    expect(cell('cycles_total')).toBeCloseTo(q.cyclesTotal, 5);
    expect(cell('cycles_per_day')).toBeCloseTo(q.cyclesTotal / q.days, 5);
    expect(cell('perfect_foresight_profit')).toBeCloseTo(backtest.policies['perfect-foresight'].profit, 5);
    expect(cell('point_profit')).toBeCloseTo(backtest.policies.point.profit, 5);
    expect(backtest.edge.status).toBe('ok');
    expect(cell('p_value_vs_point')).toBeCloseTo(backtest.edge.pValueOneSided, 5);
    expect(cell('price_taking_profit')).toBeCloseTo(backtest.policies['price-taking'].profit, 5);
    const taking = backtest.edges.find((e: { reference: string }) => e.reference === 'price-taking');
    expect(cell('edge_vs_price_taking')).toBeCloseTo(taking.meanDifference, 5);
    // The reference rows are the backtest's policies under the same rule.
    for (const policy of ['point', 'price-taking', 'perfect-foresight']) {
      const reference = rows.find((r) => r[0] === '' && r[1] === policy && r[2] === 'follow-plan') as string[];
      expect(Number(reference[header.indexOf('profit')])).toBeCloseTo(backtest.policies[policy].profit, 5);
      expect(Number(reference[header.indexOf('capture_ratio')])).toBeCloseTo(backtest.policies[policy].captureRatio, 5);
    }
  });

  it('summary.json names, within each rule, the setting with the highest profit in sweep.csv and reads it against the stronger simple baseline', () => {
    const rows = csvRows(readFileSync(join(oneThread, 'sweep.csv'), 'utf8'));
    const profit = (rows[0] as string[]).indexOf('profit');
    const summary = JSON.parse(readFileSync(join(oneThread, 'summary.json'), 'utf8'));
    expect(summary.best).toBeUndefined();
    expect(summary.bestByRule.map((b: { unaccepted: string }) => b.unaccepted)).toEqual(RULES);
    for (const rule of summary.bestByRule) {
      const ofRule = rows.slice(1).filter((r) => r[0] !== '' && r[2] === rule.unaccepted);
      const top = ofRule.reduce((best, r) => (Number(r[profit]) > Number(best[profit]) ? r : best));
      expect([String(rule.best.setting.alpha), rule.best.setting.policy, rule.best.setting.unaccepted]).toEqual(top.slice(0, 3));
      const reference = (policy: string) => Number((rows.find((r) => r[0] === '' && r[1] === policy && r[2] === rule.unaccepted) as string[])[profit]);
      const stronger = reference('price-taking') > reference('point') ? 'price-taking' : 'point';
      expect(rule.strongestBaseline.policy).toBe(stronger);
      expect(rule.beatsStrongestBaseline).toBe(Number(top[profit]) > reference(stronger));
    }
    expect(summary.bestAlphaByPolicy).toHaveLength(POLICIES.length * RULES.length);
    // An alpha at 0.05 or 0.45, the ends of --alphas, is flagged; one inside is not.
    for (const best of summary.bestAlphaByPolicy) expect(best.onEdgeOfAlphaGrid).toBe(best.alpha === 0.05 || best.alpha === 0.45);
    expect(summary.daysCovered).toBe(8);
  });

  it('writes the same bytes with 2 threads as with 1', () => {
    const out = join(scenario.dir, 'two-threads');
    const run = quantbid(sweepArgs(out, ['--threads', '2', '--json']));
    expect(run).toMatchObject({ code: 0, stderr: '' });
    for (const name of ['sweep.csv', 'summary.json']) expect(readFileSync(join(out, name), 'utf8')).toBe(readFileSync(join(oneThread, name), 'utf8'));
    expect(run.stdout).toBe(readFileSync(join(oneThread, 'summary.json'), 'utf8'));
  });

  it('killed with SIGKILL part-way, it resumes from the journal to the bytes of an uninterrupted run', async () => {
    const out = join(scenario.dir, 'killed');
    const journal = join(out, '.sweep-journal.jsonl');
    const killed = await quantbidStoppedAfter(sweepArgs(out, ['--threads', '2']), journal, 3, 'SIGKILL');
    expect(killed.signal).toBe('SIGKILL');
    expect(existsSync(join(out, 'sweep.csv'))).toBe(false);
    const kept = journalKeys(journal);
    expect(kept.length).toBeGreaterThanOrEqual(3);
    expect(kept.length).toBeLessThan(SETTINGS);
    const resumed = quantbid(sweepArgs(out, ['--threads', '2']));
    expect(resumed).toMatchObject({ code: 0, stderr: '' });
    expect(resumed.stdout).toContain(`${SETTINGS} settings (${kept.length} resumed from the journal)`);
    for (const name of ['sweep.csv', 'summary.json']) expect(readFileSync(join(out, name), 'utf8')).toBe(readFileSync(join(oneThread, name), 'utf8'));
    expect(existsSync(journal)).toBe(false);
  });

  it('stopped with Ctrl-C (SIGINT): exit code 130 and a message on how to resume, the journal kept', async () => {
    const out = join(scenario.dir, 'interrupted');
    const journal = join(out, '.sweep-journal.jsonl');
    const stopped = await quantbidStoppedAfter(sweepArgs(out, ['--threads', '2']), journal, 1, 'SIGINT');
    expect(stopped.code).toBe(130);
    const kept = journalKeys(journal);
    expect(stopped.stderr).toContain(`stopped after ${kept.length} of ${SETTINGS} settings; the finished ones are kept in ${journal}.\nRun the same command again to resume (or add --restart to start over).\n`);
    expect(existsSync(join(out, 'sweep.csv'))).toBe(false);
  });

  it('stopped with SIGTERM (as a service manager stops it): exit code 143 and the same message on how to resume, the journal kept', async () => {
    const out = join(scenario.dir, 'terminated');
    const journal = join(out, '.sweep-journal.jsonl');
    const stopped = await quantbidStoppedAfter(sweepArgs(out, ['--threads', '2']), journal, 1, 'SIGTERM');
    expect(stopped.code).toBe(143);
    const kept = journalKeys(journal);
    expect(stopped.stderr).toContain('stopping: no new settings start, the running ones finish and are kept; send SIGTERM again to stop at once.\n');
    expect(stopped.stderr).toContain(`stopped after ${kept.length} of ${SETTINGS} settings; the finished ones are kept in ${journal}.\nRun the same command again to resume (or add --restart to start over).\n`);
    expect(existsSync(join(out, 'sweep.csv'))).toBe(false);
    const resumed = quantbid(sweepArgs(out, ['--threads', '2']));
    expect(resumed.stdout).toContain(`${SETTINGS} settings (${kept.length} resumed from the journal)`);
  });

  it('reads the old names of the imbalance price (fallback_price, "fallback"): each note once for all threads, the same sweep.csv', () => {
    const market = JSON.parse(readFileSync(join(scenario.dir, 'market.json'), 'utf8'));
    const { imbalance, ...rest } = market;
    writeFileSync(join(scenario.dir, 'market-old.json'), `${JSON.stringify({ ...rest, fallback: imbalance }, null, 2)}\n`);
    const [header, ...rows] = readFileSync(join(scenario.dir, 'history.csv'), 'utf8').trimEnd().split('\n');
    const withColumn = (name: string): string => `${[`${header},${name}`, ...rows.map((row) => `${row},${(Number(row.split(',')[1]) + 7).toFixed(2)}`)].join('\n')}\n`;
    writeFileSync(join(scenario.dir, 'history-old.csv'), withColumn('fallback_price'));
    writeFileSync(join(scenario.dir, 'history-new.csv'), withColumn('imbalance_price'));
    const run = (name: string, marketFile: string) => {
      const out = join(scenario.dir, `names-${name}`);
      return { out, run: quantbid(sweepArgs(out, ['--threads', '2', '--market', join(scenario.dir, marketFile), '--history', join(scenario.dir, `history-${name}.csv`)])) };
    };
    const now = run('new', 'market.json');
    const then = run('old', 'market-old.json');
    expect(now.run).toMatchObject({ code: 0, stderr: '' });
    expect(then.run.code).toBe(0);
    expect(then.run.stderr).toBe(
      `note: ${join(scenario.dir, 'market-old.json')}:8: the field "fallback" is read as "imbalance"; rename it to "imbalance"\n` +
        `note: ${join(scenario.dir, 'history-old.csv')}:1: the column fallback_price is read as imbalance_price; rename the column to imbalance_price\n`,
    );
    expect(readFileSync(join(then.out, 'sweep.csv'), 'utf8')).toBe(readFileSync(join(now.out, 'sweep.csv'), 'utf8'));
    // The history's column, not the market's rule, prices unaccepted orders: the outputs differ from the run without it.
    expect(readFileSync(join(now.out, 'sweep.csv'), 'utf8')).not.toBe(readFileSync(join(oneThread, 'sweep.csv'), 'utf8'));
  });

  it('--help shows examples', () => {
    const help = quantbid(['sweep', '--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/Examples:\n {2}quantbid sweep --scenario/);
  });
});

describe('quantbid sweep rejects bad input with exit code 2 and writes nothing', () => {
  it.each([
    [['--alphas', '0.3:0.1:0.1'], /--alphas: the start of "0.3:0.1:0.1" is above its end/],
    [['--alphas', '0.1,0.6'], /--alphas: 0.6 is not an alpha in \[0.001, 0.5\)/],
    [['--alphas', '0.02,0.1'], /--alphas: alpha 0.02 needs the levels 0.02 and 0.98, outside the forecast's levels \[0.05, 0.95\]/],
    [['--policies', 'quantile,oracle'], /--policies: "oracle" is not one of quantile, median/],
    [['--unaccepted', 'ignore'], /--unaccepted: "ignore" is not one of follow-plan, follow-accepted/],
    [['--threads', '0'], /"0" must be a whole number in \[1, 1024\]/],
  ])('%j', (extra, message) => {
    const out = join(scenario.dir, `bad-${extra.join('').replace(/[^a-z0-9]/gi, '')}`);
    const run = quantbid(['sweep', '--scenario', scenario.scenario, '--from', scenario.from, '--to', scenario.to, '--out', out, ...extra]);
    expect(run).toMatchObject({ code: 2, stderr: expect.stringMatching(message) });
    expect(existsSync(out)).toBe(false);
  });

  it('lists every missing flag together', () => {
    const run = quantbid(['sweep', '--scenario', scenario.scenario]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/--from: no --from given[\s\S]*--to: no --to given[\s\S]*--out: no --out given/);
  });
});
