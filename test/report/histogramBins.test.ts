import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { labelStride, valueAxisX } from '../../src/report/axes.js';
import { dataBinWidth, histogram, histogramBins, nearestLadderStep } from '../../src/report/histogram.js';
import { linearScale } from '../../src/report/linearScale.js';
import { FONT } from '../../src/report/svgText.js';
import { textWidth } from '../../src/report/textWidth.js';
import { elements, texts } from './svgQuery.js';

describe('histogram bins chosen from the data', () => {
  it('Freedman-Diaconis on 1..100, worked by hand: IQR 49.5, h = 2 x 49.5 / 100^(1/3) = 21.33, nearest 1-2-5 step 20', () => {
    // Quartiles by Hyndman and Fan's definition 7: h = 99 x 0.25 = 24.75: 25 + 0.75 = 25.75; 99 x 0.75 = 74.25: 75.25.
    const values = Array.from({ length: 100 }, (_, i) => i + 1);
    expect(dataBinWidth(values)).toBe(20);
    // [0, 20) holds 1..19, [80, 100] holds 80..100 (the largest value on the upper edge goes to the last bin).
    expect(histogramBins(values).map((b) => [b.from, b.to, b.count])).toEqual([
      [0, 20, 19],
      [20, 40, 20],
      [40, 60, 20],
      [60, 80, 20],
      [80, 100, 21],
    ]);
  });

  it('equal quartiles fall back to Sturges: nine values, range 4 over ceil(log2 9) + 1 = 5 bins, 0.8, nearest step 1', () => {
    expect(dataBinWidth([5, 5, 5, 5, 5, 5, 5, 5, 9])).toBe(1);
  });

  it('a far outlier: at most 50 bins over the range (0..98 and 1e6: 1e6 / 50 = 20000)', () => {
    expect(dataBinWidth([...Array.from({ length: 99 }, (_, i) => i), 1e6])).toBe(20000);
  });

  it('the nearest step of the 1-2-5 ladder in ratio', () => {
    // 3.2 lies above sqrt(2 x 5) = 3.162, the geometric middle of 2 and 5: it goes to 5; 3.1 to 2.
    expect([21.33, 0.03, 7, 3.2, 3.1, 1, 150, 0.7].map(nearestLadderStep)).toEqual([20, 0.02, 5, 5, 2, 1, 200, 0.5]);
  });
});

describe('tick labels of a value axis never overlap', () => {
  const plot = (width: number) => ({ left: 60, right: 60 + width, top: 10, bottom: 110 });
  it('labelStride keeps every k-th label, k the least that fits', () => {
    // Labels "1000" are 4 x 0.64 x the tick font wide; 30 px apart they collide, 60 px apart they do not.
    const label = textWidth('1000', FONT.tick);
    expect(label + 10).toBeGreaterThan(30);
    expect(label + 10).toBeLessThanOrEqual(60);
    expect(labelStride([0, 30, 60, 90, 120], ['1000', '1000', '1000', '1000', '1000'])).toBe(2);
    expect(labelStride([0, 60, 120], ['1000', '1000', '1000'])).toBe(1);
  });

  it('on any data range and plot width (fast-check, fixed seed): labelled neighbours keep 10 px apart', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e7, max: 1e7, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e7, noNaN: true }),
        fc.integer({ min: 80, max: 900 }),
        fc.integer({ min: 2, max: 30 }),
        (lo, span, width, target) => {
          const scale = linearScale([lo, lo + span], [60, 60 + width], { tickTarget: target, min: lo, max: lo + span });
          // A span below a billionth of its magnitude is no range an axis shows (niceTicks widens it, no tick is left inside).
          fc.pre(scale.ticks.length > 0);
          const svg = valueAxisX(scale, plot(width)).text;
          const xs = elements(svg, 'text', 'tick-label').map((e) => e.num('x'));
          const labels = texts(svg, 'tick-label');
          expect(labels.length).toBeGreaterThan(0);
          for (let i = 1; i < xs.length; i++) {
            const gap = Math.abs((xs[i] as number) - (xs[i - 1] as number)) - (textWidth(labels[i] as string, FONT.tick) + textWidth(labels[i - 1] as string, FONT.tick)) / 2;
            expect(gap).toBeGreaterThanOrEqual(10 - 1e-9);
          }
        },
      ),
      { seed: 13, numRuns: 300 },
    );
  });

  it('a daily-profit histogram with wide labels on a narrow plot: its labels keep apart too', () => {
    const values = Array.from({ length: 90 }, (_, i) => -12000 + 300 * i + 1000 * Math.sin(i));
    const chart = histogram({ id: 'h', title: 't', caption: 'c', width: 260, values, x: { label: 'profit of a day', unit: 'HLV', min: -15000, max: 20000 }, y: { label: 'days', unit: 'count' } }).text;
    // The x axis's group only (the y axis's labels share the class).
    const svg = chart.slice(chart.indexOf('<g class="axis axis-x">'), chart.indexOf('</g>', chart.indexOf('<g class="axis axis-x">')));
    const xs = elements(svg, 'text', 'tick-label');
    const labels = texts(svg, 'tick-label');
    // Each tick draws a grid line and a tick mark; the axis one baseline.
    const ticks = ((svg.match(/<line /g) ?? []).length - 1) / 2;
    expect(labels.length).toBeGreaterThan(1);
    expect(labels.length).toBeLessThanOrEqual(ticks);
    for (let i = 1; i < xs.length; i++) {
      const gap = Math.abs(xs[i]!.num('x') - xs[i - 1]!.num('x')) - (textWidth(labels[i]!, FONT.tick) + textWidth(labels[i - 1]!, FONT.tick)) / 2;
      expect(gap).toBeGreaterThanOrEqual(10 - 1e-9);
    }
  });
});
