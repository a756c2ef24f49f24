import type { BatteryModel, DeliveryPeriod, MarketSpec } from '../types.js';
import type { BacktestMetrics } from '../backtest/backtestMetrics.js';
import type { BacktestDay, BacktestResult } from '../backtest/runBacktest.js';
import type { FallbackSource } from '../settle/fallbackPrices.js';
import { CsvBuilder } from './csvBuilder.js';
import { csvLine, formatNumber } from './formatNumber.js';

/**
 * `ledger.csv`: one row per covered day, policy and delivery period, in that order. The order columns
 * are empty in a period without an order. Energies at the grid [MWh]; cash + received, - paid
 * [currency]; `soc_mwh` is the state of charge at the end of the period.
 */
export const LEDGER_COLUMNS = Object.freeze([
  'day', 'policy', 'period_start', 'side', 'quantity_mw', 'limit_price', 'accepted',
  'clearing_price', 'fallback_buy_price', 'fallback_sell_price',
  'bought_auction_mwh', 'sold_auction_mwh', 'bought_fallback_mwh', 'sold_fallback_mwh',
  'charged_mwh', 'discharged_mwh', 'auction_cash', 'fallback_cash', 'degradation_cost', 'profit', 'soc_mwh',
]);

/**
 * `days.csv`: one row per covered day and policy. The first nine columns are a contract that scripts
 * rely on (DESIGN.md section 8); later columns may be added.
 */
export const DAYS_COLUMNS = Object.freeze([
  'day', 'policy', 'profit', 'soc_start_mwh', 'soc_end_mwh', 'buys_accepted', 'buys', 'sells_accepted', 'sells',
  'auction_cash', 'fallback_cash', 'degradation_cost',
  'bought_auction_mwh', 'sold_auction_mwh', 'bought_fallback_mwh', 'sold_fallback_mwh', 'discharged_mwh', 'plan_status',
]);

export function ledgerCsv(result: BacktestResult): string {
  return `${LEDGER_COLUMNS.join(',')}\n${result.days.map(ledgerRows).join('')}`;
}

/**
 * The ledger.csv rows of one covered day, each ending in a line break; ledger.csv is the header line
 * (LEDGER_COLUMNS) and then these rows day by day, so a long backtest can write it as it goes. The rows
 * are written as bytes (CsvBuilder); the day's realised prices, the same in every policy's rows, are
 * formatted once per period and copied.
 */
export function ledgerRows(day: BacktestDay): string {
  const out = ledgerBuilder;
  const count = day.periods.length;
  // Where the prices of period t (clearing, fallback buy, fallback sell) were written in this text.
  const priceFrom = new Int32Array(count).fill(-1);
  const priceTo = new Int32Array(count);
  for (const run of day.runs) {
    if (run.ledger === null) {
      out.take();
      throw new RangeError('ledgerCsv: the backtest was run without keepLedger');
    }
    const { orders, periods } = run.ledger;
    for (let t = 0; t < count; t++) {
      const period = day.periods[t] as DeliveryPeriod;
      const order = orders[t] ?? null;
      const s = periods[t];
      if (s === undefined) {
        out.take();
        throw new RangeError(`ledgerCsv: no settlement for ${period.start}`);
      }
      out.text(day.day);
      out.comma();
      out.text(run.policy);
      out.comma();
      out.text(period.start);
      out.comma();
      if (order !== null) {
        out.text(order.side);
        out.comma();
        out.number(order.quantityMw);
        out.comma();
        out.number(order.limitPrice);
      } else out.text(',,');
      out.comma();
      if (s.accepted !== null) out.text(s.accepted ? 'true' : 'false');
      out.comma();
      const from = priceFrom[t] as number;
      if (from < 0) {
        priceFrom[t] = out.position;
        out.number(day.clearingPricePerMwh[t] as number);
        out.comma();
        out.number(day.fallback.buyPerMwh[t] as number);
        out.comma();
        out.number(day.fallback.sellPerMwh[t] as number);
        priceTo[t] = out.position;
      } else out.copy(from, priceTo[t] as number);
      out.comma();
      out.number(s.boughtAuctionMwh);
      out.comma();
      out.number(s.soldAuctionMwh);
      out.comma();
      out.number(s.boughtFallbackMwh);
      out.comma();
      out.number(s.soldFallbackMwh);
      out.comma();
      out.number(s.chargedMwh);
      out.comma();
      out.number(s.dischargedMwh);
      out.comma();
      out.number(s.auctionCash);
      out.comma();
      out.number(s.fallbackCash);
      out.comma();
      out.number(s.degradationCost);
      out.comma();
      out.number(s.profit);
      out.comma();
      out.number(s.socMwh);
      out.newline();
    }
  }
  return out.take();
}

/** One builder for every day's ledger rows: its buffer is kept from day to day. */
const ledgerBuilder = new CsvBuilder();

export function daysCsv(result: BacktestResult): string {
  const lines = [DAYS_COLUMNS.join(',')];
  for (const day of result.days) {
    for (const run of day.runs) {
      const x = run.totals;
      lines.push(
        csvLine([
          day.day, run.policy, x.profit, run.socStartMwh, run.socEndMwh, x.buysAccepted, x.buys, x.sellsAccepted, x.sells,
          x.auctionCash, x.fallbackCash, x.degradationCost,
          x.boughtAuctionMwh, x.soldAuctionMwh, x.boughtFallbackMwh, x.soldFallbackMwh, x.dischargedMwh, run.planStatus,
        ]),
      );
    }
  }
  return `${lines.join('\n')}\n`;
}

/** Words for the summary: which fallback price was used. */
export function fallbackDescription(source: FallbackSource, currency: string): string {
  return source.kind === 'history'
    ? 'the history\'s fallback_price column'
    : `the market spec's rule: unaccepted buys at clearing + ${formatNumber(source.penaltyPerMwh)} ${currency}/MWh, unaccepted sells at clearing - ${formatNumber(source.penaltyPerMwh)}`;
}

export interface BacktestSummaryContext {
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  /** Input paths as the user gave them. */
  readonly inputs: Readonly<Record<string, string>>;
}

/**
 * The content of `summary.json` and of `--json`: `policies.<name>.profit` and `.captureRatio` (and the
 * other metrics), `edge`, `skippedDays`, `fallbackSource`, `months`. Key order is fixed by construction.
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
    fallbackSource: { ...result.fallbackSource, description: fallbackDescription(result.fallbackSource, market.currency) },
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
    name, money(m.profit), money(m.meanDailyProfit), share(m.captureRatio), share(m.buyAcceptanceRate), share(m.sellAcceptanceRate), formatNumber(m.equivalentFullCycles, 1), money(m.fallbackCash),
  ]);
  const header = ['policy', `profit ${market.currency}`, 'per day', 'capture', 'buys acc.', 'sells acc.', 'cycles', 'fallback cash'];
  const widths = header.map((h, k) => Math.max(h.length, ...rows.map((r) => (r[k] as string).length)));
  const line = (cells: readonly string[]) => `  ${cells.map((c, k) => (k === 0 ? c.padEnd(widths[k] as number) : c.padStart(widths[k] as number))).join('  ')}`;
  const lines = [
    `backtest ${result.from} to ${result.to}: ${result.days.length} days covered, ${result.skippedDays.length} skipped; alpha ${result.alpha}, unaccepted orders: ${result.unaccepted}`,
    `  fallback price: ${fallbackDescription(result.fallbackSource, market.currency)}`,
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
