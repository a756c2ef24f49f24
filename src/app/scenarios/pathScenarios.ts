import type { MarketSpec, PriceHistory, QuantileDay } from '../../types.js';
import type { DayScenarios, DayScenarioSource } from '../../backtest/scenarioPlanning.js';
import { InputError } from '../../errors/inputError.js';
import { priceAtLevel } from '../../forecast/quantileSet.js';
import type { ScenarioPathsFile } from '../../io/readScenarioPaths.js';
import { dayScenarios, type ImbalancePathSource } from '../../scenarios/dayScenarios.js';
import { fitImbalanceSpread, type SpreadDay } from '../../scenarios/imbalanceSpread.js';
import { formatNumber } from '../../io/formatNumber.js';
import { chooseImbalanceSource } from '../../settle/imbalancePrices.js';

/** Fewest paths a day must have: a planning set of at least 10 and a validation and a fresh set of at least 5 each [-]. */
export const MIN_DAY_PATHS = 20;

/** Most past days the imbalance spread model learns from [days] (a year, as the forecasters use). */
export const SPREAD_DAYS = 364;

/** What the scenarios of a day are made from. */
export interface ScenarioInputs {
  readonly paths: ScenarioPathsFile;
  readonly market: MarketSpec;
  /** The history (its imbalance prices), or null when the market's imbalance rule is used. */
  readonly history: PriceHistory | null;
  /** Past forecast days, for the surprise the spread model is fitted on; may be empty. */
  readonly forecastDays: ReadonlyMap<string, QuantileDay>;
  /** Paths planned on [-]; the day's other paths are the fresh ones. */
  readonly planningPaths: number;
}

/**
 * The imbalance prices of a day's paths (docs/design.md section 4.7): the history's observed imbalance
 * prices win, as in settlement (settle/imbalancePrices.ts): the spread model fitted on the history's days
 * before `day` (at most a year) that have a forecast, the surprise measured from that forecast's median;
 * with fewer than 28 such days the spread is resampled from the days without a surprise term (every
 * history day before `day` with an imbalance price, surprise 0). Without imbalance prices in the history,
 * the market's clearing-plus-penalty rule. Returns the source and a line saying which it is.
 */
export function imbalancePathSource(day: string, inputs: Pick<ScenarioInputs, 'market' | 'history' | 'forecastDays'>): { source: ImbalancePathSource; description: string } {
  const { market, history } = inputs;
  const chosen = history === null ? (market.imbalance === undefined ? null : ({ kind: 'clearing-plus-penalty', penaltyPerMwh: market.imbalance.penaltyPerMwh } as const)) : chooseImbalanceSource(history, market);
  if (chosen === null) {
    throw new InputError([{ file: 'command line', field: '--history', message: 'the paths need imbalance prices: the market spec has no imbalance rule and no history with imbalance_price was given', fix: 'add an imbalance rule to market.json or give --history with an imbalance_price column' }]);
  }
  if (chosen.kind === 'clearing-plus-penalty') return { source: chosen, description: `clearing price +/- ${chosen.penaltyPerMwh} (the market's rule)` };
  const past = (history as PriceHistory).days.filter((d) => d.day < day && d.imbalancePricePerMwh !== null).slice(-SPREAD_DAYS);
  const spreadDay = (d: (typeof past)[number], median: readonly number[]): SpreadDay => ({
    periods: d.periods,
    clearingPricePerMwh: d.pricePerMwh,
    imbalancePricePerMwh: d.imbalancePricePerMwh as readonly number[],
    medianPricePerMwh: median,
  });
  const withForecast = past.flatMap((d) => {
    const f = inputs.forecastDays.get(d.day);
    return f === undefined ? [] : [spreadDay(d, f.prices.map((row) => priceAtLevel(f.levels, row, 0.5)))];
  });
  const conditional = fitImbalanceSpread(withForecast);
  if (conditional !== null) {
    return { source: conditional, description: `history's imbalance - clearing spread on the surprise, fitted on ${withForecast.length} days (a ${fmt(conditional.intercept)} + ${fmt(conditional.slopeUp)} up + ${fmt(conditional.slopeDown)} down, whole-day residuals)` };
  }
  const unconditional = fitImbalanceSpread(past.map((d) => spreadDay(d, d.pricePerMwh)));
  if (unconditional === null) {
    throw new InputError([{ file: 'history', field: 'imbalance_price', message: `fewer than 28 days with imbalance prices before ${day}`, fix: 'give a longer history, or add an imbalance rule to market.json' }]);
  }
  return { source: unconditional, description: `history's imbalance - clearing spread of ${past.length} days resampled whole (too few past forecast days to learn its dependence on the surprise)` };
}

/**
 * Scenarios from a paths file: the day's paths clamped into [floor, cap], P = min(planning paths, n / 2)
 * of them (evenly spread over the file's order, path indices floor(k n / P)) for planning, and of the
 * others alternately one for fresh and one for validation (the curves' strength); each with its
 * imbalance prices (imbalancePathSource).
 *
 * @throws InputError for a day without paths or with fewer than MIN_DAY_PATHS
 */
export function pathScenarioSource(inputs: ScenarioInputs): DayScenarioSource {
  return (forecast: QuantileDay): DayScenarios => {
    const paths = inputs.paths.days.get(forecast.day);
    if (paths === undefined || paths.length < MIN_DAY_PATHS) {
      throw new InputError([{ file: inputs.paths.file, field: 'period_start', message: `${paths === undefined ? 'no paths' : `only ${paths.length} paths`} for ${forecast.day}`, fix: `give at least ${MIN_DAY_PATHS} whole-day paths for every day planned (quantbid forecast --paths 364)` }]);
    }
    const { priceFloor, priceCap } = inputs.market;
    const clamped = paths.map((path) => path.map((p) => Math.min(priceCap, Math.max(priceFloor, p))));
    const n = clamped.length;
    const planningCount = Math.min(inputs.planningPaths, Math.floor(n / 2));
    const planningIndex = new Set(Array.from({ length: planningCount }, (_, k) => Math.floor((k * n) / planningCount)));
    const planning = clamped.filter((_, j) => planningIndex.has(j));
    const others = clamped.filter((_, j) => !planningIndex.has(j));
    const validation = others.filter((_, j) => j % 2 === 1);
    const fresh = others.filter((_, j) => j % 2 === 0);
    const median = forecast.prices.map((row) => priceAtLevel(forecast.levels, row, 0.5));
    const { source } = imbalancePathSource(forecast.day, inputs);
    const set = (chosen: number[][]) => dayScenarios(chosen, forecast.periods, median, source);
    return { planning: set(planning), validation: set(validation), fresh: set(fresh) };
  };
}

const fmt = (x: number): string => formatNumber(x, 3);
