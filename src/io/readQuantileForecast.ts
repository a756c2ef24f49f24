import type { MarketSpec, QuantileDay } from '../types.js';
import { DayCalendar, locatePeriod } from '../market/dayCalendar.js';
import { rearrange } from '../forecast/quantileSet.js';
import { ProblemList } from './inputError.js';
import { parseDecimal, splitCsv, type CsvRow } from './csvText.js';

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

const LEVEL_HEADER = /^q(\d*\.?\d+)$/;

/**
 * Reads a quantile forecast from CSV text, wide (`period_start,q0.05,...,q0.95`) or long
 * (`period_start,level,price`). All problems are collected and thrown together as an InputError.
 * Crossing quantiles are repaired by sorting and counted.
 */
export function parseQuantileForecast(text: string, file: string, market: MarketSpec): QuantileForecastFile {
  const split = splitCsv(text, file);
  const problems = new ProblemList();
  if ('problems' in split) {
    split.problems.forEach((p) => problems.add(p));
    problems.throwIfAny();
    throw new Error('unreachable');
  }
  const { header, rows } = split.table;
  if (header[0] !== 'period_start') {
    problems.add({ file, line: 1, field: header[0] ?? '', message: `the first column is "${header[0] ?? ''}", expected "period_start"`, fix: 'use the header period_start,q0.05,...,q0.95 (wide) or period_start,level,price (long)' });
    problems.throwIfAny();
  }
  const isLong = header.length === 3 && header[1] === 'level' && header[2] === 'price';
  const grid = isLong ? longGrid(rows, file, problems) : wideGrid(header, rows, file, problems);
  problems.throwIfAny();
  return assembleDays(grid, file, market, problems);
}

/** Rows of (timestamp text, line, prices at `levels`). */
interface ForecastGrid {
  readonly levels: number[];
  readonly entries: { stamp: string; line: number; prices: number[] }[];
}

function wideGrid(header: readonly string[], rows: readonly CsvRow[], file: string, problems: ProblemList): ForecastGrid {
  const levels: number[] = [];
  header.slice(1).forEach((name, k) => {
    const column = k + 2;
    const match = LEVEL_HEADER.exec(name);
    if (match === null) {
      problems.add({ file, line: 1, field: name, message: `column ${column} is "${name}", not a level header`, fix: 'name quantile columns q<level> with the level in (0, 1), e.g. q0.05' });
      return;
    }
    const level = Number(match[1]);
    if (level >= 1 && level < 100) {
      problems.add({ file, line: 1, field: name, message: `level ${level} looks like a percentage`, fix: `write levels as fractions in (0, 1): q${level / 100} for ${level}%` });
    } else if (!(level > 0 && level < 1)) {
      problems.add({ file, line: 1, field: name, message: `level ${level} is outside (0, 1)`, fix: 'levels are probabilities strictly between 0 and 1' });
    } else if (levels.length > 0 && level <= (levels[levels.length - 1] as number)) {
      problems.add({ file, line: 1, field: name, message: `level ${level} does not increase from the column before (${levels[levels.length - 1]})`, fix: 'order the quantile columns by increasing level, each level once' });
    }
    levels.push(level);
  });
  if (header.length < 2) {
    problems.add({ file, line: 1, message: 'no quantile columns', fix: 'add columns q<level>, e.g. q0.05,...,q0.95' });
  }
  const entries: ForecastGrid['entries'] = [];
  if (problems.items.length > 0) return { levels, entries };
  for (const row of rows) {
    if (row.cells.length !== header.length) {
      problems.add({ file, line: row.line, message: `${row.cells.length} fields, the header has ${header.length}`, fix: 'give one value per column on every line' });
      continue;
    }
    const prices: number[] = new Array<number>(levels.length);
    for (let k = 0; k < levels.length; k++) {
      const parsed = parseDecimal(row.cells[k + 1] as string);
      if ('error' in parsed) problems.add({ file, line: row.line, field: header[k + 1] as string, message: parsed.error, fix: parsed.fix });
      else prices[k] = parsed.value;
    }
    entries.push({ stamp: row.cells[0] as string, line: row.line, prices });
  }
  return { levels, entries };
}

function longGrid(rows: readonly CsvRow[], file: string, problems: ProblemList): ForecastGrid {
  const levelSet = new Set<number>();
  const parsed: { stamp: string; line: number; level: number; price: number }[] = [];
  for (const row of rows) {
    if (row.cells.length !== 3) {
      problems.add({ file, line: row.line, message: `${row.cells.length} fields, the header has 3`, fix: 'give period_start,level,price on every line' });
      continue;
    }
    const level = parseDecimal(row.cells[1] as string);
    const price = parseDecimal(row.cells[2] as string);
    if ('error' in level) problems.add({ file, line: row.line, field: 'level', message: level.error, fix: level.fix });
    else if (level.value >= 1 && level.value < 100) problems.add({ file, line: row.line, field: 'level', message: `level ${level.value} looks like a percentage`, fix: `write levels as fractions in (0, 1), e.g. ${level.value / 100}` });
    else if (!(level.value > 0 && level.value < 1)) problems.add({ file, line: row.line, field: 'level', message: `level ${level.value} is outside (0, 1)`, fix: 'levels are probabilities strictly between 0 and 1' });
    if ('error' in price) problems.add({ file, line: row.line, field: 'price', message: price.error, fix: price.fix });
    if ('value' in level && 'value' in price) {
      levelSet.add(level.value);
      parsed.push({ stamp: row.cells[0] as string, line: row.line, level: level.value, price: price.value });
    }
  }
  const levels = [...levelSet].sort((a, b) => a - b);
  const position = new Map(levels.map((level, k) => [level, k]));
  const byStamp = new Map<string, { stamp: string; line: number; prices: number[]; seen: boolean[] }>();
  for (const entry of parsed) {
    let group = byStamp.get(entry.stamp);
    if (group === undefined) {
      group = { stamp: entry.stamp, line: entry.line, prices: new Array<number>(levels.length).fill(Number.NaN), seen: new Array<boolean>(levels.length).fill(false) };
      byStamp.set(entry.stamp, group);
    }
    const k = position.get(entry.level) as number;
    if (group.seen[k]) problems.add({ file, line: entry.line, field: 'level', message: `level ${entry.level} appears twice for ${entry.stamp}`, fix: 'give each period and level once' });
    group.seen[k] = true;
    group.prices[k] = entry.price;
  }
  for (const group of byStamp.values()) {
    const missing = levels.filter((_, k) => !group.seen[k]);
    if (missing.length > 0) problems.add({ file, line: group.line, field: 'level', message: `period ${group.stamp} lacks levels ${missing.join(', ')}`, fix: 'give every period the same set of levels' });
  }
  return { levels, entries: [...byStamp.values()] };
}

function assembleDays(grid: ForecastGrid, file: string, market: MarketSpec, problems: ProblemList): QuantileForecastFile {
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const byDay = new Map<string, { prices: (number[] | undefined)[]; lines: number[] }>();
  let repairedPeriods = 0;
  const repairedExamples: string[] = [];
  for (const entry of grid.entries) {
    const located = locatePeriod(entry.stamp, calendar);
    if (!located.ok) {
      problems.add({ file, line: entry.line, field: 'period_start', message: located.message, fix: located.fix });
      continue;
    }
    const outside = entry.prices.find((p) => p < market.priceFloor || p > market.priceCap);
    if (outside !== undefined) {
      problems.add({ file, line: entry.line, message: `price ${outside} is outside the market's [${market.priceFloor}, ${market.priceCap}]`, fix: 'check the forecast\'s unit and the market spec\'s priceFloor and priceCap' });
      continue;
    }
    let day = byDay.get(located.day);
    if (day === undefined) {
      const count = calendar.periods(located.day).length;
      day = { prices: new Array<number[] | undefined>(count).fill(undefined), lines: new Array<number>(count).fill(0) };
      byDay.set(located.day, day);
    }
    if (day.prices[located.index] !== undefined) {
      problems.add({ file, line: entry.line, field: 'period_start', message: `period ${entry.stamp} appears twice (first on line ${day.lines[located.index]})`, fix: 'give each delivery period once' });
      continue;
    }
    const { prices, repaired } = rearrange(entry.prices);
    if (repaired) {
      repairedPeriods++;
      if (repairedExamples.length < 5) repairedExamples.push(entry.stamp);
    }
    day.prices[located.index] = prices;
    day.lines[located.index] = entry.line;
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
