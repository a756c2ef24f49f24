import { INK } from './palette.js';
import { markup, type Markup } from './markup.js';

/** Font sizes of the chart parts [px]. */
export const FONT = Object.freeze({ title: 16, label: 12, tick: 11, caption: 12, value: 10 });

export interface TextOptions {
  readonly size?: number;
  readonly anchor?: 'start' | 'middle' | 'end';
  readonly bold?: boolean;
  readonly fill?: string;
  /** Class for tests and styling, e.g. `tick-label`. */
  readonly cls?: string;
  /** White outline behind the glyphs, for text drawn over data. */
  readonly halo?: boolean;
  /** Vertical centring on y instead of sitting on the baseline. */
  readonly middle?: boolean;
}

/** One line of SVG text at (x, y): y is the baseline, or the centre with `middle`. */
export function svgText(x: number, y: number, content: string, o: TextOptions = {}): Markup {
  const size = o.size ?? FONT.label;
  return markup`<text x="${x}" y="${y}"${o.middle === true ? markup` dy="0.35em"` : ''} font-size="${size}"${
    o.anchor !== undefined && o.anchor !== 'start' ? markup` text-anchor="${o.anchor}"` : ''
  }${o.bold === true ? markup` font-weight="bold"` : ''} fill="${o.fill ?? INK.text}"${o.cls !== undefined ? markup` class="${o.cls}"` : ''}${
    o.halo === true ? markup` stroke="${INK.paper}" stroke-width="3" stroke-linejoin="round" paint-order="stroke"` : ''
  }>${content}</text>`;
}

/** A `<title>` child: the browser shows it as a tooltip on hover, no script needed. */
export function tooltip(text: string): Markup {
  return markup`<title>${text}</title>`;
}
