import type { DeliveryPeriod, MarketSpec } from '../types.js';
import { DayCalendar, locatePeriod } from '../market/dayCalendar.js';
import { InputError, ProblemList } from '../errors/inputError.js';
import { fieldCountProblem, parseDecimal, separatorProblem, splitCsv, splitCsvLine } from './csvText.js';
import { readInputFile } from './readInputFile.js';
import { shownText } from '../errors/shownText.js';

/** One delivery day's whole-day paths: paths[j][t] for the day's periods, path j + 1 of the file. */
export interface PathDay {
  readonly day: string;
  readonly periods: readonly DeliveryPeriod[];
  readonly paths: readonly (readonly number[])[];
}

/** A scenario paths file, validated: complete days by day, and the days left out with the reason. */
export interface ScenarioPathsFile {
  readonly file: string;
  readonly days: ReadonlyMap<string, PathDay>;
  readonly incompleteDays: readonly { readonly day: string; readonly reason: string }[];
}

const HEADER = ['period_start', 'path', 'price'] as const;

/** Reads a scenario paths file (.csv or .csv.gz), the layout `quantbid forecast --paths` writes; see parseScenarioPaths. */
export function readScenarioPaths(path: string, market: MarketSpec): ScenarioPathsFile {
  const firstLine = (line: string, lineNumber: number) => {
    const separator = separatorProblem(line, path, lineNumber);
    return separator === null ? headerProblems(splitCsvLine(line), path, lineNumber) : [separator];
  };
  return parseScenarioPaths(readInputFile(path, { firstLine }), path, market);
}

/**
 * Reads scenario paths from CSV text `period_start,path,price` (one row per period and path, any order).
 * Rules: `period_start` a period start of the market's calendar with the zone's offset; `path` a whole
 * number >= 1; `price` a finite decimal inside the market's [priceFloor, priceCap]; each (period, path)
 * once. A day is complete when its paths are numbered 1..n and each has every period of the day;
 * other days are listed with the reason and never filled in. All problems are thrown together.
 */
export function parseScenarioPaths(text: string, file: string, market: MarketSpec): ScenarioPathsFile {
  const split = splitCsv(text, file);
  if ('problems' in split) throw new InputError(split.problems);
  const problems = new ProblemList();
  const { header, headerLine, rows } = split.table;
  headerProblems(header, file, headerLine).forEach((p) => problems.add(p));
  problems.throwIfAny();
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  const byDay = new Map<string, Map<number, (number | undefined)[]>>();
  for (const row of rows) {
    if (problems.full) break;
    if (row.cells.length !== HEADER.length) {
      problems.add(fieldCountProblem(row, header, file, 'give period_start, path and price on every line'));
      continue;
    }
    const [stamp, pathCell, priceCell] = row.cells as [string, string, string];
    const located = locatePeriod(stamp, calendar);
    if (!located.ok) {
      problems.add({ file, line: row.line, field: 'period_start', message: located.message, fix: located.fix });
      continue;
    }
    const path = Number(pathCell);
    if (!/^\d+$/.test(pathCell) || !(path >= 1)) {
      problems.add({ file, line: row.line, field: 'path', message: `"${shownText(pathCell)}" is not a path number`, fix: 'number the paths of a day 1, 2, 3, ...' });
      continue;
    }
    const price = parseDecimal(priceCell);
    if ('error' in price) {
      problems.add({ file, line: row.line, field: 'price', message: price.error, fix: price.fix });
      continue;
    }
    if (!(price.value >= market.priceFloor && price.value <= market.priceCap)) {
      problems.add({ file, line: row.line, field: 'price', message: `price ${price.value} is outside the market's [${market.priceFloor}, ${market.priceCap}]`, fix: "check the paths' unit and the market spec's priceFloor and priceCap" });
      continue;
    }
    let paths = byDay.get(located.day);
    if (paths === undefined) {
      paths = new Map();
      byDay.set(located.day, paths);
    }
    let values = paths.get(path);
    if (values === undefined) {
      values = new Array<number | undefined>(calendar.periods(located.day).length).fill(undefined);
      paths.set(path, values);
    }
    if (values[located.index] !== undefined) {
      problems.add({ file, line: row.line, field: 'period_start', message: `period ${stamp} of path ${path} appears twice`, fix: 'give each period of each path once' });
      continue;
    }
    values[located.index] = price.value;
  }
  problems.throwIfAny();
  const days = new Map<string, PathDay>();
  const incompleteDays: { day: string; reason: string }[] = [];
  for (const day of [...byDay.keys()].sort()) {
    const paths = byDay.get(day) as Map<number, (number | undefined)[]>;
    const n = paths.size;
    const numbers = [...paths.keys()].sort((a, b) => a - b);
    if (numbers[n - 1] !== n) {
      incompleteDays.push({ day, reason: `paths numbered ${numbers.slice(0, 5).join(', ')}${n > 5 ? ', ...' : ''}, not 1 to ${n}` });
      continue;
    }
    const short = numbers.find((j) => (paths.get(j) as (number | undefined)[]).some((v) => v === undefined));
    if (short !== undefined) {
      const missing = (paths.get(short) as (number | undefined)[]).filter((v) => v === undefined).length;
      incompleteDays.push({ day, reason: `path ${short} misses ${missing} of the day's ${calendar.periods(day).length} periods` });
      continue;
    }
    days.set(day, { day, periods: calendar.periods(day), paths: numbers.map((j) => paths.get(j) as number[]) });
  }
  return { file, days, incompleteDays };
}

function headerProblems(header: readonly string[], file: string, line: number) {
  if (header.length === HEADER.length && HEADER.every((name, i) => header[i] === name)) return [];
  return [{ file, line, field: 'header', message: `the header is "${shownText(header.join(','))}"`, fix: `use the header ${HEADER.join(',')} (the layout quantbid forecast --paths writes)` }];
}
