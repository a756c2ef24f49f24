import type { DeliveryPeriod, HistoryDay, MarketSpec, PriceHistory } from '../types.js';
import { DayCalendar } from '../market/dayCalendar.js';
import { InputError, ProblemList } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';
import { PRICE_LIMIT_PER_MWH } from '../market/marketLimits.js';
import { hasOpenQuote, openQuoteProblem, parseDecimal, splitCsv, splitCsvLine, type CsvRow, type CsvTable } from './csvText.js';
import { PeriodLocator } from './periodLocator.js';
import { PlainRow } from './plainRow.js';
import { readInputFile } from './readInputFile.js';

/** Column names with a fixed meaning in a price history (docs/design.md section 8). */
export const HISTORY_COLUMNS = Object.freeze({
  periodStart: 'period_start',
  price: 'price',
  imbalancePrice: 'imbalance_price',
});

/** The old name of the `imbalance_price` column, still read (docs/design.md section 2). */
export const OLD_IMBALANCE_PRICE_COLUMN = 'fallback_price';

/** Reads a price history file (.csv or .csv.gz); see parsePriceHistory. */
export function readPriceHistory(path: string, market: MarketSpec, note?: (text: string) => void): PriceHistory {
  return parsePriceHistory(readInputFile(path), path, market, note);
}

/**
 * Parses a price history: `period_start,price` plus an optional `imbalance_price` column and any number
 * of exogenous columns (e.g. `load_forecast_mw`), in any order after `price`. The column under its old
 * name `fallback_price` is read as `imbalance_price`, and `note` (when given) hears one line saying so
 * and asking to rename the column; both names in one file is a problem.
 *
 * Conventions:
 * - every cell must be a finite decimal with a dot (parseDecimal); `period_start` must name a period
 *   start of the market's calendar with the zone's offset on that date (locatePeriod);
 * - `price` must lie in the market's [priceFloor, priceCap]; `imbalance_price` is a balancing price, not
 *   bound by the auction's limits (common practice), and must lie within +-PRICE_LIMIT_PER_MWH; an
 *   exogenous column's values within +-EXOGENOUS_LIMIT;
 * - rows may come in any order; days come out ascending;
 * - a day with missing periods or a period given twice is left out and listed in `incompleteDays` with
 *   the reason (never filled in, never averaged);
 * - cell problems are all collected and thrown together as one InputError (file, line, column).
 */
export function parsePriceHistory(text: string, file: string, market: MarketSpec, note?: (text: string) => void): PriceHistory {
  const split = splitCsv(text, file);
  if ('problems' in split) throw new InputError(split.problems);
  const problems = new ProblemList();
  const { header } = split.table;
  const layout = historyLayout(header, file, problems);
  problems.throwIfAny();
  if (layout.oldImbalanceName && note !== undefined) {
    note(`note: ${file}:1: the column ${OLD_IMBALANCE_PRICE_COLUMN} is read as ${HISTORY_COLUMNS.imbalancePrice}; rename the column to ${HISTORY_COLUMNS.imbalancePrice}\n`);
  }
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  const byDay = readRows(split.table, header, layout, file, market, calendar, problems);
  problems.throwIfAny();
  return assembleHistory(byDay, layout, calendar);
}

/** Where each column is. */
interface HistoryLayout {
  readonly imbalanceColumn: number | null;
  /** Whether the imbalance price column has its old name. */
  readonly oldImbalanceName: boolean;
  /** Exogenous columns: name and 0-based index. */
  readonly exogenous: readonly { readonly name: string; readonly column: number }[];
}

const HEADER_FIX = 'use the header period_start,price[,imbalance_price][,other columns such as load_forecast_mw]';

function historyLayout(header: readonly string[], file: string, problems: ProblemList): HistoryLayout {
  const at = (k: number): string => header[k] ?? '';
  if (at(0) !== HISTORY_COLUMNS.periodStart) {
    problems.add({ file, line: 1, field: at(0), message: `the first column is "${shownText(at(0))}", expected "period_start"`, fix: HEADER_FIX });
  }
  if (at(1) !== HISTORY_COLUMNS.price) {
    problems.add({ file, line: 1, field: at(1), message: `the second column is "${shownText(at(1))}", expected "price"`, fix: HEADER_FIX });
  }
  let imbalanceColumn: number | null = null;
  let oldImbalanceName = false;
  const exogenous: { name: string; column: number }[] = [];
  const seen = new Set<string>();
  header.forEach((name, k) => {
    if (name === '') {
      problems.add({ file, line: 1, field: `column ${k + 1}`, message: `column ${k + 1} has no name`, fix: 'give every column a header name, or remove the empty column' });
      return;
    }
    if (seen.has(name)) {
      problems.add({ file, line: 1, field: name, message: `column "${shownText(name)}" appears twice`, fix: 'give each column once' });
      return;
    }
    seen.add(name);
    if (k < 2) return;
    if (name === HISTORY_COLUMNS.imbalancePrice || name === OLD_IMBALANCE_PRICE_COLUMN) {
      if (imbalanceColumn !== null) {
        problems.add({ file, line: 1, field: name, message: `both ${HISTORY_COLUMNS.imbalancePrice} and its old name ${OLD_IMBALANCE_PRICE_COLUMN} are given`, fix: `keep one of them, named ${HISTORY_COLUMNS.imbalancePrice}` });
        return;
      }
      imbalanceColumn = k;
      oldImbalanceName = name === OLD_IMBALANCE_PRICE_COLUMN;
    } else {
      exogenous.push({ name, column: k });
    }
  });
  return { imbalanceColumn, oldImbalanceName, exogenous };
}

/** The cells of one delivery day as they are read: one column per numeric field, NaN where not given. */
interface DayBuffer {
  /** columns[k][t]: value of header column k + 1 in period t. */
  readonly columns: Float64Array[];
  /** Line each period was first read from, 0 where none. */
  readonly lines: Int32Array;
  /** Periods given twice, as "start on lines a and b". */
  readonly doubled: string[];
}

/**
 * Reads every row into its day's buffer; a row with any problem is listed and not used. Rows go
 * straight into per-day columns (no object per row), which keeps a long history quick to read; the
 * usual row is read in place (PlainRow, PeriodLocator), any other by splitCsvLine and parseDecimal,
 * which word its problems.
 */
function readRows(
  table: CsvTable,
  header: readonly string[],
  layout: HistoryLayout,
  file: string,
  market: MarketSpec,
  calendar: DayCalendar,
  problems: ProblemList,
): Map<string, DayBuffer> {
  const limits = columnLimits(header, layout);
  const locator = new PeriodLocator(calendar);
  const byDay = new Map<string, DayBuffer>();
  const values = new Float64Array(header.length - 1);
  const plain = new PlainRow(header.length);
  const lines = table.lines();
  while (lines.next()) {
    if (problems.full) break;
    if (plain.read(lines.text, lines.from, lines.to) && withinLimits(plain.values, limits, market)) {
      const located = locator.locateAt(lines.text, plain.stampFrom, plain.stampTo);
      if (located.ok) store(byDay, calendar, located, lines.line, plain.values);
      else problems.add({ file, line: lines.line, field: HISTORY_COLUMNS.periodStart, message: located.message, fix: located.fix });
    } else {
      const lineText = lines.lineText();
      if (hasOpenQuote(lineText)) problems.add(openQuoteProblem(lines.line, file));
      else readRow({ line: lines.line, cells: splitCsvLine(lineText) }, { header, limits, file, market, locator, calendar }, problems, values, byDay);
    }
  }
  return byDay;
}

/**
 * Largest size of a value of an exogenous column (a load or renewables forecast in MW, or kW) [-]:
 * beyond a thousand times the largest grid's load, and far from overflow in a regression's sums.
 */
export const EXOGENOUS_LIMIT = 1e9;

/**
 * The largest size each column's values may have, by column index (the header's): the imbalance
 * price as large as a market's prices may be (PRICE_LIMIT_PER_MWH; balancing prices are not bound by
 * the auction's floor and cap), an exogenous column EXOGENOUS_LIMIT. Columns 0 and 1 (period start,
 * price) have their own checks.
 */
function columnLimits(header: readonly string[], layout: HistoryLayout): Float64Array {
  const limits = new Float64Array(header.length).fill(EXOGENOUS_LIMIT);
  if (layout.imbalanceColumn !== null) limits[layout.imbalanceColumn] = PRICE_LIMIT_PER_MWH;
  return limits;
}

/** Whether the values of a row (columns 1 on) lie in their ranges: the price in [priceFloor, priceCap], the others within their limits. */
function withinLimits(values: Float64Array, limits: Float64Array, market: MarketSpec): boolean {
  const price = values[0] as number;
  if (!(price >= market.priceFloor && price <= market.priceCap)) return false;
  for (let k = 1; k < values.length; k++) {
    const v = values[k] as number;
    const limit = limits[k + 1] as number;
    if (!(v >= -limit && v <= limit)) return false;
  }
  return true;
}

/** One row read cell by cell: its problems listed (the period start first, then the cells in order), or its values stored. */
/** What readRow reads a row against: the header, each column's limit, the file's name, the market, the period locator and the calendar. */
interface RowContext {
  readonly header: readonly string[];
  readonly limits: Float64Array;
  readonly file: string;
  readonly market: MarketSpec;
  readonly locator: PeriodLocator;
  readonly calendar: DayCalendar;
}

/** One row read cell by cell: its problems listed (the period start first, then the cells in order), or its values stored. */
function readRow(row: CsvRow, context: RowContext, problems: ProblemList, values: Float64Array, byDay: Map<string, DayBuffer>): void {
  const { header, limits, file, market, locator, calendar } = context;
  const width = header.length;
  if (row.cells.length !== width) {
    // Name the first column without a value, or the first cell beyond the header.
    const field = row.cells.length < width ? (header[row.cells.length] as string) : `column ${width + 1}`;
    const fix = row.cells.length > width ? 'give one value per column on every line; a decimal comma (42,5) splits a number in two: write 42.5' : 'give one value per column on every line';
    problems.add({ file, line: row.line, field, message: `${row.cells.length} fields, the header has ${width}`, fix });
    return;
  }
  const located = locator.locate(row.cells[0] as string);
  let ok = located.ok;
  if (!located.ok) problems.add({ file, line: row.line, field: HISTORY_COLUMNS.periodStart, message: located.message, fix: located.fix });
  for (let k = 1; k < width; k++) {
    const text = row.cells[k] as string;
    const cell = parseDecimal(text);
    const field = header[k] as string;
    const limit = limits[k] as number;
    if ('error' in cell) {
      problems.add({ file, line: row.line, field, message: cell.error, fix: cell.fix });
      ok = false;
    } else if (k === 1 && (cell.value < market.priceFloor || cell.value > market.priceCap)) {
      problems.add({ file, line: row.line, field, message: `price ${shownText(text)} is outside the market's [${market.priceFloor}, ${market.priceCap}]`, fix: "check the history's unit and the market spec's priceFloor and priceCap" });
      ok = false;
    } else if (k > 1 && !(Math.abs(cell.value) <= limit)) {
      const what = limit === PRICE_LIMIT_PER_MWH ? 'an imbalance price' : 'a value of this column';
      problems.add({ file, line: row.line, field, message: `${shownText(text)} is out of range: ${what} lies in [-${limit}, ${limit}]`, fix: "check the column's unit and decimal point" });
      ok = false;
    } else {
      values[k - 1] = cell.value;
    }
  }
  if (ok && located.ok) store(byDay, calendar, located, row.line, values);
}

function store(byDay: Map<string, DayBuffer>, calendar: DayCalendar, at: { day: string; index: number }, line: number, values: Float64Array): void {
  let buffer = byDay.get(at.day);
  if (buffer === undefined) {
    const count = calendar.periods(at.day).length;
    buffer = { columns: Array.from(values, () => new Float64Array(count).fill(Number.NaN)), lines: new Int32Array(count), doubled: [] };
    byDay.set(at.day, buffer);
  }
  const first = buffer.lines[at.index] as number;
  if (first !== 0) {
    buffer.doubled.push(`${(calendar.periods(at.day)[at.index] as DeliveryPeriod).start} on lines ${first} and ${line}`);
    return;
  }
  buffer.lines[at.index] = line;
  for (let k = 0; k < values.length; k++) (buffer.columns[k] as Float64Array)[at.index] = values[k] as number;
}

function assembleHistory(byDay: ReadonlyMap<string, DayBuffer>, layout: HistoryLayout, calendar: DayCalendar): PriceHistory {
  const days: HistoryDay[] = [];
  const incompleteDays: { day: string; reason: string }[] = [];
  for (const day of [...byDay.keys()].sort()) {
    const buffer = byDay.get(day) as DayBuffer;
    const periods = calendar.periods(day);
    const reason = incompleteReason(buffer, periods);
    if (reason !== null) {
      incompleteDays.push({ day, reason });
      continue;
    }
    const column = (k: number): number[] => plainArray(buffer.columns[k - 1] as Float64Array);
    const exogenous: Record<string, number[]> = {};
    for (const { name, column: k } of layout.exogenous) exogenous[name] = column(k);
    days.push({
      day,
      periods,
      pricePerMwh: column(1),
      imbalancePricePerMwh: layout.imbalanceColumn === null ? null : column(layout.imbalanceColumn),
      exogenous,
    });
  }
  return { days, exogenousNames: layout.exogenous.map((e) => e.name), incompleteDays };
}

/** The numbers of a typed array as a plain array of its exact length (Array.from is several times slower). */
function plainArray(values: Float64Array): number[] {
  const array = new Array<number>(values.length);
  for (let k = 0; k < values.length; k++) array[k] = values[k] as number;
  return array;
}

function incompleteReason(buffer: DayBuffer, periods: readonly DeliveryPeriod[]): string | null {
  const reasons: string[] = [];
  const missing = periods.filter((_, t) => buffer.lines[t] === 0).map((p) => p.start);
  if (missing.length > 0) reasons.push(`${missing.length} of ${periods.length} periods missing (${listSome(missing)})`);
  const doubled = buffer.doubled;
  if (doubled.length > 0) reasons.push(`${doubled.length} period${doubled.length > 1 ? 's' : ''} given twice (${listSome(doubled)})`);
  return reasons.length === 0 ? null : reasons.join('; ');
}

function listSome(items: readonly string[]): string {
  return `${items.slice(0, 3).join(', ')}${items.length > 3 ? ', ...' : ''}`;
}
