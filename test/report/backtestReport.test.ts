import { existsSync, mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { batteryModel } from '../../src/battery/batterySpec.js';
import { backtestMetrics } from '../../src/backtest/backtestMetrics.js';
import { runBacktest } from '../../src/backtest/runBacktest.js';
import { readPriceHistory } from '../../src/io/readPriceHistory.js';
import { readQuantileForecast } from '../../src/io/readQuantileForecast.js';
import { readBatterySpec, readMarketSpec } from '../../src/io/readSpecs.js';
import { backtestChartIds, backtestReport } from '../../src/report/index.js';
import { runCli } from './planFixtures.js';
import { backtestWithReport, chartSource, csvObjects, HALVORN_SCENARIO, markTitles, readOutput, shownNumber, tableRows, labelledCharts } from './reportFixtures.js';
import { deepFreeze } from './svgQuery.js';

// The report must show what the command's other outputs say. Each check below recomputes a number
// from days.csv (one row per day and policy, summed here) and compares it with the chart or table.

const POLICIES = ['quantile', 'median', 'point', 'price-taking', 'perfect-foresight'];
const LABELS: Record<string, string> = { quantile: 'quantile', median: 'median', point: 'point', 'price-taking': 'price-taking', 'perfect-foresight': 'perfect foresight (ceiling)' };

describe('quantbid backtest --report', () => {
  let out = '';
  let html = '';
  let days: Record<string, string>[] = [];
  const sum = (policy: string, column: string) => days.filter((d) => d.policy === policy).reduce((s, d) => s + Number(d[column]), 0);

  beforeAll(async () => {
    out = await backtestWithReport();
    html = readOutput(out, 'report.html');
    days = csvObjects(readOutput(out, 'days.csv'));
  });

  it('writes report.html beside ledger.csv, days.csv and summary.json, every chart present', () => {
    expect(labelledCharts(html)).toEqual(backtestChartIds(POLICIES));
    for (const name of ['ledger.csv', 'days.csv', 'summary.json', 'report.html']) expect(existsSync(join(out, name)), name).toBe(true);
    for (const id of backtestChartIds(POLICIES)) expect(html, id).toContain(`<svg xmlns="http://www.w3.org/2000/svg" id="${id}"`);
  });

  it('the same inputs give a byte-identical report', async () => {
    expect(readOutput(await backtestWithReport(), 'report.html')).toBe(html);
  });

  it('each cumulative line starts at 0 and ends at the sum of the policy\'s daily profits in days.csv', () => {
    // Pixels are linear in value: (y(0) - y(end)) / profit is the same for every policy.
    const svg = chartSource(html, 'backtest-cumulative');
    const ends = POLICIES.map((policy) => {
      const group = svg.slice(svg.indexOf(`data-series="${LABELS[policy] as string}"`));
      const points = [...(/d="([^"]+)"/.exec(group)?.[1] ?? '').matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => Number(m[2]));
      expect(points, policy).toHaveLength(8); // the start plus the end of each of 7 days
      return { policy, start: points[0] as number, end: points[7] as number };
    });
    expect(new Set(ends.map((e) => e.start)).size).toBe(1);
    const reference = ends[ends.length - 1] as (typeof ends)[number];
    const pixelsPerMoney = (reference.start - reference.end) / sum(reference.policy, 'profit');
    for (const e of ends) expect((e.start - e.end) / pixelsPerMoney, e.policy).toBeCloseTo(sum(e.policy, 'profit'), -1);
    const rows = tableRows(html, 'Profit and risk per policy');
    for (const policy of POLICIES) expect(shownNumber((rows.find((r) => r[0] === policy) as string[])[1] as string), policy).toBeCloseTo(sum(policy, 'profit'), 0);
  });

  it('each daily-profit histogram counts every covered day of its policy once', () => {
    for (const policy of POLICIES) {
      const counts = [...chartSource(html, `backtest-daily-${policy}`).matchAll(/data-count="(\d+)"/g)].map((m) => Number(m[1]));
      expect(counts.reduce((a, b) => a + b, 0), policy).toBe(days.filter((d) => d.policy === policy).length);
    }
  });

  it('acceptance bars are accepted / placed orders per side, from days.csv', () => {
    const titles = markTitles(chartSource(html, 'backtest-acceptance'));
    for (const policy of POLICIES) {
      for (const [side, accepted, placed] of [['buy', 'buys_accepted', 'buys'], ['sell', 'sells_accepted', 'sells']] as const) {
        const expected = (100 * sum(policy, accepted)) / sum(policy, placed);
        const title = titles.find((t) => t.startsWith(`${side} orders, ${LABELS[policy] as string}:`));
        expect(shownNumber(/: (\S+) %$/.exec(title ?? '')?.[1] ?? 'NaN'), `${policy} ${side}`).toBeCloseTo(expected, 2);
      }
    }
  });

  it('imbalance energy bars are the energies bought and sold at the imbalance price in days.csv', () => {
    const titles = markTitles(chartSource(html, 'backtest-imbalance-energy'));
    const value = (name: string) => shownNumber(/: (\S+) MWh$/.exec(titles.find((t) => t.startsWith(name)) ?? '')?.[1] ?? 'NaN');
    expect(value('bought at the imbalance price, quantile:')).toBeCloseTo(sum('quantile', 'bought_imbalance_mwh'), 2);
    expect(value('sold at the imbalance price, point:')).toBeCloseTo(sum('point', 'sold_imbalance_mwh'), 2);
    // Price-taking orders are always accepted, so it has no imbalance bar at all (0 draws none).
    expect(titles.some((t) => t.includes('price-taking'))).toBe(false);
  });

  it('imbalance cash bars are the gross imbalance cash and the cost of imbalance against the clearing price in days.csv', () => {
    const titles = markTitles(chartSource(html, 'backtest-imbalance-cash'));
    const value = (name: string) => shownNumber(/: (\S+) HLV$/.exec(titles.find((t) => t.startsWith(name)) ?? '')?.[1] ?? 'NaN');
    for (const policy of ['quantile', 'median', 'point']) {
      expect(value(`gross imbalance cash (+ received), ${policy}:`), policy).toBeCloseTo(sum(policy, 'imbalance_cash'), 0);
      expect(value(`cost of imbalance against the clearing price (+ cost), ${policy}:`), policy).toBeCloseTo(sum(policy, 'imbalance_cost_vs_clearing'), 0);
    }
    expect(chartSource(html, 'backtest-imbalance-cash')).toContain('above zero it cost the policy money');
    const rows = tableRows(html, 'Orders and the imbalance price per policy');
    const quantile = rows.find((r) => r[0] === 'quantile') as string[];
    expect(shownNumber(quantile[5] as string)).toBeCloseTo(sum('quantile', 'imbalance_cash'), 0);
    expect(shownNumber(quantile[6] as string)).toBeCloseTo(sum('quantile', 'imbalance_cost_vs_clearing'), 0);
  });

  it('the month table has one row per calendar month and a total equal to days.csv', () => {
    const rows = tableRows(html, 'Profit by calendar month');
    expect(rows.map((r) => r[0])).toEqual(['2026-03', 'all']);
    expect(rows[1]?.[1]).toBe('7');
    POLICIES.forEach((policy, k) => expect(shownNumber(rows[1]?.[2 + k] as string), policy).toBeCloseTo(sum(policy, 'profit'), 0));
  });

  it('an existing report.html is kept without --force (exit 2) and replaced with it; without --report none is written', async () => {
    const args = ['backtest', '--scenario', HALVORN_SCENARIO, '--from', '2026-03-01', '--to', '2026-03-02', '--policies', 'quantile,point'];
    const before = statSync(join(out, 'report.html')).mtimeMs;
    const again = await runCli([...args, '--report', '--out', out]);
    expect(again.code).toBe(2);
    expect(again.stderr).toMatch(/already exist.*report\.html.*add --force/);
    expect(statSync(join(out, 'report.html')).mtimeMs).toBe(before);
    const forced = await runCli([...args, '--report', '--out', out, '--force']);
    expect(forced.code).toBe(0);
    expect(forced.stdout).toContain('summary.json, report.html');
    const plain = join(dirname(out), 'plain');
    expect((await runCli([...args, '--out', plain])).code).toBe(0);
    expect(existsSync(join(plain, 'report.html'))).toBe(false);
  });
});

describe('backtestReport as a function', () => {
  const dir = mkdtempSync(join(tmpdir(), 'quantbid-backtest-report-'));
  const scenario = JSON.parse(readFileSync(HALVORN_SCENARIO, 'utf8')) as Record<string, string>;
  const at = (name: string) => join(dirname(HALVORN_SCENARIO), scenario[name] as string);
  const marketFile = join(dir, 'market.json');
  writeFileSync(marketFile, JSON.stringify({ ...JSON.parse(readFileSync(at('market'), 'utf8')), currency: 'HLV <&> "x"' }));
  const market = readMarketSpec(marketFile);
  const battery = batteryModel(readBatterySpec(at('battery')));
  const history = readPriceHistory(at('history'), market);
  const forecast = readQuantileForecast(at('forecast'), market);
  const run = (from: string, to: string) => {
    const result = runBacktest({ market, battery, history, forecast, from, to }, { policies: ['quantile', 'point', 'perfect-foresight'], keepLedger: false });
    return { result, metrics: backtestMetrics(result, battery), market, battery };
  };

  it('escapes the currency label everywhere, does not mutate its (frozen) input and is deterministic', () => {
    const input = deepFreeze({ ...run('2026-03-01', '2026-03-03'), inputs: { market: '<market>.json' } });
    const page = backtestReport(input);
    expect(backtestReport(input)).toBe(page);
    expect(page).toContain('HLV &lt;&amp;&gt; &quot;x&quot;');
    expect(page).toContain('&lt;market&gt;.json');
    expect(page).not.toContain('HLV <&>');
    expect(page).not.toContain('<market>');
  });

  it('says so when no day of the span is covered, and draws no chart', () => {
    const page = backtestReport(run('2030-01-01', '2030-01-02'));
    expect(page).toContain('No covered day');
    expect(page).not.toContain('<svg');
  });
});
