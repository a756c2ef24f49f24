import type { PriceHistory, QuantileDay } from '../types.js';
import { dayForecastKey, historyDigests, type DayForecastSetup } from './dayForecastKey.js';
import { DEFAULTS, forecastSettings, type ForecastOptions } from './forecaster.js';
import { choiceRecord, type ChosenCandidate, type DayChoice } from './autoChoices.js';
import { forecastRange, type ForecastRangeRequest, type SkippedDay } from './forecastRange.js';

/** What is stored of one delivery day: its clamped quantile prices, or why it could not be forecast. */
export type StoredDayForecast =
  | {
      readonly outcome: 'forecast';
      /** prices[t][k] at the setup's levels [currency/MWh], clamped into [floor, cap]. */
      readonly prices: readonly (readonly number[])[];
      /** With method `auto`: the method and calibration window it chose for the day, or the quantile average and its members. */
      readonly chosen?: ChosenCandidate;
    }
  | { readonly outcome: 'skipped'; readonly reason: string };

/**
 * Where day forecasts are kept between runs (an on-disk cache, or nothing). `recall` returns
 * undefined for a key it does not hold or cannot trust; `keep` must never leave a half-written entry.
 */
export interface DayForecastStore {
  recall(key: string, day: string): StoredDayForecast | undefined;
  keep(key: string, day: string, value: StoredDayForecast): void;
}

/** The forecasts of the history's days in a range, and where they came from. */
export interface StoredForecastRangeResult {
  /** One per day forecast, in day order. */
  readonly forecasts: readonly QuantileDay[];
  /** History days of the range that could not be forecast (too little history before them), in day order. */
  readonly skipped: readonly SkippedDay[];
  /** Days the forecaster worked out in this run [-]. */
  readonly daysFitted: number;
  /** Days taken from the store [-]. */
  readonly daysFromStore: number;
  /** With method `auto`: what it chose for each day forecast, in day order; otherwise empty. */
  readonly chosen: readonly DayChoice[];
}

/**
 * forecastRange over the complete history days from `request.from` to `request.to`, through a store:
 * a day whose key (dayForecastKey: method, levels, options, market, software version, and the digests
 * of the history before the day and of the day's known columns) the store holds is taken from it;
 * the other days are forecast, each run of consecutive ones by one forecastRange call (so their
 * calibration forecasts are made once), and kept. Days not in the history are left out (a backtest
 * cannot score them). A stored entry whose shape does not fit the day is made again.
 *
 * The result equals forecastRange's for the same days: a stored value is the very clamped forecast
 * forecastRange made for the same inputs, and the forecaster's answer for a day never depends on which
 * days were asked before it.
 *
 * @param onDay called after each day with (days done, days in the range)
 */
export function storedForecastRange(
  history: PriceHistory,
  request: ForecastRangeRequest,
  setup: Omit<DayForecastSetup, 'method' | 'levels' | 'options'>,
  options: Partial<ForecastOptions>,
  store: DayForecastStore,
  onDay?: (done: number, total: number) => void,
): StoredForecastRangeResult {
  const digests = historyDigests(history);
  // The key holds the forecaster's options with the defaults merged in, as the Forecaster merges them
  // (without a stopwatch, which measures time and changes no forecast).
  const fullSetup: DayForecastSetup = { ...setup, method: request.method, levels: request.levels, options: { ...DEFAULTS, ...forecastSettings(options) } };
  const indices = history.days.flatMap((d, i) => (d.day >= request.from && d.day <= request.to ? [i] : []));
  const outcomes = new Map<number, StoredDayForecast>();
  const keys = new Map<number, string>();
  let daysFromStore = 0;
  const report = (): void => onDay?.(outcomes.size, indices.length);
  for (const i of indices) {
    const day = history.days[i] as (typeof history.days)[number];
    const key = dayForecastKey(fullSetup, day.day, digests.before[i] as string, digests.target[i] as string);
    keys.set(i, key);
    const stored = store.recall(key, day.day);
    if (stored !== undefined && fits(stored, day.periods.length, request.levels.length)) {
      outcomes.set(i, stored);
      daysFromStore++;
      report();
    }
  }
  for (const run of consecutiveRuns(indices.filter((i) => !outcomes.has(i)))) {
    const first = history.days[run[0] as number]?.day as string;
    const last = history.days[run[run.length - 1] as number]?.day as string;
    const before = outcomes.size;
    const made = forecastRange(history, { ...request, from: first, to: last }, options, (done) => onDay?.(before + done, indices.length));
    const byDay = new Map<string, StoredDayForecast>([
      ...made.forecasts.map((f) => [f.quantiles.day, { outcome: 'forecast', prices: f.quantiles.prices, ...(f.chosen === null ? {} : { chosen: choiceRecord(f.chosen) }) }] as const),
      ...made.skipped.map((s) => [s.day, { outcome: 'skipped', reason: s.reason }] as const),
    ]);
    for (const i of run) {
      const day = history.days[i]?.day as string;
      const outcome = byDay.get(day);
      if (outcome === undefined) throw new Error(`storedForecastRange: forecastRange returned nothing for ${day}`);
      outcomes.set(i, outcome);
      store.keep(keys.get(i) as string, day, outcome);
    }
  }
  const forecasts: QuantileDay[] = [];
  const skipped: SkippedDay[] = [];
  const chosen: DayChoice[] = [];
  for (const i of indices) {
    const day = history.days[i] as (typeof history.days)[number];
    const outcome = outcomes.get(i) as StoredDayForecast;
    if (outcome.outcome === 'forecast') {
      forecasts.push({ day: day.day, levels: [...request.levels], periods: day.periods, prices: outcome.prices });
      if (outcome.chosen !== undefined) chosen.push({ day: day.day, ...outcome.chosen });
    } else skipped.push({ day: day.day, reason: outcome.reason });
  }
  return { forecasts, skipped, daysFitted: indices.length - daysFromStore, daysFromStore, chosen };
}

/** A store that holds nothing: every day is forecast. */
export const NO_STORE: DayForecastStore = Object.freeze({ recall: () => undefined, keep: () => undefined });

/** Whether a stored value has one row of `levels` finite, non-decreasing prices per period (and a well-formed choice, if any). */
function fits(stored: StoredDayForecast, periods: number, levels: number): boolean {
  if (stored.outcome === 'skipped') return typeof stored.reason === 'string';
  const chosen = stored.chosen;
  if (chosen !== undefined && !isChoice(chosen)) return false;
  return (
    Array.isArray(stored.prices) &&
    stored.prices.length === periods &&
    stored.prices.every((row) => Array.isArray(row) && row.length === levels && row.every((p, k) => Number.isFinite(p) && (k === 0 || p >= (row[k - 1] as number))))
  );
}

/** Ascending indices split where they are not consecutive: [3, 4, 5, 9, 10] -> [[3, 4, 5], [9, 10]]. */
function consecutiveRuns(indices: readonly number[]): number[][] {
  const runs: number[][] = [];
  for (const i of indices) {
    const run = runs[runs.length - 1];
    if (run !== undefined && run[run.length - 1] === i - 1) run.push(i);
    else runs.push([i]);
  }
  return runs;
}

/** Whether a stored choice is well formed: a method and an integer window, and for an average, members that are. */
function isChoice(c: unknown): boolean {
  if (typeof c !== 'object' || c === null) return false;
  const { method, calibrationDays, averageOf } = c as { method?: unknown; calibrationDays?: unknown; averageOf?: unknown };
  if (typeof method !== 'string' || !Number.isInteger(calibrationDays)) return false;
  if (averageOf === undefined) return true;
  return Array.isArray(averageOf) && averageOf.every((m: unknown) => isChoice(m) && Number.isFinite((m as { weight?: unknown }).weight));
}
