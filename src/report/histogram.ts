import { valueAxisX, valueAxisY } from './axes.js';
import { layoutFrame, renderChart } from './chartFrame.js';
import type { ChartBase, LegendEntry, Quantity, ValueAxis } from './chartTypes.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { niceTicks } from './niceTicks.js';
import { linearScale } from './linearScale.js';
import { INK, seriesColour } from './palette.js';
import { FONT, svgText, tooltip } from './svgText.js';
import { numberText } from './tickLabel.js';
import { quantileSorted } from '../stats/quantileSorted.js';

/** A vertical reference line on a histogram, e.g. the mean or 0. */
export interface HistogramMarker {
  readonly value: number;
  readonly label: string;
}

export interface HistogramSpec extends ChartBase {
  /** The observations; non-finite values are left out. */
  readonly values: readonly number[];
  /** What was observed, e.g. { label: 'daily profit', unit: 'HLV' }. */
  readonly x: ValueAxis;
  /** What a bar counts, e.g. { label: 'days', unit: 'count' }. */
  readonly y: Quantity;
  /** Width of a bin [x unit]. Default: from the data (dataBinWidth, Freedman-Diaconis). */
  readonly binWidth?: number;
  readonly colour?: string;
  /** Name of the bars in the legend. Default: the y label. */
  readonly name?: string;
  readonly markers?: readonly HistogramMarker[];
}

/** One bin [from, to): observations v with from <= v < to (the last bin also takes v = to). */
export interface Bin {
  readonly from: number;
  readonly to: number;
  readonly count: number;
}

export const HISTOGRAM_DEFAULTS = Object.freeze({ binTarget: 20, maxBins: 50 });

/**
 * A bin width chosen from the data: the Freedman-Diaconis rule h = 2 IQR n^(-1/3) (D. Freedman and
 * P. Diaconis 1981, "On the histogram as a density estimator: L2 theory", Z. Wahrscheinlichkeitstheorie
 * verw. Gebiete 57, 453-476), robust to the long tails daily profits have; the quartiles by Hyndman and
 * Fan's definition 7 (stats/quantileSorted.ts). When the quartiles coincide (IQR 0), Sturges' rule
 * range / (ceil(log2 n) + 1) (H. A. Sturges 1926, J. Am. Stat. Assoc. 21(153), 65-66). At most
 * `maxBins` bins over the range. The width is then moved to the nearest step of the 1-2-5 ladder (in
 * ratio), so that bin edges read as round numbers.
 *
 * Example: 1, 2, ..., 100: IQR = 75.25 - 25.75 = 49.5, h = 2 x 49.5 / 100^(1/3) = 21.33, nearest
 * ladder step 20.
 */
export function dataBinWidth(values: readonly number[], maxBins: number = HISTOGRAM_DEFAULTS.maxBins): number {
  const sorted = values.filter(Number.isFinite).sort((a, b) => a - b);
  const n = sorted.length;
  if (n === 0) return 1;
  const range = (sorted[n - 1] as number) - (sorted[0] as number);
  if (!(range > 0)) return niceTicks(sorted[0] as number, sorted[0] as number, 1).step;
  const iqr = quantileSorted(sorted, 0.75) - quantileSorted(sorted, 0.25);
  const rule = iqr > 0 ? (2 * iqr) / Math.cbrt(n) : range / (Math.ceil(Math.log2(n)) + 1);
  return nearestLadderStep(Math.max(rule, range / maxBins));
}

/** The step of the 1-2-5 ladder nearest to `width` in ratio (|log(step / width)| smallest; the larger on a tie). */
export function nearestLadderStep(width: number): number {
  const above = niceTicks(0, width, 1).step;
  const mantissa = Math.round(above / 10 ** Math.floor(Math.log10(above) + 1e-9));
  const below = mantissa === 5 ? (above * 2) / 5 : above / 2;
  return Math.log(above / width) <= Math.log(width / below) ? above : below;
}

/**
 * Bins of equal width starting at a multiple of the width: [k w, (k + 1) w). Each observation is
 * counted once; the largest observation, when it falls on the upper edge, goes to the last bin.
 */
export function histogramBins(values: readonly number[], binWidth?: number): Bin[] {
  const finite = values.filter(Number.isFinite);
  if (finite.length === 0) return [];
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const width = binWidth ?? dataBinWidth(finite);
  if (!(width > 0)) throw new RangeError(`bin width must be > 0, got ${width}`);
  const first = Math.floor(lo / width + 1e-9);
  const count = Math.max(1, Math.ceil(hi / width - 1e-9) - first);
  const bins = Array.from({ length: count }, (_, k) => ({ from: roundLike((first + k) * width, width), to: roundLike((first + k + 1) * width, width), count: 0 }));
  for (const v of finite) {
    const k = Math.min(count - 1, Math.max(0, Math.floor(v / width + 1e-9) - first));
    (bins[k] as { count: number }).count += 1;
  }
  return bins;
}

/** Histogram of observations with equal-width bins and optional vertical reference lines. */
export function histogram(spec: HistogramSpec): Markup {
  const colour = spec.colour ?? seriesColour(0);
  const markers = spec.markers ?? [];
  const legend: LegendEntry[] = [{ label: spec.name ?? spec.y.label, swatch: { kind: 'bar', colour } }];
  const frame = layoutFrame({ kind: 'histogram', base: spec, legend, xTitle: spec.x, yTitle: spec.y });
  const { plot } = frame;
  const bins = histogramBins(spec.values, spec.binWidth);
  const edges = bins.flatMap((b) => [b.from, b.to]);
  const x = linearScale([...edges, ...markers.map((m) => m.value)], [plot.left, plot.right], { ...spec.x, tickTarget: Math.max(2, Math.floor((plot.right - plot.left) / 90)) });
  const y = linearScale(bins.map((b) => b.count), [plot.bottom, plot.top], { includeZero: true });
  const bars = bins.map((b) =>
    b.count === 0
      ? null
      : markup`<rect class="mark bar" x="${x.at(b.from)}" y="${y.at(b.count)}" width="${x.at(b.to) - x.at(b.from)}" height="${y.at(0) - y.at(b.count)}" fill="${colour}" stroke="${INK.paper}" stroke-width="0.5" data-count="${b.count}">${tooltip(
          `${numberText(b.from, 6)} to ${numberText(b.to, 6)} ${spec.x.unit}: ${b.count} ${spec.y.label}`,
        )}</rect>`,
  );
  // Labels step down one line per marker so that markers close together keep readable labels.
  const lines = markers.map(
    (m, k) =>
      markup`<g class="guide"><line x1="${x.at(m.value)}" y1="${plot.top}" x2="${x.at(m.value)}" y2="${plot.bottom}" stroke="${INK.text}" stroke-dasharray="6 4"/>${svgText(x.at(m.value) + 4, plot.top + 10 + 13 * k, m.label, { size: FONT.value, halo: true, cls: 'guide-label' })}</g>`,
  );
  const axes = joinMarkup([valueAxisX(x, plot), valueAxisY(y, plot, 'left')]);
  return renderChart(frame, { axes, marks: joinMarkup(bars), overlay: joinMarkup(lines) });
}

/** Rounds a bin edge to the decimals of the width, so 0.1 * 3 prints as 0.3. */
function roundLike(value: number, width: number): number {
  const decimals = Math.max(0, Math.ceil(-Math.log10(width)) + 2);
  return Number(value.toFixed(Math.min(12, decimals)));
}
