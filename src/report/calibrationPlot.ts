import { valueAxisX, valueAxisY } from './axes.js';
import { layoutFrame, renderChart } from './chartFrame.js';
import type { ChartBase, LegendEntry, Quantity } from './chartTypes.js';
import { linearScale } from './linearScale.js';
import { markerPath } from './markerShape.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { INK, seriesColour } from './palette.js';
import { linePath } from './svgPath.js';
import { tooltip } from './svgText.js';
import { numberText } from './tickLabel.js';

/** One forecast's calibration: for each nominal level, the observed share and optionally a range. */
export interface CalibrationSeries {
  readonly name: string;
  /** Nominal levels tau in (0, 1). */
  readonly nominal: readonly number[];
  /** Observed share of outcomes at or below the quantile at each level, in [0, 1]. */
  readonly observed: readonly number[];
  /** Optional lower and upper ends of an acceptance range per level (e.g. a binomial 95 % range), in [0, 1]. */
  readonly low?: readonly number[];
  readonly high?: readonly number[];
  readonly colour?: string;
}

export interface CalibrationSpec extends ChartBase {
  readonly series: readonly CalibrationSeries[];
  /** Default { label: 'nominal level τ', unit: '-' }. */
  readonly x?: Quantity;
  /** Default { label: 'observed share at or below the quantile', unit: '-' }. */
  readonly y?: Quantity;
}

export const CALIBRATION_DEFAULTS = Object.freeze({
  x: { label: 'nominal level \u03c4', unit: '-' },
  y: { label: 'observed share at or below the quantile', unit: '-' },
  width: 560,
});

/**
 * Calibration plot (reliability diagram): nominal level against observed share on [0, 1] x [0, 1]
 * with the diagonal of perfect calibration; points above the diagonal mean the quantiles are too
 * high at that level, below it too low. The plot area is square.
 */
export function calibrationPlot(spec: CalibrationSpec): Markup {
  const xTitle = spec.x ?? CALIBRATION_DEFAULTS.x;
  const yTitle = spec.y ?? CALIBRATION_DEFAULTS.y;
  const width = spec.width ?? CALIBRATION_DEFAULTS.width;
  const legend: LegendEntry[] = [
    { label: 'perfect calibration (observed = nominal)', swatch: { kind: 'line', colour: INK.guide, dash: true } },
    ...spec.series.map((s, i) => ({ label: s.name, swatch: { kind: 'marker' as const, colour: s.colour ?? seriesColour(i), shape: 'circle' as const } })),
  ];
  const base = { ...spec, width, plotHeight: spec.plotHeight ?? width - 128 };
  const frame = layoutFrame({ kind: 'calibration', base, legend, xTitle, yTitle });
  const { plot } = frame;
  const x = linearScale([], [plot.left, plot.right], { min: 0, max: 1, tickTarget: 5 });
  const y = linearScale([], [plot.bottom, plot.top], { min: 0, max: 1, tickTarget: 5 });
  const diagonal = markup`<line class="diagonal" x1="${x.at(0)}" y1="${y.at(0)}" x2="${x.at(1)}" y2="${y.at(1)}" stroke="${INK.guide}" stroke-width="1.5" stroke-dasharray="6 4"/>`;
  const marks = spec.series.map((s, k) => {
    const colour = s.colour ?? seriesColour(k);
    const points = s.nominal.map((tau, i) => [tau, s.observed[i]] as const).filter((p): p is readonly [number, number] => p[1] !== undefined && Number.isFinite(p[1]));
    const whiskers = s.nominal.map((tau, i) => {
      const lo = s.low?.[i];
      const hi = s.high?.[i];
      return lo === undefined || hi === undefined ? null : markup`<line class="range" x1="${x.at(tau)}" y1="${y.at(lo)}" x2="${x.at(tau)}" y2="${y.at(hi)}" stroke="${colour}" stroke-width="1.5" stroke-opacity="0.6"/>`;
    });
    const dots = points.map(
      ([tau, share]) =>
        markup`<path class="mark point" d="${markerPath('circle', x.at(tau), y.at(share), 4)}" fill="${colour}">${tooltip(`${s.name}: level ${numberText(tau, 4)}, observed ${numberText(share, 4)}`)}</path>`,
    );
    return markup`<g class="series" data-series="${s.name}">${whiskers}<path d="${linePath(points.map(([tau, share]) => [x.at(tau), y.at(share)]))}" fill="none" stroke="${colour}" stroke-width="1.25"/>${dots}</g>`;
  });
  const axes = joinMarkup([valueAxisX(x, plot), valueAxisY(y, plot, 'left')]);
  return renderChart(frame, { axes, marks: joinMarkup([diagonal, ...marks]) });
}
