import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arxForecast } from '../../src/forecast/models/arx.js';
import type { ArxSettings } from '../../src/forecast/models/arx.js';
import { HistoryView } from '../../src/forecast/models/historyView.js';
import { LASSO_DEFAULTS } from '../../src/forecast/linalg/lasso.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

// The ARX's price lags are clipped at Tukey's far-out fences of the training days' prices and each
// window's forecast is held within the training days' lowest and highest price (arx.ts).
// Reference: the ARX written out by hand below, as its doc states it: Z = asinh((P - a) / b) with a the
// median and b = MAD / Phi^-1(3/4) of the training days' prices (Hampel 1974; Uniejewski, Weron and
// Ziel 2018), fences [Q1 - 3 IQR, Q3 + 3 IQR] of the same prices with quartiles of Hyndman and Fan's
// (1996) definition 7 (J. W. Tukey 1977, Exploratory Data Analysis, section 2H), one ordinary least
// squares fit per slot solved from the normal equations X'X beta = X'y by Gaussian elimination with
// partial pivoting (the textbook closed form of OLS), and P = a + b sinh(x' beta), x' beta held within
// asinh((min - a) / b) and asinh((max - a) / b) of the training days' prices. Nothing of the
// project's fitting code is used.

const WINDOW = 42;
const settings: ArxSettings = { windowsDays: [WINDOW], estimator: 'least-squares', lasso: LASSO_DEFAULTS, minTrainingDays: 21 };
/** Phi^-1(3/4) (e.g. R: qnorm(0.75) = 0.6744897501960817). */
const PHI_INV_3_4 = 0.6744897501960817;

/** Definition 7 of Hyndman and Fan (1996) on ascending values. */
function quantile7(sorted: readonly number[], tau: number): number {
  const h = (sorted.length - 1) * tau;
  const j = Math.floor(h);
  return sorted[j]! + (h - j) * (sorted[Math.min(j + 1, sorted.length - 1)]! - sorted[j]!);
}

function median(values: readonly number[]): number {
  const s = [...values].sort((p, q) => p - q);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Solves A x = b (A square) by Gaussian elimination with partial pivoting. */
function solve(A: number[][], b: number[]): number[] {
  const n = b.length;
  const M = A.map((row, i) => [...row, b[i]!]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[p]![c]!)) p = r;
    [M[c], M[p]] = [M[p]!, M[c]!];
    for (let r = c + 1; r < n; r++) {
      const f = M[r]![c]! / M[c]![c]!;
      for (let k = c; k <= n; k++) M[r]![k]! -= f * M[c]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let sum = M[r]![n]!;
    for (let k = r + 1; k < n; k++) sum -= M[r]![k]! * x[k]!;
    x[r] = sum / M[r]![r]!;
  }
  return x;
}

/** OLS with an intercept, columns standardised first (the fit is unchanged): the prediction at `at`. */
function olsPrediction(rows: number[][], y: number[], at: number[]): number {
  const k = at.length;
  const n = rows.length;
  const mean = Array.from({ length: k }, (_, j) => rows.reduce((s, r) => s + r[j]!, 0) / n);
  const sd = Array.from({ length: k }, (_, j) => Math.sqrt(rows.reduce((s, r) => s + (r[j]! - mean[j]!) ** 2, 0) / n) || 1);
  const design = rows.map((r) => [1, ...r.map((v, j) => (v - mean[j]!) / sd[j]!)]);
  const xtx = Array.from({ length: k + 1 }, (_, u) => Array.from({ length: k + 1 }, (_, v) => design.reduce((s, r) => s + r[u]! * r[v]!, 0)));
  const xty = Array.from({ length: k + 1 }, (_, u) => design.reduce((s, r, i) => s + r[u]! * y[i]!, 0));
  const beta = solve(xtx, xty);
  return beta[0]! + at.reduce((s, v, j) => s + beta[j + 1]! * ((v - mean[j]!) / sd[j]!), 0);
}

/**
 * The ARX forecast of day `target` (one window of WINDOW days, a contiguous history), by hand; guarded
 * (lags clipped, forecast held within the training prices) or as the ARX was before.
 */
function handArx(history: PriceHistory, target: number, guarded: boolean): { forecast: number[]; fences: { low: number; high: number }; highest: number } {
  const days = history.days;
  const S = days[0]!.pricePerMwh.length;
  const training: number[] = [];
  for (let d = Math.max(7, target - WINDOW); d < target; d++) training.push(d);
  const sample = training.flatMap((d) => days[d]!.pricePerMwh);
  const a = median(sample);
  const b = median(sample.map((p) => Math.abs(p - a))) / PHI_INV_3_4;
  const sorted = [...sample].sort((p, q) => p - q);
  const q1 = quantile7(sorted, 0.25);
  const q3 = quantile7(sorted, 0.75);
  const fences = { low: q1 - 3 * (q3 - q1), high: q3 + 3 * (q3 - q1) };
  const z = (p: number): number => Math.asinh((p - a) / b);
  const lag = (p: number): number => z(guarded ? Math.min(Math.max(p, fences.low), fences.high) : p);
  const lowest = sorted[0]!;
  const highest = sorted[sorted.length - 1]!;
  const weekday = (d: number): number => new Date(`${days[d]!.day}T12:00:00Z`).getUTCDay(); // 0 = Sunday
  const regressors = (d: number, s: number): number[] => {
    const before = days[d - 1]!.pricePerMwh;
    const row = [lag(before[s]!), lag(days[d - 2]!.pricePerMwh[s]!), lag(days[d - 7]!.pricePerMwh[s]!), Math.min(...before.map(lag)), Math.max(...before.map(lag))];
    if (s < S - 1) row.push(lag(before[S - 1]!));
    for (let w = 1; w <= 6; w++) row.push(weekday(d) === w ? 1 : 0);
    row.push(days[d]!.exogenous.load_mw![s]!, days[d - 1]!.exogenous.load_mw![s]!);
    return row;
  };
  const forecast = Array.from({ length: S }, (_, s) => {
    const zHat = olsPrediction(
      training.map((d) => regressors(d, s)),
      training.map((d) => z(days[d]!.pricePerMwh[s]!)),
      regressors(target, s),
    );
    return a + b * Math.sinh(guarded ? Math.min(Math.max(zHat, z(lowest)), z(highest)) : zHat);
  });
  return { forecast, fences, highest };
}

function withDayBefore(history: PriceHistory, target: number, price: (p: number, s: number) => number): PriceHistory {
  return { ...history, days: history.days.map((d, i) => (i === target - 1 ? { ...d, pricePerMwh: d.pricePerMwh.map(price) } : d)) };
}

describe('ARX lags clipped at far-out fences', () => {
  it('an outage the day before (4 hours at 15 000) no longer runs away: the forecast is the hand OLS on the clipped design (Tukey 1977; normal equations)', () => {
    const target = 60;
    const history = withDayBefore(syntheticHistory({ days: 70, periodMinutes: 60, seed: 21 }), target, (p, s) => (s >= 17 && s <= 20 ? 15000 : p));
    const clipped = handArx(history, target, true);
    const unclipped = handArx(history, target, false);
    const forecast = arxForecast(HistoryView.before(history, target), settings)!.mean;
    forecast.forEach((p, s) => expect(p).toBeCloseTo(clipped.forecast[s]!, 6));
    // Read unclipped, the outage sends the forecast of other hours far beyond the fences widened by their
    // span (to 8 691 in hour 8 with this seed); clipped, every hour stays within.
    const span = clipped.fences.high - clipped.fences.low;
    expect(Math.max(...unclipped.forecast)).toBeGreaterThan(clipped.fences.high + 10 * span);
    for (const p of forecast) {
      expect(p).toBeGreaterThan(clipped.fences.low - span);
      expect(p).toBeLessThan(clipped.fences.high + span);
    }
  });

  it('a lag beyond the fence reads as the fence: a spike of any height on a lag-only day gives the same forecast, bit for bit (fast-check, fixed seed)', () => {
    // Day target - 45 lies before the 42-day window: it is read only as a lag (lag 7 of day target - 38),
    // neither as a response nor in the sample of the scale and the fences.
    const target = 60;
    const base = syntheticHistory({ days: 70, periodMinutes: 60, seed: 22 });
    const spiked = (height: number): PriceHistory => ({
      ...base,
      days: base.days.map((d, i) => (i === target - 45 ? { ...d, pricePerMwh: d.pricePerMwh.map((p, s) => (s === 19 ? p + height : p)) } : d)),
    });
    const reference = arxForecast(HistoryView.before(spiked(1e4), target), settings)!.mean;
    expect([...reference]).not.toEqual([...arxForecast(HistoryView.before(base, target), settings)!.mean]);
    fc.assert(
      fc.property(fc.double({ min: 1e4, max: 1e12, noNaN: true }), (height) => {
        expect([...arxForecast(HistoryView.before(spiked(height), target), settings)!.mean]).toEqual([...reference]);
      }),
      { seed: 1309, numRuns: 12 },
    );
  });

  it('a whole day of spikes (+1e6) the day before: the clipped fit still extrapolates, and the forecast is held at the highest training price (hand OLS)', () => {
    const target = 60;
    const history = withDayBefore(syntheticHistory({ days: 70, periodMinutes: 60, seed: 21 }), target, (p) => p + 1e6);
    const guarded = handArx(history, target, true);
    const forecast = arxForecast(HistoryView.before(history, target), settings)!.mean;
    forecast.forEach((p, s) => expect(p).toBeCloseTo(guarded.forecast[s]!, 6));
    // a + b sinh(asinh((max - a) / b)) = max, up to rounding.
    expect(Math.max(...forecast) / guarded.highest).toBeCloseTo(1, 12);
  });

  it('on histories without far-out prices nothing is clipped or held: the forecast is the hand OLS of the ARX as it was (fast-check, fixed seed)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000 }), (seed) => {
        const history = syntheticHistory({ days: 64, periodMinutes: 60, seed });
        const target = 63;
        const { forecast: expected, fences, highest } = handArx(history, target, false);
        const read = history.days.slice(target - WINDOW - 7, target).flatMap((d) => d.pricePerMwh);
        const sample = history.days.slice(target - WINDOW, target).flatMap((d) => d.pricePerMwh);
        fc.pre(read.every((p) => p >= fences.low && p <= fences.high) && expected.every((p) => p >= Math.min(...sample) && p <= highest));
        const forecast = arxForecast(HistoryView.before(history, target), settings)!.mean;
        forecast.forEach((p, s) => expect(p).toBeCloseTo(expected[s]!, 6));
      }),
      { seed: 1310, numRuns: 8 },
    );
  });
});
