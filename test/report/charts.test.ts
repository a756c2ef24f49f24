import { describe, expect, it } from 'vitest';
import {
  barChart,
  bestCell,
  calibrationPlot,
  categoryAxis,
  fanChart,
  heatMap,
  histogram,
  histogramBins,
  lineChart,
  SEQUENTIAL_STOPS,
} from '../../src/report/index.js';
import { FRAME } from '../../src/report/chartFrame.js';
import { GALLERY_CHART_IDS, galleryPage } from './gallery.js';
import { deepFreeze, elements, texts } from './svgQuery.js';

const days = (n: number) => categoryAxis(Array.from({ length: n }, (_, i) => `day ${i + 1}`), { label: 'delivery day', unit: 'YYYY-MM-DD' });
const plotRight = 960 - FRAME.right;
/** Title and caption do not matter to these tests. */
const base = (id: string) => ({ id, title: 't', caption: 'c' });

describe('barChart', () => {
  const signed = barChart({
    ...base('b'),
    x: days(4),
    y: { label: 'power', unit: 'MW', min: -5, max: 5 },
    layout: 'overlaid',
    series: [{ name: 'charge', values: [-5, 0, null, -2.5] }, { name: 'discharge', values: [0, 2.5, 0, 0] }],
  }).text;

  it('draws a bar per non-zero value; heights are proportional to |value|', () => {
    const bars = elements(signed, 'rect', 'bar');
    expect(bars).toHaveLength(3);
    // document order: the charge series (-5 in band 0, -2.5 in band 3), then discharge (2.5 in band 1)
    const [full, half, up] = bars as [(typeof bars)[0], (typeof bars)[0], (typeof bars)[0]];
    expect([full, half, up].map((b) => b.attrs['data-index'])).toEqual(['0', '3', '1']);
    expect(full.num('height') / half.num('height')).toBeCloseTo(2, 2);
    expect(up.num('height')).toBeCloseTo(half.num('height'), 2);
  });
  it('negative bars hang from the zero line, positive ones stand on it', () => {
    const zero = elements(signed, 'line', 'zero-line')[0]?.num('y1') as number;
    const bars = elements(signed, 'rect', 'bar');
    expect(bars[0]?.num('y')).toBeCloseTo(zero, 2);
    expect(bars[1]?.num('y')).toBeCloseTo(zero, 2);
    expect((bars[2]?.num('y') as number) + (bars[2]?.num('height') as number)).toBeCloseTo(zero, 1);
  });
  it('fixed ends -5 and 5 are both labelled (ticks -5, 0, 5)', () => {
    expect(texts(signed, 'tick-label').filter((t) => !t.startsWith('day'))).toEqual(['\u22125', '0', '5']);
  });
  it('grouped bars share a band side by side without overlapping', () => {
    const grouped = elements(barChart({ ...base('g'), x: days(3), y: { label: 'energy', unit: 'MWh' }, series: [{ name: 'a', values: [1, 2, 3] }, { name: 'b', values: [3, 2, 1] }] }).text, 'rect', 'bar');
    expect(grouped).toHaveLength(6);
    const a0 = grouped[0] as (typeof grouped)[0];
    const b0 = grouped[3] as (typeof grouped)[0];
    // coordinates are rounded to 1/100 px, so the sum of two may differ from a third by 0.01
    expect(b0.num('x')).toBeCloseTo(a0.num('x') + a0.num('width'), 1);
  });
});

describe('lineChart', () => {
  it("boundary values span the band axis from its start to its end (a state at each period's end)", () => {
    const svg = lineChart({ ...base('l'), x: days(4), y: { label: 'soc', unit: 'MWh' }, series: [{ name: 's', values: [1, 2, 3, 4, 5], position: 'boundary' }] }).text;
    const d = elements(svg, 'path', 'line')[0]?.attrs.d ?? '';
    expect(d.startsWith(`M${FRAME.left},`)).toBe(true);
    expect(d).toMatch(new RegExp(`L${plotRight},[\\d.]+$`));
    expect(d.match(/[ML]/g)).toHaveLength(5);
  });
  it('a right axis gets as many ticks as the left one, so both share the grid', () => {
    const svg = lineChart({
      ...base('r'),
      x: days(3),
      y: { label: 'price', unit: 'HLV/MWh' },
      y2: { label: 'soc', unit: 'MWh' },
      series: [{ name: 'p', values: [0, 50, 97] }, { name: 's', values: [1, 7, 3], axis: 'right' }],
    }).text;
    const left = texts(svg, 'tick-label').filter((t) => !t.startsWith('day'));
    expect(left).toEqual(['0', '20', '40', '60', '80', '100', '0', '2', '4', '6', '8', '10']);
    expect(svg).toContain('s (right axis)');
  });
  it('a point with no neighbour gets a marker, gaps break the line', () => {
    const svg = lineChart({ ...base('p'), x: days(5), y: { label: 'y', unit: '-' }, series: [{ name: 's', values: [1, 2, null, 4, null] }] }).text;
    expect(elements(svg, 'path', 'point')).toHaveLength(1);
    expect(elements(svg, 'path', 'line')[0]?.attrs.d?.match(/M/g)).toHaveLength(2);
  });
  it('a numeric x axis places points at their x values', () => {
    const svg = lineChart({ ...base('n'), x: { kind: 'linear', label: 'alpha', unit: '-', values: [0, 0.25, 0.5] }, y: { label: 'profit', unit: 'HLV' }, series: [{ name: 's', values: [1, 2, 3], points: true }] }).text;
    const xs = elements(svg, 'path', 'line')[0]?.attrs.d?.match(/[ML]([\d.]+),/g)?.map((s) => Number(s.slice(1, -1)));
    expect(xs).toEqual([FRAME.left, (FRAME.left + plotRight) / 2, plotRight]);
  });
  it('refuses a right-axis series without y2', () => {
    expect(() => lineChart({ ...base('x'), x: days(2), y: { label: 'y', unit: '-' }, series: [{ name: 's', values: [1, 2], axis: 'right' }] })).toThrow(/y2/);
  });
});

describe('fanChart', () => {
  const svg = fanChart({
    ...base('f'),
    x: days(3),
    y: { label: 'price', unit: 'HLV/MWh' },
    bands: [
      { lowerLevel: 0.05, upperLevel: 0.95, lower: [0, 0, 0], upper: [100, 100, 100] },
      { lowerLevel: 0.25, upperLevel: 0.75, lower: [25, 25, 25], upper: [75, 75, 75] },
    ],
    median: { name: 'median', values: [50, 50, 50] },
    markers: [{ name: 'buy limit', values: [90, null, null], shape: 'triangle-down', colour: '#009e73' }],
  }).text;
  it('one area per interval, the median line, one marker per limit', () => {
    expect(elements(svg, 'path', 'band')).toHaveLength(2);
    expect(elements(svg, 'path', 'line')).toHaveLength(1);
    expect(elements(svg, 'path', 'point')).toHaveLength(1);
  });
  it('legend swatches darken inward as the stacked bands do: 1 - (1 - a)^k', () => {
    const swatches = [...svg.matchAll(/fill-opacity="([\d.]+)"\/>/g)].map((m) => Number(m[1]));
    expect(swatches.slice(0, 2)).toEqual([0.22, 0.39]);
    expect(svg).toContain('q0.05\u2013q0.95 (90 % central interval)');
  });
});

describe('histogram', () => {
  it('bins [k w, (k + 1) w): 0..9 by 2 gives five bins of two', () => {
    expect(histogramBins([0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 2).map((b) => [b.from, b.to, b.count])).toEqual([
      [0, 2, 2],
      [2, 4, 2],
      [4, 6, 2],
      [6, 8, 2],
      [8, 10, 2],
    ]);
  });
  it('the largest value on the upper edge goes to the last bin; edges print as decimals', () => {
    expect(histogramBins([0, 10], 5).map((b) => b.count)).toEqual([1, 1]);
    expect(histogramBins([0.1, 0.2, 0.3], 0.1).map((b) => [b.from, b.to])).toEqual([
      [0.1, 0.2],
      [0.2, 0.3],
    ]);
  });
  it('every observation is counted once; one bar per non-empty bin', () => {
    const values = Array.from({ length: 200 }, (_, i) => Math.sin(i * 1.3) * 100);
    const bins = histogramBins(values);
    expect(bins.reduce((s, b) => s + b.count, 0)).toBe(200);
    const svg = histogram({ ...base('h'), values, x: { label: 'profit', unit: 'HLV' }, y: { label: 'days', unit: 'count' } }).text;
    expect(elements(svg, 'rect', 'bar').map((r) => Number(r.attrs['data-count']))).toEqual(bins.filter((b) => b.count > 0).map((b) => b.count));
  });
});

describe('heatMap', () => {
  const values = [
    [1, 5, null],
    [5, 2, 0],
  ];
  it('best cell: highest or lowest value, ties to the first in row order', () => {
    expect(bestCell(values, 'max')).toEqual({ row: 0, column: 1, value: 5 });
    expect(bestCell(values, 'min')).toEqual({ row: 1, column: 2, value: 0 });
    expect(bestCell([[null]], 'max')).toBeNull();
  });
  it('the extremes take the ends of the sequential scale; the best cell is outlined; a missing cell says so', () => {
    const svg = heatMap({ ...base('hm'), x: days(3), y: days(2), values, value: { label: 'profit', unit: 'HLV' }, best: 'max' }).text;
    const cells = elements(svg, 'rect', 'cell');
    expect(cells).toHaveLength(6);
    const at = (r: number, c: number) => cells.find((e) => e.attrs['data-row'] === String(r) && e.attrs['data-column'] === String(c));
    expect(at(1, 2)?.attrs.fill).toBe(SEQUENTIAL_STOPS[0]);
    expect(at(0, 1)?.attrs.fill).toBe(SEQUENTIAL_STOPS[SEQUENTIAL_STOPS.length - 1]);
    expect(at(0, 2)?.attrs['data-value']).toBeUndefined();
    expect(svg).toMatch(/<g class="best-cell" data-row="0" data-column="1">/);
    expect(svg).toContain('no result');
    // row 0 is at the bottom
    expect(at(0, 0)?.num('y')).toBeGreaterThan(at(1, 0)?.num('y') as number);
  });
});

describe('calibrationPlot', () => {
  it('a square plot with the diagonal from (0, 0) to (1, 1)', () => {
    const svg = calibrationPlot({ ...base('cal'), series: [{ name: 'm', nominal: [0.1, 0.5, 0.9], observed: [0.12, 0.5, 0.85] }] }).text;
    const d = elements(svg, 'line', 'diagonal')[0];
    expect(d).toBeDefined();
    const width = (d?.num('x2') as number) - (d?.num('x1') as number);
    const height = (d?.num('y1') as number) - (d?.num('y2') as number);
    expect(width).toBeGreaterThan(300);
    expect(height).toBeCloseTo(width, 6);
    expect(elements(svg, 'path', 'point')).toHaveLength(3);
  });
});

describe('every chart', () => {
  const page = galleryPage();
  it('the same input gives byte-identical HTML', () => {
    expect(galleryPage()).toBe(page);
  });
  it('has a title, axis titles with units in brackets, and a caption, as SVG text', () => {
    for (const id of GALLERY_CHART_IDS) {
      const svg = page.slice(page.indexOf(`id="${id}"`), page.indexOf('</svg>', page.indexOf(`id="${id}"`)));
      expect(texts(svg, 'chart-title'), id).toHaveLength(1);
      expect(texts(svg, 'caption').length, id).toBeGreaterThanOrEqual(1);
      const axisTitles = texts(svg, 'axis-title');
      expect(axisTitles.length, id).toBeGreaterThanOrEqual(2);
      for (const t of axisTitles) expect(t, id).toMatch(/ \[[^\]]+\]$/);
    }
  });
  it('coordinates carry at most two decimals', () => {
    const numbers = [...page.matchAll(/ (?:x|y|x1|x2|y1|y2|width|height)="(-?[\d.]+)"/g)].map((m) => m[1] as string);
    expect(numbers.length).toBeGreaterThan(500);
    expect(numbers.filter((n) => /\.\d{3,}/.test(n))).toEqual([]);
  });
  it('rendering does not mutate frozen input', () => {
    const spec = deepFreeze({ ...base('z'), x: days(3), y: { label: 'y', unit: '-' }, series: [{ name: 's', values: [3, 1, 2] }] });
    expect(() => lineChart(spec)).not.toThrow();
    expect(() => barChart(spec)).not.toThrow();
  });
});
