import { CHART_DEFAULTS, type ChartBase, type LegendEntry, type Quantity } from './chartTypes.js';
import { legendBlock, type PlacedBlock } from './legend.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { INK } from './palette.js';
import { FONT, svgText } from './svgText.js';
import { wrapText } from './textWidth.js';

/** Kinds of chart, written to `data-chart` on the `<svg>`. */
export type ChartKind = 'line' | 'bar' | 'fan' | 'histogram' | 'heat-map' | 'calibration';

/** The plot area inside a chart [px]. */
export interface PlotArea {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

export interface FrameSpec {
  readonly kind: ChartKind;
  readonly base: ChartBase;
  readonly legend: readonly LegendEntry[];
  readonly xTitle: Quantity;
  /** Title of the left y axis, printed above its top end. */
  readonly yTitle?: Quantity;
  /** Title of the right y axis, printed above its top end. */
  readonly y2Title?: Quantity;
  /** A block drawn above the legend (the heat map's colour bar). */
  readonly header?: (x: number, y: number, maxWidth: number) => PlacedBlock;
  /** Default plot height when the caller gives none [px]. */
  readonly defaultPlotHeight?: number;
  /** Default width when the caller gives none [px]. */
  readonly defaultWidth?: number;
}

/** Margins of the plot area [px]: wide enough for tick labels on both sides, equal on every chart so stacked charts line up. */
export const FRAME = Object.freeze({ left: 64, right: 64, pad: 12, titleBaseline: 26, blockTop: 38 });

const ID = /^[a-z][a-z0-9-]*$/;

export interface Frame {
  readonly spec: FrameSpec;
  readonly width: number;
  readonly height: number;
  readonly plot: PlotArea;
  readonly parts: readonly Markup[];
}

/** Lays out title, header block, legend, axis titles and caption around a plot area. */
export function layoutFrame(spec: FrameSpec): Frame {
  const { base } = spec;
  if (!ID.test(base.id)) throw new RangeError(`chart id "${base.id}" must be lower-case letters, digits and hyphens, starting with a letter`);
  const width = base.width ?? spec.defaultWidth ?? CHART_DEFAULTS.width;
  const plotHeight = base.plotHeight ?? spec.defaultPlotHeight ?? CHART_DEFAULTS.plotHeight;
  const inner = width - 2 * FRAME.pad;
  const parts: Markup[] = [svgText(FRAME.pad, FRAME.titleBaseline, base.title, { size: FONT.title, bold: true, cls: 'chart-title' })];
  let y = FRAME.blockTop;
  const header = spec.header?.(FRAME.pad, y, inner);
  if (header !== undefined && header.height > 0) {
    parts.push(header.markup);
    y += header.height + 6;
  }
  const legend = legendBlock(spec.legend, FRAME.pad, y, inner);
  parts.push(legend.markup);
  y += legend.height;
  const axisTitleBaseline = y + 16;
  if (spec.yTitle !== undefined) parts.push(svgText(FRAME.pad, axisTitleBaseline, quantityText(spec.yTitle), { cls: 'axis-title' }));
  if (spec.y2Title !== undefined) parts.push(svgText(width - FRAME.pad, axisTitleBaseline, quantityText(spec.y2Title), { anchor: 'end', cls: 'axis-title' }));
  const plot: PlotArea = { left: FRAME.left, right: width - FRAME.right, top: axisTitleBaseline + 12, bottom: axisTitleBaseline + 12 + plotHeight };
  parts.push(svgText((plot.left + plot.right) / 2, plot.bottom + 38, quantityText(spec.xTitle), { anchor: 'middle', cls: 'axis-title' }));
  const captionLines = wrapText(base.caption, inner, FONT.caption);
  captionLines.forEach((line, i) => parts.push(svgText(FRAME.pad, plot.bottom + 62 + i * 16, line, { size: FONT.caption, fill: INK.muted, cls: 'caption' })));
  const height = plot.bottom + 62 + (captionLines.length - 1) * 16 + 12;
  return { spec, width, height, plot, parts };
}

/** The chart's `<figure>`: frame, axes under the marks, marks clipped to the plot (with room for markers at the edges). */
export function renderChart(frame: Frame, body: { readonly axes: Markup; readonly marks: Markup; readonly overlay?: Markup; readonly defs?: Markup }): Markup {
  const { spec, width, height, plot } = frame;
  const id = spec.base.id;
  const bleed = 8;
  return markup`<figure class="chart-figure">
<svg xmlns="http://www.w3.org/2000/svg" id="${id}" class="chart" data-chart="${spec.kind}" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-labelledby="${id}-title ${id}-desc" font-family="sans-serif">
<title id="${id}-title">${spec.base.title}</title>
<desc id="${id}-desc">${spec.base.caption}</desc>
<defs><clipPath id="${id}-clip"><rect x="${plot.left - bleed}" y="${plot.top - bleed}" width="${plot.right - plot.left + 2 * bleed}" height="${plot.bottom - plot.top + 2 * bleed}"/></clipPath>${body.defs ?? ''}</defs>
<rect class="chart-paper" width="${width}" height="${height}" fill="${INK.paper}"/>
${joinMarkup(frame.parts)}
<g class="axes">${body.axes}</g>
<g class="marks" clip-path="url(#${id}-clip)">${body.marks}</g>
${body.overlay ?? ''}
</svg>
</figure>`;
}

/** `label [unit]`. */
export function quantityText(q: Quantity): string {
  return `${q.label} [${q.unit}]`;
}
