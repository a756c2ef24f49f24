import type { DeliveryPeriod, QuantileDay } from '../types.js';
import { formatNumber } from './formatNumber.js';

/** Decimals of the prices written [-]: 0.0001 currency/MWh, far below any market's tick. */
export const FORECAST_PRICE_DECIMALS = 4;

/**
 * A level as the shortest decimal that reads back as the same number, without an exponent:
 * 0.05 -> `0.05`, 0.1 -> `0.1`, 1e-7 -> `0.0000001` (the header `q<level>` takes no exponent).
 *
 * @param level a number in (0, 1)
 */
export function levelText(level: number): string {
  const text = String(level);
  const exponent = /^(\d)(?:\.(\d+))?e-(\d+)$/.exec(text);
  if (exponent === null) return text;
  return `0.${'0'.repeat(Number(exponent[3]) - 1)}${exponent[1]}${exponent[2] ?? ''}`;
}

/**
 * The wide quantile forecast CSV of docs/design.md section 8, `period_start,q0.05,...,q0.95`: one row per
 * delivery period, days in the order given, levels as in the first day (every day must have them),
 * prices with at most FORECAST_PRICE_DECIMALS decimals. parseQuantileForecast reads it back.
 */
export function quantileForecastCsv(days: readonly QuantileDay[]): string {
  const levels = days[0]?.levels ?? [];
  const lines = [['period_start', ...levels.map((tau) => `q${levelText(tau)}`)].join(',')];
  for (const day of days) {
    if (day.levels.length !== levels.length || day.levels.some((tau, k) => tau !== levels[k])) {
      throw new RangeError(`quantileForecastCsv: the levels of ${day.day} differ from those of ${days[0]?.day}`);
    }
    day.periods.forEach((p, t) => lines.push([p.start, ...(day.prices[t] as readonly number[]).map(priceText)].join(',')));
  }
  return `${lines.join('\n')}\n`;
}

/** One delivery day's whole-day scenario paths: paths[j][t] for the periods of the day. */
export interface DayPaths {
  readonly periods: readonly DeliveryPeriod[];
  readonly paths: readonly (readonly number[])[];
}

/**
 * Whole-day scenario paths in the long layout `period_start,path,price`: per day, path 1 over all
 * the day's periods, then path 2, and so on. Path j of a day is one coherent price curve for the
 * whole day; the same number on another day is an unrelated curve.
 */
export function scenarioPathsCsv(days: readonly DayPaths[]): string {
  const lines = ['period_start,path,price'];
  for (const day of days) {
    day.paths.forEach((path, j) => day.periods.forEach((p, t) => lines.push(`${p.start},${j + 1},${priceText(path[t] as number)}`)));
  }
  return `${lines.join('\n')}\n`;
}

function priceText(price: number): string {
  return formatNumber(price, FORECAST_PRICE_DECIMALS);
}
