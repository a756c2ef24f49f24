import { bestResult } from '../../backtest/bestResult.js';
import type { SweepReferenceRow, SweepResult } from '../../backtest/sweepSettingRow.js';
import { formatNumber } from '../../io/formatNumber.js';
import { gridSummaryHead, shownResult, type GridSummaryContext } from '../gridSummary.js';

/** The most profitable alpha of one policy under one rule. */
export interface BestAlpha {
  readonly policy: number | string;
  readonly unaccepted: number | string;
  readonly alpha: number | null;
  readonly row: SweepResult['row'] | null;
  /** The alpha is the smallest or largest of the alpha axis (of two or more values): the optimum may lie beyond. */
  readonly onEdgeOfAlphaGrid: boolean;
}

/** The most profitable setting under one rule, read against the rule's simple baselines. */
export interface BestInRule {
  readonly unaccepted: number | string;
  readonly best: { readonly setting: SweepResult['setting']; readonly row: SweepResult['row'] } | null;
  /** The more profitable of point and price-taking under the rule. */
  readonly strongestBaseline: { readonly policy: 'point' | 'price-taking'; readonly profit: number } | null;
  readonly beatsStrongestBaseline: boolean | null;
  readonly perfectForesightProfit: number | null;
}

/** What the sweep's summary knows besides the grid: the reference rows it is read against. */
export interface SweepSummaryContext extends GridSummaryContext {
  readonly references: readonly SweepReferenceRow[];
}

/**
 * The content of the sweep's `summary.json` and of `--json`: the span and inputs, the axes, the
 * reference policies per rule (point, price-taking, perfect foresight), per unaccepted rule the
 * setting with the highest profit (first in grid order on a tie) read against the strongest simple
 * baseline of that rule, and per policy and rule the alpha with the highest profit, with a warning
 * when it lies on the edge of the alpha grid. The best setting is chosen within each rule, never
 * across rules: the rule is a fact of how the battery is operated, not a setting to choose. Nothing
 * in it depends on threads or on a resume, so a resumed run writes the same bytes.
 */
export function sweepSummary(results: readonly SweepResult[], context: SweepSummaryContext) {
  const values = (name: string) => context.axes.find((axis) => axis.name === name)?.values ?? [];
  const alphas = values('alpha') as readonly number[];
  const onEdge = (alpha: number | null) => alpha !== null && alphas.length > 1 && (alpha === Math.min(...alphas) || alpha === Math.max(...alphas));
  const bestAlphas: BestAlpha[] = values('policy').flatMap((policy) =>
    values('unaccepted').map((unaccepted) => {
      const best = bestResult(results.filter((r) => r.setting.policy === policy && r.setting.unaccepted === unaccepted), 'profit');
      const alpha = best?.setting.alpha ?? null;
      return { policy, unaccepted, alpha, row: best?.row ?? null, onEdgeOfAlphaGrid: onEdge(alpha) } satisfies BestAlpha;
    }),
  );
  const bestByRule: BestInRule[] = values('unaccepted').map((unaccepted): BestInRule => {
    const best = bestResult(results.filter((r) => r.setting.unaccepted === unaccepted), 'profit');
    const refs = context.references.filter((r) => r.setting.unaccepted === unaccepted);
    const profitOf = (policy: string) => refs.find((r) => r.setting.policy === policy)?.row.profit;
    const simple = (['point', 'price-taking'] as const).map((policy) => ({ policy, profit: profitOf(policy) })).filter((b): b is { policy: 'point' | 'price-taking'; profit: number } => typeof b.profit === 'number');
    const strongest = simple.reduce<(typeof simple)[number] | null>((a, b) => (a === null || b.profit > a.profit ? b : a), null);
    const profit = best?.row.profit;
    return {
      unaccepted,
      best: best === null ? null : shownResult(best),
      strongestBaseline: strongest,
      beatsStrongestBaseline: strongest === null || typeof profit !== 'number' ? null : profit > strongest.profit,
      perfectForesightProfit: typeof profitOf('perfect-foresight') === 'number' ? (profitOf('perfect-foresight') as number) : null,
    };
  });
  return {
    ...gridSummaryHead('sweep', context),
    settings: results.length,
    bestByRule,
    bestAlphaByPolicy: bestAlphas,
    references: context.references.map((r) => ({ policy: r.setting.policy, unaccepted: r.setting.unaccepted, row: r.row })),
    warnings: sweepWarnings(bestByRule, bestAlphas, alphas),
    note: 'in-sample: the best setting is chosen on the same days its profit is measured on, so its profit overstates what choosing alpha this way earns on new days; quantbid size --alpha best chooses on earlier days and scores on later ones. It is chosen within each unaccepted rule, never across rules: the rule is how the battery is operated, not a setting',
    conventions: {
      captureRatio: 'profit / perfect-foresight profit on the same days',
      pValueVsPoint: 'one-sided Diebold-Mariano test with the Harvey-Leybourne-Newbold correction (h = 1) of the daily profit of the setting minus that of the point policy; H1: the setting earns more; below 1e-4 written in scientific notation',
      pValueVsPriceTaking: 'the same against the price-taking policy',
      references: 'rows of sweep.csv after the grid, alpha empty: point, price-taking and perfect-foresight under each rule; they do not depend on alpha',
      strongestBaseline: 'the more profitable of point and price-taking under the rule',
      cycles: 'discharged MWh at the grid / usable MWh (socMax - socMin)',
      cash: '+ received, - paid',
    },
  };
}

/** A best setting that loses to a simple baseline, and a best alpha on the edge of its grid. */
function sweepWarnings(bestByRule: readonly BestInRule[], bestAlphas: readonly BestAlpha[], alphas: readonly number[]): string[] {
  const warnings: string[] = [];
  for (const rule of bestByRule) {
    if (rule.beatsStrongestBaseline !== false || rule.strongestBaseline === null || rule.best === null) continue;
    const profit = rule.best.row.profit as number;
    warnings.push(`${String(rule.unaccepted)}: the most profitable setting (alpha ${String(rule.best.setting.alpha)}, ${String(rule.best.setting.policy)}) earns ${formatNumber(profit, 0)}, less than ${rule.strongestBaseline.policy} (${formatNumber(rule.strongestBaseline.profit, 0)}): no setting of the grid beats the simplest baseline`);
  }
  const span = alphas.length > 1 ? `${formatNumber(Math.min(...alphas))} to ${formatNumber(Math.max(...alphas))}` : '';
  for (const best of bestAlphas) {
    if (best.onEdgeOfAlphaGrid) {
      warnings.push(`${String(best.policy)}, ${String(best.unaccepted)}: the most profitable alpha ${String(best.alpha)} lies on the edge of the grid in --alphas (${span}); extend the grid past it to see whether it is the optimum`);
    }
  }
  return warnings;
}

/** The short human summary of a sweep printed on stdout. */
export function sweepSummaryText(summary: ReturnType<typeof sweepSummary>, resumed: number, files: readonly string[]): string {
  const c = summary.currency;
  const money = (x: unknown) => (typeof x === 'number' ? `${formatNumber(x, 0)} ${c}` : '-');
  const capture = (x: unknown) => (typeof x === 'number' ? ` (capture ${formatNumber(100 * x, 1)}%)` : '');
  const lines = [`sweep ${summary.from} to ${summary.to}: ${summary.settings} settings (${resumed} resumed from the journal), ${summary.daysCovered} days covered, ${summary.skippedDays.length} skipped`];
  if ('scenarioPaths' in summary) lines.push(`  paths of curve and auto: ${summary.scenarioPaths}`);
  for (const rule of summary.bestByRule) {
    const refs = summary.references.filter((r) => r.unaccepted === rule.unaccepted);
    const ref = (policy: string) => refs.find((r) => r.policy === policy)?.row;
    lines.push(`  ${String(rule.unaccepted)}: point ${money(ref('point')?.profit)}, price-taking ${money(ref('price-taking')?.profit)}${capture(ref('price-taking')?.capture_ratio)}, perfect foresight ${money(rule.perfectForesightProfit)}`);
    if (rule.best !== null) {
      const verdict = rule.beatsStrongestBaseline === null || rule.strongestBaseline === null ? '' : rule.beatsStrongestBaseline ? `: beats ${rule.strongestBaseline.policy}` : `: LOSES to ${rule.strongestBaseline.policy}`;
      lines.push(`    best setting under ${String(rule.unaccepted)}: alpha ${String(rule.best.setting.alpha)}, ${String(rule.best.setting.policy)}, profit ${money(rule.best.row.profit)}${capture(rule.best.row.capture_ratio)}${verdict}`);
    }
    for (const group of summary.bestAlphaByPolicy.filter((g) => g.unaccepted === rule.unaccepted)) {
      if (group.row === null) continue;
      lines.push(`    best alpha for ${String(group.policy)}: ${String(group.alpha)}, profit ${money(group.row.profit)}${capture(group.row.capture_ratio)}${group.onEdgeOfAlphaGrid ? ' (on the edge of the alpha grid)' : ''}`);
    }
  }
  for (const warning of summary.warnings) lines.push(`  note: ${warning}`);
  lines.push(`  (in-sample: chosen on the days it is measured on, within each unaccepted rule)`, `  wrote ${files.join(', ')}`);
  return `${lines.join('\n')}\n`;
}
