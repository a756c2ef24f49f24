/**
 * Speed of a year of daily quantile forecasts at 15-minute resolution (96 slots, 19 levels
 * 0.05..0.95), default options, on a seeded synthetic history (1 year + 364 + 7 + 182 days before).
 * Run: npx vitest bench --run test/forecast/forecastYear.bench.ts
 * Each method starts from a fresh Forecaster, so its time includes every point forecast it needs.
 */
import { bench, describe } from 'vitest';
import type { ForecastMethod } from '../../src/forecast/forecaster.js';
import { FORECAST_METHODS, Forecaster } from '../../src/forecast/forecaster.js';
import { syntheticHistory } from './syntheticHistory.js';

const DAYS = 365;
const total = 364 + 7 + 182 + DAYS;
const history = syntheticHistory({ days: total, periodMinutes: 15, seed: 3, shortDay: 200, longDay: 410 });
const levels = Array.from({ length: 19 }, (_, i) => Math.round(5 * (i + 1)) / 100);

function year(method: ForecastMethod): void {
  const forecaster = new Forecaster(history);
  for (let d = total - DAYS; d < total; d++) forecaster.forecast(d, levels, method);
}

describe('a year of 15-minute quantile forecasts', () => {
  for (const method of FORECAST_METHODS) {
    bench(method, () => year(method), { iterations: 1, time: 0, warmupIterations: 0, warmupTime: 0 });
  }
});
