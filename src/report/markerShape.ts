import type { MarkerShape } from './chartTypes.js';
import { coord } from './markup.js';

/**
 * SVG path data of a point marker centred on (x, y) with "radius" r [px]. Triangles point up or
 * down so that two marker kinds differ in shape as well as colour.
 */
export function markerPath(shape: MarkerShape, x: number, y: number, r: number): string {
  const p = (dx: number, dy: number) => `${coord(x + dx)},${coord(y + dy)}`;
  switch (shape) {
    case 'circle':
      return `M${p(-r, 0)}A${coord(r)},${coord(r)} 0 1,0 ${p(r, 0)}A${coord(r)},${coord(r)} 0 1,0 ${p(-r, 0)}Z`;
    case 'square':
      return `M${p(-r, -r)}L${p(r, -r)}L${p(r, r)}L${p(-r, r)}Z`;
    case 'diamond':
      return `M${p(0, -r * 1.3)}L${p(r * 1.3, 0)}L${p(0, r * 1.3)}L${p(-r * 1.3, 0)}Z`;
    case 'triangle-up':
      return `M${p(0, -r * 1.2)}L${p(r * 1.15, r * 0.8)}L${p(-r * 1.15, r * 0.8)}Z`;
    case 'triangle-down':
      return `M${p(0, r * 1.2)}L${p(r * 1.15, -r * 0.8)}L${p(-r * 1.15, -r * 0.8)}Z`;
  }
}
