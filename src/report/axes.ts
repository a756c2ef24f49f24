import type { BandAxis, BandTick } from './chartTypes.js';
import type { BandScale } from './bandScale.js';
import type { PlotArea } from './chartFrame.js';
import type { LinearScale } from './linearScale.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { INK } from './palette.js';
import { FONT, svgText } from './svgText.js';
import { textWidth } from './textWidth.js';

/** Space kept between neighbouring tick labels [px]. */
const LABEL_GAP = 10;

/**
 * A value axis at the left (with horizontal grid lines across the plot and a darker line at 0)
 * or at the right (labels only, so the grid belongs to the left axis).
 */
export function valueAxisY(scale: LinearScale, plot: PlotArea, side: 'left' | 'right'): Markup {
  const parts = scale.ticks.map((tick, i) => {
    const y = scale.at(tick);
    const label = scale.labels[i] as string;
    if (side === 'right') {
      return markup`<line x1="${plot.right}" y1="${y}" x2="${plot.right + 5}" y2="${y}" stroke="${INK.axis}"/>${svgText(plot.right + 8, y, label, { size: FONT.tick, middle: true, cls: 'tick-label' })}`;
    }
    const isZero = tick === 0 && y < plot.bottom - 0.5;
    return markup`<line x1="${plot.left}" y1="${y}" x2="${plot.right}" y2="${y}" stroke="${isZero ? INK.axis : INK.grid}"/>${svgText(plot.left - 8, y, label, { size: FONT.tick, anchor: 'end', middle: true, cls: 'tick-label' })}`;
  });
  const x = side === 'left' ? plot.left : plot.right;
  return markup`<g class="axis axis-y-${side}"><line x1="${x}" y1="${plot.top}" x2="${x}" y2="${plot.bottom}" stroke="${INK.axis}"/>${joinMarkup(parts, '')}</g>`;
}

/**
 * A numeric x axis: light vertical grid lines and labels under the plot. Every tick gets its grid
 * line and tick mark; labels go on every k-th tick, k the smallest stride at which no two labels
 * (centred on their ticks, widths by textWidth) come closer than LABEL_GAP.
 */
export function valueAxisX(scale: LinearScale, plot: PlotArea): Markup {
  const stride = labelStride(scale.ticks.map((tick) => scale.at(tick)), scale.labels);
  const parts = scale.ticks.map((tick, i) => {
    const x = scale.at(tick);
    const label = i % stride === 0 ? svgText(x, plot.bottom + 18, scale.labels[i] as string, { size: FONT.tick, anchor: 'middle', cls: 'tick-label' }) : '';
    return markup`<line x1="${x}" y1="${plot.top}" x2="${x}" y2="${plot.bottom}" stroke="${INK.grid}"/><line x1="${x}" y1="${plot.bottom}" x2="${x}" y2="${plot.bottom + 5}" stroke="${INK.axis}"/>${label}`;
  });
  return markup`<g class="axis axis-x">${baseline(plot)}${joinMarkup(parts, '')}</g>`;
}

/**
 * A band x axis: the densest tick set whose labels do not collide is labelled, with a light
 * vertical grid line at each labelled tick; every tick of the densest set gets a short tick mark.
 */
export function bandAxisX(axis: BandAxis, scale: BandScale, plot: PlotArea): Markup {
  const labelled = firstFitting(axis.tickSets, (a, b) => Math.abs(scale.at(b.at) - scale.at(a.at)) >= (textWidth(a.label, FONT.tick) + textWidth(b.label, FONT.tick)) / 2 + LABEL_GAP);
  const minor = (axis.tickSets[0] ?? []).map((t) => markup`<line x1="${scale.at(t.at)}" y1="${plot.bottom}" x2="${scale.at(t.at)}" y2="${plot.bottom + 4}" stroke="${INK.axis}"/>`);
  const major = labelled.map((t) => {
    const x = scale.at(t.at);
    return markup`<line x1="${x}" y1="${plot.top}" x2="${x}" y2="${plot.bottom}" stroke="${INK.grid}"/><line x1="${x}" y1="${plot.bottom}" x2="${x}" y2="${plot.bottom + 6}" stroke="${INK.axis}"/>${svgText(x, plot.bottom + 18, t.label, { size: FONT.tick, anchor: 'middle', cls: 'tick-label' })}`;
  });
  return markup`<g class="axis axis-x">${joinMarkup(minor, '')}${joinMarkup(major, '')}${baseline(plot)}</g>`;
}

/** A band y axis (heat map rows), band 0 at the bottom; labels right-aligned left of the plot. */
export function bandAxisY(axis: BandAxis, scale: BandScale, plot: PlotArea): Markup {
  const labelled = firstFitting(axis.tickSets, (a, b) => Math.abs(scale.at(b.at) - scale.at(a.at)) >= FONT.tick + 3);
  const parts = labelled.map((t) => {
    const y = scale.at(t.at);
    return markup`<line x1="${plot.left - 5}" y1="${y}" x2="${plot.left}" y2="${y}" stroke="${INK.axis}"/>${svgText(plot.left - 8, y, t.label, { size: FONT.tick, anchor: 'end', middle: true, cls: 'tick-label' })}`;
  });
  return markup`<g class="axis axis-y-left"><line x1="${plot.left}" y1="${plot.top}" x2="${plot.left}" y2="${plot.bottom}" stroke="${INK.axis}"/>${joinMarkup(parts, '')}</g>`;
}

/**
 * The smallest k such that labels 0, k, 2k, ... centred at `positions` [px] keep LABEL_GAP apart
 * (their widths by textWidth at the tick font); the number of labels when none does (one label).
 */
export function labelStride(positions: readonly number[], labels: readonly string[]): number {
  const half = labels.map((label) => textWidth(label, FONT.tick) / 2);
  for (let k = 1; k < positions.length; k++) {
    let fits = true;
    for (let i = k; i < positions.length && fits; i += k) {
      fits = Math.abs((positions[i] as number) - (positions[i - k] as number)) >= (half[i] as number) + (half[i - k] as number) + LABEL_GAP;
    }
    if (fits) return k;
  }
  return Math.max(1, positions.length);
}

function baseline(plot: PlotArea): Markup {
  return markup`<line x1="${plot.left}" y1="${plot.bottom}" x2="${plot.right}" y2="${plot.bottom}" stroke="${INK.axis}"/>`;
}

/** The first tick set in which every two neighbours keep apart; the sparsest set when none does. */
function firstFitting(sets: readonly (readonly BandTick[])[], apart: (a: BandTick, b: BandTick) => boolean): readonly BandTick[] {
  for (const set of sets) {
    const sorted = [...set].sort((a, b) => a.at - b.at);
    if (sorted.every((t, i) => i === 0 || apart(sorted[i - 1] as BandTick, t))) return set;
  }
  return sets[sets.length - 1] ?? [];
}
