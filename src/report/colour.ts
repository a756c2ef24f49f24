/**
 * Colour arithmetic on `#rrggbb` sRGB colours: parsing, mixing, relative luminance and contrast.
 */

/** Red, green, blue in 0..255. */
export type Rgb = readonly [number, number, number];

export function parseHex(hex: string): Rgb {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (m === null) throw new RangeError(`not a #rrggbb colour: ${hex}`);
  return [parseInt(m[1] as string, 16), parseInt(m[2] as string, 16), parseInt(m[3] as string, 16)];
}

export function toHex(rgb: Rgb): string {
  return `#${rgb.map((c) => Math.round(Math.min(255, Math.max(0, c))).toString(16).padStart(2, '0')).join('')}`;
}

/** Linear interpolation in sRGB: t = 0 gives `a`, t = 1 gives `b` (what SVG gradients do by default). */
export function mixHex(a: string, b: string, t: number): string {
  const x = parseHex(a);
  const y = parseHex(b);
  const lerp = (i: 0 | 1 | 2) => x[i] + (y[i] - x[i]) * t;
  return toHex([lerp(0), lerp(1), lerp(2)]);
}

/**
 * Relative luminance of an sRGB colour, 0 (black) to 1 (white), as defined in W3C WCAG 2.1,
 * "relative luminance": L = 0.2126 R + 0.7152 G + 0.0722 B on linearised channels,
 * C = c / 12.92 for c <= 0.04045, else ((c + 0.055) / 1.055)^2.4, with c = channel / 255.
 */
export function relativeLuminance(hex: string): number {
  const [r, g, b] = parseHex(hex).map((c) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05), lighter over darker: 1 to 21. */
export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}
