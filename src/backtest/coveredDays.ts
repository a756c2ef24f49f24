import { daysBetween } from '../market/calendar.js';
import type { PriceHistory } from '../types.js';
import type { ForecastDays } from './runBacktest.js';

/**
 * The days of [from, to] a backtest covers: those with a complete history and a complete forecast
 * (runBacktest skips the others), ascending.
 */
export function coveredDays(history: PriceHistory, forecast: ForecastDays, from: string, to: string): string[] {
  const withHistory = new Set(history.days.map((d) => d.day));
  return daysBetween(from, to).filter((day) => withHistory.has(day) && forecast.days.has(day));
}
