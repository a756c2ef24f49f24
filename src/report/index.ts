/**
 * quantbid's report module: self-contained HTML pages with inline SVG charts. No charting library,
 * no scripts, no network: every function is pure (data in, escaped markup out) and deterministic
 * (same data, same bytes; coordinates rounded to 1/100 px).
 *
 * API
 *
 * Page
 * - `htmlPage({ title, subtitle?, sections: [{ id, heading, blocks }], footer? })` -> the HTML text.
 *   Blocks are `Markup`: charts, `htmlTable`, `factList`, `paragraph`. Inline CSS with a print
 *   style sheet, a Content-Security-Policy that forbids every fetch (REPORT_CSP).
 * - `htmlTable({ caption?, columns: [{ header, unit?, decimals? }], rows })`, `factList([[term, value]])`,
 *   `paragraph(text)`: all text is escaped.
 * - `markup` tagged template and `Markup`: the only way text reaches a page; strings are escaped,
 *   numbers rounded (`coord`). Use it to compose new blocks.
 *
 * Axes (x of line, bar, fan charts; both axes of heat maps)
 * - `periodAxis(periods, timeZone)`: one band per delivery period, ticks in local clock time read
 *   from the ISO strings (clock-change days correct), labelled every 1, 2, 3, 4, 6 or 12 hours,
 *   whichever fits.
 * - `categoryAxis(labels, { label, unit })`: days, parameter values; labels thinned 1-2-5.
 * - value axes are `{ label, unit, min?, max?, includeZero? }`: nice ticks on the 1-2-5 ladder
 *   (`niceTicks`; [0, 97] gives 0, 20, ..., 100).
 *
 * Charts: each takes `{ id, title, caption, width? = 960, plotHeight? = 240, ... }` and returns a
 * `<figure>` with one `<svg id=id data-chart=kind>`; data marks carry `class="mark"` (browser tests
 * count them) and a `<title>` tooltip. Charts of the same width have the same plot margins, so
 * charts stacked over the same periods line up.
 * - `lineChart({ x: BandAxis | { kind: 'linear', label, unit, values }, y, y2?, series: [{ name, values,
 *   colour?, dash?, axis?: 'left' | 'right', points?, marker?: { shape, size? }, position?: 'centre' | 'boundary' }], guides? })`
 * - `barChart({ x: BandAxis, y, series: [{ name, values, colour? }], layout?: 'grouped' | 'overlaid', guides? })`;
 *   signed values grow down from 0 (charge negative, discharge positive).
 * - `fanChart({ x: BandAxis, y, bands: [{ lowerLevel, upperLevel, lower, upper }] widest first,
 *   median?, markers?: [{ name, values, shape, colour }] })`
 * - `histogram({ values, x, y, binWidth?, markers? })`, bins [k w, (k + 1) w) (`histogramBins`).
 * - `heatMap({ x: BandAxis, y: BandAxis, values[row][column], value: { label, unit }, best?: 'max' | 'min' })`
 * - `calibrationPlot({ series: [{ name, nominal, observed, low?, high? }] })`, square, with the diagonal.
 *
 * Colours: `OKABE_ITO` (Okabe and Ito 2008) for series and meanings (`ROLE_COLOURS`: buy, sell,
 * forecast), `sequentialColour(t)` over our own viridis-like `SEQUENTIAL_STOPS` for heat maps.
 *
 * Pages (report.html of each command): `planReport`, `backtestReport`, `sweepReport`, `sizeReport`,
 * `scoreReport`. Policies keep one colour on every page (`POLICY_STYLES`); `clockAxis` is the axis of
 * the periods of a day by clock time (scores pooled over days).
 *
 * Testing a page in a browser: test/report/browser.ts, `expectReportRendersCleanly(htmlPath, chartIds, name)`.
 */

// page
export { htmlPage, paragraph, REPORT_CSP, type PageSection, type PageSpec } from './htmlPage.js';
export { factList, htmlTable, type TableColumn, type TableSpec } from './table.js';
export { coord, escapeText, joinMarkup, Markup, markup, type MarkupValue } from './markup.js';

// axes and scales
export { categoryAxis } from './categoryAxis.js';
export { localTime, periodAxis, PERIOD_TICK_HOURS, type PeriodBounds } from './periodAxis.js';
export { alignedTicks, niceTicks, type NiceTicks } from './niceTicks.js';
export { linearScale, SCALE_DEFAULTS, type LinearScale, type ScaleOptions } from './linearScale.js';
export { numberText, tickLabel, tickLabels } from './tickLabel.js';

// charts
export { CHART_DEFAULTS } from './chartTypes.js';
export type { BandAxis, BandTick, ChartBase, Guide, LegendEntry, LegendSwatch, MarkerShape, NumberAxis, Quantity, ValueAxis } from './chartTypes.js';
export { lineChart, type LineChartSpec, type LineSeries } from './lineChart.js';
export { barChart, type BarChartSpec, type BarSeries } from './barChart.js';
export { fanChart, intervalLabel, type FanBand, type FanChartSpec, type FanMarkers } from './fanChart.js';
export { histogram, histogramBins, HISTOGRAM_DEFAULTS, type Bin, type HistogramMarker, type HistogramSpec } from './histogram.js';
export { bestCell, heatMap, type HeatMapSpec } from './heatMap.js';
export { calibrationPlot, CALIBRATION_DEFAULTS, type CalibrationSeries, type CalibrationSpec } from './calibrationPlot.js';

// colours
export { INK, OKABE_ITO, ROLE_COLOURS, SERIES_COLOURS, seriesColour } from './palette.js';
export { SEQUENTIAL_STOPS, sequentialColour } from './sequentialPalette.js';
export { contrastRatio, relativeLuminance } from './colour.js';

// pages
export { FAN_LEVEL_PAIRS, fanBands, planReport, type OptimalPlan, type PlanReportInput } from './planReport.js';
export { backtestChartIds, backtestReport, type BacktestReportInput } from './backtestReport.js';
export { alphaCurves, bestIndex, curveChartId, sweepReport, SWEEP_REPORT_TOP, topSettings, type AlphaCurve, type SweepReportInput } from './sweepReport.js';
export type { GridSummaryHead, PickedSize, ResultCell, SettingResult, SizeReportSummary, SweepReportSummary } from './gridReportInput.js';
export { sizeChartIds, sizeGrid, sizeReport, type SizeGrid, type SizeReportInput } from './sizeReport.js';
export { SCORE_CHART_IDS, scoreReport, type ScoreReportInput, type ScoreSummaryInput, type UnscoredDay } from './scoreReport.js';
export { POLICY_STYLES, policyStyle, type PolicyStyle } from './policyStyles.js';
export { clockAxis } from './clockAxis.js';
