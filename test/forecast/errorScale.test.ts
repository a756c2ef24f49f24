import { describe, expect, it } from 'vitest';
import type { ForecastOptions } from '../../src/forecast/forecaster.js';
import { forecastDay } from '../../src/forecast/forecaster.js';
import { asinhErrorScale, PRICE_SCALE } from '../../src/forecast/quantiles/errorScale.js';
import { syntheticHistory } from './syntheticHistory.js';

describe('asinhErrorScale', () => {
  // Sample [1, 2, 3, 4, 100]: median a = 3, MAD = 1, b = 1 / Phi^-1(3/4) = 1.482602218505602 (Phi^-1(3/4)
  // = 0.6744897501960817, the value R's qnorm(0.75) prints to 16 digits, from memory).
  const scale = asinhErrorScale([1, 2, 3, 4, 100]);
  const b = 1 / 0.6744897501960817;

  it('is asinh((p - a) / b): 0 at the median, asinh(1) = ln(1 + sqrt 2) one b above, odd about a', () => {
    expect(scale.to(3)).toBe(0);
    expect(scale.to(3 + b)).toBeCloseTo(Math.log(1 + Math.SQRT2), 12);
    expect(scale.to(3 - b)).toBeCloseTo(-Math.log(1 + Math.SQRT2), 12);
  });

  it('is increasing and inverted by from (negative prices and spikes included)', () => {
    const prices = [-500, -20, 0, 2.5, 3, 80, 4000];
    const mapped = prices.map(scale.to);
    mapped.forEach((z, i) => {
      if (i > 0) expect(z).toBeGreaterThan(mapped[i - 1]!);
      expect(scale.from(z)).toBeCloseTo(prices[i]!, 9);
    });
    expect(PRICE_SCALE.to(-7.5)).toBe(-7.5);
    expect(PRICE_SCALE.from(12)).toBe(12);
  });
});

describe('errorScale option of the Forecaster', () => {
  const SMALL: Partial<ForecastOptions> = { windowsDays: [28, 56], minTrainingDays: 21, calibrationDays: 42, minCalibrationDays: 21 };
  const LEVELS = [0.05, 0.5, 0.95];
  const history = syntheticHistory({ days: 130, periodMinutes: 60, seed: 7 });

  it("measures ARX errors on the asinh scale by default ('model') and on prices with 'price'", () => {
    const model = forecastDay(history, 110, LEVELS, 'arx-hs', SMALL);
    const price = forecastDay(history, 110, LEVELS, 'arx-hs', { ...SMALL, errorScale: 'price' });
    expect(model.point).toEqual(price.point);
    expect(model.quantiles.prices).not.toEqual(price.quantiles.prices);
  });

  it('refuses an unknown scale with the argument named', () => {
    expect(() => forecastDay(history, 110, LEVELS, 'arx-hs', { ...SMALL, errorScale: 'log' as 'price' })).toThrow(/options.errorScale/);
  });

  it('keeps the seasonal naive model on prices either way (its own scale)', () => {
    const model = forecastDay(history, 110, LEVELS, 'naive-hs', SMALL);
    const price = forecastDay(history, 110, LEVELS, 'naive-hs', { ...SMALL, errorScale: 'price' });
    expect(model.quantiles.prices).toEqual(price.quantiles.prices);
  });
});
