import { formatNumber } from '../io/formatNumber.js';
import { bandAxisX, bandAxisY } from './axes.js';
import { bandScale } from './bandScale.js';
import { layoutFrame, quantityText, renderChart } from './chartFrame.js';
import type { BandAxis, ChartBase, LegendEntry, Quantity } from './chartTypes.js';
import { contrastRatio } from './colour.js';
import type { PlacedBlock } from './legend.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { niceTicks } from './niceTicks.js';
import { INK, OKABE_ITO } from './palette.js';
import { SEQUENTIAL_STOPS, sequentialColour } from './sequentialPalette.js';
import { FONT, svgText, tooltip } from './svgText.js';
import { numberText, tickLabels } from './tickLabel.js';
import { textWidth } from './textWidth.js';

export interface HeatMapSpec extends ChartBase {
  /** Columns, e.g. energy settings. */
  readonly x: BandAxis;
  /** Rows, e.g. power settings; row 0 is drawn at the bottom. */
  readonly y: BandAxis;
  /** values[row][column] [value unit]; null marks a cell without a result. */
  readonly values: readonly (readonly (number | null)[])[];
  /** What the colour shows, e.g. { label: 'profit', unit: 'HLV/year' }. */
  readonly value: Quantity;
  /** Outline the cell with the highest (`max`) or lowest (`min`) value; ties go to the first in row order. Default: none. */
  readonly best?: 'max' | 'min';
  /** Print each value in its cell when it fits. Default true. */
  readonly showValues?: boolean;
}

/** Where the best cell is, or null when there is no value. */
export function bestCell(values: readonly (readonly (number | null)[])[], best: 'max' | 'min'): { readonly row: number; readonly column: number; readonly value: number } | null {
  let found: { row: number; column: number; value: number } | null = null;
  values.forEach((row, r) =>
    row.forEach((v, c) => {
      if (v === null || !Number.isFinite(v)) return;
      if (found === null || (best === 'max' ? v > found.value : v < found.value)) found = { row: r, column: c, value: v };
    }),
  );
  return found;
}

const BAR_WIDTH = 240;

/** Heat map over two parameters: a sequential colour per cell, a colour bar, the best cell outlined. */
export function heatMap(spec: HeatMapSpec): Markup {
  const cells = spec.values.flatMap((row) => row.filter((v): v is number => v !== null && Number.isFinite(v)));
  const lo = cells.length > 0 ? Math.min(...cells) : 0;
  const hi = cells.length > 0 ? Math.max(...cells) : 1;
  const t = (v: number) => (hi > lo ? (v - lo) / (hi - lo) : 0.5);
  const best = spec.best === undefined ? null : bestCell(spec.values, spec.best);
  const hasMissing = spec.values.some((row) => row.some((v) => v === null || !Number.isFinite(v)));
  const legend: LegendEntry[] = [
    ...(best === null || spec.best === undefined ? [] : [{ label: `outlined: ${spec.best === 'max' ? 'highest' : 'lowest'} ${spec.value.label}`, swatch: { kind: 'outline' as const, colour: OKABE_ITO.black } }]),
    ...(hasMissing ? [{ label: 'no result', swatch: { kind: 'bar' as const, colour: INK.missing } }] : []),
  ];
  const gradientId = `${spec.id}-gradient`;
  const header = (x: number, y: number): PlacedBlock => colourBar(spec.value, gradientId, lo, hi, x, y);
  const frame = layoutFrame({ kind: 'heat-map', base: spec, legend, header, xTitle: spec.x.title, yTitle: spec.y.title });
  const { plot } = frame;
  const columns = bandScale(spec.x.bandLabels.length, [plot.left, plot.right]);
  const rows = bandScale(spec.y.bandLabels.length, [plot.bottom, plot.top]);
  const cellHeight = Math.abs(rows.bandwidth);
  const marks = spec.values.map((row, r) =>
    row.map((v, c) => {
      if (c >= columns.count || r >= rows.count) return null;
      const x = columns.at(c);
      const y = rows.at(r + 1);
      const where = `${spec.x.title.label} ${spec.x.bandLabels[c] ?? ''} ${spec.x.title.unit}, ${spec.y.title.label} ${spec.y.bandLabels[r] ?? ''} ${spec.y.title.unit}`;
      const missing = v === null || !Number.isFinite(v);
      const fill = missing ? INK.missing : sequentialColour(t(v));
      const text = missing ? '' : numberText(v, 2);
      const showText = spec.showValues !== false && !missing && textWidth(text, FONT.value) + 6 <= columns.bandwidth && cellHeight >= FONT.value + 4;
      const ink = contrastRatio(fill, '#000000') >= contrastRatio(fill, '#ffffff') ? '#000000' : '#ffffff';
      return markup`<rect class="mark cell" x="${x}" y="${y}" width="${columns.bandwidth}" height="${cellHeight}" fill="${fill}" stroke="${INK.paper}" stroke-width="1" data-row="${r}" data-column="${c}"${
        missing ? '' : markup` data-value="${formatNumber(v, 6)}"`
      }>${tooltip(`${where}: ${missing ? 'no result' : `${numberText(v, 3)} ${spec.value.unit}`}`)}</rect>${showText && svgText(x + columns.bandwidth / 2, y + cellHeight / 2, text, { size: FONT.value, anchor: 'middle', middle: true, fill: ink, cls: 'cell-label' })}`;
    }),
  );
  const outline =
    best &&
    markup`<g class="best-cell" data-row="${best.row}" data-column="${best.column}"><rect x="${columns.at(best.column) + 1.5}" y="${rows.at(best.row + 1) + 1.5}" width="${columns.bandwidth - 3}" height="${cellHeight - 3}" fill="none" stroke="${OKABE_ITO.black}" stroke-width="3"/><rect x="${columns.at(best.column) + 4}" y="${rows.at(best.row + 1) + 4}" width="${columns.bandwidth - 8}" height="${cellHeight - 8}" fill="none" stroke="${INK.paper}" stroke-width="1.5"/></g>`;
  const defs = markup`<linearGradient id="${gradientId}" x1="0" x2="1" y1="0" y2="0">${SEQUENTIAL_STOPS.map((c, i) => markup`<stop offset="${i / (SEQUENTIAL_STOPS.length - 1)}" stop-color="${c}"/>`)}</linearGradient>`;
  const axes = joinMarkup([bandAxisX(spec.x, columns, plot), bandAxisY(spec.y, rows, plot)]);
  return renderChart(frame, { axes, marks: joinMarkup(marks.flat()), overlay: outline || undefined, defs });
}

/** The colour bar: `value [unit]`, the gradient from the lowest to the highest value, ticks below. */
function colourBar(value: Quantity, gradientId: string, lo: number, hi: number, x: number, y: number): PlacedBlock {
  const title = quantityText(value);
  const barLeft = x + textWidth(title, FONT.label) + 12;
  const at = (v: number) => barLeft + (hi > lo ? ((v - lo) / (hi - lo)) * BAR_WIDTH : BAR_WIDTH / 2);
  const nice = niceTicks(lo, hi, 6);
  const inside = nice.values.filter((v) => v >= lo - 1e-9 && v <= hi + 1e-9);
  const ticks = inside.length > 0 ? inside : [lo];
  const labels = tickLabels(ticks, nice.step, nice.decimals);
  const tickMarks = ticks.map(
    (v, i) => markup`<line x1="${at(v)}" y1="${y + 16}" x2="${at(v)}" y2="${y + 20}" stroke="${INK.axis}"/>${svgText(at(v), y + 32, labels[i] as string, { size: FONT.tick, anchor: 'middle', cls: 'tick-label' })}`,
  );
  return {
    height: 36,
    markup: markup`<g class="colour-bar">${svgText(x, y + 14, title, { cls: 'axis-title' })}<rect x="${barLeft}" y="${y + 4}" width="${BAR_WIDTH}" height="12" fill="url(#${gradientId})" stroke="${INK.axis}" stroke-width="0.5"/>${tickMarks}</g>`,
  };
}
