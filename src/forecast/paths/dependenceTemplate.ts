import type { PriceHistory, QuantileDay } from '../../types.js';
import { dayNumberOf } from '../models/historyView.js';
import { slotLayout, toSlotGrid } from '../models/slotGrid.js';
import { levelOf } from './quantileFunction.js';
import { scenarioPaths } from './scenarioPaths.js';

/** A past day of a quantile forecast with its realised prices (one per period). */
export interface PastForecastDay {
  readonly forecast: QuantileDay;
  readonly realised: readonly number[];
}

/**
 * A dependence template from a forecast's own past days: per day, the probability integral transform
 * u_t = F_t(y_t) of each realised price under that day's forecast (levelOf in quantileFunction.ts), on
 * the clock-slot grid. Their ranks across days are the ranks of the forecast's errors on a common
 * scale, whatever the forecast's spread was each day: the template for a vendor's quantile file
 * (Schefzik, Thorarinsdottir and Gneiting 2013 reorder by past observations the same way).
 *
 * Reference: R. Schefzik, T. L. Thorarinsdottir and T. Gneiting (2013), Statist. Sci. 28(4), 616-640.
 */
export function pitTemplate(days: readonly PastForecastDay[]): Float64Array[] {
  return days.map(({ forecast, realised }, d) => {
    const layout = slotLayout(forecast.periods, `days[${d}].forecast.periods`);
    const u = forecast.prices.map((row, t) => levelOf(forecast.levels, row, realised[t] as number));
    return toSlotGrid(u, layout);
  });
}

/**
 * A dependence template from the history alone: the errors of the seasonal naive forecast,
 * e(d, s) = P(d, s) - P(d - lagDays, s) on the clock-slot grid, of the `count` latest history days
 * before `beforeDay` whose day lagDays earlier is in the history (Hyndman and Athanasopoulos 2021,
 * section 5.2, for the seasonal naive method). For a forecast without past days of its own.
 */
export function naiveErrorTemplate(history: PriceHistory, beforeDay: string, count: number, lagDays = 7): Float64Array[] {
  const byNumber = new Map(history.days.map((d) => [dayNumberOf(d.day), d]));
  const before = dayNumberOf(beforeDay);
  const out: Float64Array[] = [];
  const days = history.days.filter((d) => d.day < beforeDay).reverse();
  for (const day of days) {
    if (out.length >= count) break;
    const earlier = byNumber.get(dayNumberOf(day.day) - lagDays);
    if (earlier === undefined || dayNumberOf(day.day) >= before) continue;
    const now = toSlotGrid(day.pricePerMwh, slotLayout(day.periods, `history ${day.day}`));
    const then = toSlotGrid(earlier.pricePerMwh, slotLayout(earlier.periods, `history ${earlier.day}`));
    out.push(Float64Array.from(now, (v, s) => v - (then[s] as number)));
  }
  return out.reverse();
}

/** What {@link forecastFileScenarioPaths} needs. */
export interface ForecastFilePathsRequest {
  /** The delivery day's quantiles (e.g. a day of a vendor's file). */
  readonly quantileDay: QuantileDay;
  /** The same file's past days (any order; days on or after the delivery day are ignored). */
  readonly pastForecasts: readonly QuantileDay[];
  /** The price history: the realised prices of the past days. */
  readonly history: PriceHistory;
  readonly n: number;
  readonly seed: number;
  readonly priceFloor?: number;
  readonly priceCap?: number;
  /** Most template days, the latest first [days]. Default 364. */
  readonly templateDays?: number;
  /** Fewest past forecast days with realised prices for the PIT template [days]. Default 28. */
  readonly minPastDays?: number;
}

/**
 * Scenario paths for a quantile file alone plus the history (a vendor's forecast): the Schaake shuffle
 * (scenarioPaths.ts) with the PIT template of the file's own past days before the delivery day that the
 * history has prices for, or, with fewer than minPastDays of them, the seasonal naive errors of the
 * history. Returns the paths and which template was used.
 */
export function forecastFileScenarioPaths(request: ForecastFilePathsRequest): { paths: number[][]; template: 'pit' | 'naive-errors'; templateDays: number } {
  const keep = request.templateDays ?? 364;
  const realised = new Map(request.history.days.map((d) => [d.day, d.pricePerMwh]));
  const past = request.pastForecasts
    .filter((q) => q.day < request.quantileDay.day && realised.has(q.day))
    .sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0))
    .slice(-keep)
    .map((forecast) => ({ forecast, realised: realised.get(forecast.day) as readonly number[] }));
  const usePit = past.length >= (request.minPastDays ?? 28);
  const template = usePit ? pitTemplate(past) : naiveErrorTemplate(request.history, request.quantileDay.day, keep);
  const { quantileDay, n, seed } = request;
  const paths = scenarioPaths({ quantileDay, template, n, seed, ...bounds(request) });
  return { paths, template: usePit ? 'pit' : 'naive-errors', templateDays: template.length };
}

function bounds(request: { priceFloor?: number; priceCap?: number }): { priceFloor?: number; priceCap?: number } {
  return {
    ...(request.priceFloor === undefined ? {} : { priceFloor: request.priceFloor }),
    ...(request.priceCap === undefined ? {} : { priceCap: request.priceCap }),
  };
}
