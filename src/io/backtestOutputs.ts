import type { DeliveryPeriod } from '../types.js';
import type { BacktestDay, BacktestResult } from '../backtest/runBacktest.js';
import { isCurve } from '../settle/periodBid.js';
import { CsvBuilder } from './csvBuilder.js';
import { csvLine, formatNumber } from './formatNumber.js';

/**
 * `ledger.csv`: one row per covered day, policy and delivery period, in that order. The order columns
 * are empty in a period without an order; a period bid as a curve has side `curve` and empty quantity
 * and limit (its steps are a stack of orders; what it cleared is in the energy columns). Energies at
 * the grid [MWh]; cash + received, - paid [currency]; `soc_mwh` is the state of charge at the end of
 * the period; `deliberate_imbalance_mwh` is the part of `bought_imbalance_mwh` + `sold_imbalance_mwh`
 * that the store could not deliver or absorb (SettlementTotals.deliberateImbalanceMwh), the rest being
 * unaccepted orders closed under follow-plan.
 */
export const LEDGER_COLUMNS = Object.freeze([
  'day', 'policy', 'period_start', 'side', 'quantity_mw', 'limit_price', 'accepted',
  'clearing_price', 'imbalance_buy_price', 'imbalance_sell_price',
  'bought_auction_mwh', 'sold_auction_mwh', 'bought_imbalance_mwh', 'sold_imbalance_mwh',
  'charged_mwh', 'discharged_mwh', 'auction_cash', 'imbalance_cash', 'degradation_cost', 'profit', 'soc_mwh',
  'deliberate_imbalance_mwh',
]);

/**
 * `days.csv`: one row per covered day and policy. The first nine columns are a contract that scripts
 * rely on (docs/design.md section 8); later columns may be added. `imbalance_cash` is the gross cash at
 * the imbalance price, `imbalance_cost_vs_clearing` what that energy cost against the clearing price
 * (+ cost), and the `deliberate_imbalance_*` columns the part of the imbalance the store could not deliver
 * or absorb (SettlementTotals).
 */
export const DAYS_COLUMNS = Object.freeze([
  'day', 'policy', 'profit', 'soc_start_mwh', 'soc_end_mwh', 'buys_accepted', 'buys', 'sells_accepted', 'sells',
  'auction_cash', 'imbalance_cash', 'degradation_cost',
  'bought_auction_mwh', 'sold_auction_mwh', 'bought_imbalance_mwh', 'sold_imbalance_mwh', 'discharged_mwh', 'plan_status',
  'imbalance_cost_vs_clearing', 'deliberate_imbalance_mwh', 'deliberate_imbalance_periods', 'deliberate_imbalance_cash',
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
  writeLedgerRows(day);
  return ledgerBuilder.take();
}

/**
 * ledgerRows as their UTF-8 bytes, for a file written as it goes: no string is made. The bytes are a
 * view of a buffer that the next call overwrites; write them before asking for the next day's.
 */
export function ledgerRowBytes(day: BacktestDay): Uint8Array {
  writeLedgerRows(day);
  return ledgerBuilder.takeBytes();
}

/** The rows of ledgerRows, written into ledgerBuilder. */
function writeLedgerRows(day: BacktestDay): void {
  const out = ledgerBuilder;
  const count = day.periods.length;
  // Where the start of period t and where its prices (clearing, imbalance buy, imbalance sell) were
  // written in this text: the first policy's rows write them, the others copy them.
  const marks = ledgerMarks(count);
  const { startFrom, startTo, priceFrom, priceTo } = marks;
  let first = true;
  for (const run of day.runs) {
    if (run.ledger === null) {
      out.take();
      throw new RangeError('ledgerCsv: the backtest was run without keepLedger');
    }
    const { orders, periods } = run.ledger;
    // The row's first cells, day and policy, written once per policy and copied.
    let leadFrom = -1;
    let leadTo = -1;
    for (let t = 0; t < count; t++) {
      const period = day.periods[t] as DeliveryPeriod;
      const order = orders[t] ?? null;
      const s = periods[t];
      if (s === undefined) {
        out.take();
        throw new RangeError(`ledgerCsv: no settlement for ${period.start}`);
      }
      if (leadFrom < 0) {
        leadFrom = out.position;
        out.text(day.day);
        out.comma();
        out.text(run.policy);
        out.comma();
        leadTo = out.position;
      } else out.copy(leadFrom, leadTo);
      if (first) {
        startFrom[t] = out.position;
        out.text(period.start);
        startTo[t] = out.position;
      } else out.copy(startFrom[t] as number, startTo[t] as number);
      out.comma();
      if (isCurve(order)) {
        // A curve's steps are in orders.csv; the ledger shows what it cleared in the energy columns.
        out.text('curve,,');
      } else if (order !== null) {
        out.text(order.side);
        out.comma();
        out.number(order.quantityMw);
        out.comma();
        out.number(order.limitPrice);
      } else out.text(',,');
      out.comma();
      if (s.accepted !== null) out.text(s.accepted ? 'true' : 'false');
      out.comma();
      if (first) {
        priceFrom[t] = out.position;
        out.number(day.clearingPricePerMwh[t] as number);
        out.comma();
        out.number(day.imbalance.buyPerMwh[t] as number);
        out.comma();
        out.number(day.imbalance.sellPerMwh[t] as number);
        priceTo[t] = out.position;
      } else out.copy(priceFrom[t] as number, priceTo[t] as number);
      out.comma();
      out.number(s.boughtAuctionMwh);
      out.comma();
      out.number(s.soldAuctionMwh);
      out.comma();
      out.number(s.boughtImbalanceMwh);
      out.comma();
      out.number(s.soldImbalanceMwh);
      out.comma();
      out.number(s.chargedMwh);
      out.comma();
      out.number(s.dischargedMwh);
      out.comma();
      out.number(s.auctionCash);
      out.comma();
      out.number(s.imbalanceCash);
      out.comma();
      out.number(s.degradationCost);
      out.comma();
      out.number(s.profit);
      out.comma();
      out.number(s.socMwh);
      out.comma();
      out.number(s.deliberateImbalanceMwh);
      out.newline();
    }
    first = false;
  }
}

/** Positions in the ledger text of a day's period starts and prices, kept from day to day (ledgerMarks). */
interface LedgerMarks {
  readonly startFrom: Int32Array;
  readonly startTo: Int32Array;
  readonly priceFrom: Int32Array;
  readonly priceTo: Int32Array;
}

let kept: LedgerMarks | null = null;

/** Room for the marks of a day of `count` periods (every mark is written before it is read). */
function ledgerMarks(count: number): LedgerMarks {
  if (kept === null || kept.startFrom.length < count) {
    const size = Math.max(count, 128);
    kept = { startFrom: new Int32Array(size), startTo: new Int32Array(size), priceFrom: new Int32Array(size), priceTo: new Int32Array(size) };
  }
  return kept;
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
          x.auctionCash, x.imbalanceCash, x.degradationCost,
          x.boughtAuctionMwh, x.soldAuctionMwh, x.boughtImbalanceMwh, x.soldImbalanceMwh, x.dischargedMwh, run.planStatus,
          x.imbalanceCostVsClearing, x.deliberateImbalanceMwh, x.deliberateImbalancePeriods, x.deliberateImbalanceCash,
        ]),
      );
    }
  }
  return `${lines.join('\n')}\n`;
}
