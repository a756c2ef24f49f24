import { describe, expect, it } from 'vitest';
import { contrastRatio, INK, OKABE_ITO, relativeLuminance, SEQUENTIAL_STOPS, sequentialColour, SERIES_COLOURS } from '../../src/report/index.js';
import { parseHex } from '../../src/report/colour.js';

describe('Okabe and Ito (2008) palette', () => {
  // RGB values as published in M. Okabe and K. Ito (2008), "Color Universal Design (CUD): how to make
  // figures and presentations that are friendly to colorblind people", https://jfly.uni-koeln.de/color/
  const published: Record<keyof typeof OKABE_ITO, [number, number, number]> = {
    black: [0, 0, 0],
    orange: [230, 159, 0],
    skyBlue: [86, 180, 233],
    bluishGreen: [0, 158, 115],
    yellow: [240, 228, 66],
    blue: [0, 114, 178],
    vermillion: [213, 94, 0],
    reddishPurple: [204, 121, 167],
  };
  it.each(Object.entries(published))('%s is %j', (name, rgb) => {
    expect(parseHex(OKABE_ITO[name as keyof typeof OKABE_ITO])).toEqual(rgb);
  });
  it('series colours are the eight Okabe-Ito colours, each once', () => {
    expect([...SERIES_COLOURS].sort()).toEqual(Object.values(OKABE_ITO).sort());
  });
});

describe('WCAG 2.1 relative luminance and contrast', () => {
  it('black on white is 21:1, the top of the range WCAG 2.1 gives (1 to 21)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10);
    expect(relativeLuminance('#ffffff')).toBe(1);
    expect(relativeLuminance('#000000')).toBe(0);
  });
  it('#767676 on white is 4.54:1 by the WCAG 2.1 formulas (relative luminance, then (L1 + 0.05) / (L2 + 0.05))', () => {
    // WCAG 2.1, definitions "relative luminance" and "contrast ratio": 0x76 / 255 = 0.462745, linearised
    // ((0.462745 + 0.055) / 1.055)^2.4 = 0.181164 for each channel, so L = 0.181164 for a grey, and
    // (1 + 0.05) / (0.181164 + 0.05) = 4.5422.
    expect(relativeLuminance('#767676')).toBeCloseTo(0.181164, 6);
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.5422, 4);
  });
  it('every grey that carries text is at least 4.5:1 on the paper (WCAG 2.1 SC 1.4.3, AA)', () => {
    for (const ink of [INK.text, INK.muted, INK.axis, INK.guide]) expect(contrastRatio(ink, INK.paper)).toBeGreaterThanOrEqual(4.5);
  });
});

describe('sequential palette', () => {
  it('runs from the first stop to the last', () => {
    expect(sequentialColour(0)).toBe(SEQUENTIAL_STOPS[0]);
    expect(sequentialColour(1)).toBe(SEQUENTIAL_STOPS[SEQUENTIAL_STOPS.length - 1]);
    expect(sequentialColour(-3)).toBe(SEQUENTIAL_STOPS[0]);
  });
  it('relative luminance rises strictly along the scale (41 samples), so order reads in grey print', () => {
    const luminance = Array.from({ length: 41 }, (_, i) => relativeLuminance(sequentialColour(i / 40)));
    for (let i = 1; i < luminance.length; i++) expect(luminance[i]).toBeGreaterThan(luminance[i - 1] as number);
    expect((luminance[40] as number) / (luminance[0] as number)).toBeGreaterThan(20);
  });
});
