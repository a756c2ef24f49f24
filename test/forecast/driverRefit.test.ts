import { describe, expect, it } from 'vitest';
import { DriverFits, driverForecast, type DriverSettings } from '../../src/forecast/models/driverRegression.js';
import { dayNumberOf, HistoryView } from '../../src/forecast/models/historyView.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

const base = syntheticHistory({ days: 160, periodMinutes: 60, seed: 11 });
const SETTINGS: DriverSettings = { windowsDays: [56, 91], minTrainingDays: 28, knots: 1, scale: 'price' };

/** The history with each day's prices a function of its own load: P = f(load, day index). */
function pricedBy(f: (load: number, d: number) => number): PriceHistory {
  return { ...base, days: base.days.map((day, d) => ({ ...day, pricePerMwh: (day.exogenous.load_mw as number[]).map((l) => f(l, d)) })) };
}

/** The mean point forecast of day index i, in slot order (the synthetic history's days are 24 one-hour slots). */
function forecastOf(h: PriceHistory, i: number, settings: DriverSettings): number[] {
  const made = driverForecast(HistoryView.before(h, i), settings);
  if (made === null) throw new Error(`no driver forecast of day ${i}`);
  return Array.from(made.mean);
}

/** Index of the first day at or after `from` whose day number is a multiple of 7 (a refit day of refitDays 7). */
function refitDayFrom(from: number): number {
  for (let i = from; i < base.days.length; i++) if (dayNumberOf(base.days[i]!.day) % 7 === 0) return i;
  throw new Error('no such day');
}

describe('driver regression refit cadence (refitDays)', () => {
  it('a refit every 7 days predicts with the fit of the refit day and the delivery day own drivers: closed form of an exactly linear market', () => {
    // Prices exactly linear in the day's own load, P = 40 + 0.1 load before day index `change` and
    // P = 60 + 0.2 load from it on (closed form; least squares reproduces an exact linear relation). A
    // fit on days before the change predicts 40 + 0.1 load(d) for any day d: its own load, the old relation.
    const refit = refitDayFrom(120);
    const change = refit;
    const h = pricedBy((l, d) => (d < change ? 40 + 0.1 * l : 60 + 0.2 * l));
    const d = refit + 3;
    const load = h.days[d]!.exogenous.load_mw as number[];
    const weekly = forecastOf(h, d, { ...SETTINGS, refitDays: 7 });
    weekly.forEach((p, s) => expect(p).toBeCloseTo(40 + 0.1 * (load[s] as number), 6));
    // Refitted daily, the days from the change on enter the fit and move the forecast off the old line.
    const daily = forecastOf(h, d, SETTINGS);
    expect(Math.max(...daily.map((p, s) => Math.abs(p - (40 + 0.1 * (load[s] as number)))))).toBeGreaterThan(0.1);
  });

  it('no look-ahead: a weekly fit reads no day on or after its refit day (prices of those days other than the lags changed, the forecast is the same)', () => {
    const refit = refitDayFrom(120);
    const d = refit + 3;
    // Days refit .. d - 2 are neither the day before d nor the week before it: changing them must not move d's forecast.
    const changed: PriceHistory = { ...base, days: base.days.map((day, i) => (i >= refit && i <= d - 2 ? { ...day, pricePerMwh: day.pricePerMwh.map((p) => p + 25) } : day)) };
    const weekly = { ...SETTINGS, refitDays: 7 };
    expect(forecastOf(changed, d, weekly)).toEqual(forecastOf(base, d, weekly));
    expect(forecastOf(changed, d, SETTINGS)).not.toEqual(forecastOf(base, d, SETTINGS));
  });

  it('on a refit day, and with refitDays 1, the forecast is the daily fit bit for bit; kept fits give the fresh forecast whatever was asked before', () => {
    const refit = refitDayFrom(120);
    expect(forecastOf(base, refit, { ...SETTINGS, refitDays: 7 })).toEqual(forecastOf(base, refit, SETTINGS));
    expect(forecastOf(base, refit + 2, { ...SETTINGS, refitDays: 1 })).toEqual(forecastOf(base, refit + 2, SETTINGS));
    const fits = new DriverFits();
    const kept = { ...SETTINGS, refitDays: 7, fits };
    const order = [refit + 5, refit + 1, refit - 3, refit + 6, refit];
    const asked = order.map((i) => forecastOf(base, i, kept));
    order.forEach((i, j) => expect(asked[j]).toEqual(forecastOf(base, i, { ...SETTINGS, refitDays: 7 })));
  });

  it('when the days before the refit day are too few for a fit, the delivery day uses its own fit', () => {
    // With 28 training days needed in a 56-day window and 7 lag days, the first forecastable days have
    // no fit on the refit day before them; they then match the daily fit.
    const first = base.days.findIndex((_, i) => i > 0 && driverForecast(HistoryView.before(base, i), SETTINGS) !== null);
    const i = dayNumberOf(base.days[first]!.day) % 7 === 0 ? first + 1 : first;
    const refitIndex = i - (dayNumberOf(base.days[i]!.day) % 7);
    expect(refitIndex).toBeLessThan(first);
    expect(driverForecast(HistoryView.before(base, refitIndex), SETTINGS)).toBeNull();
    expect(forecastOf(base, i, { ...SETTINGS, refitDays: 7 })).toEqual(forecastOf(base, i, SETTINGS));
  });
});
