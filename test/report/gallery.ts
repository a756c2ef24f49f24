/**
 * A page with one chart of every kind, from invented deterministic numbers (no random source), for
 * the determinism test and the browser test of the chart module. Not a check value anywhere.
 */
import { deliveryPeriods } from '../../src/market/calendar.js';
import {
  barChart,
  calibrationPlot,
  categoryAxis,
  fanChart,
  heatMap,
  histogram,
  htmlPage,
  htmlTable,
  lineChart,
  paragraph,
  periodAxis,
  ROLE_COLOURS,
} from '../../src/report/index.js';

export const GALLERY_CHART_IDS = ['g-line', 'g-line-days', 'g-bar', 'g-fan', 'g-histogram', 'g-heat-map', 'g-calibration'] as const;

export function galleryPage(): string {
  const periods = deliveryPeriods('2027-10-31', 'Europe/Berlin', 15); // autumn clock change: 100 periods
  const axis = periodAxis(periods, 'Europe/Berlin');
  const wave = periods.map((_, t) => 80 + 50 * Math.sin((2 * Math.PI * t) / periods.length) + 10 * Math.sin(t / 3));
  const days = Array.from({ length: 60 }, (_, d) => `2026-${d < 31 ? '01' : '02'}-${String((d % 31) + 1).padStart(2, '0')}`);
  const cumulative = days.map((_, d) => 120 * d + 400 * Math.sin(d / 5));
  const energies = [5, 10, 15, 20, 25, 30, 35, 40];
  const powers = [2.5, 5, 7.5, 10, 12.5, 15];
  const profit = powers.map((p) => energies.map((e) => (e === 40 && p === 2.5 ? null : Math.round(1000 * (Math.log(e) * Math.log(1 + p) - 0.02 * e * p)) / 10)));
  const levels = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95];
  return htmlPage({
    title: 'Chart gallery <test & "escape">',
    subtitle: 'Every chart kind of the report module, invented numbers.',
    sections: [
      {
        id: 'lines',
        heading: 'Line charts',
        blocks: [
          lineChart({
            id: 'g-line',
            title: 'Two series, right axis, gap, guide',
            caption: 'Blue: price; orange dashed: state of charge on the right axis; a gap where a value is missing.',
            x: axis,
            y: { label: 'price', unit: 'HLV/MWh' },
            y2: { label: 'state of charge', unit: 'MWh' },
            series: [
              { name: 'price', values: wave.map((v, t) => (t >= 40 && t < 44 ? null : v)) },
              { name: 'state of charge', values: periods.map((_, t) => 5 + 4 * Math.cos(t / 16)), axis: 'right', dash: true },
            ],
            guides: [{ value: 100, label: 'reference price' }],
          }),
          lineChart({
            id: 'g-line-days',
            title: 'Cumulative profit over days',
            caption: 'Line: profit summed from the first day.',
            x: categoryAxis(days, { label: 'delivery day', unit: 'YYYY-MM-DD' }),
            y: { label: 'cumulative profit', unit: 'HLV', includeZero: true },
            series: [{ name: 'quantile policy', values: cumulative, points: true }],
          }),
        ],
      },
      {
        id: 'bars',
        heading: 'Bars and fan',
        blocks: [
          barChart({
            id: 'g-bar',
            title: 'Grouped bars',
            caption: 'Two bars per day: bought and sold energy.',
            x: categoryAxis(days.slice(0, 12), { label: 'delivery day', unit: 'YYYY-MM-DD' }),
            y: { label: 'energy', unit: 'MWh' },
            series: [
              { name: 'bought', values: days.slice(0, 12).map((_, d) => 10 + (d % 4)), colour: ROLE_COLOURS.buy },
              { name: 'sold', values: days.slice(0, 12).map((_, d) => -(8 + (d % 3))), colour: ROLE_COLOURS.sell },
            ],
          }),
          fanChart({
            id: 'g-fan',
            title: 'Fan of quantiles on a 25-hour day',
            caption: 'Bands: central intervals; line: median; markers: limits.',
            x: axis,
            y: { label: 'price', unit: 'HLV/MWh' },
            bands: [
              [0.05, 0.95],
              [0.1, 0.9],
              [0.25, 0.75],
            ].map(([lo, hi]) => ({ lowerLevel: lo as number, upperLevel: hi as number, lower: wave.map((v) => v - 60 * (0.5 - (lo as number))), upper: wave.map((v) => v + 60 * ((hi as number) - 0.5)) })),
            median: { name: 'median (q0.5)', values: wave },
            markers: [
              { name: 'buy limit', values: wave.map((v, t) => (t < 12 ? v + 24 : null)), shape: 'triangle-down', colour: ROLE_COLOURS.buy },
              { name: 'sell limit', values: wave.map((v, t) => (t > 70 && t < 80 ? v - 24 : null)), shape: 'triangle-up', colour: ROLE_COLOURS.sell },
            ],
          }),
        ],
      },
      {
        id: 'distributions',
        heading: 'Distributions, grids, calibration',
        blocks: [
          histogram({
            id: 'g-histogram',
            title: 'Daily profit',
            caption: 'Bars: number of days per profit bin; dashed: mean and zero.',
            values: days.map((_, d) => 150 * Math.sin(d * 1.7) + 40),
            x: { label: 'daily profit', unit: 'HLV' },
            y: { label: 'days', unit: 'count' },
            markers: [
              { value: 40, label: 'mean' },
              { value: 0, label: 'zero' },
            ],
          }),
          heatMap({
            id: 'g-heat-map',
            title: 'Profit over energy and power',
            caption: 'Colour: yearly profit per setting; outlined: the best; grey: no result.',
            x: categoryAxis(energies.map(String), { label: 'energy', unit: 'MWh' }),
            y: categoryAxis(powers.map(String), { label: 'power', unit: 'MW' }),
            values: profit,
            value: { label: 'profit', unit: 'kHLV/year' },
            best: 'max',
          }),
          calibrationPlot({
            id: 'g-calibration',
            title: 'Calibration of two forecasts',
            caption: 'Points on the dashed diagonal are calibrated; vertical lines: 95 % acceptance range.',
            series: [
              { name: 'empirical residuals', nominal: levels, observed: levels.map((l) => l + 0.03 * Math.sin(l * 9)), low: levels.map((l) => l - 0.04), high: levels.map((l) => l + 0.04) },
              { name: 'split conformal', nominal: levels, observed: levels.map((l) => l * 0.9 + 0.04) },
            ],
          }),
          htmlTable({
            caption: 'A table with text to escape',
            columns: [{ header: 'name' }, { header: 'value', unit: 'HLV', decimals: 2 }],
            rows: [
              ['<b>not bold</b>', 1234.5],
              ['a & b', -2],
              ['missing', null],
            ],
          }),
          paragraph('A paragraph with <tags> & "quotes".'),
        ],
      },
    ],
    footer: 'Invented numbers.',
  });
}
