import type { BatterySpec, HistoryDay, MarketSpec, QuantileDay } from '../types.js';
import { DayCalendar } from '../market/dayCalendar.js';
import type { BacktestInputData } from './readBacktestInputs.js';
import type { QuantileForecastFile } from './readQuantileForecast.js';

/**
 * A backtest's inputs, read and checked, in a form that worker threads share instead of copying: every
 * price in one SharedArrayBuffer per series (a structured clone hands a worker the same memory), the
 * rest small plain data. A worker rebuilds the days from it (sharedInputData) in a few milliseconds,
 * where copying a year's days as objects took a third of a second on each side; the periods come from
 * the market's calendar, which made them when the files were read.
 */
export interface SharedInputs {
  readonly market: MarketSpec;
  readonly batterySpec: BatterySpec;
  readonly history: {
    /** The covered days, ascending, and the number of periods of each. */
    readonly days: readonly string[];
    readonly periodCounts: readonly number[];
    readonly pricePerMwh: Float64Array;
    /** The imbalance price of every period, or null when the history has no such column. */
    readonly imbalancePricePerMwh: Float64Array | null;
    readonly exogenousNames: readonly string[];
    /** exogenous[k]: the column exogenousNames[k], every period. */
    readonly exogenous: readonly Float64Array[];
    readonly incompleteDays: BacktestInputData['history']['incompleteDays'];
  };
  readonly forecast: Omit<QuantileForecastFile, 'days'> & {
    /** The complete days in the file's (ascending) order and the number of periods of each. */
    readonly days: readonly string[];
    readonly periodCounts: readonly number[];
    /** Every period's prices at every level, period after period. */
    readonly prices: Float64Array;
  };
}

/** Inputs shared from this thread: sharedInputData hands back the very data they were made from. */
const madeHere = new WeakMap<Float64Array, BacktestInputData>();

/** The inputs as SharedInputs, for a grid's worker threads. */
export function shareInputs(data: BacktestInputData): SharedInputs {
  const { history, forecast } = data;
  const historyDays = history.days;
  const forecastDays = [...forecast.days.values()];
  const periodCount = historyDays.reduce((n, d) => n + d.pricePerMwh.length, 0);
  const withImbalance = historyDays.every((d) => d.imbalancePricePerMwh !== null) && historyDays.length > 0;
  const series = (values: (day: HistoryDay) => readonly number[]): Float64Array => {
    const out = sharedArray(periodCount);
    let at = 0;
    for (const day of historyDays) {
      out.set(values(day), at);
      at += day.pricePerMwh.length;
    }
    return out;
  };
  const levels = forecast.levels.length;
  const prices = sharedArray(forecastDays.reduce((n, d) => n + d.prices.length, 0) * levels);
  let at = 0;
  for (const day of forecastDays) {
    for (const row of day.prices) {
      prices.set(row, at);
      at += levels;
    }
  }
  const pricePerMwh = series((d) => d.pricePerMwh);
  const shared: SharedInputs = {
    market: data.market,
    batterySpec: data.batterySpec,
    history: {
      days: historyDays.map((d) => d.day),
      periodCounts: historyDays.map((d) => d.pricePerMwh.length),
      pricePerMwh,
      imbalancePricePerMwh: withImbalance ? series((d) => d.imbalancePricePerMwh as readonly number[]) : null,
      exogenousNames: history.exogenousNames,
      exogenous: history.exogenousNames.map((name) => series((d) => d.exogenous[name] as readonly number[])),
      incompleteDays: history.incompleteDays,
    },
    forecast: {
      file: forecast.file,
      levels: forecast.levels,
      incompleteDays: forecast.incompleteDays,
      repairedPeriods: forecast.repairedPeriods,
      repairedExamples: forecast.repairedExamples,
      repairedByDay: forecast.repairedByDay,
      days: forecastDays.map((d) => d.day),
      periodCounts: forecastDays.map((d) => d.prices.length),
      prices,
    },
  };
  madeHere.set(pricePerMwh, data);
  return shared;
}

/** The inputs SharedInputs were made from: in the thread that made them the data itself, elsewhere rebuilt from the shared prices. */
export function sharedInputData(shared: SharedInputs): BacktestInputData {
  const own = madeHere.get(shared.history.pricePerMwh);
  if (own !== undefined) return own;
  const { market, history, forecast } = shared;
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  const periodsOf = (day: string, count: number) => {
    const periods = calendar.periods(day);
    if (periods.length !== count) throw new RangeError(`shared inputs: ${day} has ${count} periods, the calendar ${periods.length}`);
    return periods;
  };
  const historyDays: HistoryDay[] = [];
  let from = 0;
  history.days.forEach((day, i) => {
    const count = history.periodCounts[i] as number;
    const slice = (values: Float64Array): number[] => plainArray(values, from, count);
    const exogenous: Record<string, number[]> = {};
    history.exogenousNames.forEach((name, k) => {
      exogenous[name] = slice(history.exogenous[k] as Float64Array);
    });
    historyDays.push({
      day,
      periods: periodsOf(day, count),
      pricePerMwh: slice(history.pricePerMwh),
      imbalancePricePerMwh: history.imbalancePricePerMwh === null ? null : slice(history.imbalancePricePerMwh),
      exogenous,
    });
    from += count;
  });
  const levels = forecast.levels;
  const forecastDays = new Map<string, QuantileDay>();
  from = 0;
  forecast.days.forEach((day, i) => {
    const count = forecast.periodCounts[i] as number;
    const prices: number[][] = new Array<number[]>(count);
    for (let t = 0; t < count; t++) {
      prices[t] = plainArray(forecast.prices, from, levels.length);
      from += levels.length;
    }
    forecastDays.set(day, { day, levels, periods: periodsOf(day, count), prices });
  });
  return {
    market,
    batterySpec: shared.batterySpec,
    history: { days: historyDays, exogenousNames: history.exogenousNames, incompleteDays: history.incompleteDays },
    forecast: {
      file: forecast.file,
      levels,
      days: forecastDays,
      incompleteDays: forecast.incompleteDays,
      repairedPeriods: forecast.repairedPeriods,
      repairedExamples: forecast.repairedExamples,
      repairedByDay: forecast.repairedByDay,
    },
  };
}

function sharedArray(length: number): Float64Array {
  return new Float64Array(new SharedArrayBuffer(length * Float64Array.BYTES_PER_ELEMENT));
}

/** values[from, from + count) as a plain array. */
function plainArray(values: Float64Array, from: number, count: number): number[] {
  const out = new Array<number>(count);
  for (let k = 0; k < count; k++) out[k] = values[from + k] as number;
  return out;
}
