import { mixHex } from './colour.js';

/**
 * Sequential colour scale for heat maps, dark blue-violet through teal and green to pale yellow.
 *
 * The stops are this project's own, made in the manner of viridis (S. van der Walt and N. Smith
 * 2015, "A better default colormap for Matplotlib", SciPy 2015): the hue turns from blue to yellow
 * while the relative luminance rises at every step, so the order of values reads in grey print and
 * for the common colour-vision deficiencies. Relative luminance (WCAG 2.1) of the stops:
 * 0.019, 0.080, 0.185, 0.320, 0.522, 0.738.
 */
export const SEQUENTIAL_STOPS: readonly string[] = Object.freeze(['#2a1858', '#2f4f8a', '#23838e', '#35ad76', '#9ccf4a', '#f5e14b']);

/**
 * The colour at position t in [0, 1] (clamped) along the stops, interpolated linearly in sRGB
 * between neighbouring stops, which is also how an SVG linearGradient through the same stops
 * interpolates.
 */
export function sequentialColour(t: number): string {
  const x = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0)) * (SEQUENTIAL_STOPS.length - 1);
  const i = Math.min(SEQUENTIAL_STOPS.length - 2, Math.floor(x));
  return mixHex(SEQUENTIAL_STOPS[i] as string, SEQUENTIAL_STOPS[i + 1] as string, x - i);
}
