import type { MarketSpec, QuantileDay } from '../types.js';
import { DayCalendar, locatePeriod } from '../market/dayCalendar.js';
import { rearrange } from '../forecast/quantileSet.js';
import { ProblemList } from '../errors/inputError.js';
import { fieldCountProblem, parseDecimal, separatorProblem, splitCsv, splitCsvLine, type CsvRow } from './csvText.js';
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
}

/**
 * Reads a quantile forecast file (.csv or .csv.gz); see parseQuantileForecast. The header is checked
 * from the first bytes, before the file is read whole.
 */
export function readQuantileForecast(path: string, market: MarketSpec): QuantileForecastFile {
  const firstLine = (line: string, lineNumber: number) => {
    const separator = separatorProblem(line, path, lineNumber);
    return separator === null ? readQuantileHeader(splitCsvLine(line), path, lineNumber).problems : [separator];
  };
  return parseQuantileForecast(readInputFile(path, { firstLine }), path, market);
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
  const grid = checked.layout === 'long' ? longGrid(rows, file, market, problems) : wideGrid(header, checked.levels, rows, file, market, problems);
  problems.throwIfAny();
  return assembleDays(grid, file, market, problems);
}

/**
 * The rows as read, in file order: timestamp text, line, and the prices at `levels` packed into one
 * typed array (row r at r x levels.length), so that ten years of quarter-hours take 8 bytes per price
 * rather than an array object per row.
 */
class ForecastGrid {
  readonly stamps: string[] = [];
  readonly lines: number[] = [];
  /** 0 where a cell of the row is wrong (its prices are not kept). */
  private valid = new Uint8Array(1024);
  private prices: Float64Array;

  constructor(readonly levels: number[]) {
    this.prices = new Float64Array(1024 * Math.max(1, levels.length));
  }

  get size(): number {
    return this.stamps.length;
  }

  /** Adds a row; `prices` null when a cell of it is wrong. */
  add(stamp: string, line: number, prices: ArrayLike<number> | null): void {
    const r = this.stamps.length;
    const width = this.levels.length;
    if (r === this.valid.length) {
      this.valid = grown(this.valid, new Uint8Array(2 * r));
      this.prices = grown(this.prices, new Float64Array(2 * r * width));
    }
    this.stamps.push(stamp);
    this.lines.push(line);
    this.valid[r] = prices === null ? 0 : 1;
    if (prices !== null) for (let k = 0; k < width; k++) this.prices[r * width + k] = prices[k] as number;
  }

  /** Row r's prices as a new array, or null when a cell of it was wrong. */
  pricesOf(r: number): number[] | null {
    const width = this.levels.length;
    return this.valid[r] === 1 ? Array.from(this.prices.subarray(r * width, (r + 1) * width)) : null;
  }
}

function grown<T extends Uint8Array | Float64Array>(from: T, to: T): T {
  to.set(from);
  return to;
}

function wideGrid(header: readonly string[], levels: readonly number[], rows: Iterable<CsvRow>, file: string, market: MarketSpec, problems: ProblemList): ForecastGrid {
  const grid = new ForecastGrid([...levels]);
  const prices = new Float64Array(levels.length);
  for (const row of rows) {
    if (problems.full) break;
    if (row.cells.length !== header.length) {
      problems.add(fieldCountProblem(row, header, file, 'give one value per column on every line'));
      continue;
    }
    let valid = true;
    for (let k = 0; k < levels.length; k++) {
      const parsed = priceCell(row.cells[k + 1] as string, market);
      if ('value' in parsed) prices[k] = parsed.value;
      else {
        problems.add({ file, line: row.line, field: header[k + 1] as string, message: parsed.error, fix: parsed.fix });
        valid = false;
      }
    }
    grid.add(row.cells[0] as string, row.line, valid ? prices : null);
  }
  return grid;
}

/** A price cell: a finite decimal inside the market's [priceFloor, priceCap]. */
function priceCell(cell: string, market: MarketSpec): ReturnType<typeof parseDecimal> {
  const parsed = parseDecimal(cell);
  if ('error' in parsed || (parsed.value >= market.priceFloor && parsed.value <= market.priceCap)) return parsed;
  return { error: `price ${parsed.value} is outside the market's [${market.priceFloor}, ${market.priceCap}]`, fix: "check the forecast's unit and the market spec's priceFloor and priceCap" };
}

/** A level cell of the long layout: a finite decimal in (0, 1); a percentage is named as such. */
function levelCell(cell: string): ReturnType<typeof parseDecimal> {
  const parsed = parseDecimal(cell);
  if ('error' in parsed) return parsed;
  const level = parsed.value;
  if (level >= 1 && level < 100) return { error: `level ${level} looks like a percentage`, fix: `write levels as fractions in (0, 1), e.g. ${level / 100}` };
  if (!(level > 0 && level < 1)) return { error: `level ${level} is outside (0, 1)`, fix: 'levels are probabilities strictly between 0 and 1' };
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

function longGrid(rows: Iterable<CsvRow>, file: string, market: MarketSpec, problems: ProblemList): ForecastGrid {
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
    if (row.cells.length !== 3) {
      problems.add(fieldCountProblem(row, LONG_HEADER, file, 'give period_start,level,price on every line'));
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
  const grid = new ForecastGrid(levels);
  for (const group of byStamp.values()) {
    const missing = levels.filter((level) => !group.prices.has(level));
    if (group.valid && missing.length > 0) {
      problems.add({ file, line: group.line, field: 'level', message: `period ${shownText(group.stamp)} lacks levels ${missing.join(', ')}`, fix: 'give every period the same set of levels' });
    }
    const complete = group.valid && missing.length === 0;
    grid.add(group.stamp, group.line, complete ? levels.map((level) => group.prices.get(level) as number) : null);
  }
  return grid;
}

function assembleDays(grid: ForecastGrid, file: string, market: MarketSpec, problems: ProblemList): QuantileForecastFile {
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  // Per day and period: the prices (undefined until read) and the line they were first read from (0: none).
  const byDay = new Map<string, { prices: (number[] | undefined)[]; lines: number[] }>();
  let repairedPeriods = 0;
  const repairedExamples: string[] = [];
  for (let r = 0; r < grid.size; r++) {
    const entry = { stamp: grid.stamps[r] as string, line: grid.lines[r] as number, prices: grid.pricesOf(r) };
    const located = locatePeriod(entry.stamp, calendar);
    if (!located.ok) {
      problems.add({ file, line: entry.line, field: 'period_start', message: located.message, fix: located.fix });
      continue;
    }
    let day = byDay.get(located.day);
    if (day === undefined) {
      const count = calendar.periods(located.day).length;
      day = { prices: new Array<number[] | undefined>(count).fill(undefined), lines: new Array<number>(count).fill(0) };
      byDay.set(located.day, day);
    }
    if (day.lines[located.index] !== 0) {
      problems.add({ file, line: entry.line, field: 'period_start', message: `period ${entry.stamp} appears twice (first on line ${day.lines[located.index]})`, fix: 'give each delivery period once' });
      continue;
    }
    day.lines[located.index] = entry.line;
    if (entry.prices === null) continue; // its problems are listed already
    const { prices, repaired } = rearrange(entry.prices);
    if (repaired) {
      repairedPeriods++;
      if (repairedExamples.length < 5) repairedExamples.push(entry.stamp);
    }
    day.prices[located.index] = prices;
  }
  problems.throwIfAny();
  const days = new Map<string, QuantileDay>();
  const incompleteDays: { day: string; reason: string }[] = [];
  for (const day of [...byDay.keys()].sort()) {
    const entry = byDay.get(day) as { prices: (number[] | undefined)[] };
    const periods = calendar.periods(day);
    const missing = periods.filter((_, t) => entry.prices[t] === undefined);
    if (missing.length > 0) {
      const shown = missing.slice(0, 3).map((p) => p.start).join(', ');
      incompleteDays.push({ day, reason: `${missing.length} of ${periods.length} periods missing (${shown}${missing.length > 3 ? ', ...' : ''})` });
      continue;
    }
    days.set(day, { day, levels: grid.levels, periods, prices: entry.prices as number[][] });
  }
  return { file, levels: grid.levels, days, incompleteDays, repairedPeriods, repairedExamples };
}
