import { bestResult } from '../backtest/bestResult.js';
import { coveredDays } from '../backtest/coveredDays.js';
import type { SweepAxis } from '../backtest/sweep/sweepAxis.js';
import type { GridPoint } from '../backtest/sweep/sweepGrid.js';
import type { SweepRow } from '../backtest/sweep/taskModule.js';
import { daysBetween } from '../market/calendar.js';
import { formatNumber } from './formatNumber.js';
import type { BacktestInputData, BacktestInputPaths } from './readBacktestInputs.js';

/** A finished setting of a grid with its row. */
export interface GridResult extends GridPoint {
  readonly row: SweepRow;
}

/** What a grid's summary says about its run, besides the rows. */
export interface GridSummaryContext {
  readonly from: string;
  readonly to: string;
  readonly data: BacktestInputData;
  readonly paths: BacktestInputPaths;
  readonly axes: readonly SweepAxis[];
  /** With --model: what made the forecasts (method, levels, options, days forecast and skipped). */
  readonly forecastModel?: { readonly method: string };
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
  };
}

/** A setting and its row, as summaries show them. */
export function shownResult(result: GridResult) {
  return { setting: result.setting, row: result.row };
}

/**
 * The content of the sweep's `summary.json` and of `--json`: the span and inputs, the axes, the
 * setting with the highest profit (first in grid order on a tie) and, per policy and unaccepted rule,
 * the alpha with the highest profit. Nothing in it depends on threads or on a resume, so a resumed
 * run writes the same bytes.
 */
export function sweepSummary(results: readonly GridResult[], context: GridSummaryContext) {
  const values = (name: string) => context.axes.find((axis) => axis.name === name)?.values ?? [];
  const bestAlphas = values('policy').flatMap((policy) =>
    values('unaccepted').map((unaccepted) => {
      const best = bestResult(results.filter((r) => r.setting.policy === policy && r.setting.unaccepted === unaccepted), 'profit');
      return { policy, unaccepted, alpha: best?.setting.alpha ?? null, row: best?.row ?? null };
    }),
  );
  const best = bestResult(results, 'profit');
  return {
    ...gridSummaryHead('sweep', context),
    settings: results.length,
    best: best === null ? null : shownResult(best),
    bestAlphaByPolicy: bestAlphas,
    note: 'in-sample: the best setting is chosen on the same days its profit is measured on, so its profit overstates what choosing alpha this way earns on new days; quantbid size --alpha best chooses on earlier days and scores on later ones',
    conventions: {
      captureRatio: 'profit / perfect-foresight profit on the same days',
      pValueVsPoint: 'one-sided Diebold-Mariano test with the Harvey-Leybourne-Newbold correction (h = 1) of the daily profit of the setting minus that of the point policy; H1: the setting earns more',
      cycles: 'discharged MWh at the grid / usable MWh (socMax - socMin)',
      cash: '+ received, - paid',
    },
  };
}

/** The short human summary of a sweep printed on stdout. */
export function sweepSummaryText(summary: ReturnType<typeof sweepSummary>, resumed: number, files: readonly string[]): string {
  const lines = [`sweep ${summary.from} to ${summary.to}: ${summary.settings} settings (${resumed} resumed from the journal), ${summary.daysCovered} days covered, ${summary.skippedDays.length} skipped`];
  for (const group of summary.bestAlphaByPolicy) {
    const row = group.row;
    if (row === null) continue;
    const capture = typeof row.capture_ratio === 'number' ? `, capture ${formatNumber(100 * row.capture_ratio, 1)}%` : '';
    lines.push(`  best alpha for ${String(group.policy)}, ${String(group.unaccepted)}: ${String(group.alpha)}, profit ${formatNumber(row.profit as number, 0)} ${summary.currency}${capture}`);
  }
  lines.push(`  (in-sample: chosen on the days it is measured on)`, `  wrote ${files.join(', ')}`);
  return `${lines.join('\n')}\n`;
}
