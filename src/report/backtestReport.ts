import type { BacktestMetrics } from '../backtest/backtestMetrics.js';
import type { PolicyMetrics } from '../backtest/policyMetrics.js';
import type { BacktestResult, PolicyDay } from '../backtest/runBacktest.js';
import { extrapolationWarning, yearCoverage } from '../economics/yearCoverage.js';
import { formatPValue } from '../io/formatNumber.js';
import { baselineHeadline, edgeSentence } from './edgeText.js';
import { imbalanceDescription } from './imbalanceDescription.js';
import type { BatteryModel, MarketSpec } from '../types.js';
import { barChart } from './barChart.js';
import { categoryAxis } from './categoryAxis.js';
import { dataBinWidth, histogram } from './histogram.js';
import { htmlPage, paragraph, type PageSection } from './htmlPage.js';
import { lineChart } from './lineChart.js';
import type { Markup } from './markup.js';
import { OKABE_ITO, ROLE_COLOURS } from './palette.js';
import { policyStyle } from './policyStyles.js';
import { factList, htmlTable } from './table.js';
import { numberText } from './tickLabel.js';

export interface BacktestReportInput {
  /** runBacktest's result (the ledger is not needed). */
  readonly result: BacktestResult;
  /** backtestMetrics of that result: per policy, the edge test, the months. */
  readonly metrics: BacktestMetrics;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** Input files by role as the user named them, listed in the report. */
  readonly inputs?: Readonly<Record<string, string>>;
}

/** Ids of the charts a backtest report draws for these policies (when every chart has data). */
export function backtestChartIds(policies: readonly string[]): string[] {
  return ['backtest-cumulative', ...policies.map((p) => `backtest-daily-${p}`), 'backtest-acceptance', 'backtest-imbalance-energy', 'backtest-imbalance-cash'];
}

/**
 * The backtest report, `report.html`: a summary; cumulative profit of every policy over the covered
 * days with perfect foresight as the ceiling; the distribution of daily profit per policy; acceptance
 * rates per side; energy and cash at the imbalance price; tables per policy and per month. Every
 * number comes from runBacktest and backtestMetrics, the same as summary.json. Same input, same bytes.
 */
export function backtestReport(input: BacktestReportInput): string {
  const { result, market } = input;
  const currency = market.currency;
  const sections: PageSection[] = [{ id: 'summary', heading: 'Summary', blocks: [factList(summaryFacts(input))] }];
  if (result.days.length === 0) {
    sections.push({ id: 'no-days', heading: 'No covered day', blocks: [paragraph('No day of the span has both a complete history and a complete forecast, so nothing was replayed; see the skipped days in summary.json.')] });
  } else {
    sections.push(
      { id: 'profit', heading: 'Cumulative profit', blocks: [cumulativeChart(input)] },
      { id: 'daily', heading: 'Daily profit', blocks: dailyHistograms(input) },
      { id: 'orders', heading: 'Acceptance and the imbalance price', blocks: [acceptanceChart(input), ...imbalanceCharts(input)] },
      { id: 'policies', heading: 'Policies', blocks: [...policyTables(input), ...edgeTable(input.metrics, currency)] },
      { id: 'months', heading: 'Month by month', blocks: monthTables(input) },
    );
  }
  if (input.inputs !== undefined) {
    sections.push({ id: 'inputs', heading: 'Inputs', blocks: [htmlTable({ columns: [{ header: 'input' }, { header: 'file' }], rows: Object.entries(input.inputs).map(([k, v]) => [k, v]) })] });
  }
  return htmlPage({
    title: `Backtest ${result.from} to ${result.to}`,
    subtitle: `${result.days.length} delivery days covered, ${result.skippedDays.length} skipped; alpha ${numberText(result.alpha, 4)}; unaccepted orders: ${result.unaccepted}; money in ${currency}.`,
    sections,
    footer:
      'Written by quantbid. A backtest replays the policies on past prices: it shows what they would have earned, not what they will earn. Perfect foresight knows the prices in advance and is an upper bound, not a policy one can run. This page is self-contained: it runs no scripts and loads nothing from the network.',
  });
}

function money(x: number | null, currency: string): string {
  return x === null ? '\u2013' : `${numberText(x, 0)} ${currency}`;
}

function percent(x: number | null): string {
  return x === null ? '\u2013' : `${numberText(100 * x, 1)} %`;
}

function summaryFacts(input: BacktestReportInput): [string, string][] {
  const { result, metrics, market, battery } = input;
  const c = market.currency;
  const policies = Object.entries(metrics.policies).map(([name, m]) => `${name} ${money(m.profit, c)}${m.captureRatio === null || name === 'perfect-foresight' ? '' : ` (${percent(m.captureRatio)} of perfect foresight)`}`);
  return [
    ['span', `${result.from} to ${result.to}: ${result.days.length} days covered, ${result.skippedDays.length} skipped`],
    ['battery', `${numberText(battery.energyMwh, 3)} MWh, charge ${numberText(battery.chargeMw, 3)} MW, discharge ${numberText(battery.dischargeMw, 3)} MW, usable ${numberText(battery.socMaxMwh - battery.socMinMwh, 3)} MWh`],
    ['policies', `alpha ${numberText(result.alpha, 4)} for quantile and median; unaccepted orders: ${result.unaccepted}`],
    ['imbalance price', imbalanceDescription(result.imbalanceSource, c)],
    ['profit', policies.join('; ')],
    ...headlineFacts(metrics, c),
    ...deliberateFact(metrics, c),
    ...yearlyFact(result),
  ];
}

/** The warning on the yearly figures of summary.json when they are extrapolated (yearCoverage.ts). */
function yearlyFact(result: BacktestResult): [string, string][] {
  const warning = extrapolationWarning(yearCoverage(result.days.map((day) => day.day)), 'the yearly figures of summary.json (profitPerMwYear, profitPerMwhYear)');
  return warning === null ? [] : [['yearly figures', `Warning: ${warning}.`]];
}

/** The flag on deliberate imbalance (orders the battery could not honour), when there is any. */
function deliberateFact(metrics: BacktestMetrics, currency: string): [string, string][] {
  const flagged = Object.entries(metrics.policies).filter(([, m]) => m.deliberateImbalancePeriods > 0);
  if (flagged.length === 0) return [];
  const who = flagged.map(([name, m]) => `${name} ${numberText(m.deliberateImbalanceMwh, 1)} MWh in ${m.deliberateImbalancePeriods} periods, ${money(m.deliberateImbalanceCash, currency)}`);
  return [['deliberate imbalance', `${who.join('; ')}: orders the battery could not deliver or absorb, settled at the imbalance price. Most markets forbid planning on it: it breaches the balance responsibility (SAFETY.md).`]];
}

/** The tested policy against the strongest simple baseline, first and plainly. */
function headlineFacts(metrics: BacktestMetrics, currency: string): [string, string][] {
  if (metrics.tested === null) return [];
  const headline = baselineHeadline(metrics, currency, numberText);
  if (headline === null) return [[`${metrics.tested} against a simple baseline`, 'not tested: neither point nor price-taking was run beside it']];
  return [[`${metrics.tested} against the strongest simple baseline`, `${headline.verdict}. ${headline.test}.`]];
}

/** The tested policy against every other one, as in summary.json's `edges`. */
function edgeTable(metrics: BacktestMetrics, currency: string): Markup[] {
  if (metrics.tested === null || metrics.edges.length === 0) return [];
  return [
    htmlTable({
      caption: `${metrics.tested} against every other policy: mean daily profit difference and the Diebold-Mariano test with the Harvey-Leybourne-Newbold correction (one-sided p-values; small: that side earns more)`,
      columns: [
        { header: 'against' },
        { header: `${metrics.tested} minus it`, unit: `${currency}/day`, decimals: 2 },
        { header: 'HLN statistic', unit: '-', decimals: 3 },
        { header: `p, ${metrics.tested} earns more` },
        { header: 'p, it earns more' },
        { header: 'reading' },
      ],
      rows: metrics.edges.map((e) => [
        e.reference,
        e.meanDifference,
        e.status === 'ok' ? e.hln : null,
        e.status === 'ok' ? formatPValue(e.pValueTestedEarnsMore) : null,
        e.status === 'ok' ? formatPValue(e.pValueReferenceEarnsMore) : null,
        edgeSentence(e, currency, numberText),
      ]),
    }),
  ];
}

function runsOf(result: BacktestResult, k: number): PolicyDay[] {
  return result.days.map((day) => day.runs[k] as PolicyDay);
}

function cumulativeChart(input: BacktestReportInput): Markup {
  const { result, market } = input;
  const days = result.days.map((d) => d.day);
  const series = result.policies.map((policy, k) => {
    let sum = 0;
    const values = [0, ...runsOf(result, k).map((run) => (sum += run.totals.profit))];
    const style = policyStyle(policy);
    return { name: style.label, values, colour: style.colour, dash: style.dash, position: 'boundary' as const };
  });
  const ceiling = result.policies.includes('perfect-foresight') ? ' Dashed black: perfect foresight, the most any policy could have earned on these days.' : '';
  return lineChart({
    id: 'backtest-cumulative',
    title: 'Cumulative profit per policy',
    caption: `Profit summed from 0 before the first covered day to the end of each day; steeper is better.${ceiling}${result.skippedDays.length > 0 ? ' Skipped days are left out of the axis.' : ''}`,
    x: categoryAxis(days, { label: 'delivery day', unit: 'YYYY-MM-DD' }),
    y: { label: 'cumulative profit', unit: market.currency, includeZero: true },
    series,
  });
}

/** One histogram per policy over the same bins and x range, so that their shapes compare. */
function dailyHistograms(input: BacktestReportInput): Markup[] {
  const { result, metrics, market } = input;
  const profits = result.policies.map((_, k) => runsOf(result, k).map((run) => run.totals.profit));
  const all = profits.flat();
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  // One width for every policy, chosen from all their daily profits together (Freedman-Diaconis).
  const binWidth = dataBinWidth(all);
  const min = Math.floor(lo / binWidth + 1e-9) * binWidth;
  const max = Math.max(min + binWidth, Math.ceil(hi / binWidth - 1e-9) * binWidth);
  return result.policies.map((policy, k) => {
    const m = metrics.policies[policy] as PolicyMetrics;
    const style = policyStyle(policy);
    const markers = [
      ...(m.meanDailyProfit === null ? [] : [{ value: m.meanDailyProfit, label: `mean ${numberText(m.meanDailyProfit, 0)}` }]),
      ...(m.worstDay5Percent === null ? [] : [{ value: m.worstDay5Percent, label: `5 % worst day ${numberText(m.worstDay5Percent, 0)}` }]),
    ];
    return histogram({
      id: `backtest-daily-${policy}`,
      title: `Daily profit, ${style.label}`,
      caption: `Bars: number of days whose profit falls in each ${numberText(binWidth, 6)} ${market.currency} bin (the width chosen from the data by the Freedman-Diaconis rule, 2 IQR n^(\u22121/3), rounded to a 1-2-5 step; the same bins for every policy); dashed: the mean day and the 5 % quantile (the worst day in 20).`,
      values: profits[k] as number[],
      binWidth,
      x: { label: 'profit of a day', unit: market.currency, min, max },
      y: { label: 'days', unit: 'count' },
      name: `days, ${style.label}`,
      colour: style.colour,
      plotHeight: 120,
      markers,
    });
  });
}

function acceptanceChart(input: BacktestReportInput): Markup {
  const { result, metrics } = input;
  const rates = result.policies.map((p) => metrics.policies[p] as PolicyMetrics);
  if (rates.every((m) => m.buys + m.sells === 0)) return paragraph('No policy placed an order, so there is no acceptance rate to show.');
  const share = (x: number | null) => (x === null ? null : 100 * x);
  return barChart({
    id: 'backtest-acceptance',
    title: 'Acceptance rate of the orders, per side and policy',
    caption: 'Share of orders the auction accepted: a buy when the clearing price is at or below its limit, a sell at or above it. Price-taking and perfect-foresight orders are accepted by construction.',
    x: categoryAxis(result.policies.map((p) => policyStyle(p).label), { label: 'policy', unit: '-' }),
    y: { label: 'orders accepted', unit: '%', min: 0, max: 100 },
    plotHeight: 180,
    series: [
      { name: 'buy orders', values: rates.map((m) => share(m.buyAcceptanceRate)), colour: ROLE_COLOURS.buy },
      { name: 'sell orders', values: rates.map((m) => share(m.sellAcceptanceRate)), colour: ROLE_COLOURS.sell },
    ],
  });
}

function imbalanceCharts(input: BacktestReportInput): Markup[] {
  const { result, metrics, market } = input;
  const m = result.policies.map((p) => metrics.policies[p] as PolicyMetrics);
  const x = categoryAxis(result.policies.map((p) => policyStyle(p).label), { label: 'policy', unit: '-' });
  if (m.every((p) => p.boughtImbalanceMwh === 0 && p.soldImbalanceMwh === 0 && p.imbalanceCash === 0)) {
    return [paragraph('No energy was settled at the imbalance price: every policy moved only energy the auction accepted.')];
  }
  const rule = result.unaccepted === 'follow-plan' ? 'the battery ran its plan anyway, so unaccepted orders were bought or sold at the imbalance price' : 'the battery moved only with accepted orders; what it could not deliver or absorb was bought or sold back at the imbalance price';
  const deliberate = m.some((p) => p.deliberateImbalanceMwh > 0);
  return [
    barChart({
      id: 'backtest-imbalance-energy',
      title: 'Energy settled at the imbalance price, per policy',
      caption: `Energy bought and sold at the imbalance (balancing) price instead of the auction over all covered days (${result.unaccepted}: ${rule}).${deliberate ? ' Deliberate imbalance: the part of it the store could not deliver or absorb, orders the battery could not honour (SAFETY.md: most markets forbid planning on it).' : ''}`,
      x,
      y: { label: 'energy at the imbalance price', unit: 'MWh' },
      plotHeight: 180,
      series: [
        { name: 'bought at the imbalance price', values: m.map((p) => p.boughtImbalanceMwh), colour: ROLE_COLOURS.buy },
        { name: 'sold at the imbalance price', values: m.map((p) => p.soldImbalanceMwh), colour: ROLE_COLOURS.sell },
        ...(deliberate ? [{ name: 'of it deliberate imbalance', values: m.map((p) => p.deliberateImbalanceMwh), colour: OKABE_ITO.reddishPurple }] : []),
      ],
    }),
    barChart({
      id: 'backtest-imbalance-cash',
      title: 'Gross imbalance cash and the cost of imbalance against the clearing price, per policy',
      caption:
        'Gross imbalance cash: the whole price of the energy above, + received, \u2212 paid; it is part of the profit, but its size mostly says how much energy went through the imbalance price, not what that cost. Cost of imbalance against the clearing price: (imbalance price \u2212 clearing price) \u00d7 MWh bought at the imbalance price, minus the same for MWh sold at it, summed: what closing that energy at the imbalance price instead of the clearing price took from the profit; above zero it cost the policy money, below zero it earned.',
      x,
      y: { label: 'cash', unit: market.currency },
      plotHeight: 180,
      series: [
        { name: 'gross imbalance cash (+ received)', values: m.map((p) => p.imbalanceCash), colour: OKABE_ITO.blue },
        { name: 'cost of imbalance against the clearing price (+ cost)', values: m.map((p) => p.imbalanceCostVsClearing), colour: OKABE_ITO.orange },
      ],
    }),
  ];
}

function policyTables(input: BacktestReportInput): Markup[] {
  const { result, metrics, market } = input;
  const c = market.currency;
  const rows = result.policies.map((p) => [p, metrics.policies[p] as PolicyMetrics] as const);
  const pct = (x: number | null) => (x === null ? null : 100 * x);
  return [
    htmlTable({
      caption: 'Profit and risk per policy (as in summary.json)',
      columns: [
        { header: 'policy' },
        { header: 'profit', unit: c, decimals: 0 },
        { header: 'per day', unit: c, decimals: 0 },
        { header: 'capture ratio', unit: '%', decimals: 1 },
        { header: '5 % worst day', unit: c, decimals: 0 },
        { header: 'max drawdown', unit: c, decimals: 0 },
        { header: 'full cycles, total', unit: '-', decimals: 1 },
        { header: 'full cycles per day', unit: '1/day', decimals: 2 },
      ],
      rows: rows.map(([p, m]) => [p, m.profit, m.meanDailyProfit, pct(m.captureRatio), m.worstDay5Percent, m.maxDrawdown, m.cyclesTotal, m.cyclesPerDay]),
    }),
    htmlTable({
      caption: 'Orders and the imbalance price per policy',
      columns: [
        { header: 'policy' },
        { header: 'buys accepted', unit: '%', decimals: 1 },
        { header: 'sells accepted', unit: '%', decimals: 1 },
        { header: 'bought at imbalance price', unit: 'MWh', decimals: 1 },
        { header: 'sold at imbalance price', unit: 'MWh', decimals: 1 },
        { header: 'gross imbalance cash', unit: c, decimals: 0 },
        { header: 'imbalance cost vs clearing', unit: c, decimals: 0 },
        { header: 'deliberate imbalance', unit: 'MWh', decimals: 1 },
        { header: 'deliberate imbalance periods' },
        { header: 'days without plan' },
      ],
      rows: rows.map(([p, m]) => [
        p, pct(m.buyAcceptanceRate), pct(m.sellAcceptanceRate), m.boughtImbalanceMwh, m.soldImbalanceMwh, m.imbalanceCash, m.imbalanceCostVsClearing,
        m.deliberateImbalanceMwh, m.deliberateImbalancePeriods, m.daysWithoutPlan,
      ]),
    }),
  ];
}

function monthTables(input: BacktestReportInput): Markup[] {
  const { result, metrics, market } = input;
  const c = market.currency;
  const cell = (row: (typeof metrics.months)[number], p: string) => row.policies[p];
  const tables = [
    htmlTable({
      caption: `Profit by calendar month [${c}]`,
      columns: [{ header: 'month' }, { header: 'days' }, ...result.policies.map((p) => ({ header: p, unit: c, decimals: 0 }))],
      rows: [
        ...metrics.months.map((row) => [row.month, row.days, ...result.policies.map((p) => cell(row, p)?.profit ?? null)]),
        ['all', result.days.length, ...result.policies.map((p) => metrics.policies[p]?.profit ?? null)],
      ],
    }),
  ];
  const captured = result.policies.filter((p) => p !== 'perfect-foresight');
  if (result.policies.includes('perfect-foresight') && captured.length > 0) {
    const pct = (x: number | null | undefined) => (x === null || x === undefined ? null : 100 * x);
    tables.push(
      htmlTable({
        caption: 'Capture ratio by calendar month: profit / perfect-foresight profit [%]',
        columns: [{ header: 'month' }, ...captured.map((p) => ({ header: p, unit: '%', decimals: 1 }))],
        rows: [
          ...metrics.months.map((row) => [row.month, ...captured.map((p) => pct(cell(row, p)?.captureRatio))]),
          ['all', ...captured.map((p) => pct(metrics.policies[p]?.captureRatio))],
        ],
      }),
    );
  }
  return tables;
}
