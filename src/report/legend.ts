import type { LegendEntry, LegendSwatch } from './chartTypes.js';
import { markerPath } from './markerShape.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { FONT, svgText } from './svgText.js';
import { textWidth } from './textWidth.js';

const ROW = 20;
const SWATCH = 24;
const GAP_AFTER_SWATCH = 6;
const GAP_BETWEEN = 18;

export interface PlacedBlock {
  /** Height taken [px] (0 when there is nothing to show). */
  readonly height: number;
  readonly markup: Markup;
}

/**
 * Legend entries laid out left to right from (x, y), wrapped into rows no wider than `maxWidth`.
 */
export function legendBlock(entries: readonly LegendEntry[], x: number, y: number, maxWidth: number): PlacedBlock {
  let cx = x;
  let row = 0;
  const items: Markup[] = [];
  for (const entry of entries) {
    const width = SWATCH + GAP_AFTER_SWATCH + textWidth(entry.label, FONT.label);
    if (cx > x && cx + width > x + maxWidth) {
      row += 1;
      cx = x;
    }
    const top = y + row * ROW;
    items.push(markup`<g class="legend-item">${swatch(entry.swatch, cx, top + ROW / 2)}${svgText(cx + SWATCH + GAP_AFTER_SWATCH, top + ROW / 2, entry.label, { middle: true })}</g>`);
    cx += width + GAP_BETWEEN;
  }
  if (items.length === 0) return { height: 0, markup: markup`` };
  return { height: (row + 1) * ROW, markup: markup`<g class="legend">${joinMarkup(items, '')}</g>` };
}

/** A swatch `SWATCH` px wide whose vertical centre is cy. */
function swatch(s: LegendSwatch, x: number, cy: number): Markup {
  switch (s.kind) {
    case 'line':
      return markup`<line x1="${x}" y1="${cy}" x2="${x + SWATCH}" y2="${cy}" stroke="${s.colour}" stroke-width="2.5"${s.dash === true ? markup` stroke-dasharray="5 3"` : ''}/>`;
    case 'area':
      return markup`<rect x="${x}" y="${cy - 6}" width="${SWATCH}" height="12" fill="${s.colour}" fill-opacity="${s.opacity}"/>`;
    case 'bar':
      return markup`<rect x="${x + 6}" y="${cy - 6}" width="12" height="12" fill="${s.colour}"/>`;
    case 'marker':
      return markup`<path d="${markerPath(s.shape, x + SWATCH / 2, cy, 5)}" fill="${s.colour}"/>`;
    case 'outline':
      return markup`<rect x="${x + 3}" y="${cy - 6}" width="${SWATCH - 6}" height="12" fill="none" stroke="${s.colour}" stroke-width="2.5"/>`;
  }
}
