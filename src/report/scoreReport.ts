import type { ForecastComparison } from '../forecast/scoring/compareForecasts.js';
import { formatPValue } from '../io/formatNumber.js';
import type { ScoreTable } from '../forecast/scoring/scoreForecasts.js';
import { barChart } from './barChart.js';
import { calibrationPlot } from './calibrationPlot.js';
import { categoryAxis } from './categoryAxis.js';
import { clockAxis } from './clockAxis.js';
import { htmlPage, type PageSection } from './htmlPage.js';
import { lineChart, type LineSeries } from './lineChart.js';
import type { Markup } from './markup.js';
import { OKABE_ITO } from './palette.js';
import { factList, htmlTable } from './table.js';
import { numberText } from './tickLabel.js';

/** A forecast day that was not scored, and why. */
export interface UnscoredDay {
  readonly day: string;
  readonly reason: string;
}

/** A scored forecast: what score.json (app/score/scoreSummary.ts) and the score report show. */
export interface ScoreSummaryInput {
  readonly inputs: Readonly<Record<string, string>>;
  readonly currency: string;
  readonly table: ScoreTable;
  /** Scored days, in time order. */
  readonly days: readonly string[];
  readonly unscored: readonly UnscoredDay[];
  /** The --against comparison, or null. */
  readonly comparison: ForecastComparison | null;
}

export interface ScoreReportInput extends ScoreSummaryInput {
  /** The market's IANA zone, named on the period-of-the-day axis. */
  readonly timeZone: string;
  /** Length of a delivery period [min]. */
  readonly periodMinutes: number;
}

export const SCORE_CHART_IDS = Object.freeze(['score-calibration', 'score-pinball-level', 'score-pinball-period'] as const);

/** Significance level at which per-period rejections are counted [-] (as in score.json). */
const TEST_LEVEL = 0.05;

/**
 * The forecast-score report, `report.html`: a calibration chart (each level against the share of
 * realised prices below its quantile), the pinball loss per level and per period of the day, and the
 * coverage of the central intervals with their tests. The numbers are those of score.json (the same
 * ScoreTable). Same input, same bytes.
 */
export function scoreReport(input: ScoreReportInput): string {
  const { table, days, currency } = input;
  const sections: PageSection[] = [
    { id: 'summary', heading: 'Summary', blocks: [factList(summaryFacts(input))] },
    { id: 'calibration', heading: 'Calibration', blocks: [calibrationChart(input), levelTable(input)] },
    { id: 'pinball', heading: 'Pinball loss', blocks: [pinballByLevel(input), pinballByPeriod(input)] },
    { id: 'coverage', heading: 'Central intervals', blocks: [coverageTable(input)] },
    { id: 'inputs', heading: 'Inputs', blocks: [htmlTable({ columns: [{ header: 'input' }, { header: 'file' }], rows: Object.entries(input.inputs).map(([k, v]) => [k, v]) })] },
  ];
  return htmlPage({
    title: `Forecast score ${days[0] ?? ''} to ${days[days.length - 1] ?? ''}`,
    subtitle: `${days.length} days, ${table.overall.count} delivery periods scored at ${table.levels.length} quantile levels; losses in ${currency}/MWh.`,
    sections,
    footer: 'Written by quantbid. Scores compare the forecast with the realised clearing prices of the history. This page is self-contained: it runs no scripts and loads nothing from the network.',
  });
}

function summaryFacts(input: ScoreReportInput): [string, string][] {
  const { table, days, currency, comparison } = input;
  const unit = `${currency}/MWh`;
  const facts: [string, string][] = [
    ['days scored', `${days.length} (${days[0] ?? '\u2013'} to ${days[days.length - 1] ?? '\u2013'}); ${input.unscored.length} forecast days not scored`],
    ['periods scored', String(table.overall.count)],
    ['levels', table.levels.map((l) => numberText(l, 4)).join(', ')],
    ['crps', `${numberText(table.overall.crps, 4)} ${unit}: the mean pinball loss over the levels and every period, each period counting once (about CRPS / 2)`],
  ];
  if (comparison !== null) {
    const t = comparison.test;
    facts.push([
      'against the second forecast',
      `its crps ${numberText(comparison.lossSecond, 4)} ${unit}, this forecast's ${numberText(comparison.lossFirst, 4)} ${unit}, on ${comparison.days} common days: ${comparison.lossFirst < comparison.lossSecond ? 'this forecast is better' : comparison.lossFirst > comparison.lossSecond ? 'the second forecast is better' : 'neither is better'} (lower crps); ` +
        (t.status === 'ok' ? `Diebold-Mariano (HLN) ${numberText(t.hln, 3)}, two-sided p = ${formatPValue(t.pValueTwoSided)}` : `Diebold-Mariano not defined: ${t.reason}`),
    ]);
  }
  return facts;
}

function calibrationChart(input: ScoreReportInput): Markup {
  const { table } = input;
  return calibrationPlot({
    id: 'score-calibration',
    title: 'Calibration: nominal level against observed share below',
    caption: `Each dot: a quantile level against the share of the ${table.overall.count} realised prices below that quantile. On the dashed diagonal the forecast is calibrated; above it the quantile is too high, below it too low.`,
    y: { label: 'observed share of prices below the quantile', unit: '-' },
    series: [{ name: 'forecast', nominal: table.levels, observed: table.overall.belowShare, colour: OKABE_ITO.blue }],
  });
}

function levelTable(input: ScoreReportInput): Markup {
  const { table, currency } = input;
  return htmlTable({
    caption: 'Per level: share of realised prices below the quantile and mean pinball loss',
    columns: [
      { header: 'level \u03c4', unit: '-' },
      { header: 'share below', unit: '-', decimals: 4 },
      { header: 'share \u2212 \u03c4', unit: '-', decimals: 4 },
      { header: 'pinball loss', unit: `${currency}/MWh`, decimals: 4 },
    ],
    rows: table.levels.map((tau, k) => {
      const below = table.overall.belowShare[k] ?? null;
      return [numberText(tau, 4), below, below === null ? null : below - tau, table.overall.pinball[k] ?? null];
    }),
  });
}

function pinballByLevel(input: ScoreReportInput): Markup {
  const { table, currency } = input;
  return barChart({
    id: 'score-pinball-level',
    title: 'Pinball loss by quantile level',
    caption: 'Bars: mean pinball loss of each level over every scored period, lower is better; outer levels lose less by construction. Dashed: the mean over the levels (crps).',
    x: categoryAxis(table.levels.map((l) => numberText(l, 4)), { label: 'quantile level \u03c4', unit: '-' }),
    y: { label: 'mean pinball loss', unit: `${currency}/MWh` },
    plotHeight: 180,
    series: [{ name: 'pinball loss', values: table.overall.pinball, colour: OKABE_ITO.blue }],
    guides: [{ value: table.overall.crps, label: `mean over the levels (crps) ${numberText(table.overall.crps, 3)}` }],
  });
}

function pinballByPeriod(input: ScoreReportInput): Markup {
  const { table, currency } = input;
  const slots = table.bySlot;
  const median = table.levels.findIndex((l) => Math.abs(l - 0.5) < 1e-9);
  const series: LineSeries[] = [{ name: 'mean over the levels (crps)', values: slots.map((s) => (s.count > 0 ? s.crps : null)), colour: OKABE_ITO.blue }];
  if (median >= 0) series.push({ name: 'median (level 0.5)', values: slots.map((s) => (s.count > 0 ? (s.pinball[median] ?? null) : null)), colour: OKABE_ITO.orange, dash: true });
  return lineChart({
    id: 'score-pinball-period',
    title: 'Pinball loss by period of the day',
    caption: `Mean pinball loss of the forecasts of each period of the day over the ${input.days.length} scored days, lower is better; high values show the hours the forecast finds hard.`,
    x: clockAxis(slots.map((s) => s.slotStart), input.periodMinutes, input.timeZone),
    y: { label: 'mean pinball loss', unit: `${currency}/MWh`, includeZero: true },
    plotHeight: 200,
    series,
  });
}

function coverageTable(input: ScoreReportInput): Markup {
  const { table } = input;
  const slots = table.bySlot.filter((s) => s.count > 0);
  const rejected = (i: number, pValue: (c: NonNullable<(typeof slots)[number]['coverage'][number]>) => number | undefined) =>
    slots.filter((s) => {
      const c = s.coverage[i];
      const p = c === undefined ? undefined : pValue(c);
      return p !== undefined && p < TEST_LEVEL;
    }).length;
  return htmlTable({
    caption: `Central intervals [q(\u03c4), q(1 \u2212 \u03c4)]: observed coverage and tests; per-period counts are of the ${slots.length} periods of the day rejecting at 5 %`,
    columns: [
      { header: 'interval', unit: '%' },
      { header: 'levels' },
      { header: 'observed', unit: '%', decimals: 2 },
      { header: 'outside' },
      { header: 'Kupiec p', unit: '-', decimals: 4 },
      { header: 'periods rejected, Kupiec' },
      { header: 'periods rejected, Christoffersen' },
    ],
    rows: table.overall.coverage.map((c, i) => [
      numberText(100 * c.nominal, 2),
      `q${numberText(c.lower, 4)}\u2013q${numberText(c.upper, 4)}`,
      100 * c.observed,
      c.failures,
      c.kupiec?.pValue ?? null,
      rejected(i, (x) => x.kupiec?.pValue),
      rejected(i, (x) => x.christoffersen?.pValueConditionalCoverage),
    ]),
  });
}
