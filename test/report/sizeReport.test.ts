import { beforeAll, describe, expect, it } from 'vitest';
import { sizeChartIds, sizeGrid, sizeReport, type SizeReportSummary, type SettingResult } from '../../src/report/index.js';
import { chartSource, csvObjects, readOutput, sizeWithReport, tableRows, labelledCharts } from './reportFixtures.js';
import { deepFreeze, elements } from './svgQuery.js';

const AXES = { energy_mwh: [5, 10], power_mw: [2.5, 5, 10], round_trip_efficiency: [0.88], policy: ['quantile', 'perfect-foresight'] };

/** Invented rows (behaviour only): NPV highest at 10 MWh / 5 MW; one IRR without a root. */
function inventedResults(): SettingResult[] {
  const results: SettingResult[] = [];
  for (const energy_mwh of AXES.energy_mwh) {
    for (const power_mw of AXES.power_mw) {
      for (const policy of AXES.policy) {
        const setting = { energy_mwh, power_mw, round_trip_efficiency: 0.88, policy };
        const npv = 1000 * (energy_mwh === 10 && power_mw === 5 ? 50 : energy_mwh - power_mw) + (policy === 'perfect-foresight' ? 1e5 : 0);
        results.push({ setting, row: { npv, profit_per_mwh: 100 / energy_mwh + power_mw, irr: power_mw === 10 ? 'none' : 0.05 } });
      }
    }
  }
  return results;
}

function inventedSummary(currency: string): SizeReportSummary {
  return {
    command: 'size',
    from: '2026-01-01',
    to: '2026-01-31',
    daysCovered: 31,
    skippedDays: [],
    currency,
    inputs: { battery: 'battery <2>.json' },
    axes: AXES,
    settings: 12,
    battery: { scenario: {}, scaling: '' },
    unaccepted: 'follow-plan',
    alpha: { method: 'fixed', alpha: 0.1, scored: { from: '2026-01-01', to: '2026-01-31', days: ['2026-01-01'] } },
    economics: { capexPerMwh: 1, capexPerMw: 1, fixedOmPerMwYear: 0, lifeYears: 15, lifeCycles: null, discountRate: 0.07, steps: ['npv = sum'] },
    best: [],
    warnings: ['yearly figures <extrapolated>'],
    note: 'perfect foresight is a bound',
  } as unknown as SizeReportSummary;
}

describe('sizeReport as a function', () => {
  it('puts each size into its row (power) and column (energy); cells that are not numbers stay empty', () => {
    const grid = sizeGrid(inventedResults(), AXES, 'quantile', 0.88, 'npv');
    expect(grid.values).toEqual([
      [2500, 7500],
      [0, 50000],
      [-5000, 0],
    ]);
    expect(sizeGrid(inventedResults(), AXES, 'quantile', 0.88, 'irr').values[2]).toEqual([null, null]);
  });

  it('outlines the size with the highest NPV; perfect foresight gets no map of its own', () => {
    const page = sizeReport({ results: inventedResults(), summary: inventedSummary('HLV') });
    const [npvId, profitId] = sizeChartIds('quantile', 0, 1);
    const best = elements(chartSource(page, npvId), 'g', 'best-cell')[0];
    // Row 1 is 5 MW, column 1 is 10 MWh.
    expect([best?.attrs['data-row'], best?.attrs['data-column']]).toEqual(['1', '1']);
    // Profit per MWh 100 / e + p is highest at 5 MWh and 10 MW: row 2, column 0.
    const bestProfit = elements(chartSource(page, profitId), 'g', 'best-cell')[0];
    expect([bestProfit?.attrs['data-row'], bestProfit?.attrs['data-column']]).toEqual(['2', '0']);
    expect(page).not.toContain('size-npv-perfect-foresight');
  });

  it('escapes the currency label and file names, does not mutate its (frozen) input and is deterministic', () => {
    const input = deepFreeze({ results: inventedResults(), summary: inventedSummary('HLV <&> "x"') });
    const page = sizeReport(input);
    expect(sizeReport(input)).toBe(page);
    expect(page).toContain('HLV &lt;&amp;&gt; &quot;x&quot;');
    expect(page).toContain('battery &lt;2&gt;.json');
    // The summary's warnings are shown in the report's summary, escaped.
    expect(page).toMatch(/warning<\/dt>\s*<dd>yearly figures &lt;extrapolated&gt;\.<\/dd>/);
    expect(page).not.toMatch(/HLV <&>|<2>/);
  });
});

describe('quantbid size --report on the Halvorn demo (compiled CLI)', () => {
  let html = '';
  let rows: Record<string, string>[] = [];
  let summary: { best: { policy: string; highestNpv: { energyMwh: number; powerMw: number } | null }[] };
  beforeAll(() => {
    const out = sizeWithReport();
    html = readOutput(out, 'report.html');
    rows = csvObjects(readOutput(out, 'size.csv'));
    summary = JSON.parse(readOutput(out, 'summary.json'));
  });

  it('every NPV cell is the npv of its size in size.csv, in thousands', () => {
    // The price-taking baseline's maps follow the policy's: every size is read against it.
    expect(labelledCharts(html)).toEqual(['size-npv-quantile', 'size-profit-quantile', 'size-npv-price-taking', 'size-profit-price-taking']);
    const cells = elements(chartSource(html, 'size-npv-quantile'), 'rect', 'cell');
    const energies = [5, 10, 20];
    const powers = [2.5, 5, 10];
    expect(cells).toHaveLength(9);
    for (const cell of cells) {
      const row = rows.find((r) => r.policy === 'quantile' && Number(r.energy_mwh) === energies[cell.num('data-column')] && Number(r.power_mw) === powers[cell.num('data-row')]);
      expect(cell.num('data-value')).toBeCloseTo(Number(row?.npv) / 1000, 5);
    }
  });

  it('the outlined cells are the rows of size.csv with the highest NPV and profit per MWh, as summary.json says', () => {
    const quantile = rows.filter((r) => r.policy === 'quantile');
    const top = (column: string) => quantile.reduce((a, b) => (Number(b[column]) > Number(a[column]) ? b : a));
    for (const [id, column] of [['size-npv-quantile', 'npv'], ['size-profit-quantile', 'profit_per_mwh']] as const) {
      const best = elements(chartSource(html, id), 'g', 'best-cell')[0];
      const expected = top(column);
      expect([[5, 10, 20][best?.num('data-column') ?? -1], [2.5, 5, 10][best?.num('data-row') ?? -1]], id).toEqual([Number(expected.energy_mwh), Number(expected.power_mw)]);
    }
    const pick = summary.best.find((b) => b.policy === 'quantile')?.highestNpv;
    expect([pick?.energyMwh, pick?.powerMw]).toEqual([Number(top('npv').energy_mwh), Number(top('npv').power_mw)]);
    const table = tableRows(html, 'Size with the highest NPV');
    expect(table[0]?.slice(0, 3)).toEqual(['quantile', 'NPV', `${pick?.energyMwh} MWh / ${pick?.powerMw} MW`]);
  });
});
