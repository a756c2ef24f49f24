import { describe, expect, it } from 'vitest';
import { crpsFromQuantiles, crpsNormal } from '../../src/forecast/scoring/crps.js';
import { pinballLoss } from '../../src/forecast/scoring/pinball.js';
import { scoreForecasts } from '../../src/forecast/scoring/scoreForecasts.js';
import { compareForecasts } from '../../src/forecast/scoring/compareForecasts.js';
import type { ScoredDay } from '../../src/forecast/scoring/scoreForecasts.js';
import { ForecastInputError } from '../../src/forecast/models/errors.js';
import { normalQuantile } from '../../src/stats/normalQuantile.js';
import { seededNormal } from './seededRandom.js';
import { syntheticHistory } from './syntheticHistory.js';

describe('pinball loss', () => {
  it('follows the definition rho_tau(u) = u (tau - 1{u < 0}) (Koenker and Bassett 1978)', () => {
    expect(pinballLoss(10, 8, 0.9)).toBeCloseTo(0.9 * 2, 14);
    expect(pinballLoss(10, 12, 0.9)).toBeCloseTo(0.1 * 2, 14);
    expect(pinballLoss(5, 5, 0.3)).toBe(0);
  });

  it('is minimised in expectation by the true quantile (strict consistency, Gneiting and Raftery 2007)', () => {
    const z = seededNormal(77);
    const sample = Array.from({ length: 20000 }, () => z());
    const expected = (q: number): number => sample.reduce((s, y) => s + pinballLoss(y, q, 0.9), 0) / sample.length;
    const q90 = normalQuantile(0.9);
    expect(expected(q90)).toBeLessThan(expected(q90 - 0.2));
    expect(expected(q90)).toBeLessThan(expected(q90 + 0.2));
  });
});

describe('CRPS', () => {
  // Closed form for N(mu, sigma^2): CRPS = sigma [z (2 Phi(z) - 1) + 2 phi(z) - 1 / sqrt(pi)], z = (y - mu) / sigma
  // (Gneiting, Raftery, Westveld and Goldman 2005, Monthly Weather Review 133, 1098-1118, eq. 5), worked by
  // hand with Phi(1) = 0.8413447, phi(1) = 0.2419707, Phi(2) = 0.9772499, phi(2) = 0.0539910 (Abramowitz
  // and Stegun 1964, table 26.1): y = 0 gives 2 phi(0) - 1/sqrt(pi) = (sqrt 2 - 1) / sqrt pi = 0.2336950,
  // y = 1 gives 0.6826895 + 0.4839414 - 0.5641896 = 0.6024413, y = 2 gives 1.9089996 + 0.1079820 - 0.5641896 = 1.4527920.
  it('closed form of N(0,1) at y = 0, 1, 2 gives 0.2336950, 0.6024414, 1.4527918', () => {
    expect(crpsNormal(0, 1, 0)).toBeCloseTo(0.233695, 6);
    expect(crpsNormal(0, 1, 0)).toBeCloseTo((Math.SQRT2 - 1) / Math.sqrt(Math.PI), 12);
    expect(crpsNormal(0, 1, 1)).toBeCloseTo(0.6024414, 6);
    expect(crpsNormal(0, 1, 2)).toBeCloseTo(1.4527918, 6);
    // location-scale: CRPS(N(mu, s^2), y) = s CRPS(N(0,1), (y - mu)/s)
    expect(crpsNormal(3, 2, 5)).toBeCloseTo(2 * 0.6024414, 6);
  });

  it('mean pinball over the 99 percentile levels of N(0,1) at y = 0 is 0.117956, about CRPS / 2', () => {
    const levels = Array.from({ length: 99 }, (_, i) => (i + 1) / 100);
    const quantiles = levels.map(normalQuantile);
    // At y = 0 the pinball loss of the exact quantile q_tau is min(tau, 1 - tau) |q_tau|, so the mean is
    // (1/99) sum_k min(tau_k, 1 - tau_k) |Phi^-1(tau_k)|; 0.117956 is that sum from R's qnorm (from memory).
    expect(crpsFromQuantiles(0, quantiles, levels)).toBeCloseTo(0.117956, 6);
    expect(crpsFromQuantiles(0, quantiles, levels)).toBeCloseTo(levels.reduce((s, tau, k) => s + Math.min(tau, 1 - tau) * Math.abs(quantiles[k] as number), 0) / 99, 12);
    // 99 levels leave out the tails beyond 1% and 99%: within 0.01 of CRPS / 2 at y = 0, 1, 2
    for (const y of [0, 1, 2]) expect(Math.abs(crpsFromQuantiles(y, quantiles, levels) - crpsNormal(0, 1, y) / 2)).toBeLessThan(0.01);
  });

  it('twice the mean pinball over a dense midpoint grid of levels converges to the closed form', () => {
    const m = 20000;
    const levels = Array.from({ length: m }, (_, i) => (i + 0.5) / m);
    const quantiles = levels.map(normalQuantile);
    for (const y of [0, 1, 2]) expect(2 * crpsFromQuantiles(y, quantiles, levels)).toBeCloseTo(crpsNormal(0, 1, y), 5);
  });
});

describe('scoreForecasts', () => {
  const levels = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95];
  const history = syntheticHistory({ days: 60, periodMinutes: 60, seed: 4, shortDay: 20, longDay: 40 });
  // Forecasts equal to the true quantiles of N(mu, 4) with y drawn from that law (seeded):
  const z = seededNormal(12);
  const days: ScoredDay[] = history.days.map((day) => {
    const mu = day.pricePerMwh;
    return {
      forecast: { day: day.day, levels, periods: day.periods, prices: mu.map((m) => levels.map((tau) => m + 2 * normalQuantile(tau))) },
      realised: mu.map((m) => m + 2 * z()),
    };
  });
  const table = scoreForecasts(days);
  const periods = days.reduce((s, d) => s + d.realised.length, 0);

  it('counts every period once overall and by local clock slot (23- and 25-hour days included)', () => {
    expect(table.overall.count).toBe(periods);
    expect(table.bySlot).toHaveLength(24);
    expect(table.bySlot.reduce((s, b) => s + b.count, 0)).toBe(periods);
    expect(table.bySlot[2]!.slotStart).toBe('02:00');
    expect(table.bySlot[2]!.count).toBe(60); // 59 days + the long day's two 02:00 periods - the short day's none
    expect(table.bySlot[3]!.count).toBe(60);
  });

  it('is calibrated within binomial error when the forecast is the true law (Gneiting et al. 2007)', () => {
    const n = table.overall.count;
    levels.forEach((tau, k) => {
      const se = Math.sqrt((tau * (1 - tau)) / n);
      expect(Math.abs(table.overall.belowShare[k]! - tau)).toBeLessThan(4 * se);
    });
    expect(table.overall.coverage.map((c) => [c.lower, c.upper])).toEqual([
      [0.05, 0.95],
      [0.1, 0.9],
      [0.25, 0.75],
    ]);
    for (const c of table.overall.coverage) {
      expect(c.nominal).toBeCloseTo(c.upper - c.lower, 12);
      expect(Math.abs(c.observed - c.nominal)).toBeLessThan(4 * Math.sqrt((c.nominal * (1 - c.nominal)) / n));
    }
  });

  it('overall scores are the count-weighted means of the per-slot scores; crps is the mean pinball', () => {
    levels.forEach((_, k) => {
      const weighted = table.bySlot.reduce((s, b) => s + b.count * b.pinball[k]!, 0) / table.overall.count;
      expect(table.overall.pinball[k]).toBeCloseTo(weighted, 10);
    });
    const mean = table.overall.pinball.reduce((s, v) => s + v, 0) / levels.length;
    expect(table.overall.crps).toBeCloseTo(mean, 12);
  });

  it('mean pinball at the true quantile of N(mu, sigma^2) is sigma phi(Phi^-1(tau)) in expectation', () => {
    // E rho_tau(Y - q_tau) = sigma phi(z_tau) for Y ~ N(mu, sigma^2), q_tau its tau-quantile (closed form:
    // E[(Z - z)(tau - 1{Z < z})] = -tau z - (E[Z 1{Z < z}] - z tau) = phi(z)).
    levels.forEach((tau, k) => {
      const losses = days.flatMap((d) => d.realised.map((y, t) => pinballLoss(y, d.forecast.prices[t]![k]!, tau)));
      const mean = losses.reduce((s, v) => s + v, 0) / losses.length;
      const sd = Math.sqrt(losses.reduce((s, v) => s + (v - mean) ** 2, 0) / (losses.length - 1));
      const zt = normalQuantile(tau);
      const expected = (2 * Math.exp(-0.5 * zt * zt)) / Math.sqrt(2 * Math.PI);
      expect(table.overall.pinball[k]).toBeCloseTo(mean, 12);
      expect(Math.abs(mean - expected)).toBeLessThan((4 * sd) / Math.sqrt(losses.length));
    });
  });

  it('rejects days with other levels or missing prices', () => {
    const other = { ...days[1]!, forecast: { ...days[1]!.forecast, levels: [0.1, 0.5, 0.9] } };
    expect(() => scoreForecasts([days[0]!, other])).toThrow(ForecastInputError);
    const short = { ...days[0]!, realised: days[0]!.realised.slice(1) };
    expect(() => scoreForecasts([short])).toThrow(ForecastInputError);
    expect(() => scoreForecasts([])).toThrow(ForecastInputError);
  });
});

describe('one crps per forecast: the DM comparison\'s crps is the crps of scoreForecasts', () => {
  // Two days at the single level 0.5, whose pinball loss is |y - q| / 2. Day A has one period with
  // error 2 (loss 1), day B two periods with errors 4 and 4 (losses 2 and 2). Each period counting
  // once, crps = (1 + 2 + 2) / 3 = 5/3; the mean of the two day means would be (1 + 2) / 2 = 1.5.
  const periods = (n: number) => Array.from({ length: n }, (_, t) => ({ start: `2030-01-0${n}T0${t}:00:00Z`, end: `2030-01-0${n}T0${t + 1}:00:00Z`, startMs: Date.UTC(2030, 0, n, t) }));
  const day = (d: string, n: number, q: number): ScoredDay => ({ forecast: { day: d, levels: [0.5], periods: periods(n), prices: Array.from({ length: n }, () => [q]) }, realised: new Array<number>(n).fill(q + (n === 1 ? 2 : 4)) });
  it('crpsForecast is the crps over every period of the compared days (5/3 by hand), and scoreForecasts gives the same', () => {
    const first = [day('2030-01-01', 1, 10), day('2030-01-02', 2, 10)];
    // The second forecast is exact: loss 0 everywhere.
    const second = first.map((d) => ({ ...d, forecast: { ...d.forecast, prices: d.realised.map((y) => [y]) } }));
    const c = compareForecasts(first, second);
    expect(c.lossFirst).toBeCloseTo(5 / 3, 12);
    expect(c.lossSecond).toBe(0);
    expect(c.test.meanDifference).toBeCloseTo(5 / 3, 12);
    expect(scoreForecasts(first).overall.crps).toBeCloseTo(5 / 3, 12);
  });
});
