import { describe, expect, it } from 'vitest';
import { driverForecast, type DriverSettings } from '../../src/forecast/models/driverRegression.js';
import { dayNumberOf, HistoryView } from '../../src/forecast/models/historyView.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

// The driver regression's price regressors (the day before's prices and mean, the week before's prices)
// are clipped at the day's own far-out fences and then at the far-out fences of all prices of the fit's
// training days on the model's scale (driverRegression.ts). A day that spiked in every period has day
// fences that hold its spikes; only the training sample's fences catch it (docs/forecast-quality.md, the
// ninth wave: outage-spikes' fresh draw 3). Reference: Tukey's far-out fences [Q1 - 3 IQR, Q3 + 3 IQR]
// (J. W. Tukey 1977, Exploratory Data Analysis, Addison-Wesley, section 2H) with quartiles of Hyndman and
// Fan's (1996) definition 7, on the asinh scale Z = asinh((P - a) / b) with a the median and b = MAD /
// Phi^-1(3/4) of the training days' prices (Hampel 1974; Uniejewski, Weron and Ziel 2018) applied to the
// quartiles, all computed below by hand from the training days' prices; nothing of the project's fence
// or scale code is used.

const base = syntheticHistory({ days: 160, periodMinutes: 60, seed: 5 });
const WINDOW = 91;
const SETTINGS: DriverSettings = { windowsDays: [56, WINDOW], minTrainingDays: 28, knots: 1, scale: 'asinh', refitDays: 7 };

/** Phi^-1(3/4) (e.g. R: qnorm(0.75) = 0.6744897501960817). */
const PHI_INV_3_4 = 0.6744897501960817;

function median(values: readonly number[]): number {
  const s = [...values].sort((p, q) => p - q);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Definition 7 of Hyndman and Fan (1996) on ascending values. */
function quantile7(sorted: readonly number[], tau: number): number {
  const h = (sorted.length - 1) * tau;
  const j = Math.floor(h);
  return sorted[j]! + (h - j) * (sorted[Math.min(j + 1, sorted.length - 1)]! - sorted[j]!);
}

/** Index of the first day at or after `from` whose day number is a multiple of 7 (a refit day of refitDays 7). */
function refitDayFrom(from: number): number {
  for (let i = from; i < base.days.length; i++) if (dayNumberOf(base.days[i]!.day) % 7 === 0) return i;
  throw new Error('no such day');
}

/** The history with day index `i`'s prices all equal to `price`. */
function withFlatDay(i: number, price: number): PriceHistory {
  return { ...base, days: base.days.map((day, j) => (j === i ? { ...day, pricePerMwh: day.pricePerMwh.map(() => price) } : day)) };
}

function forecastOf(h: PriceHistory, i: number, settings: DriverSettings): number[] {
  const made = driverForecast(HistoryView.before(h, i), settings);
  if (made === null) throw new Error(`no driver forecast of day ${i}`);
  return Array.from(made.mean);
}

describe('driver regression: price regressors clipped at the training days\' far-out fences', () => {
  // The fit of refit day r reads the days before r only; the day after r reads day r as its day before.
  const r = refitDayFrom(130);
  // Training days of that fit: every day of the longest window before r (all have their lag days here).
  const training = base.days.filter((d) => dayNumberOf(d.day) >= dayNumberOf(base.days[r]!.day) - WINDOW && dayNumberOf(d.day) < dayNumberOf(base.days[r]!.day));
  const sorted = training.flatMap((d) => d.pricePerMwh).sort((p, q) => p - q);
  const q1 = quantile7(sorted, 0.25);
  const q3 = quantile7(sorted, 0.75);
  // The high fence as a price: on the price scale directly; on the asinh scale of the transformed quartiles, mapped back.
  const a = median(sorted);
  const b = median(sorted.map((p) => Math.abs(p - a))) / PHI_INV_3_4;
  const z1 = Math.asinh((q1 - a) / b);
  const z3 = Math.asinh((q3 - a) / b);
  const highOf = { price: q3 + 3 * (q3 - q1), asinh: a + b * Math.sinh(z3 + 3 * (z3 - z1)) };

  for (const scale of ['asinh', 'price'] as const) {
    it(`${scale} scale: a day before spiking in every period counts as a day at the training prices' high fence on that scale, whatever the spike's height`, () => {
      expect(training.length).toBe(WINDOW);
      expect(Math.max(...sorted)).toBeLessThan(1000);
      const settings = { ...SETTINGS, scale };
      const high = highOf[scale];
      expect(high).toBeLessThan(5000);
      const atFence = forecastOf(withFlatDay(r, high), r + 1, settings);
      const spiked = forecastOf(withFlatDay(r, 5000), r + 1, settings);
      const capped = forecastOf(withFlatDay(r, 15000), r + 1, settings);
      expect(spiked).toEqual(capped);
      spiked.forEach((p, s) => expect(p).toBeCloseTo(atFence[s] as number, 6));
      // Below the fence the day before still moves the forecast (the clip is no constant).
      const below = forecastOf(withFlatDay(r, q1), r + 1, settings);
      expect(Math.max(...below.map((p, s) => Math.abs(p - (atFence[s] as number))))).toBeGreaterThan(0.1);
    });
  }
});
