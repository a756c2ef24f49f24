import type { ResultCell, SettingResult, SweepReportSummary } from './gridReportInput.js';
import type { Guide, NumberAxis } from './chartTypes.js';
import { htmlPage, paragraph, type PageSection } from './htmlPage.js';
import { lineChart, type LineSeries } from './lineChart.js';
import type { Markup } from './markup.js';
import { OKABE_ITO, ROLE_COLOURS } from './palette.js';
import { policyStyle } from './policyStyles.js';
import { factList, htmlTable } from './table.js';
import { numberText } from './tickLabel.js';
import { formatPValue } from '../io/formatNumber.js';

export interface SweepReportInput {
  /** Every finished setting with its row of sweep.csv, in grid order. */
  readonly results: readonly SettingResult[];
  /** The content of the sweep's summary.json (span, axes, best setting, best alpha per policy and rule). */
  readonly summary: SweepReportSummary;
}

/** Settings listed in the table of top settings. */
export const SWEEP_REPORT_TOP = 10;

/** One line of settings that differ only in alpha, e.g. policy quantile under follow-plan. */
export interface AlphaCurve {
  /** The setting's values besides alpha, in axis order. */
  readonly fixed: Readonly<Record<string, ResultCell>>;
  /** `quantile, follow-plan`. */
  readonly label: string;
  /** The result at each alpha of the alpha axis (null where the grid has none). */
  readonly results: readonly (SettingResult | null)[];
}

/** The sweep's results grouped into curves over the alpha axis, in grid order of the other axes. */
export function alphaCurves(results: readonly SettingResult[], alphas: readonly number[]): AlphaCurve[] {
  const curves = new Map<string, { fixed: Record<string, ResultCell>; results: (SettingResult | null)[] }>();
  for (const r of results) {
    const fixed = Object.fromEntries(Object.entries(r.setting).filter(([name]) => name !== 'alpha'));
    const key = JSON.stringify(fixed);
    const curve = curves.get(key) ?? { fixed, results: alphas.map(() => null) };
    const k = alphas.indexOf(r.setting.alpha as number);
    if (k >= 0) curve.results[k] = r;
    curves.set(key, curve);
  }
  return [...curves.values()].map((c) => ({ ...c, label: Object.values(c.fixed).map(String).join(', ') }));
}

/** `sweep-acceptance-quantile-follow-plan`: an svg id from a curve's values. */
export function curveChartId(curve: AlphaCurve): string {
  return `sweep-acceptance-${Object.values(curve.fixed).map((v) => String(v).toLowerCase().replace(/[^a-z0-9]+/g, '-')).join('-')}`.replace(/-+$/, '');
}

function num(cell: ResultCell | undefined): number | null {
  return typeof cell === 'number' && Number.isFinite(cell) ? cell : null;
}

/**
 * The sweep report, `report.html`: profit against alpha for every policy and unaccepted rule with the
 * most profitable setting of each rule marked and the reference policies of each rule as guides; per policy and rule the profit with the acceptance rates of buys and
 * sells on a second axis; the best alpha per policy and rule and the top settings as tables. Numbers
 * are the rows of sweep.csv and summary.json. Same input, same bytes.
 */
export function sweepReport(input: SweepReportInput): string {
  const { summary } = input;
  const alphas = ((summary.axes.alpha ?? []) as number[]).slice();
  const curves = alphaCurves(input.results, alphas);
  const x: NumberAxis = { kind: 'linear', label: 'alpha', unit: '-', values: alphas };
  const sections: PageSection[] = [{ id: 'summary', heading: 'Summary', blocks: [factList(summaryFacts(input)), ...summary.warnings.map((w) => paragraph(`Warning: ${w}.`)), paragraph(`Note: ${summary.note}.`)] }];
  if (input.results.length > 0) {
    sections.push(
      { id: 'profit', heading: 'Profit against alpha', blocks: [profitChart(input, curves, x)] },
      { id: 'acceptance', heading: 'Profit and acceptance per policy', blocks: curves.map((c) => acceptanceChart(c, x, summary.currency)) },
      { id: 'settings', heading: 'Best settings', blocks: [referenceTable(summary), bestAlphaTable(summary), topSettingsTable(input)] },
    );
  }
  sections.push({ id: 'inputs', heading: 'Inputs', blocks: [htmlTable({ columns: [{ header: 'input' }, { header: 'file' }], rows: Object.entries(summary.inputs).flatMap(([k, v]) => (v === undefined ? [] : [[k, v]])) })] });
  return htmlPage({
    title: `Sweep ${summary.from} to ${summary.to}`,
    subtitle: `${summary.settings} settings over ${summary.daysCovered} covered days (${summary.skippedDays.length} skipped); money in ${summary.currency}.`,
    sections,
    footer:
      'Written by quantbid. Every setting is a backtest over the same days; the best one is chosen in-sample. This page is self-contained: it runs no scripts and loads nothing from the network.',
  });
}

function summaryFacts(input: SweepReportInput): [string, string][] {
  const { summary } = input;
  const c = summary.currency;
  const axes = Object.entries(summary.axes).map(([name, values]) => `${name} ${values.map((v) => (typeof v === 'number' ? numberText(v, 6) : v)).join(', ')}`);
  const facts: [string, string][] = [
    ['span', `${summary.from} to ${summary.to}: ${summary.daysCovered} days covered, ${summary.skippedDays.length} skipped`],
    ['grid', `${summary.settings} settings: ${axes.join('; ')}`],
  ];
  const money = (x: ResultCell | undefined) => `${numberText(num(x) ?? Number.NaN, 0)} ${c}`;
  for (const rule of summary.bestByRule) {
    const refs = summary.references.filter((r) => r.unaccepted === rule.unaccepted);
    const ref = (policy: string) => refs.find((r) => r.policy === policy)?.row;
    facts.push([`references, ${String(rule.unaccepted)}`, `point ${money(ref('point')?.profit)}, price-taking ${money(ref('price-taking')?.profit)}, perfect foresight ${money(ref('perfect-foresight')?.profit)}`]);
    const best = rule.best;
    if (best === null) continue;
    const row = best.row;
    const capture = num(row.capture_ratio) === null ? '' : `, ${numberText(100 * (num(row.capture_ratio) as number), 1)} % of perfect foresight`;
    const verdict = rule.strongestBaseline === null || rule.beatsStrongestBaseline === null ? '' : rule.beatsStrongestBaseline ? `; beats ${rule.strongestBaseline.policy}` : `; LOSES to ${rule.strongestBaseline.policy}, the strongest simple baseline`;
    facts.push([`most profitable setting, ${String(rule.unaccepted)}`, `${settingText(best.setting)}: ${money(row.profit)}${capture}${verdict}`]);
  }
  return facts;
}

/** A p-value cell of sweep.csv (a number, or text below 1e-4) as read. */
function pValueCell(cell: ResultCell | undefined): string | null {
  if (typeof cell === 'number') return formatPValue(cell);
  return typeof cell === 'string' ? cell : null;
}

function settingText(setting: Readonly<Record<string, ResultCell>>): string {
  return Object.entries(setting)
    .map(([name, v]) => (name === 'alpha' ? `alpha ${numberText(v as number, 6)}` : String(v)))
    .join(', ');
}

function profitChart(input: SweepReportInput, curves: readonly AlphaCurve[], x: NumberAxis): Markup {
  const { summary } = input;
  const series: LineSeries[] = curves.map((curve) => {
    const style = policyStyle(String(curve.fixed.policy));
    return { name: curve.label, values: curve.results.map((r) => num(r?.row.profit)), colour: style.colour, dash: curve.fixed.unaccepted === 'follow-accepted', points: true };
  });
  const guides: Guide[] = [];
  for (const rule of summary.bestByRule) {
    const best = rule.best;
    const k = best === null ? -1 : x.values.indexOf(best.setting.alpha as number);
    const profit = best === null ? null : num(best.row.profit);
    if (best !== null && k >= 0 && profit !== null) {
      series.push({ name: `most profitable, ${String(rule.unaccepted)}: ${settingText(best.setting)}`, values: x.values.map((_, i) => (i === k ? profit : null)), colour: OKABE_ITO.black, marker: { shape: rule.unaccepted === 'follow-accepted' ? 'square' : 'diamond', size: 7 } });
    }
  }
  for (const reference of summary.references) {
    const profit = num(reference.row.profit);
    if (profit !== null) guides.push({ value: profit, label: `${reference.policy}, ${reference.unaccepted}: ${numberText(profit, 0)}` });
  }
  return lineChart({
    id: 'sweep-profit',
    title: 'Profit against alpha, per policy and unaccepted rule',
    caption: `One line per policy and rule (dashed: follow-accepted); black markers: the most profitable setting within each rule (diamond follow-plan, square follow-accepted), never chosen across rules; dashed grey: the reference policies point, price-taking and perfect foresight under each rule, which do not depend on alpha. Alpha, the tail level, sets buy limits at q(1 \u2212 alpha) and sell limits at q(alpha); profit over ${summary.daysCovered} days.`,
    x,
    y: { label: 'profit', unit: summary.currency },
    series,
    guides,
  });
}

function acceptanceChart(curve: AlphaCurve, x: NumberAxis, currency: string): Markup {
  const style = policyStyle(String(curve.fixed.policy));
  const share = (r: SettingResult | null, column: string) => {
    const v = num(r?.row[column]);
    return v === null ? null : 100 * v;
  };
  const profits = curve.results.map((r) => num(r?.row.profit));
  const best = bestIndex(profits);
  return lineChart({
    id: curveChartId(curve),
    title: `Profit and acceptance against alpha: ${curve.label}`,
    caption: 'Solid: profit (left axis), the diamond at its highest. Dashed: share of buy and sell orders the auction accepted (right axis); a smaller alpha sets wider limits (buys up to q(1 \u2212 alpha), sells down to q(alpha)), which are accepted more often.',
    x,
    y: { label: 'profit', unit: currency },
    y2: { label: 'orders accepted', unit: '%', min: 0, max: 100 },
    plotHeight: 180,
    series: [
      { name: `profit, ${curve.label}`, values: profits, colour: style.colour, points: true },
      { name: 'buys accepted', values: curve.results.map((r) => share(r, 'buy_acceptance_rate')), colour: ROLE_COLOURS.buy, dash: true, axis: 'right', points: true },
      { name: 'sells accepted', values: curve.results.map((r) => share(r, 'sell_acceptance_rate')), colour: ROLE_COLOURS.sell, dash: true, axis: 'right', points: true },
      ...(best < 0 ? [] : [{ name: `most profitable alpha ${numberText(x.values[best] as number, 6)}`, values: profits.map((v, i) => (i === best ? v : null)), colour: OKABE_ITO.black, marker: { shape: 'diamond' as const, size: 7 } }]),
    ],
  });
}

/** Index of the largest value (the first of equal ones), -1 when there is none. */
export function bestIndex(values: readonly (number | null)[]): number {
  let best = -1;
  values.forEach((v, i) => {
    if (v !== null && (best < 0 || v > (values[best] as number))) best = i;
  });
  return best;
}

function bestAlphaTable(summary: SweepReportSummary): Markup {
  const c = summary.currency;
  const pct = (x: ResultCell | undefined) => (num(x) === null ? null : 100 * (num(x) as number));
  return htmlTable({
    caption: 'Most profitable alpha per policy and unaccepted rule (as in summary.json); "edge" when it is the smallest or largest alpha of the grid, where the optimum may lie beyond',
    columns: [
      { header: 'policy' },
      { header: 'unaccepted' },
      { header: 'alpha', unit: '-' },
      { header: 'on the grid' },
      { header: 'profit', unit: c, decimals: 0 },
      { header: 'capture ratio', unit: '%', decimals: 1 },
      { header: 'edge over point', unit: `${c}/day`, decimals: 2 },
      { header: 'p-value vs point', unit: '-' },
      { header: 'edge over price-taking', unit: `${c}/day`, decimals: 2 },
      { header: 'p-value vs price-taking', unit: '-' },
    ],
    rows: summary.bestAlphaByPolicy.map((b) => [
      String(b.policy),
      String(b.unaccepted),
      typeof b.alpha === 'number' ? numberText(b.alpha, 6) : null,
      b.onEdgeOfAlphaGrid ? 'edge' : 'inside',
      num(b.row?.profit),
      pct(b.row?.capture_ratio),
      num(b.row?.edge_vs_point),
      pValueCell(b.row?.p_value_vs_point),
      num(b.row?.edge_vs_price_taking),
      pValueCell(b.row?.p_value_vs_price_taking),
    ]),
  });
}

function referenceTable(summary: SweepReportSummary): Markup {
  const c = summary.currency;
  const pct = (x: ResultCell | undefined) => (num(x) === null ? null : 100 * (num(x) as number));
  return htmlTable({
    caption: 'Reference policies per unaccepted rule (the rows of sweep.csv after the grid, alpha empty)',
    columns: [
      { header: 'policy' },
      { header: 'unaccepted' },
      { header: 'profit', unit: c, decimals: 0 },
      { header: 'capture ratio', unit: '%', decimals: 1 },
      { header: 'buys accepted', unit: '%', decimals: 1 },
      { header: 'sells accepted', unit: '%', decimals: 1 },
      { header: 'imbalance energy', unit: 'MWh', decimals: 1 },
    ],
    rows: summary.references.map((r) => [r.policy, r.unaccepted, num(r.row.profit), pct(r.row.capture_ratio), pct(r.row.buy_acceptance_rate), pct(r.row.sell_acceptance_rate), num(r.row.imbalance_mwh)]),
  });
}

/** The SWEEP_REPORT_TOP settings with the highest profit, ties in grid order. */
export function topSettings(results: readonly SettingResult[], count = SWEEP_REPORT_TOP): SettingResult[] {
  return results
    .filter((r) => num(r.row.profit) !== null)
    .map((r, i) => [r, i] as const)
    .sort(([a, i], [b, j]) => (num(b.row.profit) as number) - (num(a.row.profit) as number) || i - j)
    .slice(0, count)
    .map(([r]) => r);
}

function topSettingsTable(input: SweepReportInput): Markup {
  const c = input.summary.currency;
  const pct = (x: ResultCell | undefined) => (num(x) === null ? null : 100 * (num(x) as number));
  const top = topSettings(input.results);
  return htmlTable({
    caption: `Top ${top.length} settings by profit (of ${input.results.length})`,
    columns: [
      { header: 'alpha', unit: '-' },
      { header: 'policy' },
      { header: 'unaccepted' },
      { header: 'profit', unit: c, decimals: 0 },
      { header: 'capture ratio', unit: '%', decimals: 1 },
      { header: 'p-value vs point', unit: '-' },
      { header: 'p-value vs price-taking', unit: '-' },
      { header: 'buys accepted', unit: '%', decimals: 1 },
      { header: 'sells accepted', unit: '%', decimals: 1 },
      { header: 'imbalance energy', unit: 'MWh', decimals: 1 },
    ],
    rows: top.map((r) => [
      typeof r.setting.alpha === 'number' ? numberText(r.setting.alpha, 6) : null,
      String(r.setting.policy),
      String(r.setting.unaccepted),
      num(r.row.profit),
      pct(r.row.capture_ratio),
      pValueCell(r.row.p_value_vs_point),
      pValueCell(r.row.p_value_vs_price_taking),
      pct(r.row.buy_acceptance_rate),
      pct(r.row.sell_acceptance_rate),
      num(r.row.imbalance_mwh),
    ]),
  });
}
