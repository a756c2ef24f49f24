import { describe, expect, it } from 'vitest';
import { arxForecast, keptAsinhDay } from '../../src/forecast/models/arx.js';
import type { ArxSettings } from '../../src/forecast/models/arx.js';
import { ForecastInputError } from '../../src/forecast/models/errors.js';
import { HistoryView, dayNumberOf, weekdayOf } from '../../src/forecast/models/historyView.js';
import { fromAsinhScale, robustScale, toAsinhScale, toAsinhScales } from '../../src/forecast/models/robustAsinh.js';
import { seasonalNaive } from '../../src/forecast/models/seasonalNaive.js';
import { fromSlotGrid, localMinuteOfDay, slotLayout, toSlotGrid } from '../../src/forecast/models/slotGrid.js';
import { LASSO_DEFAULTS } from '../../src/forecast/linalg/lasso.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';
import { seededNormal } from './seededRandom.js';
import { ArxGramBuilder } from '../../src/forecast/models/arxGram.js';
import { nestedStandardisedGrams } from '../../src/forecast/linalg/standardisedGram.js';
import type { StandardisedGram } from '../../src/forecast/linalg/standardisedGram.js';

describe('slot grid', () => {
  const history = syntheticHistory({ days: 8, periodMinutes: 60, seed: 2, shortDay: 2, longDay: 5 });
  const short = history.days[2]!;
  const long = history.days[5]!;

  it('reads the local clock time of a period start', () => {
    expect(localMinuteOfDay('2031-03-30T03:15:00+02:00')).toBe(195);
    expect(() => localMinuteOfDay('yesterday')).toThrow(ForecastInputError);
  });

  it('interpolates the skipped hour of a 23-hour day linearly and averages the doubled hour of a 25-hour day', () => {
    const shortLayout = slotLayout(short.periods, 'short');
    expect(short.periods).toHaveLength(23);
    const grid = toSlotGrid(short.pricePerMwh, shortLayout);
    expect(grid).toHaveLength(24);
    expect(grid[2]).toBeCloseTo((short.pricePerMwh[1]! + short.pricePerMwh[2]!) / 2, 12);
    const longLayout = slotLayout(long.periods, 'long');
    expect(long.periods).toHaveLength(25);
    const longGrid = toSlotGrid(long.pricePerMwh, longLayout);
    expect(longGrid[2]).toBeCloseTo((long.pricePerMwh[2]! + long.pricePerMwh[3]!) / 2, 12);
    expect(fromSlotGrid(longGrid, longLayout)).toHaveLength(25);
    expect(fromSlotGrid(grid, shortLayout)).toEqual(short.pricePerMwh);
  });
});

describe('calendar helpers', () => {
  it('numbers days from 1970-01-01 (a Thursday) and gives ISO weekdays', () => {
    expect(dayNumberOf('1970-01-01')).toBe(0);
    expect(dayNumberOf('2000-03-01') - dayNumberOf('2000-02-28')).toBe(2); // 2000 was a leap year
    expect(weekdayOf(0)).toBe(4);
    expect(weekdayOf(dayNumberOf('2031-01-06'))).toBe(1); // a Monday
    expect(weekdayOf(-1)).toBe(3);
  });
});

describe('robust scale and asinh transformation (Uniejewski, Weron and Ziel 2018)', () => {
  it('median and MAD / Phi^-1(3/4), with Phi^-1(3/4) = 0.6744897501960817', () => {
    // Phi^-1(0.75) = 0.674490 in Abramowitz and Stegun (1964), table 26.5; more digits from memory.
    const s = robustScale([1, 2, 3, 4, 100]);
    expect(s.median).toBe(3);
    expect(s.scale).toBeCloseTo(1 / 0.6744897501960817, 12);
    expect(robustScale([4, 1, 3, 2]).median).toBe(2.5);
  });

  it('falls back to the mean absolute deviation when the MAD is 0, and to 1 for a constant sample', () => {
    const s = robustScale([5, 5, 5, 5, 9]);
    expect(s.median).toBe(5);
    // Mean absolute deviation about the median (0 + 0 + 0 + 0 + 4) / 5 = 4/5, times sqrt(pi/2): for a
    // normal distribution E|X - mu| = sigma sqrt(2 / pi) (Geary 1935, Biometrika 27, 310-332; from memory).
    expect(s.scale).toBeCloseTo((4 / 5) * Math.sqrt(Math.PI / 2), 12);
    expect(robustScale([7, 7, 7]).scale).toBe(1);
  });

  it('is inverted by a + b sinh(z), including negative prices', () => {
    const s = robustScale([-20, 10, 35, 40, 300]);
    for (const p of [-500, -20, 0, 37.5, 3000]) expect(fromAsinhScale(toAsinhScale(p, s), s)).toBeCloseTo(p, 9);
  });

  it('toAsinhScales: asinh((p - a) / b) = ln(x + sqrt(x^2 + 1)) of each value, toAsinhScale bit for bit', () => {
    // a = 3, b = 1 / Phi^-1(3/4) (first test): p = a gives asinh 0 = 0; p = a +- b gives
    // +-asinh(1) = +-ln(1 + sqrt 2) (the closed form of asinh; Abramowitz and Stegun 1964, 4.6.20).
    const s = robustScale([1, 2, 3, 4, 100]);
    const prices = [3, 3 + s.scale, 3 - s.scale, -250, 0, 17.25, 1e4];
    const out = new Float64Array(prices.length);
    toAsinhScales(prices, s, out);
    expect(out[0]).toBe(0);
    expect(out[1]).toBeCloseTo(Math.log(1 + Math.SQRT2), 14);
    expect(out[2]).toBeCloseTo(-Math.log(1 + Math.SQRT2), 14);
    prices.forEach((p, i) => {
      const x = (p - s.median) / s.scale;
      expect(out[i]).toBeCloseTo(Math.log(x + Math.sqrt(x * x + 1)), 10);
      expect(Object.is(out[i], toAsinhScale(p, s))).toBe(true);
    });
    // Only out.length values are written.
    const short = new Float64Array(2);
    toAsinhScales(prices, s, short);
    expect([...short]).toEqual([...out.subarray(0, 2)]);
  });
});

describe('HistoryView', () => {
  const history = syntheticHistory({ days: 20, periodMinutes: 60, seed: 3 });

  it('holds only the days before the delivery day and the delivery day without its prices', () => {
    const view = HistoryView.before(history, 12);
    expect(view.pastCount).toBe(12);
    expect(() => view.past(12)).toThrow(RangeError);
    expect(Object.keys(view.target).sort()).toEqual(['day', 'dayNumber', 'exogenous', 'layout', 'periods', 'weekday']);
    expect(view.target.exogenous[0]).toEqual(Float64Array.from(history.days[12]!.exogenous.load_mw!));
    expect(view.indexOf(view.target.dayNumber - 1)).toBe(11);
    expect(view.indexAtOrBefore(view.target.dayNumber + 5)).toBe(11);
  });

  it('rejects unsorted days and non-finite past prices with the field named', () => {
    const unsorted: PriceHistory = { ...history, days: [history.days[1]!, history.days[0]!, history.days[2]!] };
    expect(() => HistoryView.before(unsorted, 2)).toThrow(/history\.days\[1\]/);
    const holed: PriceHistory = { ...history, days: history.days.map((d, i) => (i === 3 ? { ...d, pricePerMwh: d.pricePerMwh.map(() => Number.NaN) } : d)) };
    expect(() => HistoryView.before(holed, 10).past(3)).toThrow(/history\.days\[3\]\.pricePerMwh\[0\]/);
  });
});

describe('point models', () => {
  const settings: ArxSettings = { windowsDays: [28, 42], estimator: 'least-squares', lasso: LASSO_DEFAULTS, minTrainingDays: 21 };

  it('seasonal naive repeats the same slot lagDays back', () => {
    const history = syntheticHistory({ days: 30, periodMinutes: 60, seed: 5 });
    const view = HistoryView.before(history, 20);
    expect([...seasonalNaive(view, 7)!.mean]).toEqual(history.days[13]!.pricePerMwh);
    expect([...seasonalNaive(view, 1)!.mean]).toEqual(history.days[19]!.pricePerMwh);
    expect(seasonalNaive(HistoryView.before(history, 3), 7)).toBeNull();
  });

  it('ARX reproduces a noiseless weekly price profile exactly (lag 7 fits it with zero error)', () => {
    const base = syntheticHistory({ days: 70, periodMinutes: 60, seed: 6 });
    const week = base.days.slice(0, 7).map((d) => d.pricePerMwh);
    const history: PriceHistory = { ...base, days: base.days.map((d, i) => ({ ...d, pricePerMwh: [...week[i % 7]!] })) };
    const forecast = arxForecast(HistoryView.before(history, 60), settings)!;
    forecast.mean.forEach((p, s) => expect(p).toBeCloseTo(week[60 % 7]![s]!, 6));
  });

  it('ARX averages its window members and needs minTrainingDays usable days', () => {
    const history = syntheticHistory({ days: 70, periodMinutes: 60, seed: 9 });
    const forecast = arxForecast(HistoryView.before(history, 60), settings)!;
    expect(forecast.members).toHaveLength(2);
    forecast.mean.forEach((p, s) => expect(p).toBeCloseTo((forecast.members[0]![s]! + forecast.members[1]![s]!) / 2, 12));
    // day 27: 20 usable training days (lags need 7 days) < 21
    expect(arxForecast(HistoryView.before(history, 27), settings)).toBeNull();
    expect(arxForecast(HistoryView.before(history, 28), settings)).not.toBeNull();
  });

  it('ARX with an exogenous column rescaled (a x + b) gives the same forecast (least squares with intercept)', () => {
    const history = syntheticHistory({ days: 70, periodMinutes: 60, seed: 10 });
    const rescaled: PriceHistory = {
      ...history,
      days: history.days.map((d) => ({ ...d, exogenous: { load_mw: d.exogenous.load_mw!.map((v) => 0.001 * v - 3) } })),
    };
    const a = arxForecast(HistoryView.before(history, 65), settings)!;
    const b = arxForecast(HistoryView.before(rescaled, 65), settings)!;
    a.mean.forEach((p, s) => expect(b.mean[s]).toBeCloseTo(p, 8));
  });

  it('ARX by least squares beats the weekly naive forecast on the synthetic series (behaviour, not a check value)', () => {
    const history = syntheticHistory({ days: 120, periodMinutes: 60, seed: 11 });
    let arxError = 0;
    let naiveError = 0;
    for (let d = 80; d < 120; d++) {
      const view = HistoryView.before(history, d);
      const realised = history.days[d]!.pricePerMwh;
      const arx = arxForecast(view, settings)!.mean;
      const naive = seasonalNaive(view, 7)!.mean;
      realised.forEach((p, s) => {
        arxError += Math.abs(p - arx[s]!);
        naiveError += Math.abs(p - naive[s]!);
      });
    }
    expect(arxError).toBeLessThan(naiveError);
  });
});

describe('ArxGramBuilder', () => {
  // exo 1 and 3 give an odd number of slot columns (the builder takes them two at a time).
  it.each([1, 2, 3])('equals the plain nested Gram of the explicitly built ARX design (structure used, same sums), %i exogenous columns', (exo) => {
    const z = seededNormal(41);
    const n = 50;
    const a = 4 + exo;
    const minMaxLast = Float64Array.from({ length: n * 3 }, () => z());
    const weekdays = Int8Array.from({ length: n }, (_, i) => ((i + 3) % 7) + 1);
    const slotValues = Float64Array.from({ length: n * a }, (_, i) => (i % a >= 3 && i % a < 3 + exo ? 500 + 50 * z() : z()));
    const counts = [20, 35, 50];
    const builder = new ArxGramBuilder({ minMaxLast, weekdays }, counts);
    for (const lastSlot of [false, true]) {
      const k = 12 + exo;
      const x = new Float64Array(n * k);
      const y = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const v = slotValues.subarray(i * a, (i + 1) * a);
        const row = [v[0]!, v[1]!, v[2]!, minMaxLast[3 * i]!, minMaxLast[3 * i + 1]!, lastSlot ? 0 : minMaxLast[3 * i + 2]!];
        for (let w = 1; w <= 6; w++) row.push(weekdays[i] === w ? 1 : 0);
        for (let j = 0; j < exo; j++) row.push(v[3 + j]!);
        x.set(row, i * k);
        y[i] = v[a - 1]!;
      }
      const plain = nestedStandardisedGrams({ rows: n, cols: k, data: x }, y, counts);
      const fast: StandardisedGram[] = [];
      const columns = Float64Array.from({ length: n * a }, (_, c) => slotValues[(c % n) * a + Math.floor(c / n)]!);
      builder.forEachGram(columns, a, lastSlot, (g) => fast.push(structuredClone(g)));
      fast.forEach((g, w) => {
        const p = plain[w]!;
        expect(g.n).toBe(p.n);
        expect(g.yMean).toBeCloseTo(p.yMean, 12);
        expect(g.yVariance).toBeCloseTo(p.yVariance, 12);
        expect([...g.scales].map((v) => v === 0)).toEqual([...p.scales].map((v) => v === 0));
        g.means.forEach((m, j) => expect(m).toBeCloseTo(p.means[j]!, 9));
        g.scales.forEach((m, j) => expect(m).toBeCloseTo(p.scales[j]!, 9));
        g.gram.forEach((m, j) => expect(m).toBeCloseTo(p.gram[j]!, 12));
        g.zty.forEach((m, j) => expect(m).toBeCloseTo(p.zty[j]!, 12));
      });
    }
  });
});

describe('keptAsinhDay: the last ARX fit\'s transformed prices, read again', () => {
  it('gives toAsinhScale of a day the fit transformed, bit for bit, only for the very scale object it used', () => {
    const history = syntheticHistory({ days: 90, periodMinutes: 60, seed: 5 });
    const view = HistoryView.before(history, 80);
    const settings: ArxSettings = { windowsDays: [28, 42], estimator: 'least-squares', lasso: LASSO_DEFAULTS, minTrainingDays: 21 };
    expect(arxForecast(view, settings)).not.toBeNull();
    // The training days of the longest window (a gapless history: every day 42 or fewer days back).
    const training = Array.from({ length: view.pastCount }, (_, i) => i).filter((i) => view.dayNumber(i) >= view.target.dayNumber - 42);
    const scale = view.robustScaleOf([...training].reverse(), 42);
    const out = new Float64Array(view.slotsPerDay);
    for (const i of [training[0]!, training[training.length - 1]!]) {
      const prices = view.past(i).prices;
      expect(keptAsinhDay(scale, prices, out)).toBe(true);
      expect([...out].every((z, s) => Object.is(z, toAsinhScale(prices[s]!, scale)))).toBe(true);
    }
    // An equal scale that is another object, or a day the fit did not read, is not served.
    expect(keptAsinhDay({ ...scale }, view.past(training[0]!).prices, out)).toBe(false);
    expect(keptAsinhDay(scale, view.past(0).prices, out)).toBe(false);
  });
});
