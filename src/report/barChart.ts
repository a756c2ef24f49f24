import { bandAxisX, valueAxisY } from './axes.js';
import { bandScale } from './bandScale.js';
import { layoutFrame, renderChart } from './chartFrame.js';
import type { BandAxis, ChartBase, Guide, LegendEntry, ValueAxis } from './chartTypes.js';
import { guideLines } from './guides.js';
import { linearScale } from './linearScale.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { INK, seriesColour } from './palette.js';
import { tooltip } from './svgText.js';
import { numberText } from './tickLabel.js';

export interface BarSeries {
  readonly name: string;
  /** Value per band [y unit], signed: bars grow up from 0 for positive values, down for negative. null or 0 draws no bar. */
  readonly values: readonly (number | null)[];
  /** Default: the next palette colour (SERIES_COLOURS). */
  readonly colour?: string;
}

export interface BarChartSpec extends ChartBase {
  readonly x: BandAxis;
  /** The y axis always includes 0. */
  readonly y: ValueAxis;
  readonly series: readonly BarSeries[];
  /**
   * `grouped` (default): the series stand side by side in each band. `overlaid`: every series
   * fills the whole band, for series that never both have a value in one band (charge drawn
   * negative, discharge positive).
   */
  readonly layout?: 'grouped' | 'overlaid';
  readonly guides?: readonly Guide[];
}

/** Share of a band covered by bars; the rest is the gap between bands. */
const BAR_FILL = 0.8;

/** Bar chart over a band axis, grouped or signed (overlaid), with a line at 0. */
export function barChart(spec: BarChartSpec): Markup {
  const legend: LegendEntry[] = spec.series.map((s, i) => ({ label: s.name, swatch: { kind: 'bar', colour: s.colour ?? seriesColour(i) } }));
  const frame = layoutFrame({ kind: 'bar', base: spec, legend, xTitle: spec.x.title, yTitle: spec.y });
  const { plot } = frame;
  const guides = spec.guides ?? [];
  const y = linearScale([...spec.series.flatMap((s) => s.values), ...guides.map((g) => g.value)], [plot.bottom, plot.top], { ...spec.y, includeZero: true });
  const x = bandScale(spec.x.bandLabels.length, [plot.left, plot.right]);
  const grouped = (spec.layout ?? 'grouped') === 'grouped';
  const slots = grouped ? Math.max(1, spec.series.length) : 1;
  const barWidth = (x.bandwidth * BAR_FILL) / slots;
  const zero = y.at(0);
  const marks = spec.series.map((s, k) => {
    const colour = s.colour ?? seriesColour(k);
    const bars = s.values.map((v, i) => {
      if (v === null || v === 0 || !Number.isFinite(v) || i >= x.count) return null;
      const left = x.at(i) + (x.bandwidth * (1 - BAR_FILL)) / 2 + (grouped ? k * barWidth : 0);
      const top = Math.min(zero, y.at(v));
      const height = Math.abs(y.at(v) - zero);
      return markup`<rect class="mark bar" x="${left}" y="${top}" width="${barWidth}" height="${height}" fill="${colour}" data-index="${i}">${tooltip(`${s.name}, ${spec.x.bandLabels[i] ?? ''}: ${numberText(v, 3)} ${spec.y.unit}`)}</rect>`;
    });
    return markup`<g class="series" data-series="${s.name}">${bars}</g>`;
  });
  const axes = joinMarkup([bandAxisX(spec.x, x, plot), valueAxisY(y, plot, 'left')]);
  const zeroLine = markup`<line class="zero-line" x1="${plot.left}" y1="${zero}" x2="${plot.right}" y2="${zero}" stroke="${INK.axis}"/>`;
  return renderChart(frame, { axes, marks: joinMarkup(marks), overlay: joinMarkup([zeroLine, guideLines(guides, y, undefined, plot)]) });
}
