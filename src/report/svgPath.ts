import { coord } from './markup.js';

/** A point in pixels, or null for a gap. */
export type Point = readonly [number, number] | null;

/** Path data of a polyline through the points, broken at gaps: `M x,y L x,y ...`. Empty when no two points join. */
export function linePath(points: readonly Point[]): string {
  const parts: string[] = [];
  let open = false;
  for (const p of points) {
    if (p === null) {
      open = false;
      continue;
    }
    parts.push(`${open ? 'L' : 'M'}${coord(p[0])},${coord(p[1])}`);
    open = true;
  }
  return parts.join('');
}

/** Indexes of points with no neighbour on either side (a line cannot show them; a marker must). */
export function isolatedPoints(points: readonly Point[]): number[] {
  return points.flatMap((p, i) => (p !== null && (points[i - 1] ?? null) === null && (points[i + 1] ?? null) === null ? [i] : []));
}

/** Closed path of the area between an upper and a lower line over the same x positions. */
export function areaPath(upper: readonly (readonly [number, number])[], lower: readonly (readonly [number, number])[]): string {
  if (upper.length === 0) return '';
  const forward = upper.map((p, i) => `${i === 0 ? 'M' : 'L'}${coord(p[0])},${coord(p[1])}`);
  const back = [...lower].reverse().map((p) => `L${coord(p[0])},${coord(p[1])}`);
  return `${forward.join('')}${back.join('')}Z`;
}
