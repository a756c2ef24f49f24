import { bandAxisX, valueAxisX, valueAxisY } from './axes.js';
import { bandScale } from './bandScale.js';
import { layoutFrame, renderChart, type PlotArea } from './chartFrame.js';
import type { BandAxis, ChartBase, Guide, LegendEntry, MarkerShape, NumberAxis, ValueAxis } from './chartTypes.js';
import { guideLines } from './guides.js';
import { linearScale, type LinearScale } from './linearScale.js';
import { markerPath } from './markerShape.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { INK, seriesColour } from './palette.js';
import { isolatedPoints, linePath, type Point } from './svgPath.js';
import { tooltip } from './svgText.js';
import { numberText } from './tickLabel.js';

export interface LineSeries {
  readonly name: string;
  /** y per point [unit of its axis]; null leaves a gap. */
  readonly values: readonly (number | null)[];
  /** Default: the next palette colour (SERIES_COLOURS). */
  readonly colour?: string;
  /** Dashed line, a second cue beside colour. Default false. */
  readonly dash?: boolean;
  /** Which y axis. Default `left`; a right-axis series is marked "(right axis)" in the legend. */
  readonly axis?: 'left' | 'right';
  /** A marker with a tooltip at every point. Default false (isolated points always get one). */
  readonly points?: boolean;
  /**
   * Draw every point as this marker (outlined in white, legend shows the marker), e.g. one large
   * diamond that marks a best setting. Default none: circles of radius 3 where `points` asks.
   */
  readonly marker?: { readonly shape: MarkerShape; /** Radius [px], default 6. */ readonly size?: number };
  /**
   * On a band x axis: `centre` (default) puts value i at the centre of band i; `boundary` puts
   * value i at the start of band i and takes one more value for the end of the last band (a state
   * at the start of the day, then at the end of each period).
   */
  readonly position?: 'centre' | 'boundary';
}

export interface LineChartSpec extends ChartBase {
  /** Band axis (periods, days) or a numeric axis with one x value per point. */
  readonly x: BandAxis | NumberAxis;
  readonly y: ValueAxis;
  /** Secondary y axis at the right, for series with axis `right`; its ticks line up with the left grid. */
  readonly y2?: ValueAxis;
  readonly series: readonly LineSeries[];
  readonly guides?: readonly Guide[];
}

/** Line chart: several series over periods, categories or a numeric x, with an optional right axis. */
export function lineChart(spec: LineChartSpec): Markup {
  const right = spec.series.filter((s) => s.axis === 'right');
  if (right.length > 0 && spec.y2 === undefined) throw new RangeError(`line chart ${spec.id}: series on the right axis need y2`);
  const legend: LegendEntry[] = spec.series.map((s, i) => ({
    label: s.axis === 'right' ? `${s.name} (right axis)` : s.name,
    swatch: s.marker === undefined ? { kind: 'line', colour: s.colour ?? seriesColour(i), dash: s.dash === true } : { kind: 'marker', colour: s.colour ?? seriesColour(i), shape: s.marker.shape },
  }));
  const frame = layoutFrame({ kind: 'line', base: spec, legend, xTitle: spec.x.kind === 'band' ? spec.x.title : spec.x, yTitle: spec.y, y2Title: right.length > 0 ? spec.y2 : undefined });
  const { plot } = frame;
  const guides = spec.guides ?? [];
  const valuesOn = (side: 'left' | 'right') => [
    ...spec.series.filter((s) => (s.axis ?? 'left') === side).flatMap((s) => s.values),
    ...guides.filter((g) => (g.axis ?? 'left') === side).map((g) => g.value),
  ];
  const yLeft = linearScale(valuesOn('left'), [plot.bottom, plot.top], spec.y);
  const yRight =
    right.length > 0 && spec.y2 !== undefined
      ? linearScale(valuesOn('right'), [plot.bottom, plot.top], spec.y2.min === undefined && spec.y2.max === undefined ? { ...spec.y2, alignToTickCount: yLeft.ticks.length } : spec.y2)
      : undefined;
  const x = xPositions(spec.x, plot.left, plot.right);
  const drawn = spec.series.map((s, i) => {
    const onRight = s.axis === 'right' && yRight !== undefined && spec.y2 !== undefined;
    return seriesMarks(s, s.colour ?? seriesColour(i), x, onRight ? yRight : yLeft, onRight ? spec.y2.unit : spec.y.unit);
  });
  const axes = joinMarkup([x.axis(plot), valueAxisY(yLeft, plot, 'left'), yRight && valueAxisY(yRight, plot, 'right')]);
  const overlay = guideLines(guides, yLeft, yRight, plot, drawn.map((d) => d.points));
  return renderChart(frame, { axes, marks: joinMarkup(drawn.map((d) => d.markup)), overlay });
}

interface XPositions {
  /** x of point i of a series, and the text naming it for a tooltip. */
  point(i: number, position: 'centre' | 'boundary'): { readonly x: number; readonly name: string } | null;
  axis(plot: PlotArea): Markup;
}

function xPositions(axis: BandAxis | NumberAxis, left: number, right: number): XPositions {
  if (axis.kind === 'band') {
    const count = axis.bandLabels.length;
    const scale = bandScale(count, [left, right]);
    return {
      point: (i, position) => {
        if (position === 'centre') return i < count ? { x: scale.at(i + 0.5), name: axis.bandLabels[i] as string } : null;
        if (i > count) return null;
        const name = i < count ? `start of ${axis.bandLabels[i] as string}` : `end of ${axis.bandLabels[count - 1] ?? ''}`;
        return { x: scale.at(i), name };
      },
      axis: (plot) => bandAxisX(axis, scale, plot),
    };
  }
  const scale = linearScale(axis.values, [left, right], { ...axis, tickTarget: Math.max(2, Math.floor((right - left) / 90)) });
  return {
    point: (i) => {
      const v = axis.values[i];
      return v === undefined ? null : { x: scale.at(v), name: `${axis.label} ${numberText(v, 6)} ${axis.unit}` };
    },
    axis: (plot) => valueAxisX(scale, plot),
  };
}

function seriesMarks(s: LineSeries, colour: string, x: XPositions, y: LinearScale, unit: string): { readonly markup: Markup; readonly points: readonly Point[] } {
  const position = s.position ?? 'centre';
  const located = s.values.map((v, i) => {
    const p = x.point(i, position);
    return v === null || !Number.isFinite(v) || p === null ? null : { x: p.x, y: y.at(v), name: p.name, value: v };
  });
  const points: Point[] = located.map((p) => (p === null ? null : [p.x, p.y]));
  const marked = s.points === true || s.marker !== undefined ? located.flatMap((p, i) => (p === null ? [] : [i])) : isolatedPoints(points);
  const shape = s.marker?.shape ?? 'circle';
  const radius = s.marker === undefined ? 3 : (s.marker.size ?? 6);
  const outline = s.marker === undefined ? '' : markup` stroke="${INK.paper}" stroke-width="1.5"`;
  const line = linePath(points);
  const drawn = markup`<g class="series" data-series="${s.name}">${
    line !== '' && markup`<path class="mark line" d="${line}" fill="none" stroke="${colour}" stroke-width="2" stroke-linejoin="round"${s.dash === true ? markup` stroke-dasharray="6 4"` : ''}/>`
  }${marked.map((i) => {
    const p = located[i];
    return p && markup`<path class="mark point" d="${markerPath(shape, p.x, p.y, radius)}" fill="${colour}"${outline}>${tooltip(`${s.name}, ${p.name}: ${numberText(p.value, 3)} ${unit}`)}</path>`;
  })}</g>`;
  return { markup: drawn, points };
}
