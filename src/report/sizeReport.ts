import type { PickedSize, ResultCell, SettingResult, SizeReportSummary } from './gridReportInput.js';
import { categoryAxis } from './categoryAxis.js';
import { heatMap } from './heatMap.js';
import { htmlPage, paragraph, type PageSection } from './htmlPage.js';
import type { Markup } from './markup.js';
import { factList, htmlTable } from './table.js';
import { numberText } from './tickLabel.js';

export interface SizeReportInput {
  /** Every finished setting with its row of size.csv, in grid order. */
  readonly results: readonly SettingResult[];
  /** The content of the sizing's summary.json (span, axes, alpha, economics, best sizes). */
  readonly summary: SizeReportSummary;
}

/** One energy x power grid of values: rows are powers (row 0 the smallest), columns energies. */
export interface SizeGrid {
  readonly energiesMwh: readonly number[];
  readonly powersMw: readonly number[];
  /** values[power][energy]; null where the grid has no number (e.g. no result). */
  readonly values: readonly (readonly (number | null)[])[];
}

/**
 * The grid of `column` over energy x power for one policy and one round-trip efficiency, read from
 * the results (cells that are not numbers, such as `none`, stay null).
 */
export function sizeGrid(results: readonly SettingResult[], axes: Readonly<Record<string, readonly (number | string)[]>>, policy: string, efficiency: number | string, column: string): SizeGrid {
  const energiesMwh = (axes.energy_mwh ?? []) as number[];
  const powersMw = (axes.power_mw ?? []) as number[];
  const values = powersMw.map(() => energiesMwh.map((): number | null => null));
  for (const r of results) {
    const { energy_mwh: e, power_mw: p, round_trip_efficiency: eff, policy: pol } = r.setting;
    if (pol !== policy || eff !== efficiency) continue;
    const [i, j] = [powersMw.indexOf(p as number), energiesMwh.indexOf(e as number)];
    const cell = r.row[column];
    if (i >= 0 && j >= 0 && typeof cell === 'number' && Number.isFinite(cell)) (values[i] as (number | null)[])[j] = cell;
  }
  return { energiesMwh, powersMw, values };
}

/** Ids of the heat maps of one policy and efficiency (`k` its place on the efficiency axis, shown only with several). */
export function sizeChartIds(policy: string, k: number, efficiencies: number): [string, string] {
  const suffix = efficiencies > 1 ? `-${k + 1}` : '';
  const safe = policy.toLowerCase().replace(/[^a-z0-9]+/g, '-');
  return [`size-npv-${safe}${suffix}`, `size-profit-${safe}${suffix}`];
}

/**
 * The sizing report, `report.html`: for every policy (perfect foresight aside, which is only a bound)
 * and efficiency a heat map of NPV and one of profit per MWh of energy over energy x power, each with
 * its best size outlined; the best sizes per policy as a table; the economics used. Numbers are the
 * rows of size.csv and summary.json. Same input, same bytes.
 */
export function sizeReport(input: SizeReportInput): string {
  const { summary } = input;
  const policies = ((summary.axes.policy ?? []) as string[]).filter((p) => p !== 'perfect-foresight');
  const efficiencies = (summary.axes.round_trip_efficiency ?? []) as (number | string)[];
  const maps = policies.flatMap((policy) => efficiencies.flatMap((eff, k) => heatMaps(input, policy, eff, k, efficiencies.length)));
  const sections: PageSection[] = [
    { id: 'summary', heading: 'Summary', blocks: [factList(summaryFacts(summary)), paragraph(`Note: ${summary.note}.`)] },
    { id: 'maps', heading: 'Value over energy and power', blocks: maps.length > 0 ? maps : [paragraph('No size has a result.')] },
    { id: 'best', heading: 'Best sizes', blocks: [bestTable(summary)] },
    { id: 'economics', heading: 'Economics', blocks: [factList(economicsFacts(summary)), htmlTable({ caption: 'Steps (as in summary.json)', columns: [{ header: 'step' }], rows: summary.economics.steps.map((s) => [s]) })] },
    { id: 'inputs', heading: 'Inputs', blocks: [htmlTable({ columns: [{ header: 'input' }, { header: 'file' }], rows: Object.entries(summary.inputs).flatMap(([k, v]) => (v === undefined ? [] : [[k, v]])) })] },
  ];
  return htmlPage({
    title: `Battery sizes ${summary.from} to ${summary.to}`,
    subtitle: `${summary.settings} settings, ${summary.alpha.scored.days.length} days scored; money in ${summary.currency}.`,
    sections,
    footer:
      'Written by quantbid. Each size is a backtest on past prices turned into a project by the economics above: a guide to the choice of size, not a forecast of returns. This page is self-contained: it runs no scripts and loads nothing from the network.',
  });
}

function summaryFacts(summary: SizeReportSummary): [string, string][] {
  const scored = summary.alpha.scored;
  const alpha =
    summary.alpha.method === 'fixed'
      ? `alpha ${numberText(summary.alpha.alpha, 6)} for quantile and median`
      : `alpha chosen per size and policy on ${summary.alpha.choose.from} to ${summary.alpha.choose.to} from ${summary.alpha.alphas.map((a) => numberText(a, 6)).join(', ')}`;
  const list = (name: string) => ((summary.axes[name] ?? []) as (number | string)[]).map((v) => (typeof v === 'number' ? numberText(v, 6) : v)).join(', ');
  return [
    ['span', `${summary.from} to ${summary.to}: ${summary.daysCovered} days covered, ${summary.skippedDays.length} skipped`],
    ['days scored', `${scored.days.length} (${scored.from} to ${scored.to})`],
    ['energies', `${list('energy_mwh')} MWh`],
    ['powers', `${list('power_mw')} MW (charge = discharge)`],
    ['round-trip efficiencies', list('round_trip_efficiency')],
    ['policies', `${list('policy')}; ${alpha}; unaccepted orders: ${summary.unaccepted}`],
    ...summary.warnings.map((warning): [string, string] => ['warning', `${warning}.`]),
  ];
}

function economicsFacts(summary: SizeReportSummary): [string, string][] {
  const e = summary.economics;
  const c = summary.currency;
  return [
    ['capital cost', `${numberText(e.capexPerMwh, 2)} ${c}/MWh of energy + ${numberText(e.capexPerMw, 2)} ${c}/MW of power`],
    ['fixed O&M', `${numberText(e.fixedOmPerMwYear, 2)} ${c}/(MW year)`],
    ['life', `${e.lifeYears} years${e.lifeCycles === null ? '' : `, cells replaced after ${numberText(e.lifeCycles, 0)} equivalent full cycles`}`],
    ['discount rate', `${numberText(100 * e.discountRate, 3)} % a year`],
  ];
}

function heatMaps(input: SizeReportInput, policy: string, efficiency: number | string, k: number, count: number): Markup[] {
  const { results, summary } = input;
  const [npvId, profitId] = sizeChartIds(policy, k, count);
  const where = `${policy} policy${count > 1 ? `, round-trip efficiency ${typeof efficiency === 'number' ? numberText(efficiency, 4) : efficiency}` : ''}`;
  const npv = sizeGrid(results, summary.axes, policy, efficiency, 'npv');
  const profit = sizeGrid(results, summary.axes, policy, efficiency, 'profit_per_mwh');
  const x = categoryAxis(npv.energiesMwh.map((e) => numberText(e, 6)), { label: 'energy', unit: 'MWh' });
  const y = categoryAxis(npv.powersMw.map((p) => numberText(p, 6)), { label: 'power', unit: 'MW' });
  const days = summary.alpha.scored.days.length;
  return [
    heatMap({
      id: npvId,
      title: `Net present value by size, ${where}`,
      caption: `Colour and number: NPV of each size over the ${summary.economics.lifeYears}-year life in thousands of ${summary.currency}, lighter is higher; outlined: the highest NPV, the best size; grey: no result.`,
      x,
      y,
      values: npv.values.map((row) => row.map((v) => (v === null ? null : v / 1000))),
      value: { label: 'NPV', unit: `thousand ${summary.currency}` },
      best: 'max',
    }),
    heatMap({
      id: profitId,
      title: `Profit per MWh of energy by size, ${where}`,
      caption: `Colour and number: profit over the ${days} scored days divided by the energy of the size; outlined: the highest, the size that uses each MWh best; grey: no result.`,
      x,
      y,
      values: profit.values,
      value: { label: `profit over ${days} days per MWh of energy`, unit: `${summary.currency}/MWh` },
      best: 'max',
    }),
  ];
}

function bestTable(summary: SizeReportSummary): Markup {
  const c = summary.currency;
  const num = (cell: ResultCell | undefined) => (typeof cell === 'number' && Number.isFinite(cell) ? cell : null);
  const text = (cell: ResultCell | undefined) => (typeof cell === 'string' ? cell : null);
  const row = (policy: string, criterion: string, pick: PickedSize | null) => {
    if (pick === null) return [policy, criterion, 'none', null, null, null, null, null, null];
    const r = pick.row;
    const irr = num(r.irr);
    const payback = num(r.discounted_payback_years);
    return [policy, criterion, `${numberText(pick.energyMwh, 6)} MWh / ${numberText(pick.powerMw, 6)} MW`, numberText(pick.roundTripEfficiency, 4), num(r.npv), irr === null ? (text(r.irr) ?? null) : `${numberText(100 * irr, 2)} %`, num(r.profit_per_year), payback === null ? (text(r.discounted_payback_years) ?? null) : numberText(payback, 1), num(r.capture_ratio) === null ? null : 100 * (num(r.capture_ratio) as number)];
  };
  return htmlTable({
    caption: 'Size with the highest NPV and with the highest IRR, per policy (perfect foresight: the bound no policy reaches)',
    columns: [
      { header: 'policy' },
      { header: 'highest' },
      { header: 'size' },
      { header: 'efficiency', unit: '-' },
      { header: 'NPV', unit: c, decimals: 0 },
      { header: 'IRR', unit: '%/year' },
      { header: 'profit per year', unit: c, decimals: 0 },
      { header: 'discounted payback', unit: 'years' },
      { header: 'capture ratio', unit: '%', decimals: 1 },
    ],
    rows: summary.best.flatMap((b) => [row(b.policy, 'NPV', b.highestNpv), row(b.policy, 'IRR', b.highestIrr)]),
  });
}
