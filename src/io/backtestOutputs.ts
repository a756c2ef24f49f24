import type { BacktestDay, BacktestResult } from '../backtest/runBacktest.js';
import { csvLine } from './formatNumber.js';

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
 * rely on (docs/design.md section 8); later columns may be added.
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
 * (LEDGER_COLUMNS) and then these rows day by day, so a long backtest can write it as it goes.
 */
export function ledgerRows(day: BacktestDay): string {
  const lines: string[] = [];
  for (const run of day.runs) {
    if (run.ledger === null) throw new RangeError('ledgerCsv: the backtest was run without keepLedger');
    const { orders, periods } = run.ledger;
    day.periods.forEach((period, t) => {
      const order = orders[t] ?? null;
      const s = periods[t];
      if (s === undefined) throw new RangeError(`ledgerCsv: no settlement for ${period.start}`);
      lines.push(
        csvLine([
          day.day, run.policy, period.start,
          order?.side ?? '', order === null ? '' : order.quantityMw, order === null ? '' : order.limitPrice, s.accepted === null ? '' : String(s.accepted),
          day.clearingPricePerMwh[t] as number, day.fallback.buyPerMwh[t] as number, day.fallback.sellPerMwh[t] as number,
          s.boughtAuctionMwh, s.soldAuctionMwh, s.boughtFallbackMwh, s.soldFallbackMwh,
          s.chargedMwh, s.dischargedMwh, s.auctionCash, s.fallbackCash, s.degradationCost, s.profit, s.socMwh,
        ]),
      );
    });
  }
  return lines.length === 0 ? '' : `${lines.join('\n')}\n`;
}

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
