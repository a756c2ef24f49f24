import type { BacktestMetrics } from '../../backtest/backtestMetrics.js';
import type { BacktestResult } from '../../backtest/runBacktest.js';
import { scenarioChoices } from '../../backtest/scenarioChoices.js';
import { formatNumber } from '../../io/formatNumber.js';
import { imbalanceDescription } from '../../report/imbalanceDescription.js';
import type { BatteryModel, MarketSpec } from '../../types.js';

export interface BacktestSummaryContext {
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** Input paths as the user gave them. */
  readonly inputs: Readonly<Record<string, string>>;
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
      equivalentFullCycles: 'discharged MWh at the grid / usable MWh (socMax - socMin)',
      worstDay5Percent: 'empirical 5% quantile of daily profit, linear interpolation (Hyndman-Fan definition 7)',
      maxDrawdown: 'largest fall of cumulative profit from an earlier peak, starting from 0',
      acceptanceRates: 'accepted orders / orders, counted per order',
    },
    policies: metrics.policies,
    edge: metrics.edge,
    socEndMwh: result.socEndMwh,
    skippedDays: result.skippedDays,
    plansMissing: plansMissing(result),
    months: metrics.months,
    ...(result.policies.some((p) => p === 'curve' || p === 'auto') ? { scenarioChoices: scenarioChoices(result) } : {}),
  };
}

/** Policy-days without a plan (no orders placed), with the reason. */
function plansMissing(result: BacktestResult): { day: string; policy: string; status: string; reason: string }[] {
  return result.days.flatMap((day) =>
    day.runs.filter((run) => run.planStatus !== 'optimal').map((run) => ({ day: day.day, policy: run.policy, status: run.planStatus, reason: run.planReason ?? '' })),
  );
}

/** The short human summary printed on stdout. */
export function backtestSummaryText(result: BacktestResult, metrics: BacktestMetrics, market: MarketSpec, outDir: string, written: readonly string[] = ['ledger.csv', 'days.csv', 'summary.json']): string {
  const money = (x: number | null) => (x === null ? '-' : formatNumber(x, 0));
  const share = (x: number | null) => (x === null ? '-' : `${formatNumber(100 * x, 1)}%`);
  const rows = Object.entries(metrics.policies).map(([name, m]) => [
    name, money(m.profit), money(m.meanDailyProfit), share(m.captureRatio), share(m.buyAcceptanceRate), share(m.sellAcceptanceRate), formatNumber(m.equivalentFullCycles, 1), money(m.imbalanceCash),
  ]);
  const header = ['policy', `profit ${market.currency}`, 'per day', 'capture', 'buys acc.', 'sells acc.', 'cycles', 'imbalance cash'];
  const widths = header.map((h, k) => Math.max(h.length, ...rows.map((r) => (r[k] as string).length)));
  const line = (cells: readonly string[]) => `  ${cells.map((c, k) => (k === 0 ? c.padEnd(widths[k] as number) : c.padStart(widths[k] as number))).join('  ')}`;
  const lines = [
    `backtest ${result.from} to ${result.to}: ${result.days.length} days covered, ${result.skippedDays.length} skipped; alpha ${result.alpha}, unaccepted orders: ${result.unaccepted}`,
    `  imbalance price: ${imbalanceDescription(result.imbalanceSource, market.currency)}`,
    line(header),
    ...rows.map(line),
    `  ${edgeLine(metrics)}`,
    ...missingLine(result),
    `  wrote ${outDir}/${written.join(', ')}`,
  ];
  return `${lines.join('\n')}\n`;
}

function missingLine(result: BacktestResult): string[] {
  const missing = plansMissing(result);
  if (missing.length === 0) return [];
  const shown = missing.slice(0, 3).map((m) => `${m.policy} on ${m.day} (${m.status})`).join(', ');
  return [`  no plan, so no orders, for ${missing.length} policy-day${missing.length > 1 ? 's' : ''}: ${shown}${missing.length > 3 ? ', ...' : ''} (see plansMissing in summary.json)`];
}

function edgeLine(metrics: BacktestMetrics): string {
  const edge = metrics.edge;
  if (edge === null) return 'edge of quantile over point: not tested (both policies are needed)';
  if (edge.status !== 'ok') return `edge of quantile over point: not tested (${edge.reason})`;
  return `edge of quantile over point: ${formatNumber(edge.meanDifference, 2)} per day, Diebold-Mariano/HLN ${formatNumber(edge.hln, 3)}, one-sided p = ${formatNumber(edge.pValueOneSided, 4)}`;
}
