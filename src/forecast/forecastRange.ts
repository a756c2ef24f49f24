import type { DeliveryPeriod, HistoryDay, PriceHistory } from '../types.js';
import { daysBetween } from '../market/calendar.js';
import { Forecaster, type DayForecast, type ForecastMethod, type ForecastOptions } from './forecaster.js';
import { InsufficientHistoryError } from './models/errors.js';

/** What to forecast: a range of delivery days, a method, levels, and the market's price bounds. */
export interface ForecastRangeRequest {
  /** First delivery day, YYYY-MM-DD. */
  readonly from: string;
  /** Last delivery day, YYYY-MM-DD, included. */
  readonly to: string;
  readonly method: ForecastMethod;
  /** Levels tau in (0, 1), strictly increasing. */
  readonly levels: readonly number[];
  /** The market's price floor [currency/MWh]: no quantile or path price goes below it. */
  readonly priceFloor: number;
  /** The market's price cap [currency/MWh]: no quantile or path price goes above it. */
  readonly priceCap: number;
  /** The delivery periods of a day by the market calendar (for days after the end of the history). */
  readonly periodsOf: (day: string) => readonly DeliveryPeriod[];
}

/** A delivery day of the range that was not forecast, and why. */
export interface SkippedDay {
  readonly day: string;
  readonly reason: string;
}

/** The forecasts of a range of days. */
export interface ForecastRangeResult {
  /** One per forecast day, in day order. */
  readonly forecasts: readonly DayForecast[];
  /** Days of the range that could not be forecast, in day order (never filled in). */
  readonly skipped: readonly SkippedDay[];
  /** Quantile and path prices moved onto the price floor or cap [-]. */
  readonly clampedValues: number;
}

/**
 * Quantile forecasts of every delivery day from `from` to `to`, each made by a Forecaster from the
 * days before it only (information available at gate closure). A day is forecast when it is a
 * complete day of the history (its prices are never read), or when it lies after the end of a
 * history without exogenous columns (its periods then come from the market calendar). Every other
 * day is skipped with its reason: not in the history, incomplete in the history, too little history
 * before it for the method, or after the end of a history whose exogenous columns it would need.
 *
 * Quantiles and paths are clamped into [priceFloor, priceCap]: a price outside cannot clear, and
 * clamping is non-decreasing, so the tau-quantile of the clamped price is the clamped tau-quantile
 * and the rows stay sorted.
 *
 * @param onDay called after each day of the range with (days done, days in the range)
 */
export function forecastRange(
  history: PriceHistory,
  request: ForecastRangeRequest,
  options: Partial<ForecastOptions> = {},
  onDay?: (done: number, total: number) => void,
): ForecastRangeResult {
  const forecaster = new Forecaster(history, options);
  const indexOf = new Map(history.days.map((d, i) => [d.day, i]));
  const incomplete = new Map(history.incompleteDays.map((d) => [d.day, d.reason]));
  const last = history.days[history.days.length - 1]?.day ?? '';
  const forecasts: DayForecast[] = [];
  const skipped: SkippedDay[] = [];
  const clamp = new PriceClamp(request.priceFloor, request.priceCap);
  const days = daysBetween(request.from, request.to);
  days.forEach((day, done) => {
    const attempt = (): DayForecast | string => {
      const index = indexOf.get(day);
      if (index !== undefined) return forecastOrReason(() => forecaster.forecast(index, request.levels, request.method));
      const reason = incomplete.get(day);
      if (reason !== undefined) return `incomplete in the history: ${reason}`;
      if (day < last || last === '') return 'not in the history';
      if (history.exogenousNames.length > 0) {
        return `after the end of the history (${last}); the history's exogenous columns (${history.exogenousNames.join(', ')}) are not known for it`;
      }
      const ahead = withFutureDay(history, day, request.periodsOf(day));
      return forecastOrReason(() => new Forecaster(ahead, forecaster.options).forecast(ahead.days.length - 1, request.levels, request.method));
    };
    const outcome = attempt();
    if (typeof outcome === 'string') skipped.push({ day, reason: outcome });
    else forecasts.push(clamp.day(outcome));
    onDay?.(done + 1, days.length);
  });
  return { forecasts, skipped, clampedValues: clamp.count };
}

/** The forecast, or the reason when the history before the day is too short. */
function forecastOrReason(make: () => DayForecast): DayForecast | string {
  try {
    return make();
  } catch (err) {
    if (err instanceof InsufficientHistoryError) return err.message;
    throw err;
  }
}

/** The history with one more day after its end whose prices are unknown (NaN, never read). */
function withFutureDay(history: PriceHistory, day: string, periods: readonly DeliveryPeriod[]): PriceHistory {
  const future: HistoryDay = { day, periods, pricePerMwh: periods.map(() => Number.NaN), imbalancePricePerMwh: null, exogenous: {} };
  return { ...history, days: [...history.days, future] };
}

/** Clamps prices into [floor, cap] and counts the values it moved. */
class PriceClamp {
  count = 0;

  constructor(
    private readonly floor: number,
    private readonly cap: number,
  ) {}

  day(forecast: DayForecast): DayForecast {
    const row = (prices: readonly number[]): number[] => prices.map((p) => this.price(p));
    return {
      ...forecast,
      quantiles: { ...forecast.quantiles, prices: forecast.quantiles.prices.map(row) },
      paths: forecast.paths.map(row),
    };
  }

  private price(p: number): number {
    if (p >= this.floor && p <= this.cap) return p;
    this.count++;
    return p < this.floor ? this.floor : this.cap;
  }
}
