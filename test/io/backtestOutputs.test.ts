import { describe, expect, it } from 'vitest';
import { runBacktest } from '../../src/backtest/runBacktest.js';
import { daysCsv, DAYS_COLUMNS, LEDGER_COLUMNS, ledgerCsv, ledgerRowBytes, ledgerRows } from '../../src/io/backtestOutputs.js';
import { csvLine } from '../../src/io/formatNumber.js';
import { isCurve } from '../../src/settle/periodBid.js';
import { input } from '../backtest/handWorkedWeek.js';

// Output files of the hand-worked week (test/backtest/handWorkedWeek.ts): 3 covered days of 4 periods.

const result = runBacktest(input, { policies: ['quantile', 'perfect-foresight'] });

describe('backtest output files', () => {
  it('days.csv starts with the contract columns and has one row per day and policy', () => {
    const lines = daysCsv(result).trimEnd().split('\n');
    expect(lines[0]?.split(',').slice(0, 9)).toEqual(['day', 'policy', 'profit', 'soc_start_mwh', 'soc_end_mwh', 'buys_accepted', 'buys', 'sells_accepted', 'sells']);
    expect(lines[0]).toBe(DAYS_COLUMNS.join(','));
    expect(lines).toHaveLength(1 + 3 * 2);
    // Day C (2026-05-05) under follow-plan, worked in handWorkedWeek.ts: profit 260, 1 of 1 buys and 0 of 1 sells accepted.
    expect(lines[3]?.split(',').slice(0, 9)).toEqual(['2026-05-05', 'quantile', '260', '0', '0', '1', '1', '0', '1']);
  });

  it('ledger.csv has one row per period and policy, empty order cells where there is no order', () => {
    const lines = ledgerCsv(result).trimEnd().split('\n');
    expect(lines[0]).toBe(LEDGER_COLUMNS.join(','));
    expect(lines).toHaveLength(1 + 3 * 2 * 4);
    // Day A, quantile, hour 0: buy 4 MW at limit 22, cleared at 20: pays 80; hour 1: no order.
    expect(lines[1]).toBe('2026-05-04,quantile,2026-05-04T00:00:00Z,buy,4,22,true,20,21,21,4,0,0,0,4,0,-80,0,0,-80,4,0');
    expect(lines[2]).toBe('2026-05-04,quantile,2026-05-04T01:00:00Z,,,,,45,44,44,0,0,0,0,0,0,0,0,0,0,4,0');
  });

  it('the same result gives the same bytes', () => {
    const again = runBacktest(input, { policies: ['quantile', 'perfect-foresight'] });
    expect(ledgerCsv(again)).toBe(ledgerCsv(result));
    expect(daysCsv(again)).toBe(daysCsv(result));
  });

  it('written day by day as the backtest runs (onLedgerDay), the ledger has the same bytes and none is kept', () => {
    let streamed = `${LEDGER_COLUMNS.join(',')}\n`;
    const lean = runBacktest(input, { policies: ['quantile', 'perfect-foresight'], keepLedger: false, onLedgerDay: (day) => (streamed += ledgerRows(day)) });
    expect(streamed).toBe(ledgerCsv(result));
    expect(lean.days.every((day) => day.runs.every((run) => run.ledger === null))).toBe(true);
    expect(daysCsv(lean)).toBe(daysCsv(result));
  });

  it('as bytes (what backtest writes), the ledger is the UTF-8 of the same text', () => {
    const pieces: Buffer[] = [Buffer.from(`${LEDGER_COLUMNS.join(',')}\n`)];
    // Each day's bytes are a view that the next day overwrites: copied as they come, as a file write does.
    runBacktest(input, { policies: ['quantile', 'perfect-foresight'], keepLedger: false, onLedgerDay: (day) => void pieces.push(Buffer.from(ledgerRowBytes(day))) });
    expect(Buffer.concat(pieces).toString('utf8')).toBe(ledgerCsv(result));
  });

  it('every row, cell by cell, as the column list says (five policies, so that later policies copy the period starts and prices of the first)', () => {
    const all = runBacktest(input, { unaccepted: 'follow-accepted' });
    // Built one row at a time from the documented columns with csvLine (formatNumber: toFixed's digits,
    // test/io/formatNumber.test.ts), independently of the byte builder.
    const expected = [LEDGER_COLUMNS.join(',')];
    for (const day of all.days) {
      for (const run of day.runs) {
        day.periods.forEach((period, t) => {
          const order = run.ledger?.orders[t] ?? null;
          const s = run.ledger?.periods[t];
          if (s === undefined) throw new Error('no settlement');
          const orderCells = isCurve(order) ? ['curve', '', ''] : order === null ? ['', '', ''] : [order.side, order.quantityMw, order.limitPrice];
          expected.push(
            csvLine([
              day.day, run.policy, period.start, ...orderCells, s.accepted === null ? '' : String(s.accepted),
              day.clearingPricePerMwh[t] as number, day.imbalance.buyPerMwh[t] as number, day.imbalance.sellPerMwh[t] as number,
              s.boughtAuctionMwh, s.soldAuctionMwh, s.boughtImbalanceMwh, s.soldImbalanceMwh, s.chargedMwh, s.dischargedMwh,
              s.auctionCash, s.imbalanceCash, s.degradationCost, s.profit, s.socMwh, s.deliberateImbalanceMwh,
            ]),
          );
        });
      }
    }
    expect(all.policies.length).toBe(5);
    expect(ledgerCsv(all)).toBe(`${expected.join('\n')}\n`);
  });

  it('refuses to write a ledger for a backtest run without one', () => {
    expect(() => ledgerCsv(runBacktest(input, { policies: ['point'], keepLedger: false }))).toThrow(RangeError);
  });
});
