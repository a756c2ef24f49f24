import type { HistoryView } from './historyView.js';
import type { PointForecast } from './pointForecast.js';

/**
 * Seasonal naive forecast: the price of the same clock slot `lagDays` calendar days before the
 * delivery day, P_hat(d, s) = P(d - lagDays, s); lag 1 (yesterday) or 7 (same weekday last week).
 * When that day is missing from the history the latest earlier day stands in for it.
 *
 * Reference: R. J. Hyndman and G. Athanasopoulos (2021), Forecasting: principles and practice,
 * 3rd ed., OTexts, section 5.2 (the seasonal naive method).
 *
 * @returns the forecast, or null when no day lies that far back
 */
export function seasonalNaive(view: HistoryView, lagDays: number): PointForecast | null {
  const i = view.indexAtOrBefore(view.target.dayNumber - lagDays);
  if (i < 0) return null;
  const mean = Float64Array.from(view.past(i).prices);
  return { mean, members: [mean] };
}
