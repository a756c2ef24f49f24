import { coveredDays } from '../backtest/coveredDays.js';
import type { GridAxis } from '../grid/gridAxis.js';
import type { BacktestInputData, BacktestInputPaths } from '../io/readBacktestInputs.js';
import { daysBetween } from '../market/calendar.js';

/** What a grid's summary says about its run, besides the rows. */
export interface GridSummaryContext {
  readonly from: string;
  readonly to: string;
  readonly data: BacktestInputData;
  readonly paths: BacktestInputPaths;
  readonly axes: readonly GridAxis[];
  /** With --model: what made the forecasts (method, levels, options, days forecast and skipped). */
  readonly forecastModel?: { readonly method: string };
  /** With curve or auto: where the whole-day paths came from (app/scenarios/quantilePaths.ts). */
  readonly scenarioPaths?: string;
}

/** The parts every grid summary starts with: span, days covered and skipped, currency, inputs, axes. */
export function gridSummaryHead(command: string, context: GridSummaryContext) {
  const { from, to, data } = context;
  const covered = new Set(coveredDays(data.history, data.forecast, from, to));
  return {
    command,
    from,
    to,
    daysCovered: covered.size,
    skippedDays: daysBetween(from, to).filter((day) => !covered.has(day)),
    currency: data.market.currency,
    inputs: { ...context.paths, ...(context.forecastModel === undefined ? {} : { model: context.forecastModel.method }) },
    axes: Object.fromEntries(context.axes.map((axis) => [axis.name, axis.values])),
    ...(context.forecastModel === undefined ? {} : { forecastModel: context.forecastModel }),
    ...(context.scenarioPaths === undefined ? {} : { scenarioPaths: context.scenarioPaths }),
  };
}

/** A setting and its row, as summaries show them. */
export function shownResult<S, R>(result: { readonly setting: S; readonly row: R }): { setting: S; row: R } {
  return { setting: result.setting, row: result.row };
}
