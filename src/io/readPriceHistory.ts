import type { HistoryDay, MarketSpec, PriceHistory } from '../types.js';
import { DayCalendar, locatePeriod } from '../market/dayCalendar.js';
import { ProblemList } from './inputError.js';
import { parseDecimal, splitCsv, type CsvRow } from './csvText.js';
import { readInputFile } from './readInputFile.js';

/** Column names with a fixed meaning in a price history (DESIGN.md section 8). */
export const HISTORY_COLUMNS = Object.freeze({
  periodStart: 'period_start',
  price: 'price',
  fallbackPrice: 'fallback_price',
});

/** Reads a price history file (.csv or .csv.gz); see parsePriceHistory. */
export function readPriceHistory(path: string, market: MarketSpec): PriceHistory {
  return parsePriceHistory(readInputFile(path), path, market);
}

/**
 * Parses a price history: `period_start,price` plus an optional `fallback_price` column and any number
 * of exogenous columns (e.g. `load_forecast_mw`), in any order after `price`.
 *
 * Conventions:
 * - every cell must be a finite decimal with a dot (parseDecimal); `period_start` must name a period
 *   start of the market's calendar with the zone's offset on that date (locatePeriod);
 * - `price` must lie in the market's [priceFloor, priceCap]; `fallback_price` is a balancing price and
 *   is only required to be finite (balancing prices are not bound by the auction's limits, common practice);
 * - rows may come in any order; days come out ascending;
 * - a day with missing periods or a period given twice is left out and listed in `incompleteDays` with
 *   the reason (never filled in, never averaged);
 * - cell problems are all collected and thrown together as one InputError (file, line, column).
 */
export function parsePriceHistory(text: string, file: string, market: MarketSpec): PriceHistory {
  const problems = new ProblemList();
  const split = splitCsv(text, file);
  if ('problems' in split) {
    split.problems.forEach((p) => problems.add(p));
    problems.throwIfAny();
    throw new Error('unreachable');
  }
  const { header, rows } = split.table;
  const layout = historyLayout(header, file, problems);
  problems.throwIfAny();
  const cells = parseRows(rows, header, file, market, problems);
  problems.throwIfAny();
  return assembleHistory(cells, layout, market);
}

/** Where each column is. */
interface HistoryLayout {
  readonly fallbackColumn: number | null;
  /** Exogenous columns: name and 0-based index. */
  readonly exogenous: readonly { readonly name: string; readonly column: number }[];
}

const HEADER_FIX = 'use the header period_start,price[,fallback_price][,other columns such as load_forecast_mw]';

function historyLayout(header: readonly string[], file: string, problems: ProblemList): HistoryLayout {
  const at = (k: number): string => header[k] ?? '';
  if (at(0) !== HISTORY_COLUMNS.periodStart) {
    problems.add({ file, line: 1, field: at(0), message: `the first column is "${at(0)}", expected "period_start"`, fix: HEADER_FIX });
  }
  if (at(1) !== HISTORY_COLUMNS.price) {
    problems.add({ file, line: 1, field: at(1), message: `the second column is "${at(1)}", expected "price"`, fix: HEADER_FIX });
  }
  let fallbackColumn: number | null = null;
  const exogenous: { name: string; column: number }[] = [];
  const seen = new Set<string>();
  header.forEach((name, k) => {
    if (name === '') {
      problems.add({ file, line: 1, field: `column ${k + 1}`, message: `column ${k + 1} has no name`, fix: 'give every column a header name, or remove the empty column' });
      return;
    }
    if (seen.has(name)) {
      problems.add({ file, line: 1, field: name, message: `column "${name}" appears twice`, fix: 'give each column once' });
      return;
    }
    seen.add(name);
    if (k < 2) return;
    if (name === HISTORY_COLUMNS.fallbackPrice) fallbackColumn = k;
    else exogenous.push({ name, column: k });
  });
  return { fallbackColumn, exogenous };
}

/** One parsed row: its day, period index within the day, line, and numbers in header order after period_start. */
interface ParsedRow {
  readonly day: string;
  readonly index: number;
  readonly line: number;
  readonly values: readonly number[];
}

function parseRows(
  rows: readonly CsvRow[],
  header: readonly string[],
  file: string,
  market: MarketSpec,
  problems: ProblemList,
): ParsedRow[] {
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const parsed: ParsedRow[] = [];
  const width = header.length;
  for (const row of rows) {
    if (problems.full) break;
    if (row.cells.length !== width) {
      problems.add({ file, line: row.line, message: `${row.cells.length} fields, the header has ${width}`, fix: 'give one value per column on every line' });
      continue;
    }
    let ok = true;
    const stamp = row.cells[0] as string;
    const located = locatePeriod(stamp, calendar);
    if (!located.ok) {
      problems.add({ file, line: row.line, field: HISTORY_COLUMNS.periodStart, message: located.message, fix: located.fix });
      ok = false;
    }
    const values: number[] = new Array<number>(width - 1);
    for (let k = 1; k < width; k++) {
      const field = header[k] as string;
      const cell = parseDecimal(row.cells[k] as string);
      if ('error' in cell) {
        problems.add({ file, line: row.line, field, message: cell.error, fix: cell.fix });
        ok = false;
        continue;
      }
      if (k === 1 && (cell.value < market.priceFloor || cell.value > market.priceCap)) {
        problems.add({
          file,
          line: row.line,
          field,
          message: `price ${cell.value} is outside the market's [${market.priceFloor}, ${market.priceCap}]`,
          fix: 'check the history\'s unit and the market spec\'s priceFloor and priceCap',
        });
        ok = false;
      }
      values[k - 1] = cell.value;
    }
    if (ok && located.ok) parsed.push({ day: located.day, index: located.index, line: row.line, values });
  }
  return parsed;
}

function assembleHistory(rows: readonly ParsedRow[], layout: HistoryLayout, market: MarketSpec): PriceHistory {
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const byDay = new Map<string, { values: (readonly number[] | undefined)[]; lines: number[]; doubled: string[] }>();
  for (const row of rows) {
    let entry = byDay.get(row.day);
    if (entry === undefined) {
      const count = calendar.periods(row.day).length;
      entry = { values: new Array<readonly number[] | undefined>(count).fill(undefined), lines: new Array<number>(count).fill(0), doubled: [] };
      byDay.set(row.day, entry);
    }
    if (entry.values[row.index] !== undefined) {
      entry.doubled.push(`${(calendar.periods(row.day)[row.index] as { start: string }).start} on lines ${entry.lines[row.index]} and ${row.line}`);
      continue;
    }
    entry.values[row.index] = row.values;
    entry.lines[row.index] = row.line;
  }
  const days: HistoryDay[] = [];
  const incompleteDays: { day: string; reason: string }[] = [];
  for (const day of [...byDay.keys()].sort()) {
    const entry = byDay.get(day) as { values: (readonly number[] | undefined)[]; doubled: string[] };
    const periods = calendar.periods(day);
    const reason = incompleteReason(entry.values, entry.doubled, periods.map((p) => p.start));
    if (reason !== null) {
      incompleteDays.push({ day, reason });
      continue;
    }
    const values = entry.values as readonly (readonly number[])[];
    const column = (k: number): number[] => values.map((v) => v[k - 1] as number);
    const exogenous: Record<string, number[]> = {};
    for (const { name, column: k } of layout.exogenous) exogenous[name] = column(k);
    days.push({
      day,
      periods,
      pricePerMwh: column(1),
      fallbackPricePerMwh: layout.fallbackColumn === null ? null : column(layout.fallbackColumn),
      exogenous,
    });
  }
  return { days, exogenousNames: layout.exogenous.map((e) => e.name), incompleteDays };
}

function incompleteReason(values: readonly (readonly number[] | undefined)[], doubled: readonly string[], starts: readonly string[]): string | null {
  const reasons: string[] = [];
  const missing = starts.filter((_, t) => values[t] === undefined);
  if (missing.length > 0) {
    reasons.push(`${missing.length} of ${starts.length} periods missing (${listSome(missing)})`);
  }
  if (doubled.length > 0) reasons.push(`${doubled.length} period${doubled.length > 1 ? 's' : ''} given twice (${listSome(doubled)})`);
  return reasons.length === 0 ? null : reasons.join('; ');
}

function listSome(items: readonly string[]): string {
  return `${items.slice(0, 3).join(', ')}${items.length > 3 ? ', ...' : ''}`;
}
