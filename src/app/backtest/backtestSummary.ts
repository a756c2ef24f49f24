import type { BacktestMetrics } from '../../backtest/backtestMetrics.js';
import type { PolicyMetrics } from '../../backtest/policyMetrics.js';
import type { BacktestResult } from '../../backtest/runBacktest.js';
import { scenarioChoices } from '../../backtest/scenarioChoices.js';
import { STRONGEST_BASELINE_RULE } from '../../backtest/backtestMetrics.js';
import { extrapolationWarning, yearCoverage } from '../../economics/yearCoverage.js';
import { formatNumber } from '../../io/formatNumber.js';
import { exchangeSteps } from '../../plan/exchangeRounding.js';
import { baselineHeadline, edgeSentence } from '../../report/edgeText.js';
import { imbalanceDescription } from '../../report/imbalanceDescription.js';
import type { BatteryModel, MarketSpec } from '../../types.js';

export interface BacktestSummaryContext {
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** Input paths as the user gave them. */
  readonly inputs: Readonly<Record<string, string>>;
  /** With the market's order steps: metrics of the same backtest with the orders as planned (unrounded). */
  readonly unrounded?: BacktestMetrics;
}

/**
 * The content of `summary.json` and of `--json`: `policies.<name>.profit` and `.captureRatio` (and the
 * other metrics), `edge`, `skippedDays`, `imbalanceSource`, `months`. Key order is fixed by construction.
 */
export function backtestSummary(result: BacktestResult, metrics: BacktestMetrics, context: BacktestSummaryContext) {
  const { market, battery } = context;
  return {
    from: result.from,
    to: result.to,
    daysCovered: result.days.length,
    daysSkipped: result.skippedDays.length,
    alpha: result.alpha,
    unaccepted: result.unaccepted,
    currency: market.currency,
    inputs: { ...context.inputs },
    battery: {
      energyMwh: battery.energyMwh,
      chargeMw: battery.chargeMw,
      dischargeMw: battery.dischargeMw,
      usableMwh: battery.socMaxMwh - battery.socMinMwh,
      socInitialMwh: battery.socInitialMwh,
    },
    imbalanceSource: { ...result.imbalanceSource, description: imbalanceDescription(result.imbalanceSource, market.currency) },
    conventions: {
      cash: '+ received, - paid',
      profitPerMwYear: 'profit / (days / 365.25) / dischargeMw',
      profitPerMwhYear: 'profit / (days / 365.25) / energyMwh',
      cyclesTotal: 'equivalent full cycles over the covered days: MWh taken out of the store (discharged MWh at the grid / discharge efficiency) / usable MWh (socMax - socMin); a full swing of the window is one cycle, the count maxCyclesPerDay caps per day',
      cyclesPerDay: 'cyclesTotal / days',
      imbalanceCash: 'gross imbalance cash: imbalance sell price x MWh sold at it - imbalance buy price x MWh bought at it (+ received, - paid)',
      imbalanceCostVsClearing: 'cost of imbalance against the clearing price: sum of (imbalance buy price - clearing) x MWh bought at the imbalance price - (imbalance sell price - clearing) x MWh sold at it (+ cost, - gain)',
      deliberateImbalance: 'energy of orders the store could not deliver (a sell beyond its content) or absorb (a buy beyond its room or power), bought or sold back at the imbalance price; under follow-accepted, accepted orders the battery cannot honour; part of the imbalance energies and imbalanceCash',
      worstDay5Percent: 'empirical 5% quantile of daily profit, linear interpolation (Hyndman-Fan definition 7)',
      maxDrawdown: 'largest fall of cumulative profit from an earlier peak, starting from 0',
      acceptanceRates: 'accepted orders / orders, counted per order',
      edges: 'the tested policy (the first run other than perfect-foresight) against every other: Diebold-Mariano test with the Harvey-Leybourne-Newbold correction (h = 1) of d = tested daily profit - reference daily profit; pValueTestedEarnsMore = P(T >= HLN), pValueReferenceEarnsMore = P(T <= HLN), T ~ t(n - 1)',
      baseline: `the headline compares the tested policy with the strongest simple baseline: ${STRONGEST_BASELINE_RULE} by profit over the run (point on a tie)`,
      edge: 'quantile against point, as in edges; kept for scripts that read it',
    },
    yearlyFigures: yearlyFigures(result),
    ...orderSteps(market, metrics, context.unrounded),
    tested: metrics.tested,
    baseline:
      metrics.baseline === null
        ? null
        : { policy: metrics.baseline.policy, testedLoses: metrics.baseline.testedLoses, ...baselineHeadline(metrics, market.currency, formatNumber), edge: metrics.baseline.edge },
    policies: metrics.policies,
    edges: metrics.edges,
    edge: metrics.edge,
    socEndMwh: result.socEndMwh,
    skippedDays: result.skippedDays,
    plansMissing: plansMissing(result),
    months: metrics.months,
    ...(result.policies.some((p) => p === 'curve' || p === 'auto') ? { scenarioChoices: scenarioChoices(result) } : {}),
  };
}

/**
 * The market's order steps, when it has any (no key without them): every policy's orders were rounded
 * to them, and `roundingLoss` is the difference in profit against the same backtest with the orders as
 * planned (`unrounded`, run on the market spec without its steps).
 */
function orderSteps(market: MarketSpec, metrics: BacktestMetrics, unrounded: BacktestMetrics | undefined) {
  const steps = exchangeSteps(market);
  if (steps === null || unrounded === undefined) return {};
  // The policies of the unrounded run: those that plan schedules (auto, on scenarios, is left out there).
  const policies = Object.keys(metrics.policies).filter((p) => p in unrounded.policies);
  const without = (p: string) => (unrounded.policies[p] as PolicyMetrics).profit;
  return {
    orderSteps: {
      ...steps,
      profitWithoutRounding: Object.fromEntries(policies.map((p) => [p, without(p)])),
      roundingLoss: Object.fromEntries(policies.map((p) => [p, without(p) - (metrics.policies[p] as PolicyMetrics).profit])),
      rule: 'orders rounded to the steps so that the battery can always deliver them (quantities down, buy limits down and sell limits up to the tick); roundingLoss = profitWithoutRounding - profit, the same backtest with the orders as planned',
    },
  };
}

/** The console line on the profit lost to rounding the orders to the market's steps. */
function roundingLine(market: MarketSpec, metrics: BacktestMetrics, unrounded: BacktestMetrics | undefined): string[] {
  const { orderSteps: steps } = orderSteps(market, metrics, unrounded);
  if (steps === undefined) return [];
  const losses = Object.entries(steps.roundingLoss).map(([name, loss]) => `${name} ${formatNumber(loss, 0)}`);
  return [`  profit lost to rounding the orders to the exchange's steps (against the same backtest unrounded): ${losses.join(', ')}`];
}

/** The figures of summary.json scaled to a year, and whether they are extrapolated from less than a year. */
export const BACKTEST_YEARLY_FIGURES = 'profitPerMwYear and profitPerMwhYear';

/**
 * Which months the yearly figures (profitPerMwYear, profitPerMwhYear) come from and, when they are
 * extrapolated from less than a year or without some month of the year, the warning (yearCoverage.ts).
 */
export function yearlyFigures(result: BacktestResult) {
  const coverage = yearCoverage(result.days.map((day) => day.day));
  return { figures: ['profitPerMwYear', 'profitPerMwhYear'], ...coverage, warning: extrapolationWarning(coverage, BACKTEST_YEARLY_FIGURES) };
}

/** Policy-days without a plan (no orders placed), with the reason. */
function plansMissing(result: BacktestResult): { day: string; policy: string; status: string; reason: string }[] {
  return result.days.flatMap((day) =>
    day.runs.filter((run) => run.planStatus !== 'optimal').map((run) => ({ day: day.day, policy: run.policy, status: run.planStatus, reason: run.planReason ?? '' })),
  );
}

/** The short human summary printed on stdout; `sourceLines` (where the scenario paths came from) go just before the files written. */
export function backtestSummaryText(
  result: BacktestResult,
  metrics: BacktestMetrics,
  market: MarketSpec,
  outDir: string,
  written: readonly string[] = ['ledger.csv', 'days.csv', 'summary.json'],
  unrounded?: BacktestMetrics,
  sourceLines: readonly string[] = [],
): string {
  const money = (x: number | null) => (x === null ? '-' : formatNumber(x, 0));
  const share = (x: number | null) => (x === null ? '-' : `${formatNumber(100 * x, 1)}%`);
  const rows = Object.entries(metrics.policies).map(([name, m]) => [
    name, money(m.profit), money(m.meanDailyProfit), share(m.captureRatio), share(m.buyAcceptanceRate), share(m.sellAcceptanceRate), m.cyclesPerDay === null ? '-' : formatNumber(m.cyclesPerDay, 2), money(m.imbalanceCash), money(m.imbalanceCostVsClearing),
  ]);
  const header = ['policy', `profit ${market.currency}`, 'per day', 'capture', 'buys acc.', 'sells acc.', 'cycles/day', 'imbalance gross', 'imb. cost vs clearing'];
  const widths = header.map((h, k) => Math.max(h.length, ...rows.map((r) => (r[k] as string).length)));
  const line = (cells: readonly string[]) => `  ${cells.map((c, k) => (k === 0 ? c.padEnd(widths[k] as number) : c.padStart(widths[k] as number))).join('  ')}`;
  const lines = [
    `backtest ${result.from} to ${result.to}: ${result.days.length} days covered, ${result.skippedDays.length} skipped; alpha ${result.alpha}, unaccepted orders: ${result.unaccepted}`,
    `  imbalance price: ${imbalanceDescription(result.imbalanceSource, market.currency)}`,
    line(header),
    ...rows.map(line),
    '  imbalance gross: gross imbalance cash, + received, - paid; imb. cost vs clearing: cost of imbalance against the clearing price,',
    '  (imbalance price - clearing price) x MWh bought at the imbalance price, minus the same for MWh sold at it, + cost',
    ...deliberateLines(result, metrics),
    ...roundingLine(market, metrics, unrounded),
    ...edgeLines(metrics, market.currency),
    ...missingLine(result),
    ...sourceLines,
    `  wrote ${outDir}/${written.join(', ')}`,
  ];
  return `${lines.join('\n')}\n`;
}

/** The flag on deliberate imbalance: orders the battery could not honour, settled at the imbalance price. */
function deliberateLines(result: BacktestResult, metrics: BacktestMetrics): string[] {
  const flagged = Object.entries(metrics.policies).filter(([, m]) => m.deliberateImbalancePeriods > 0);
  if (flagged.length === 0) return [];
  const what = result.unaccepted === 'follow-accepted' ? 'accepted orders the battery could not deliver or absorb' : 'orders the battery could not deliver or absorb';
  return [
    `  warning: deliberate imbalance: ${what}, settled at the imbalance price; most markets forbid planning on it (SAFETY.md section 3):`,
    ...flagged.map(([name, m]) => `    ${name}: ${formatNumber(m.deliberateImbalanceMwh, 1)} MWh in ${m.deliberateImbalancePeriods} periods, cash ${formatNumber(m.deliberateImbalanceCash, 0)}`),
  ];
}

function missingLine(result: BacktestResult): string[] {
  const missing = plansMissing(result);
  if (missing.length === 0) return [];
  const shown = missing.slice(0, 3).map((m) => `${m.policy} on ${m.day} (${m.status})`).join(', ');
  return [`  no plan, so no orders, for ${missing.length} policy-day${missing.length > 1 ? 's' : ''}: ${shown}${missing.length > 3 ? ', ...' : ''} (see plansMissing in summary.json)`];
}

/** The headline against the strongest simple baseline, then the tested policy against every other. */
function edgeLines(metrics: BacktestMetrics, currency: string): string[] {
  if (metrics.tested === null) return ['  no edge tested: only perfect foresight was run'];
  const headline = baselineHeadline(metrics, currency, formatNumber);
  const lines = headline === null ? [`  ${metrics.tested}: no simple baseline (point, price-taking) was run beside it`] : [`  ${headline.verdict}`, `    ${headline.test}`];
  if (metrics.edges.length > 0) lines.push(`  ${metrics.tested} against every other policy:`, ...metrics.edges.map((edge) => `    ${edgeSentence(edge, currency, formatNumber)}`));
  return lines;
}
