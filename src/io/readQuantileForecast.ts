import type { MarketSpec, QuantileDay } from '../types.js';
import { DayCalendar, locatePeriod, type LocatedPeriod } from '../market/dayCalendar.js';
import { rearrange } from '../forecast/quantileSet.js';
import { isLevel, LEVEL_RANGE_TEXT } from '../forecast/quantiles/levels.js';
import { ProblemList, type InputProblem } from '../errors/inputError.js';
import { fieldCountProblem, hasOpenQuote, openQuoteProblem, parseDecimal, separatorProblem, splitCsv, splitCsvLine, type CsvRow, type CsvTable } from './csvText.js';
import { PeriodLocator } from './periodLocator.js';
import { PlainRow } from './plainRow.js';
import { readQuantileHeader } from './quantileHeader.js';
import { readInputFile } from './readInputFile.js';
import { shownText } from '../errors/shownText.js';

/** A quantile forecast file, validated: complete days by day, and what was repaired or left out. */
export interface QuantileForecastFile {
  readonly file: string;
  /** Levels tau in (0, 1), strictly increasing. */
  readonly levels: readonly number[];
  /** Days with every delivery period present, by YYYY-MM-DD. */
  readonly days: ReadonlyMap<string, QuantileDay>;
  /** Days with periods missing, with the reason (never filled in). */
  readonly incompleteDays: readonly { readonly day: string; readonly reason: string }[];
  /** Number of periods whose quantiles crossed and were sorted. */
  readonly repairedPeriods: number;
  /** The first few repaired period starts, for the report. */
  readonly repairedExamples: readonly string[];
  /** Per day with repairs: how many of its periods were sorted, and the first of them. */
  readonly repairedByDay: ReadonlyMap<string, { readonly periods: number; readonly example: string }>;
}

/**
 * Reads a quantile forecast file (.csv or .csv.gz); see parseQuantileForecast. The header is checked
 * from the first bytes, before the file is read whole.
 */
export function readQuantileForecast(path: string, market: MarketSpec): QuantileForecastFile {
  return parseQuantileForecast(readInputFile(path, { firstLine: quantileHeaderCheck(path) }), path, market);
}

/** The check of a forecast's header line from the file's first bytes (readInputFile's `firstLine`). */
export function quantileHeaderCheck(path: string): (line: string, lineNumber: number) => readonly InputProblem[] {
  return (line, lineNumber) => {
    const separator = separatorProblem(line, path, lineNumber);
    return separator === null ? readQuantileHeader(splitCsvLine(line), path, lineNumber).problems : [separator];
  };
}

/**
 * Reads a quantile forecast from CSV text, wide (`period_start,q0.05,...,q0.95`) or long
 * (`period_start,level,price`). All problems are collected and thrown together as an InputError: first
 * those of the header; once the header is right, those of every row.
 *
 * Rules: every cell a finite decimal with a dot; every price inside the market's [priceFloor, priceCap];
 * every `period_start` a period start of the market's calendar written with the zone's offset on that
 * date; each period at most once (rows may come in any order); a day with periods missing is listed as
 * incomplete and never filled in. Crossing quantiles are repaired by sorting and counted.
 */
export function parseQuantileForecast(text: string, file: string, market: MarketSpec): QuantileForecastFile {
  const split = splitCsv(text, file);
  const problems = new ProblemList();
  if ('problems' in split) {
    split.problems.forEach((p) => problems.add(p));
    problems.throwIfAny();
    throw new Error('unreachable');
  }
  const { header, headerLine, rows } = split.table;
  const checked = readQuantileHeader(header, file, headerLine);
  checked.problems.forEach((p) => problems.add(p));
  problems.throwIfAny();
  if (!split.table.hasRows) {
    problems.add({ file, line: headerLine, message: 'the file has a header but no data rows', fix: 'give one row per delivery period (wide) or per period and level (long)' });
    problems.throwIfAny();
  }
  if (checked.layout === 'wide') return readWide(split.table, checked.levels, file, market, problems);
  const { levels, periods } = longPeriods(rows, file, market, problems);
  problems.throwIfAny();
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  const days = new ForecastDays(calendar, levels);
  for (const { stamp, line, prices } of periods) days.add(locatePeriod(stamp, calendar), stamp, 0, stamp.length, line, prices, file, problems);
  problems.throwIfAny();
  return { file, ...days.assemble() };
}

/**
 * The wide layout in one pass over the text: each row's prices go straight into its day, the usual
 * row read in place (PlainRow, PeriodLocator), any other cell by cell. The problems come out as
 * if in two passes: those of the cells first, and only when there are none, those of the period
 * starts (not a period of the calendar, given twice), each list in file order.
 */
function readWide(table: CsvTable, levels: readonly number[], file: string, market: MarketSpec, problems: ProblemList): QuantileForecastFile {
  const { header } = table;
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  const locator = new PeriodLocator(calendar);
  const days = new ForecastDays(calendar, [...levels]);
  const stampProblems = new ProblemList(problems.limit);
  const plain = new PlainRow(header.length);
  const prices = new Float64Array(levels.length);
  const lines = table.lines();
  while (lines.next()) {
    if (problems.full) break;
    if (plain.read(lines.text, lines.from, lines.to) && withinLimits(plain.values, market)) {
      // No cell problem once one is found: the period starts are then not looked at.
      if (problems.items.length > 0) continue;
      const located = locator.locateAt(lines.text, plain.stampFrom, plain.stampTo);
      days.add(located, lines.text, plain.stampFrom, plain.stampTo, lines.line, plain.values, file, stampProblems);
      continue;
    }
    const lineText = lines.lineText();
    if (hasOpenQuote(lineText)) {
      problems.add(openQuoteProblem(lines.line, file));
      continue;
    }
    const cells = splitCsvLine(lineText);
    if (cells.length !== header.length) {
      problems.add(fieldCountProblem({ line: lines.line, cells }, header, file, 'give one value per column on every line'));
      continue;
    }
    let valid = true;
    for (let k = 0; k < levels.length; k++) {
      const parsed = priceCell(cells[k + 1] as string, market);
      if ('value' in parsed) prices[k] = parsed.value;
      else {
        problems.add({ file, line: lines.line, field: header[k + 1] as string, message: parsed.error, fix: parsed.fix });
        valid = false;
      }
    }
    if (valid && problems.items.length === 0) {
      const stamp = cells[0] as string;
      days.add(locator.locate(stamp), stamp, 0, stamp.length, lines.line, prices, file, stampProblems);
    }
  }
  problems.throwIfAny();
  stampProblems.throwIfAny();
  return { file, ...days.assemble() };
}

/** Whether every price of a row lies inside the market's [priceFloor, priceCap]. */
function withinLimits(prices: Float64Array, market: MarketSpec): boolean {
  for (let k = 0; k < prices.length; k++) {
    const price = prices[k] as number;
    if (!(price >= market.priceFloor && price <= market.priceCap)) return false;
  }
  return true;
}

/**
 * A forecast's rows by day and period as they are located: prices sorted where they cross (and
 * counted), a period given twice or not of the calendar listed as a problem.
 */
class ForecastDays {
  private readonly byDay = new Map<string, { prices: (number[] | undefined)[]; lines: Int32Array }>();
  private repairedPeriods = 0;
  private readonly repairedExamples: string[] = [];
  private readonly repairedByDay = new Map<string, { periods: number; example: string }>();

  constructor(
    private readonly calendar: DayCalendar,
    private readonly levels: number[],
  ) {}

  /**
   * One row: `located` from its period_start, which stands at text[from, to) (cut out only when a
   * problem or a repair names it); `prices` null when a cell of the row was wrong (listed already).
   */
  add(located: LocatedPeriod, text: string, from: number, to: number, line: number, prices: ArrayLike<number> | null, file: string, problems: ProblemList): void {
    if (!located.ok) {
      problems.add({ file, line, field: 'period_start', message: located.message, fix: located.fix });
      return;
    }
    let day = this.byDay.get(located.day);
    if (day === undefined) {
      const count = this.calendar.periods(located.day).length;
      day = { prices: new Array<number[] | undefined>(count).fill(undefined), lines: new Int32Array(count) };
      this.byDay.set(located.day, day);
    }
    const first = day.lines[located.index] as number;
    if (first !== 0) {
      problems.add({ file, line, field: 'period_start', message: `period ${text.slice(from, to)} appears twice (first on line ${first})`, fix: 'give each delivery period once' });
      return;
    }
    day.lines[located.index] = line;
    if (prices === null) return;
    // Sized once: ten years of quarter-hours are 350,000 rows.
    const row = new Array<number>(prices.length);
    let crossing = false;
    for (let k = 0; k < prices.length; k++) {
      row[k] = prices[k] as number;
      if (k > 0 && (row[k] as number) < (row[k - 1] as number)) crossing = true;
    }
    if (crossing) {
      this.repairedPeriods++;
      if (this.repairedExamples.length < 5) this.repairedExamples.push(ownCopy(text.slice(from, to)));
      let repairs = this.repairedByDay.get(located.day);
      if (repairs === undefined) {
        repairs = { periods: 0, example: ownCopy(text.slice(from, to)) };
        this.repairedByDay.set(located.day, repairs);
      }
      // Counted on one path for a day's first repair and the next (a second path first taken later
      // would throw the compiled reader away once more).
      repairs.periods++;
    }
    day.prices[located.index] = crossing ? rearrange(row).prices : row;
  }

  /** Complete days by day, and the days with periods missing, in day order. */
  assemble(): Omit<QuantileForecastFile, 'file'> {
    const days = new Map<string, QuantileDay>();
    const incompleteDays: { day: string; reason: string }[] = [];
    for (const day of [...this.byDay.keys()].sort()) {
      const entry = this.byDay.get(day) as { prices: (number[] | undefined)[] };
      const periods = this.calendar.periods(day);
      const missing = periods.filter((_, t) => entry.prices[t] === undefined);
      if (missing.length > 0) {
        const shown = missing.slice(0, 3).map((p) => p.start).join(', ');
        incompleteDays.push({ day, reason: `${missing.length} of ${periods.length} periods missing (${shown}${missing.length > 3 ? ', ...' : ''})` });
        continue;
      }
      days.set(day, { day, levels: this.levels, periods, prices: entry.prices as number[][] });
    }
    return { levels: this.levels, days, incompleteDays, repairedPeriods: this.repairedPeriods, repairedExamples: this.repairedExamples, repairedByDay: this.repairedByDay };
  }
}

/**
 * A string that shares no memory with the text it was cut from: a cut keeps the whole file's text
 * alive for as long as the cut lives (the engine's sliced strings), and the examples live as long as
 * the forecast. UTF-16 code units round-trip unchanged.
 */
function ownCopy(text: string): string {
  return Buffer.from(text, 'utf16le').toString('utf16le');
}

/** A price cell: a finite decimal inside the market's [priceFloor, priceCap]. */
function priceCell(cell: string, market: MarketSpec): ReturnType<typeof parseDecimal> {
  const parsed = parseDecimal(cell);
  if ('error' in parsed || (parsed.value >= market.priceFloor && parsed.value <= market.priceCap)) return parsed;
  return { error: `price ${shownText(cell)} is outside the market's [${market.priceFloor}, ${market.priceCap}]`, fix: "check the forecast's unit and the market spec's priceFloor and priceCap" };
}

/** A level cell of the long layout: a finite decimal in (0, 1); a percentage is named as such. */
function levelCell(cell: string): ReturnType<typeof parseDecimal> {
  const parsed = parseDecimal(cell);
  if ('error' in parsed) return parsed;
  const level = parsed.value;
  if (level >= 1 && level < 100) return { error: `level ${level} looks like a percentage`, fix: `write levels as fractions in (0, 1), e.g. ${level / 100}` };
  if (!isLevel(level)) return { error: `level ${shownText(cell)} is outside ${LEVEL_RANGE_TEXT}`, fix: `levels are probabilities in ${LEVEL_RANGE_TEXT}` };
  return parsed;
}

/** One period of the long layout as read: a price per level, and whether every row of it was valid. */
interface LongGroup {
  readonly stamp: string;
  readonly line: number;
  readonly prices: Map<number, number>;
  valid: boolean;
}

const LONG_HEADER = ['period_start', 'level', 'price'] as const;

/** A period of the long layout: its prices at every level, or null when a row of it was wrong. */
interface LongPeriod {
  readonly stamp: string;
  readonly line: number;
  readonly prices: readonly number[] | null;
}

/** The long layout's periods in order of first appearance, and the levels they give. */
function longPeriods(rows: Iterable<CsvRow>, file: string, market: MarketSpec, problems: ProblemList): { levels: number[]; periods: LongPeriod[] } {
  const levelSet = new Set<number>();
  const byStamp = new Map<string, LongGroup>();
  for (const row of rows) {
    if (problems.full) break;
    const stamp = row.cells[0] as string;
    let group = byStamp.get(stamp);
    if (group === undefined) {
      group = { stamp, line: row.line, prices: new Map(), valid: true };
      byStamp.set(stamp, group);
    }
    if (row.openQuote === true || row.cells.length !== 3) {
      problems.add(row.openQuote === true ? openQuoteProblem(row.line, file) : fieldCountProblem(row, LONG_HEADER, file, 'give period_start,level,price on every line'));
      group.valid = false;
      continue;
    }
    const level = levelCell(row.cells[1] as string);
    const price = priceCell(row.cells[2] as string, market);
    if ('error' in level) problems.add({ file, line: row.line, field: 'level', message: level.error, fix: level.fix });
    if ('error' in price) problems.add({ file, line: row.line, field: 'price', message: price.error, fix: price.fix });
    if ('value' in level && group.prices.has(level.value)) {
      problems.add({ file, line: row.line, field: 'level', message: `level ${level.value} appears twice for ${shownText(stamp)}`, fix: 'give each period and level once' });
    } else if ('value' in level && 'value' in price) {
      levelSet.add(level.value);
      group.prices.set(level.value, price.value);
      continue;
    }
    group.valid = false;
  }
  const levels = [...levelSet].sort((a, b) => a - b);
  const periods: LongPeriod[] = [];
  for (const group of byStamp.values()) {
    const missing = levels.filter((level) => !group.prices.has(level));
    if (group.valid && missing.length > 0) {
      problems.add({ file, line: group.line, field: 'level', message: `period ${shownText(group.stamp)} lacks levels ${missing.join(', ')}`, fix: 'give every period the same set of levels' });
    }
    const complete = group.valid && missing.length === 0;
    periods.push({ stamp: group.stamp, line: group.line, prices: complete ? levels.map((level) => group.prices.get(level) as number) : null });
  }
  return { levels, periods };
}
