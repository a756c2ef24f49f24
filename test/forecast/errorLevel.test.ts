import { describe, expect, it } from 'vitest';
import { dayLevel, ERROR_LEVEL_FIT_DAYS, errorLevelShift, errorLevelShifts, fitErrorLevel, fTestPValue } from '../../src/forecast/quantiles/errorLevel.js';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { DEFAULTS, forecastDay, Forecaster } from '../../src/forecast/forecaster.js';
import { dayNumberOf } from '../../src/forecast/models/historyView.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

// Invented inputs (formulas shared with test/forecast/errorLevelReference.py); the check values come from
// that script (NumPy 2.4.6: np.median for the slot and day medians, np.linalg.lstsq for the weights; SciPy
// 1.17.1: scipy.stats.f.sf for the F test's p-value).
const S = 5;
const dayNumbers = Array.from({ length: 72 }, (_, i) => 100 + i).filter((t) => t !== 131 && t !== 150);
const error = (t: number, s: number) => 0.6 * Math.sin(t / 9) + (0.25 * (((t * 7 + s * 3) % 11) - 5)) / 5 + 0.1 * s;
const errors = dayNumbers.map((t) => Float64Array.from({ length: S }, (_, s) => error(t, s)));

describe('errorLevelShifts (intercept correction by a heterogeneous autoregression of the day-level error)', () => {
  it('gives the delivery day the shift NumPy computes (errorLevelReference.py, "delivery day shift")', () => {
    expect(errorLevelShift(dayNumbers, errors, 172)).toBeCloseTo(0.14866107812973975, 10);
  });

  it('gives each calibration day the shift of the same weights from its own lookbacks, 0 when the day before is missing (script, "a slow wave": F 166.9, p 1.5e-21)', () => {
    const { target, days } = errorLevelShifts(dayNumbers, errors, 172);
    expect(target).toBeCloseTo(0.14866107812973975, 10);
    const at = (t: number) => days[dayNumbers.indexOf(t)] as number;
    expect(at(110)).toBeCloseTo(-0.11173703460019818, 10);
    expect(at(128)).toBeCloseTo(0.6200886490372904, 10);
    expect(at(132)).toBe(0);
    expect(at(151)).toBe(0);
    expect(at(171)).toBeCloseTo(0.07668718950496793, 10);
  });

  it('is 0 with fewer whole lookbacks than the longest lookback, or without the day before the delivery day', () => {
    expect(errorLevelShift(dayNumbers.slice(0, 40), errors.slice(0, 40), 140)).toBe(0);
    expect(errorLevelShift(dayNumbers, errors, 173)).toBe(0);
  });

  it('gives nothing when the F test of the weights does not reject at 5% (script, "scrambled": F 0.502, p 0.683)', () => {
    const scrambled = dayNumbers.map((t) => Float64Array.from({ length: S }, (_, s) => (((t * 19) % 97) + s) / 97));
    const { target, days } = errorLevelShifts(dayNumbers, scrambled, 172);
    expect(target).toBe(0);
    expect(days.every((v) => v === 0)).toBe(true);
  });

  it('keeps the refit day\'s weights and slot medians for the days after it: their levels and shifts as NumPy computes them (script, "refit cadence")', () => {
    // Fitted for refit day 172 on the days before it; days 172, 173 and 175 (174 missing) then come.
    const fit = fitErrorLevel(dayNumbers, errors, 172);
    const b = fit.weights as Float64Array;
    expect(Array.from(b)).toEqual([-0.013562514210602861, 1.0632575970662763, -0.5586151762026125].map((v) => expect.closeTo(v, 10)));
    const work = new Float64Array(S);
    const levels = [172, 173, 175].map((t) => {
      const y = dayLevel(Float64Array.from({ length: S }, (_, s) => error(t, s)), fit.slotMedians, work);
      fit.levels.append(t, y);
      return y;
    });
    fit.levels.coverThrough(175);
    [0.2728075361148517, 0.3060141837905585, 0.4587090249042479].forEach((v, i) => expect(levels[i]).toBeCloseTo(v, 10));
    expect(fit.levels.shift(b, 173)).toBeCloseTo(0.22533510234848544, 10);
    expect(fit.levels.shift(b, 176)).toBeCloseTo(0.37466526205856093, 10);
    // A calibration day of the refit day keeps the shift it had there (the days after it do not enter its lookbacks).
    expect(fit.levels.shift(b, 171)).toBeCloseTo(0.07668718950496793, 10);
    expect(fit.levels.shift(b, 132)).toBeNull();
    // The delivery day 175 has no level of day 174 for its one-day lookback.
    expect(fit.levels.shift(b, 175)).toBeNull();
  });

  it('takes the rows of the weights\' regression from the last ERROR_LEVEL_FIT_DAYS days before the fit\'s day only: a run older than that sets no weights', () => {
    // The slow wave of days 100..171, then errors constant per slot (day level 0) up to the fit's day.
    const long = Array.from({ length: 500 }, (_, i) => 100 + i);
    const waveThenFlat = long.map((t) => Float64Array.from({ length: S }, (_, s) => (t < 172 ? error(t, s) : 0.1 * s)));
    expect(ERROR_LEVEL_FIT_DAYS).toBe(364);
    // Fitted for day 300 every wave day is a row and the weights are used; for day 600 none is (rows from day 236 on).
    expect(fitErrorLevel(long.slice(0, 200), waveThenFlat.slice(0, 200), 300).weights).not.toBeNull();
    expect(fitErrorLevel(long, waveThenFlat, 600).weights).toBeNull();
  });

  it('computes the F test\'s p-value as SciPy does (scipy.stats.f.sf(F, 3, n - 3) with F from ESS and RSS)', () => {
    // One weight vector, X'y and y'y chosen so that F = (ESS / 3) / (RSS / 37) = (3 / 3) / (37 / 37) = 1, and F = 2.5 with n = 43.
    expect(fTestPValue([1, 1, 1], [1, 1, 1], 40, 40)).toBeCloseTo(0.4036703667252215, 10);
    expect(fTestPValue([1, 1, 1], [2.5, 2.5, 2.5], 7.5 + 40, 43)).toBeCloseTo(0.07325435201794983, 10);
    expect(fTestPValue([1, 1, 1], [1, 1, 1], 2, 3)).toBe(1);
  });

  describe('with day means: the quadratic term in the day before\'s mean price (driverCentre \'recent-quadratic\')', () => {
    // Invented day means without persistence and errors whose day level carries their square the next day
    // (formulas shared with errorLevelReference.py, "quadratic term"; NumPy lstsq for the lookbacks' weights,
    // then q'u / q'q on what they leave; SciPy f.sf(F, 3, n - 3) and f.sf(F, 1, n - 1) for the two F tests).
    const zbar = (t: number) => ((t * 37) % 23) / 11.5 - 1;
    const curved = dayNumbers.map((t) => Float64Array.from({ length: S }, (_, s) => (0.25 * (((t * 7 + s * 3) % 11) - 5)) / 5 + 0.1 * s - 0.7 * zbar(t - 1) ** 2));
    const means = dayNumbers.map(zbar);

    it('centres the square and fits the lookbacks\' weights, then the square\'s on what they leave, as NumPy does (script: 40 rows, p 1.7e-11 and 0.0025)', () => {
      const fit = fitErrorLevel(dayNumbers, curved, 172, means);
      expect(fit.curvature?.centre).toBeCloseTo(-0.032608695652173926, 12);
      expect(fit.curvature?.meanSquare).toBeCloseTo(0.3357986767485822, 12);
      expect(fit.curvature?.high).toBeCloseTo(0.9130434782608696, 12);
      const expected = [-0.4354525676898244, -4.458619050650738, 6.003550271448418, -0.17307046633474907];
      expect(Array.from(fit.weights as Float64Array)).toEqual(expected.map((v) => expect.closeTo(v, 9)));
    });

    it('gives the delivery day and the calibration days the shifts NumPy computes', () => {
      const { target, days } = errorLevelShifts(dayNumbers, curved, 172, means);
      expect(target).toBeCloseTo(-0.31927511235994616, 9);
      const at = (t: number) => days[dayNumbers.indexOf(t)] as number;
      expect(at(110)).toBeCloseTo(0.11188200175679539, 9);
      expect(at(128)).toBeCloseTo(0.028911865731257255, 9);
      expect(at(171)).toBeCloseTo(0.2030062500254564, 9);
      expect(at(132)).toBe(0);
      // Without day means: the 'recent' regression of the same errors (script: its delivery day shift).
      expect(errorLevelShift(dayNumbers, curved, 172)).toBeCloseTo(-0.2684254389571515, 9);
    });

    it('adds no quadratic weight where its F test on what the lookbacks leave does not reject: the \'recent\' shift (script, "the slow wave with the day means": p 0.347)', () => {
      const withMeans = fitErrorLevel(dayNumbers, errors, 172, means);
      expect((withMeans.weights as Float64Array)[3]).toBe(0);
      expect(errorLevelShift(dayNumbers, errors, 172, means)).toBeCloseTo(0.14866107812973975, 10);
      // Bit for bit the shifts without day means (the lookbacks' weights from the same sums).
      expect(errorLevelShifts(dayNumbers, errors, 172, means)).toEqual(errorLevelShifts(dayNumbers, errors, 172));
    });

    it('does not extrapolate the square: a day before beyond every row\'s level takes the greatest of them (script, "clamped")', () => {
      const extreme = means.map((v, d) => (dayNumbers[d] === 171 ? 5 : v));
      expect(errorLevelShift(dayNumbers, curved, 172, extreme)).toBeCloseTo(-0.36507826035023894, 9);
    });
  });

  it('adds nothing to errors whose day level has no run (a constant per slot: every y(d) is 0, the weights not estimable)', () => {
    const flat = dayNumbers.map(() => Float64Array.from({ length: S }, (_, s) => 2 * s - 3));
    const { target, days } = errorLevelShifts(dayNumbers, flat, 172);
    expect(target).toBe(0);
    expect(days.every((v) => v === 0)).toBe(true);
  });

  it('follows a level step that persists: errors 1 higher from day 144 on raise the delivery day\'s shift', () => {
    // A property of the correction (a run of high errors predicts a high error), not a value check.
    const stepped = dayNumbers.map((t, d) => Float64Array.from(errors[d] as Float64Array, (v) => (t >= 144 ? v + 1 : v)));
    expect(errorLevelShift(dayNumbers, stepped, 172)).toBeGreaterThan(errorLevelShift(dayNumbers, errors, 172));
  });
});

describe('Forecaster option driverCentre (driver-hs and driver-fhs)', () => {
  // Invented history; every price carries a level that no driver explains, +50 and -50 in turns of 15 days:
  // the point model follows a turn only partly, so its errors run the same way for days after each turn.
  const base = syntheticHistory({ days: 130, periodMinutes: 60, seed: 7 });
  const ramped: PriceHistory = { ...base, days: base.days.map((day, d) => ({ ...day, pricePerMwh: day.pricePerMwh.map((p) => p + (Math.floor(d / 15) % 2 === 0 ? 50 : -50)) })) };
  const options: Partial<ForecastOptions> = { minTrainingDays: 21, calibrationDays: 84, minCalibrationDays: 21 };
  // Invented: a day level u(d) without persistence, and its square the next day (a level whose effect the
  // point model, linear in the day before's mean price, cannot follow): what 'recent-quadratic' is for.
  const u = (d: number) => (((d * 37) % 23) / 11.5 - 1) * 60;
  const curved: PriceHistory = { ...base, days: base.days.map((day, d) => ({ ...day, pricePerMwh: day.pricePerMwh.map((p) => p + 0.3 * u(d) + (d > 0 ? u(d - 1) ** 2 / 8 : 0)) })) };
  const LEVELS = [0.1, 0.5, 0.9];
  const mean = (values: readonly number[]) => values.reduce((a, b) => a + b, 0) / values.length;

  it("is 'recent-quadratic' by default; 'recent' raises the medians of a day five days into a high turn (the point forecast unchanged)", () => {
    expect(DEFAULTS.driverCentre).toBe('recent-quadratic');
    for (const method of ['driver-hs', 'driver-fhs'] as const) {
      const pool = forecastDay(ramped, 125, LEVELS, method, { ...options, driverCentre: 'pool' });
      const byDefault = forecastDay(ramped, 125, LEVELS, method, options);
      const recent = forecastDay(ramped, 125, LEVELS, method, { ...options, driverCentre: 'recent' });
      // The square of the day before's level carries nothing on this history: the default's forecast is 'recent''s.
      expect(byDefault.quantiles.prices).toEqual(recent.quantiles.prices);
      expect(forecastDay(curved, 125, LEVELS, method, options).quantiles.prices).toEqual(forecastDay(curved, 125, LEVELS, method, { ...options, driverCentre: 'recent-quadratic' }).quantiles.prices);
      expect(recent.point).toEqual(pool.point);
      const median = (f: typeof pool) => mean(f.quantiles.prices.map((row) => row[1] as number));
      expect(median(recent)).toBeGreaterThan(median(pool));
    }
  });

  /** Index of the first day at or after index `from` whose day number is a multiple of the refit cadence 5. */
  const refitIndexFrom = (from: number) => {
    for (let i = from; i < ramped.days.length; i++) if (dayNumberOf(ramped.days[i]!.day) % 5 === 0) return i;
    throw new Error('no refit day');
  };

  it('between refit days gives the same forecast whatever days were asked before (later days of the same refit period first: nothing of them is read)', () => {
    const refit = refitIndexFrom(110);
    const d = refit + 2;
    for (const [method, centre] of [['driver-hs', 'recent'], ['driver-fhs', 'recent'], ['driver-fhs', 'recent-quadratic']] as const) {
      const history = centre === 'recent' ? ramped : curved;
      const recent = { ...options, driverCentre: centre };
      const fresh = forecastDay(history, d, LEVELS, method, recent);
      // The quadratic term is at work on this day (its forecast differs from 'recent''s).
      if (centre === 'recent-quadratic') expect(fresh.quantiles.prices).not.toEqual(forecastDay(history, d, LEVELS, method, { ...options, driverCentre: 'recent' }).quantiles.prices);
      // The shift is at work on this day (the pool's forecast differs), so the check is not vacuous.
      expect(fresh.quantiles.prices).not.toEqual(forecastDay(history, d, LEVELS, method, { ...options, driverCentre: 'pool' }).quantiles.prices);
      const forecaster = new Forecaster(history, recent);
      for (const i of [refit + 4, refit + 3, refit - 2, refit, d]) forecaster.forecast(i, LEVELS, method);
      expect(forecaster.forecast(d, LEVELS, method).quantiles.prices).toEqual(fresh.quantiles.prices);
      // Days after d, prices changed: d's forecast is the same (only days before it are read, through the kept fit too).
      const changed: PriceHistory = { ...history, days: history.days.map((day, i) => (i > d ? { ...day, pricePerMwh: day.pricePerMwh.map((p) => p + 40) } : day)) };
      const later = new Forecaster(changed, recent);
      later.forecast(refit + 4, LEVELS, method);
      expect(later.forecast(d, LEVELS, method).quantiles.prices).toEqual(fresh.quantiles.prices);
    }
  });

  it('rejects an unknown driverCentre, naming the field and the values it takes', () => {
    expect(() => forecastDay(ramped, 125, LEVELS, 'driver-hs', { ...options, driverCentre: 'mean' as ForecastOptions['driverCentre'] })).toThrow(/options\.driverCentre.*'pool', 'recent' or 'recent-quadratic'/);
  });
});
