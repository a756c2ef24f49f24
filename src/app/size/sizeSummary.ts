import { coveredDays } from '../../backtest/coveredDays.js';
import { alphaSplit, type AlphaMode, type DayRange } from '../../sizing/alphaChoice.js';
import { bestSizes, type SizePick, type SizeResult } from '../../sizing/bestSizes.js';
import type { SizeCosts } from '../../sizing/sizeEconomics.js';
import { extrapolationWarning, yearCoverage } from '../../economics/yearCoverage.js';
import { formatNumber } from '../../io/formatNumber.js';
import { gridSummaryHead, type GridSummaryContext } from '../gridSummary.js';

export interface SizeSummaryContext extends GridSummaryContext {
  readonly alpha: AlphaMode;
  readonly unaccepted: string;
  readonly costs: SizeCosts;
}

/**
 * The content of the sizing's `summary.json` and of `--json`: span and inputs, how the battery was
 * scaled, how alpha was set (with `best`, the days each part covered: the scored days never include a
 * day alpha was chosen on), the economics and its steps, and per policy the size with the highest NPV
 * and the one with the highest IRR, each with the NPV of its neighbouring sizes.
 */
export function sizeSummary(results: readonly SizeResult[], context: SizeSummaryContext) {
  const { data, from, to } = context;
  const days = (range: DayRange) => ({ ...range, days: coveredDays(data.history, data.forecast, range.from, range.to) });
  const best = bestSizes(results, context.axes);
  const alpha = alphaPart(context.alpha, from, to, days);
  const yearly = sizeYearlyFigures(alpha.scored.days);
  return {
    ...gridSummaryHead('size', context),
    settings: results.length,
    battery: {
      scenario: data.batterySpec,
      scaling: 'energyMwh = energy_mwh, chargeMw = dischargeMw = power_mw; state-of-charge fractions, cycle cap per day and wear cost kept; efficiency from round_trip_efficiency when --efficiency is given, else the spec\'s',
    },
    unaccepted: context.unaccepted,
    alpha,
    yearlyFigures: yearly,
    economics: {
      ...context.costs,
      steps: [
        'profit_per_year = profit x 365.25 / days scored (likewise revenue, cycles and throughput per year)',
        'capex = capexPerMwh x energy_mwh + capexPerMw x power_mw',
        'CF_0 = -capex; CF_y = profit_per_year - fixedOmPerMwYear x power_mw - cell replacements in year y, y = 1..lifeYears',
        'a replacement (capexPerMwh x energy_mwh) falls at the end of each year in which the cells reach lifeCycles equivalent full cycles before the end of life (none when lifeCycles is null)',
        'residual_value: the last replacement set, written off straight-line over its own life (lifeCycles / cycles_per_year years), is credited in the last year at capexPerMwh x energy_mwh x (replacements + 1 - lifeYears x cycles_per_year / lifeCycles); the initial plant has none',
        'npv = sum_y CF_y / (1 + discountRate)^y; irr = the root of NPV nearest 0, "none" without one',
        'payback: when the (discounted) cumulative cash flow first reaches 0, linear within the year, "never" within the life',
      ],
    },
    best,
    warnings: [...(yearly.warning === null ? [] : [yearly.warning]), ...sizeWarnings(best, context.axes)],
    note: 'price-taking rows (the median schedule bid at the cap and floor) are the simplest baseline every size is read against; perfect-foresight rows know the prices in advance: an upper bound on what any policy earns with that size, not a policy one can run',
  };
}

/** The columns of size.csv scaled to a year from the scored days, and everything computed from them. */
export const SIZE_YEARLY_FIGURES = 'profit_per_year, revenue_per_mwh_year, revenue_per_mw_year, cycles_per_year and throughput_mwh_per_year, and with them npv, irr, replacements and the paybacks,';

/** Which months the yearly figures of size.csv come from, and the warning when they are extrapolated (yearCoverage.ts). */
export function sizeYearlyFigures(scoredDays: readonly string[]) {
  const coverage = yearCoverage(scoredDays);
  return { ...coverage, warning: extrapolationWarning(coverage, SIZE_YEARLY_FIGURES) };
}

function alphaPart<T>(mode: AlphaMode, from: string, to: string, days: (range: DayRange) => T) {
  if (mode.method === 'fixed') return { method: 'fixed' as const, alpha: mode.alpha, scored: days({ from, to }) };
  const split = alphaSplit(from, to);
  return {
    method: 'best' as const,
    alphas: mode.alphas,
    rule: 'per size and policy, the alpha with the highest profit on the first floor(n/2) calendar days of [from, to] (choose), scored on the other days (scored) only; ties go to the first alpha in the grid',
    choose: days(split.choose),
    scored: days(split.score),
  };
}

/** The short human summary of a sizing printed on stdout. */
export function sizeSummaryText(summary: ReturnType<typeof sizeSummary>, resumed: number, files: readonly string[]): string {
  const scored = summary.alpha.scored;
  const how = summary.alpha.method === 'best' ? `alpha chosen per size on ${summary.alpha.choose.from} to ${summary.alpha.choose.to}` : `alpha ${String(summary.alpha.alpha)}`;
  const lines = [`size ${summary.from} to ${summary.to}: ${summary.settings} settings (${resumed} resumed from the journal); ${scored.days.length} days scored from ${scored.from}, ${how}`];
  if ('scenarioPaths' in summary) lines.push(`  paths of curve and auto: ${summary.scenarioPaths}`);
  const at = (pick: SizePick) => `${formatNumber(pick.energyMwh)} MWh / ${formatNumber(pick.powerMw)} MW, efficiency ${formatNumber(pick.roundTripEfficiency, 4)}`;
  for (const policy of summary.best) {
    const npv = policy.highestNpv;
    const irr = policy.highestIrr;
    const npvText = npv === null ? 'no NPV' : `highest NPV ${formatNumber(npv.row.npv as number, 0)} ${summary.currency} at ${at(npv)}`;
    const irrText = irr === null ? 'no size has an IRR' : `highest IRR ${formatNumber(100 * (irr.row.irr as number), 2)}% at ${at(irr)}`;
    lines.push(`  ${policy.policy}: ${npvText}; ${irrText}`);
  }
  for (const warning of summary.warnings) lines.push(`  note: ${warning}`);
  lines.push(`  wrote ${files.join(', ')}`);
  return `${lines.join('\n')}\n`;
}

/**
 * What an owner must know before reading the best size as an answer: a policy whose every size loses
 * money at these costs, a best size on the edge of the grid (the optimum may lie beyond it), and a
 * policy whose best NPV is below the price-taking baseline's. Perfect foresight is an upper bound,
 * not a choice, and gets no warning.
 */
export function sizeWarnings(best: ReturnType<typeof bestSizes>, axes: readonly { readonly name: string; readonly values: readonly (number | string)[] }[]): string[] {
  const warnings: string[] = [];
  const span = (name: string): [number, number] | null => {
    const values = (axes.find((a) => a.name === name)?.values ?? []).map(Number);
    return values.length < 2 ? null : [Math.min(...values), Math.max(...values)];
  };
  const energy = span('energy_mwh');
  const power = span('power_mw');
  for (const policy of best) {
    const pick = policy.highestNpv;
    if (policy.policy === 'perfect-foresight' || pick === null) continue;
    if ((pick.row.npv as number) < 0) warnings.push(`${policy.policy}: every size has a negative NPV at these costs; the "best" size only loses least`);
    const edges: string[] = [];
    if (energy !== null && (pick.energyMwh === energy[0] || pick.energyMwh === energy[1])) edges.push(`--energy-mwh (${formatNumber(pick.energyMwh)} MWh)`);
    if (power !== null && (pick.powerMw === power[0] || pick.powerMw === power[1])) edges.push(`--power-mw (${formatNumber(pick.powerMw)} MW)`);
    if (edges.length > 0) warnings.push(`${policy.policy}: the highest NPV lies on the edge of the grid in ${edges.join(' and ')}; extend the grid past it to see whether it is the optimum`);
  }
  // Every size is read against the simplest baseline: price-taking (its rows are always there).
  const taking = best.find((b) => b.policy === 'price-taking')?.highestNpv;
  for (const policy of best) {
    const pick = policy.highestNpv;
    if (policy.policy === 'perfect-foresight' || policy.policy === 'price-taking' || pick === null || taking === undefined || taking === null) continue;
    if ((pick.row.npv as number) < (taking.row.npv as number)) {
      warnings.push(`${policy.policy}: its highest NPV (${formatNumber(pick.row.npv as number, 0)}) is below price-taking's (${formatNumber(taking.row.npv as number, 0)}): at these costs the simplest baseline pays better`);
    }
  }
  return warnings;
}
