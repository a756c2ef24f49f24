import { describe, expect, it } from 'vitest';
import { dayLevelArgument, dayLevelColumns, fitDayLevelSpline } from '../../src/forecast/models/dayLevelSpline.js';
import { DriverFits, driverForecast, type DriverSettings } from '../../src/forecast/models/driverRegression.js';
import { dayNumberOf, HistoryView, weekdayOf } from '../../src/forecast/models/historyView.js';
import type { PriceHistory } from '../../src/types.js';
import { DEFAULTS, Forecaster } from '../../src/forecast/forecaster.js';
import { seededRandom } from './seededRandom.js';
import { syntheticHistory } from './syntheticHistory.js';

// The driver regression's day-level spline in the day before's mean price (dayLevelSpline.ts).

// A sample of m (the day before's mean price) and x (its mean residual load): inputs only; the check
// values are NumPy's, pasted from test/forecast/dayLevelSplineReference.py (NumPy 2.4).
const M = Float64Array.of(0.31, -0.42, 1.27, 0.05, -1.18, 0.66, 0.12, 2.03, -0.35, 0.48, -0.91, 0.87, 0.19, 0.73);
const X = Float64Array.of(510, 480, 590, 500, 450, 540, 505, 620, 470, 530, 460, 560, 515, 545);

describe('day-level spline: knots at the training days\' quantiles', () => {
  // np.quantile's default ('linear') is Hyndman and Fan's (1996) definition 7.
  it('hinge knots are the j/(K+1) quantiles of definition 7 (np.quantile)', () => {
    const two = fitDayLevelSpline('hinge', 2, M, X);
    expect(two.knots[0]).toBeCloseTo(0.0733333333333333, 14);
    expect(two.knots[1]).toBeCloseTo(0.5999999999999999, 14);
    const three = fitDayLevelSpline('hinge-clamped', 3, M, X);
    expect(Array.from(three.knots)).toEqual([-0.25, 0.25, 0.7125].map((v) => expect.closeTo(v, 14)));
    expect([three.low, three.high]).toEqual([-1.18, 2.03]);
    expect(M[0]).toBe(0.31); // the training values are not reordered
  });

  it("natural cubic knots at Harrell's (2015, table 2.3) levels 0.10 0.5 0.90 (np.quantile)", () => {
    const spline = fitDayLevelSpline('natural-cubic', 3, M, X);
    expect(Array.from(spline.knots)).toEqual([-0.763, 0.25, 1.1500000000000004].map((v) => expect.closeTo(v, 14)));
    expect(spline.columns).toBe(1);
  });

  it("'surprise' knots are the quantiles of m less its least-squares line on x (np.polyfit, np.quantile)", () => {
    const spline = fitDayLevelSpline('surprise', 2, M, X);
    expect(spline.alpha).toBeCloseTo(-8.599703084462377, 11);
    expect(spline.beta).toBeCloseTo(0.01707846641683482, 13);
    expect(spline.knots[0]).toBeCloseTo(-0.01387623714807742, 12);
    expect(spline.knots[1]).toBeCloseTo(0.039813010473716326, 12);
  });
});

describe("day-level spline: the 'shared' curve's weights", () => {
  it('are the hinge coefficients of the least-squares regression of the day mean (np.linalg.lstsq), its column sum_j c_j max(0, m - k_j)', () => {
    // The rows of dayLevelSplineReference.py, given by the same formulas there.
    const r = Array.from({ length: 60 }, (_, i) => i);
    const m = Float64Array.from(r, (i) => Math.sin(0.7 * i) + 0.3 * Math.cos(1.9 * i));
    const before = Float64Array.from(r, (i) => 500 + 30 * Math.cos(0.45 * i));
    const own = Float64Array.from(r, (i) => 500 + 25 * Math.sin(1.1 * i + 0.3));
    const weekdays = Int8Array.from(r, (i) => (i % 7) + 1);
    const y = Float64Array.from(r, (i) => 0.2 + 0.6 * m[i]! + 0.001 * before[i]! - 0.002 * own[i]! + 0.05 * Math.sin(3.7 * i) - 0.4 * m[i]! ** 2);
    const spline = fitDayLevelSpline('shared', 2, m, before, { meanZ: y, meanX: own, weekdays });
    expect(Array.from(spline.knots)).toEqual([-0.36043254246854045, 0.5184985983441571].map((v) => expect.closeTo(v, 13)));
    expect(Array.from(spline.weights)).toEqual([-0.7806336361969791, -0.6945663898853394].map((v) => expect.closeTo(v, 10)));
    expect(spline.columns).toBe(1);
    const out = new Float64Array(1);
    dayLevelColumns(spline, dayLevelArgument(spline, 0.9), 0, out, 0);
    expect(out[0]).toBeCloseTo(-0.7806336361969791 * (0.9 + 0.36043254246854045) - 0.6945663898853394 * (0.9 - 0.5184985983441571), 10);
  });
});

describe('day-level spline: columns in closed form', () => {
  it('hinges are max(0, m - k_j) (the truncated power basis of degree 1, Hastie et al. 2009, eq. 5.3), clamped into the training range for hinge-clamped', () => {
    const spline = fitDayLevelSpline('hinge', 2, M, X);
    const out = new Float64Array(3);
    dayLevelColumns(spline, 0.4, 500, out, 1);
    expect(out[0]).toBe(0);
    expect(out[1]).toBeCloseTo(0.4 - 0.0733333333333333, 14);
    expect(out[2]).toBe(0);
    const clamped = fitDayLevelSpline('hinge-clamped', 2, M, X);
    expect(dayLevelArgument(clamped, 5)).toBe(2.03);
    expect(dayLevelArgument(clamped, -5)).toBe(-1.18);
    expect(dayLevelArgument(spline, 5)).toBe(5);
  });

  it('the restricted cubic spline is linear beyond its outer knots (Harrell 2015, section 2.4.5): zero second differences', () => {
    const spline = fitDayLevelSpline('natural-cubic', 3, M, X);
    const at = (m: number): number => {
      const out = new Float64Array(1);
      dayLevelColumns(spline, m, 0, out, 0);
      return out[0] as number;
    };
    expect(at(-1)).toBe(0);
    expect(at(2) - 2 * at(3) + at(4)).toBeCloseTo(0, 10);
    // Between the knots it is not linear.
    expect(Math.abs(at(0) - 2 * at(0.5) + at(1))).toBeGreaterThan(1e-3);
  });
});

/**
 * A history on which the driver regression's model, with the day-level hinges, holds exactly (no noise):
 *   P(d,s) = b0 + c0 x(d,s) + a3 P(d-1,s) + a4 P(d-7,s) + a1 m(d-1) + a2 xbar(d-1) + sum_j c_j max(0, m(d-1) - k_j) + g_w(d),
 * with the day means m(d) drawn first (uniform), the knots k_j the j/3 quantiles (definition 7) of
 * m(d-1) over the training days of the fit, and the day's mean residual load xbar(d) solved from the
 * day mean, xbar(d) = (m(d) - [the day-level part] - a3 m(d-1) - a4 m(d-7)) / c0, plus a zero-mean slot
 * pattern. Least squares on an exactly consistent full-rank design returns the generating coefficients
 * (the normal equations' unique solution), and the Huber step moves no response (residuals 0).
 */
const TRUE = { b0: 12, c0: 0.05, a3: 0.3, a4: 0.1, a1: 0.4, a2: -0.02, c: [0.5, -0.7], g: [0, 1.5, -0.5, 0.8, 2, -1, 3] };
const WINDOW = 120;
const template = syntheticHistory({ days: 150, periodMinutes: 60, seed: 3 });
const FIT_INDEX = 140;

function quantile7(values: readonly number[], tau: number): number {
  const sorted = [...values].sort((p, q) => p - q);
  const h = (sorted.length - 1) * tau;
  const j = Math.floor(h);
  return sorted[j]! + (h - j) * (sorted[Math.min(j + 1, sorted.length - 1)]! - sorted[j]!);
}

function exactHistory(): { history: PriceHistory; knots: number[] } {
  const u = seededRandom(11);
  const D = template.days.length;
  const S = 24;
  const m = Array.from({ length: D }, () => 20 + 60 * u());
  // Training days of the fit of day FIT_INDEX: the WINDOW days before it; their day before's means.
  const knots = [1 / 3, 2 / 3].map((tau) => quantile7(m.slice(FIT_INDEX - WINDOW - 1, FIT_INDEX - 1), tau));
  const prices: number[][] = [];
  const loads: number[][] = [];
  const xbar: number[] = [];
  for (let d = 0; d < D; d++) {
    const pattern = Array.from({ length: S }, () => 40 * (u() - 0.5));
    const patternMean = pattern.reduce((p, q) => p + q, 0) / S;
    if (d < 7) {
      // Lag days: any prices with day mean m(d).
      const x = pattern.map((p) => 500 + p - patternMean);
      loads.push(x);
      xbar.push(500);
      prices.push(x.map((v) => m[d]! + 0.05 * (v - 500)));
      continue;
    }
    const weekday = weekdayOf(dayNumberOf(template.days[d]!.day));
    const level =
      TRUE.b0 + TRUE.a1 * m[d - 1]! + TRUE.a2 * xbar[d - 1]! + TRUE.c.reduce((sum, c, j) => sum + c * Math.max(0, m[d - 1]! - knots[j]!), 0) + (weekday <= 6 ? TRUE.g[weekday]! : 0);
    const mean = (m[d]! - level - TRUE.a3 * m[d - 1]! - TRUE.a4 * m[d - 7]!) / TRUE.c0;
    const x = pattern.map((p) => mean + p - patternMean);
    loads.push(x);
    xbar.push(x.reduce((p, q) => p + q, 0) / S);
    prices.push(x.map((v, s) => level + TRUE.c0 * v + TRUE.a3 * prices[d - 1]![s]! + TRUE.a4 * prices[d - 7]![s]!));
  }
  const history: PriceHistory = {
    ...template,
    days: template.days.map((day, d) => ({ ...day, pricePerMwh: prices[d]!, exogenous: { load_mw: loads[d]! } })),
  };
  return { history, knots };
}

const SETTINGS: DriverSettings = { windowsDays: [WINDOW], minTrainingDays: 28, knots: 0, scale: 'price', levelKnots: 2, levelBasis: 'hinge' };

describe('driver regression with day-level hinges: an exactly linear model is recovered', () => {
  const { history, knots } = exactHistory();

  it('the fit returns the generating coefficients to 1e-9 and its knots are the training days\' quantiles', () => {
    const fits = new DriverFits();
    const view = HistoryView.before(history, FIT_INDEX);
    expect(driverForecast(view, { ...SETTINGS, fits })).not.toBeNull();
    const fit = fits.get(dayNumberOf(history.days[FIT_INDEX]!.day))!;
    expect(Array.from(fit.levelSpline!.knots)).toEqual(knots.map((k) => expect.closeTo(k, 12)));
    // Coefficients: x, lag 1, lag 7, meanZ, meanX, the two hinges, Monday..Saturday.
    const expected = [TRUE.c0, TRUE.a3, TRUE.a4, TRUE.a1, TRUE.a2, ...TRUE.c, ...TRUE.g.slice(1)];
    expect(fit.coefficients).toBe(expected.length);
    for (let s = 0; s < 24; s++) {
      const at = s * (fit.coefficients + 1);
      expect(Math.abs((fit.models[at] as number) - TRUE.b0)).toBeLessThan(1e-9);
      for (let j = 0; j < expected.length; j++) expect(Math.abs((fit.models[at + 1 + j] as number) - expected[j]!)).toBeLessThan(1e-9);
    }
  });

  it('the delivery day is forecast at its generated prices (the prediction reads the hinges where the fit put them)', () => {
    const made = driverForecast(HistoryView.before(history, FIT_INDEX), SETTINGS)!;
    const truth = history.days[FIT_INDEX]!.pricePerMwh;
    for (let s = 0; s < 24; s++) expect(Math.abs((made.mean[s] as number) - truth[s]!)).toBeLessThan(1e-9);
  });

  it('a day-level hinge fewer than 20 of the training days reach is left out (coefficient 0), as the residual load\'s hinges are', () => {
    const fits = new DriverFits();
    driverForecast(HistoryView.before(history, FIT_INDEX), { ...SETTINGS, levelKnots: 9, fits });
    const fit = fits.get(dayNumberOf(history.days[FIT_INDEX]!.day))!;
    const training = history.days.slice(FIT_INDEX - WINDOW - 1, FIT_INDEX - 1).map((d) => d.pricePerMwh.reduce((p, q) => p + q, 0) / 24);
    const reached = Array.from(fit.levelSpline!.knots, (k) => training.filter((m) => m > k).length);
    // Counted by hand here: the 0.8 quantile's hinge is reached by 24 days, the 0.9 quantile's by 12.
    expect(reached.slice(7)).toEqual([24, 12]);
    // Coefficients: x, lag 1, lag 7, meanZ, meanX, then the nine hinges.
    expect(fit.models[1 + 5 + 7]).not.toBe(0);
    expect(fit.models[1 + 5 + 8]).toBe(0);
  });

  it('without the day-level hinges the same data are not fitted exactly (the hinges carry the level)', () => {
    const made = driverForecast(HistoryView.before(history, FIT_INDEX), { ...SETTINGS, levelKnots: 0 })!;
    const truth = history.days[FIT_INDEX]!.pricePerMwh;
    expect(Math.max(...truth.map((p, s) => Math.abs((made.mean[s] as number) - p)))).toBeGreaterThan(1e-3);
  });
});

describe('driver regression: levelKnots 0 is the model without the spline', () => {
  // Regression pin: the coefficients (slot 0 of the 56-day window, slot 5 of the 91-day window) and the
  // first four forecasts that main's build (commit 3a4f86c, before the day-level spline existed) gives
  // on this history, printed as JSON (shortest round-trip decimals) and pasted: the same bits, not close.
  const MAIN = {
    m0: [3.555338673997529, 0.016949354382000213, -0.012142787829059068, 0, 0.31173642212258096, -0.025625722558862304, 0.4029249903566941, -0.022403605316118517, -0.1512485821982735, 1.0453942629410937, 0.9421930451622165, 0.9050783021885884, 0.9190518455354474, 1.2761145572398098],
    m5: [-3.5297877225494303, 0.0025747982695029474, 0.00217019042573491, -0.0051163645680200156, -0.030152113036425617, -0.13291475983686382, 0.7904540037288447, 0.0036790723222379818, 0.8560819215120016, -0.17026618769172325, -0.2870105647199618, -0.27732409475179187, -0.13491998499158583, -1.02326662910499],
    mean: [30.143017670986723, 30.338090914937098, 31.003196614842878, 31.709996327539592],
  };
  const h = syntheticHistory({ days: 160, periodMinutes: 60, seed: 7 });
  for (const levelKnots of [undefined, 0]) {
    it(`levelKnots ${String(levelKnots)}: main's coefficients and forecasts, bit for bit`, () => {
      const fits = new DriverFits();
      const made = driverForecast(HistoryView.before(h, 150), { windowsDays: [56, 91], minTrainingDays: 28, knots: 2, scale: 'asinh', fits, ...(levelKnots === undefined ? {} : { levelKnots }) })!;
      const fit = fits.get(dayNumberOf(h.days[150]!.day))!;
      const k = fit.coefficients;
      expect(k).toBe(13);
      expect(fit.levelSpline).toBeNull();
      expect(Array.from(fit.models.subarray(0, k + 1))).toEqual(MAIN.m0);
      expect(Array.from(fit.models.subarray((24 + 5) * (k + 1), (24 + 5) * (k + 1) + k + 1))).toEqual(MAIN.m5);
      expect(Array.from(made.mean.subarray(0, 4))).toEqual(MAIN.mean);
    });
  }
});

describe('forecaster options of the day-level spline', () => {
  const h = syntheticHistory({ days: 60, periodMinutes: 60, seed: 2 });
  it('rejects an unknown basis, a negative knot count, and a natural cubic spline with other than 3 to 5 knots (Harrell 2015, table 2.3)', () => {
    expect(() => new Forecaster(h, { driverLevelBasis: 'cubic' as never })).toThrow(/driverLevelBasis/);
    expect(() => new Forecaster(h, { driverLevelKnots: -1 })).toThrow(/driverLevelKnots/);
    expect(() => new Forecaster(h, { driverLevelKnots: 2, driverLevelBasis: 'natural-cubic' })).toThrow(/driverLevelKnots/);
    expect(() => new Forecaster(h, { driverLevelKnots: 3, driverLevelBasis: 'natural-cubic' })).not.toThrow();
    expect(DEFAULTS.driverLevelKnots).toBe(0);
  });
});
