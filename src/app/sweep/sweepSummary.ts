import { bestResult } from '../../backtest/bestResult.js';
import type { SweepResult } from '../../backtest/sweepSettingRow.js';
import { formatNumber } from '../../io/formatNumber.js';
import { gridSummaryHead, shownResult, type GridSummaryContext } from '../gridSummary.js';

/**
 * The content of the sweep's `summary.json` and of `--json`: the span and inputs, the axes, the
 * setting with the highest profit (first in grid order on a tie) and, per policy and unaccepted rule,
 * the alpha with the highest profit. Nothing in it depends on threads or on a resume, so a resumed
 * run writes the same bytes.
 */
export function sweepSummary(results: readonly SweepResult[], context: GridSummaryContext) {
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
