import type { Guide } from './chartTypes.js';
import type { PlotArea } from './chartFrame.js';
import type { LinearScale } from './linearScale.js';
import { joinMarkup, markup, type Markup } from './markup.js';
import { INK } from './palette.js';
import type { Point } from './svgPath.js';
import { FONT, svgText } from './svgText.js';
import { textWidth } from './textWidth.js';

interface Rect {
  readonly x0: number;
  readonly x1: number;
  readonly y0: number;
  readonly y1: number;
}

/**
 * Dashed horizontal reference lines with a label each. A label goes just above its line at the right
 * end, unless data (the `lines` drawn in the plot) or an earlier label would lie under it; then below
 * the line, then at the left end above and below; if every place is taken, the first.
 */
export function guideLines(guides: readonly Guide[], left: LinearScale, right: LinearScale | undefined, plot: PlotArea, lines: readonly (readonly Point[])[] = []): Markup {
  const taken: Rect[] = [];
  return joinMarkup(
    guides.map((g) => {
      const y = (g.axis === 'right' && right !== undefined ? right : left).at(g.value);
      const width = textWidth(g.label, FONT.value);
      const places = [
        { x: plot.right - 4, anchor: 'end' as const, baseline: y - 4 },
        { x: plot.right - 4, anchor: 'end' as const, baseline: y + FONT.value + 3 },
        { x: plot.left + 4, anchor: 'start' as const, baseline: y - 4 },
        { x: plot.left + 4, anchor: 'start' as const, baseline: y + FONT.value + 3 },
      ];
      const boxOf = (p: (typeof places)[number]): Rect => {
        const x0 = p.anchor === 'end' ? p.x - width : p.x;
        return { x0: x0 - 2, x1: x0 + width + 2, y0: p.baseline - FONT.value - 1, y1: p.baseline + 3 };
      };
      const inside = (r: Rect) => r.y0 >= plot.top && r.y1 <= plot.bottom;
      const place = places.find((p) => inside(boxOf(p)) && !taken.some((t) => overlaps(t, boxOf(p))) && !lines.some((l) => polylineHits(l, boxOf(p)))) ?? (places[0] as (typeof places)[number]);
      taken.push(boxOf(place));
      return markup`<g class="guide"><line x1="${plot.left}" y1="${y}" x2="${plot.right}" y2="${y}" stroke="${INK.guide}" stroke-dasharray="6 4"/>${svgText(place.x, place.baseline, g.label, { size: FONT.value, anchor: place.anchor, fill: INK.muted, halo: true, cls: 'guide-label' })}</g>`;
    }),
  );
}

function overlaps(a: Rect, b: Rect): boolean {
  return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
}

/** Whether a polyline (gaps allowed) passes through a rectangle; segments are sampled every 2 px. */
function polylineHits(points: readonly Point[], r: Rect): boolean {
  const inRect = (x: number, y: number) => x >= r.x0 && x <= r.x1 && y >= r.y0 && y <= r.y1;
  for (let i = 0; i < points.length; i++) {
    const p = points[i];
    if (p === null || p === undefined) continue;
    if (inRect(p[0], p[1])) return true;
    const q = points[i + 1];
    if (q === null || q === undefined) continue;
    const steps = Math.ceil(Math.hypot(q[0] - p[0], q[1] - p[1]) / 2);
    for (let k = 1; k < steps; k++) if (inRect(p[0] + ((q[0] - p[0]) * k) / steps, p[1] + ((q[1] - p[1]) * k) / steps)) return true;
  }
  return false;
}
