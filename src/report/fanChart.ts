import { bandAxisX, valueAxisY } from './axes.js';
import { bandScale } from './bandScale.js';
import { layoutFrame, renderChart } from './chartFrame.js';
import type { BandAxis, ChartBase, LegendEntry, MarkerShape, ValueAxis } from './chartTypes.js';
import { linearScale } from './linearScale.js';
import { markerPath } from './markerShape.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { ROLE_COLOURS } from './palette.js';
import { areaPath, linePath } from './svgPath.js';
import { tooltip } from './svgText.js';
import { numberText } from './tickLabel.js';

/** One central interval of a quantile forecast: prices at a lower and an upper level per band. */
export interface FanBand {
  /** Lower level tau, e.g. 0.05. */
  readonly lowerLevel: number;
  /** Upper level tau, e.g. 0.95. */
  readonly upperLevel: number;
  /** Price at the lower level per band [y unit]. */
  readonly lower: readonly number[];
  /** Price at the upper level per band [y unit]. */
  readonly upper: readonly number[];
}

/** Point markers on the fan, e.g. the limit prices of orders; null where a band has none. */
export interface FanMarkers {
  readonly name: string;
  readonly values: readonly (number | null)[];
  readonly shape: MarkerShape;
  readonly colour: string;
}

export interface FanChartSpec extends ChartBase {
  readonly x: BandAxis;
  readonly y: ValueAxis;
  /** Nested intervals, widest first (e.g. 5-95, 10-90, 25-75). */
  readonly bands: readonly FanBand[];
  /** The median line. */
  readonly median?: { readonly name: string; readonly values: readonly number[] };
  readonly markers?: readonly FanMarkers[];
  /** Colour of the bands. Default ROLE_COLOURS.forecast. */
  readonly colour?: string;
}

/** Opacity of one band; nested bands stack, so the inner ones come out darker. */
const BAND_OPACITY = 0.22;

/**
 * Fan chart: nested central intervals of a quantile forecast drawn as stacked translucent bands
 * (the narrowest darkest), the median as a line, and optional point markers at band centres.
 */
export function fanChart(spec: FanChartSpec): Markup {
  const colour = spec.colour ?? ROLE_COLOURS.forecast;
  const markers = spec.markers ?? [];
  const legend: LegendEntry[] = [
    ...spec.bands.map((b, k) => ({ label: intervalLabel(b), swatch: { kind: 'area' as const, colour, opacity: 1 - (1 - BAND_OPACITY) ** (k + 1) } })),
    ...(spec.median === undefined ? [] : [{ label: spec.median.name, swatch: { kind: 'line' as const, colour: ROLE_COLOURS.median } }]),
    ...markers.map((m) => ({ label: m.name, swatch: { kind: 'marker' as const, colour: m.colour, shape: m.shape } })),
  ];
  const frame = layoutFrame({ kind: 'fan', base: spec, legend, xTitle: spec.x.title, yTitle: spec.y, defaultPlotHeight: 280 });
  const { plot } = frame;
  const all = [...spec.bands.flatMap((b) => [...b.lower, ...b.upper]), ...(spec.median?.values ?? []), ...markers.flatMap((m) => m.values)];
  const y = linearScale(all, [plot.bottom, plot.top], spec.y);
  const x = bandScale(spec.x.bandLabels.length, [plot.left, plot.right]);
  const cx = (i: number) => x.at(i + 0.5);
  const bands = spec.bands.map((b) => {
    const upper = b.upper.map((v, i) => [cx(i), y.at(v)] as const);
    const lower = b.lower.map((v, i) => [cx(i), y.at(v)] as const);
    return markup`<path class="mark band" data-series="${intervalLabel(b)}" d="${areaPath(upper, lower)}" fill="${colour}" fill-opacity="${BAND_OPACITY}"/>`;
  });
  const median =
    spec.median &&
    markup`<path class="mark line" data-series="${spec.median.name}" d="${linePath(spec.median.values.map((v, i) => [cx(i), y.at(v)]))}" fill="none" stroke="${ROLE_COLOURS.median}" stroke-width="1.75" stroke-linejoin="round"/>`;
  const points = markers.map((m) => {
    const marks = m.values.map((v, i) =>
      v === null || !Number.isFinite(v)
        ? null
        : markup`<path class="mark point" d="${markerPath(m.shape, cx(i), y.at(v), 4)}" fill="${m.colour}" stroke="#ffffff" stroke-width="0.75" data-index="${i}">${tooltip(`${m.name}, ${spec.x.bandLabels[i] ?? ''}: ${numberText(v, 2)} ${spec.y.unit}`)}</path>`,
    );
    return markup`<g class="series" data-series="${m.name}">${marks}</g>`;
  });
  const axes = joinMarkup([bandAxisX(spec.x, x, plot), valueAxisY(y, plot, 'left')]);
  return renderChart(frame, { axes, marks: joinMarkup([...bands, median, ...points]) });
}

/** `q0.05–q0.95 (90 % central interval)`. */
export function intervalLabel(b: Pick<FanBand, 'lowerLevel' | 'upperLevel'>): string {
  const coverage = numberText((b.upperLevel - b.lowerLevel) * 100, 1);
  return `q${numberText(b.lowerLevel, 4)}\u2013q${numberText(b.upperLevel, 4)} (${coverage} % central interval)`;
}
