import { describe, expect, it } from 'vitest';
import { forecastDay } from '../../src/forecast/forecaster.js';
import { DriverFits, driverForecast, holdoutShiftLambda, SHIFT_HOLDOUT_DAYS, type DriverSettings } from '../../src/forecast/models/driverRegression.js';
import { residualLoadColumns } from '../../src/forecast/models/residualLoad.js';
import { HistoryView } from '../../src/forecast/models/historyView.js';
import { dayOffset, inverseOf, monotoneHingeCurve } from '../../src/forecast/models/residualLoadShift.js';
import type { PriceHistory } from '../../src/types.js';
import { seededNormal } from './seededRandom.js';
import { syntheticHistory } from './syntheticHistory.js';

describe('monotone hinge curve and its inverse (inverse prediction: Osborne 1991, Brown 1993)', () => {
  it('a linear curve: the offset f^-1(z) - x equals (z - f(x)) / slope exactly (closed form)', () => {
    // f(x) = 2 + 0.5 x, no knots. Periods (x, z) = (1, 3) and (3, 4.5): (3 - 2.5) / 0.5 = 1 and
    // (4.5 - 3.5) / 0.5 = 2; the day's offset is their median, 1.5 (worked by hand).
    const curve = monotoneHingeCurve(2, 0.5, [], []);
    expect(inverseOf(curve, 3) - 1).toBe(1);
    expect(inverseOf(curve, 4.5) - 3).toBe(2);
    expect(dayOffset([curve, curve], [3, 4.5], [1, 3], new Float64Array(2))).toBe(1.5);
  });

  it('a two-piece hinge curve f(x) = 1 + x + 2 max(0, x - 3): values worked by hand', () => {
    // f(3) = 4; slope 1 left of 3, 3 right of it. f^-1(2.5) = 3 + (2.5 - 4) / 1 = 1.5, f^-1(10) = 3 + (10 - 4) / 3 = 5
    // (check: f(5) = 1 + 5 + 4 = 10), f^-1(4) = 3.
    const curve = monotoneHingeCurve(1, 1, [2], [3]);
    expect(Array.from(curve.slopes)).toEqual([1, 3]);
    expect(inverseOf(curve, 2.5)).toBeCloseTo(1.5, 12);
    expect(inverseOf(curve, 10)).toBeCloseTo(5, 12);
    expect(inverseOf(curve, 4)).toBeCloseTo(3, 12);
    // Three periods on this curve at x = 0, 4, 6 with z = f(x + 0.5) = 1.5, 7.5, 13.5: each offset 0.5, the median 0.5.
    const z = [1 + 0.5, 1 + 4.5 + 2 * 1.5, 1 + 6.5 + 2 * 3.5];
    expect(dayOffset([curve, curve, curve], z, [0, 4, 6], new Float64Array(3))).toBeCloseTo(0.5, 12);
  });

  it('a falling stretch is floored at a tenth of the median slope, so the curve stays increasing', () => {
    // Slopes 1, 1 - 2 = -1, -1 + 3 = 2: median 1, floor 0.1; f(0) = 5, f(1) = 5 + 0.1 (worked by hand).
    const curve = monotoneHingeCurve(5, 1, [-2, 3], [0, 1]);
    expect(Array.from(curve.slopes)).toEqual([1, 0.1, 2]);
    expect(curve.values[1]).toBeCloseTo(5.1, 12);
    expect(inverseOf(curve, 5.05)).toBeCloseTo(0.5, 12);
    expect(inverseOf(curve, 7.1)).toBeCloseTo(2, 12);
  });
});

describe("driver regression, the day before's level as a residual-load shift (level 'shift')", () => {
  const SETTINGS: DriverSettings = { windowsDays: [140], minTrainingDays: 28, knots: 3, scale: 'price' };

  it("with lambda's grid {0} the forecasts are level 'mean''s bit for bit (lambda = 0 is today's model)", () => {
    const h = syntheticHistory({ days: 170, periodMinutes: 60, seed: 5 });
    for (const i of [150, 163]) {
      const mean = driverForecast(HistoryView.before(h, i), SETTINGS);
      const shifted = driverForecast(HistoryView.before(h, i), { ...SETTINGS, level: 'shift', shiftLambdas: [0] });
      expect(shifted).not.toBeNull();
      expect(Array.from(shifted!.mean)).toEqual(Array.from(mean!.mean));
    }
  });

  it("on prices made exactly as P = f(x + m_d), m_d = 0.9 D(d-1) + e_d, the fit takes a lambda > 0 and its forecast is nearer the true median f(x + 0.9 D(d-1)) than level 'mean' does", () => {
    // The generating process: f(y) = 20 + 0.05 y + 0.5 max(0, y - 560) [currency/MWh, y in MW], the same for
    // every hour; D(d-1) = median_t(f^-1(P(d-1,t)) - x(d-1,t)) = m_{d-1} exactly (f increasing), e_d ~ N(0, 40^2).
    // The true median of day d's price is f(x + 0.9 m_{d-1}) (the median of e is 0 and f is increasing):
    // the closed form the forecast is held to.
    const f = (y: number): number => 20 + 0.05 * y + 0.5 * Math.max(0, y - 560);
    const base = syntheticHistory({ days: 200, periodMinutes: 60, seed: 3 });
    const z = seededNormal(17);
    const levels: number[] = [];
    let m = 0;
    const h: PriceHistory = {
      ...base,
      days: base.days.map((day) => {
        m = 0.9 * m + 40 * z();
        levels.push(m);
        return { ...day, pricePerMwh: (day.exogenous.load_mw as number[]).map((x) => f(x + m)) };
      }),
    };
    const errors = { mean: 0, shift: 0 };
    const fits = new DriverFits();
    let count = 0;
    for (let i = 170; i < 200; i++) {
      const x = h.days[i]!.exogenous.load_mw as number[];
      const truth = x.map((v) => f(v + 0.9 * (levels[i - 1] as number)));
      const view = HistoryView.before(h, i);
      const mean = driverForecast(view, SETTINGS)!.mean;
      const shift = driverForecast(view, { ...SETTINGS, level: 'shift', shiftLambdas: [0, 0.5, 0.9], fits })!.mean;
      const fit = fits.get(view.target.dayNumber);
      expect(fit?.shift?.lambda).toBeGreaterThan(0);
      truth.forEach((t, s) => {
        errors.mean += Math.abs((mean[s] as number) - t);
        errors.shift += Math.abs((shift[s] as number) - t);
        count++;
      });
    }
    errors.mean /= count;
    errors.shift /= count;
    // Not exact: the day's e_d is unknown, and the curve D is read through is the lambda = 0 fit's, whose
    // hinge slopes are flattened by the level it leaves out (so lambda 0.5 is taken on this seed, not 0.9).
    // Seen: mean absolute error to the true median 6.65 ('mean') and 5.09 ('shift').
    expect(errors.shift).toBeLessThan(0.85 * errors.mean);
  });

  it('lambda by rolling-origin validation (Tashman 2000): > 0 where the day before carries the level, 0 where it does not', () => {
    // Prices P = f(x + m_d) with f as above, two processes on the same loads (closed forms of the process):
    // persistent, m_d = 0.9 m_{d-1} + e_d: D(d-1) = m_{d-1} forecasts 0.9 of the day's shift, the best
    // lambda of the grid is > 0; independent, m_d = e_d: D(d-1) says nothing of m_d, the best lambda is 0,
    // and a shift by lambda D(d-1) only adds noise, the more the larger lambda. The choice reads the last
    // 28 training days before the origin, fitted on the days before them.
    const f = (y: number): number => 20 + 0.05 * y + 0.5 * Math.max(0, y - 560);
    const base = syntheticHistory({ days: 200, periodMinutes: 60, seed: 3 });
    const withLevels = (persistence: number): PriceHistory => {
      const z = seededNormal(17);
      let m = 0;
      return {
        ...base,
        days: base.days.map((day) => {
          m = persistence * m + 40 * z();
          return { ...day, pricePerMwh: (day.exogenous.load_mw as number[]).map((x) => f(x + m)) };
        }),
      };
    };
    const settings: DriverSettings = { ...SETTINGS, level: 'shift', shiftLambdas: [0, 0.5, 1] };
    const choose = (h: PriceHistory, i: number) => {
      const view = HistoryView.before(h, i);
      return holdoutShiftLambda(view, residualLoadColumns(view.exogenousNames)!, settings, view.target.dayNumber);
    };
    expect(SHIFT_HOLDOUT_DAYS).toBe(28);
    for (const i of [180, 195]) {
      const persistent = choose(withLevels(0.9), i);
      expect(persistent.lambda).toBeGreaterThan(0);
      expect(persistent.scores[0]).toBeGreaterThan(Math.min(...persistent.scores));
      const independent = choose(withLevels(0), i);
      expect(independent.lambda).toBe(0);
      expect(independent.scores[1]).toBeGreaterThan(independent.scores[0] as number);
      expect(independent.scores[2]).toBeGreaterThan(independent.scores[1] as number);
    }
  });

  it("the forecaster option driverLevel takes 'mean' or 'shift' and rejects anything else", () => {
    const history = syntheticHistory({ days: 130, periodMinutes: 60, seed: 7 });
    const small = { windowsDays: [28, 56], driverWindowsDays: [56, 91], minTrainingDays: 21, calibrationDays: 21, minCalibrationDays: 21 };
    expect(() => forecastDay(history, 125, [0.1, 0.5, 0.9], 'driver-hs', { ...small, driverLevel: 'sideways' as 'shift' })).toThrow(/options.driverLevel/);
    expect(forecastDay(history, 125, [0.1, 0.5, 0.9], 'driver-hs', { ...small, driverLevel: 'shift' }).quantiles).toBeDefined();
  });
});
