import { beforeAll, describe, expect, it } from 'vitest';
import { alphaCurves, bestIndex, curveChartId, lineChart, sweepReport, topSettings, type SweepReportSummary, type SettingResult } from '../../src/report/index.js';
import { chartSource, csvObjects, markTitles, readOutput, shownNumber, sweepWithReport, tableRows, labelledCharts } from './reportFixtures.js';
import { deepFreeze, elements } from './svgQuery.js';

/** A sweep of invented rows (behaviour only): profit peaks at alpha 0.2 for quantile, 0.1 for median. */
function inventedSweep(currency = 'HLV'): { results: SettingResult[]; summary: SweepReportSummary } {
  const alphas = [0.1, 0.2, 0.3];
  const policies = ['quantile', 'median'];
  const results: SettingResult[] = [];
  for (const alpha of alphas) {
    for (const policy of policies) {
      const profit = policy === 'quantile' ? 1000 - 5000 * (alpha - 0.2) ** 2 : 900 - 1000 * alpha;
      const setting = { alpha, policy, unaccepted: 'follow-plan' };
      results.push({ setting, row: { profit, capture_ratio: profit / 2000, perfect_foresight_profit: 2000, point_profit: 700, edge_vs_point: 1, p_value_vs_point: 0.2, buy_acceptance_rate: 1 - alpha, sell_acceptance_rate: 1 - alpha / 2, imbalance_mwh: 10 } });
    }
  }
  const best = results.reduce((a, b) => ((b.row.profit as number) > (a.row.profit as number) ? b : a));
  const summary = {
    command: 'sweep',
    from: '2026-01-01',
    to: '2026-01-31',
    daysCovered: 31,
    skippedDays: [],
    currency,
    inputs: { market: 'market <1>.json' },
    axes: { alpha: alphas, policy: policies, unaccepted: ['follow-plan'] },
    settings: results.length,
    bestByRule: [{ unaccepted: 'follow-plan', best: { setting: best.setting, row: best.row }, strongestBaseline: { policy: 'price-taking', profit: 950 }, beatsStrongestBaseline: true, perfectForesightProfit: 2000 }],
    bestAlphaByPolicy: policies.map((policy) => {
      const mine = results.filter((r) => r.setting.policy === policy).reduce((a, b) => ((b.row.profit as number) > (a.row.profit as number) ? b : a));
      return { policy, unaccepted: 'follow-plan', alpha: mine.setting.alpha as number, row: mine.row, onEdgeOfAlphaGrid: mine.setting.alpha === 0.1 };
    }),
    references: [
      { policy: 'point', unaccepted: 'follow-plan', row: { profit: 700 } },
      { policy: 'price-taking', unaccepted: 'follow-plan', row: { profit: 950 } },
      { policy: 'perfect-foresight', unaccepted: 'follow-plan', row: { profit: 2000 } },
    ],
    warnings: ['median, follow-plan: the most profitable alpha 0.1 lies on the edge of the grid'],
    note: 'in-sample',
    conventions: { captureRatio: '', pValueVsPoint: '', cycles: '', cash: '' },
  } as unknown as SweepReportSummary;
  return { results, summary };
}

describe('sweepReport as a function', () => {
  it('groups the settings into one curve per policy and rule over the alpha axis', () => {
    const { results } = inventedSweep();
    const curves = alphaCurves(results, [0.1, 0.2, 0.3]);
    expect(curves.map((c) => c.label)).toEqual(['quantile, follow-plan', 'median, follow-plan']);
    expect(curves[0]?.results.map((r) => r?.setting.alpha)).toEqual([0.1, 0.2, 0.3]);
    expect(curves.map(curveChartId)).toEqual(['sweep-acceptance-quantile-follow-plan', 'sweep-acceptance-median-follow-plan']);
  });

  it('ranks the top settings by profit, ties in grid order; bestIndex takes the first of equal values', () => {
    const { results } = inventedSweep();
    expect(topSettings(results, 3).map((r) => [r.setting.policy, r.setting.alpha])).toEqual([
      ['quantile', 0.2],
      ['quantile', 0.1],
      ['quantile', 0.3],
    ]);
    expect(bestIndex([null, 3, 5, 5, 1])).toBe(2);
    expect(bestIndex([null, null])).toBe(-1);
  });

  it('marks the best setting with one diamond at its alpha and profit, and each curve\'s best in its own chart', () => {
    const input = inventedSweep();
    const page = sweepReport(input);
    const profitSvg = chartSource(page, 'sweep-profit');
    const best = profitSvg.slice(profitSvg.indexOf('data-series="most profitable, follow-plan: alpha 0.2, quantile, follow-plan"'));
    expect(markTitles(best.slice(0, best.indexOf('</g>')))).toEqual(['most profitable, follow-plan: alpha 0.2, quantile, follow-plan, alpha 0.2 -: 1000 HLV']);
    // The references of the rule are drawn as guides and named in the summary, with the verdict and the warning.
    expect(profitSvg).toContain('price-taking, follow-plan: 950');
    expect(profitSvg).toContain('perfect-foresight, follow-plan: 2000');
    expect(page).toContain('beats price-taking');
    expect(page).toContain('Warning: median, follow-plan: the most profitable alpha 0.1 lies on the edge of the grid.');
    const medianSvg = chartSource(page, 'sweep-acceptance-median-follow-plan');
    expect(markTitles(medianSvg).filter((t) => t.startsWith('most profitable'))).toEqual(['most profitable alpha 0.1, alpha 0.1 -: 800 HLV']);
  });

  it('escapes the currency label and file names, does not mutate its (frozen) input and is deterministic', () => {
    const input = deepFreeze(inventedSweep('HLV <&> "x"'));
    const page = sweepReport(input);
    expect(sweepReport(input)).toBe(page);
    expect(page).toContain('HLV &lt;&amp;&gt; &quot;x&quot;');
    expect(page).toContain('market &lt;1&gt;.json');
    expect(page).not.toMatch(/HLV <&>|<1>/);
  });

  it('a line chart series with a marker draws one outlined diamond per point and a marker in the legend', () => {
    const svg = lineChart({
      id: 'marked',
      title: 'marked',
      caption: 'marked',
      x: { kind: 'linear', label: 'x', unit: '-', values: [1, 2, 3] },
      y: { label: 'y', unit: '-' },
      series: [{ name: 'best', values: [null, 5, null], marker: { shape: 'diamond', size: 7 } }],
    }).text;
    const points = elements(svg, 'path', 'point');
    expect(points).toHaveLength(1);
    expect(points[0]?.attrs.stroke).toBe('#ffffff');
    // Diamond of "radius" 7: corners 1.3 x 7 = 9.1 px from the centre (markerShape.ts), four of them.
    expect((points[0]?.attrs.d ?? '').match(/[ML]/g)).toHaveLength(4);
  });
});

describe('quantbid sweep --report on the Halvorn demo (compiled CLI)', () => {
  let html = '';
  let rows: Record<string, string>[] = [];
  beforeAll(() => {
    const out = sweepWithReport();
    html = readOutput(out, 'report.html');
    const all = csvObjects(readOutput(out, 'sweep.csv'));
    // The grid's rows; the reference rows after them have an empty alpha.
    rows = all.filter((r) => r.alpha !== '');
    references = all.filter((r) => r.alpha === '');
  });
  let references: Record<string, string>[] = [];

  it('one marker per rule on the row of sweep.csv with the highest profit under that rule; the reference rows as guides', () => {
    expect(labelledCharts(html)).toHaveLength(5);
    const marked = markTitles(chartSource(html, 'sweep-profit')).filter((t) => t.startsWith('most profitable'));
    expect(marked).toHaveLength(2);
    for (const rule of ['follow-plan', 'follow-accepted']) {
      const best = rows.filter((r) => r.unaccepted === rule).reduce((a, b) => (Number(b.profit) > Number(a.profit) ? b : a));
      const mark = marked.find((t) => t.startsWith(`most profitable, ${rule}:`)) as string;
      expect(mark).toContain(`alpha ${best.alpha}, ${best.policy}, ${best.unaccepted}`);
      expect(shownNumber(/: (\S+) HLV$/.exec(mark)?.[1] ?? 'NaN')).toBeCloseTo(Number(best.profit), 2);
    }
    expect(references.map((r) => [r.policy, r.unaccepted])).toEqual(['follow-plan', 'follow-accepted'].flatMap((u) => ['point', 'price-taking', 'perfect-foresight'].map((p) => [p, u])));
    const shown = tableRows(html, 'Reference policies per unaccepted rule');
    shown.forEach((r, i) => expect(shownNumber(r[2] as string)).toBeCloseTo(Number(references[i]?.profit), 0));
  });

  it('every profit point and acceptance share equals its row of sweep.csv', () => {
    for (const row of rows) {
      const svg = chartSource(html, `sweep-acceptance-${row.policy}-${row.unaccepted}`);
      const titles = markTitles(svg);
      const profit = titles.find((t) => t.startsWith(`profit, ${row.policy}, ${row.unaccepted}, alpha ${row.alpha} `));
      expect(shownNumber(/: (\S+) HLV$/.exec(profit ?? '')?.[1] ?? 'NaN'), `${row.alpha} ${row.policy}`).toBeCloseTo(Number(row.profit), 2);
      for (const [side, column] of [['buys', 'buy_acceptance_rate'], ['sells', 'sell_acceptance_rate']] as const) {
        const share = titles.find((t) => t.startsWith(`${side} accepted, alpha ${row.alpha} `));
        expect(shownNumber(/: (\S+) %$/.exec(share ?? '')?.[1] ?? 'NaN'), `${row.alpha} ${row.policy} ${side}`).toBeCloseTo(100 * Number(row[column]), 2);
      }
    }
  });

  it('the top-settings table lists the 10 most profitable rows of sweep.csv in order', () => {
    const expected = [...rows].sort((a, b) => Number(b.profit) - Number(a.profit)).slice(0, 10);
    const shown = tableRows(html, 'Top 10 settings by profit');
    expect(shown.map((r) => r.slice(0, 3))).toEqual(expected.map((r) => [r.alpha, r.policy, r.unaccepted]));
    shown.forEach((r, i) => expect(shownNumber(r[3] as string)).toBeCloseTo(Number(expected[i]?.profit), 0));
  });
});
