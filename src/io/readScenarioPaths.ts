import type { MarketSpec } from '../types.js';
import { DayCalendar, locatePeriod } from '../market/dayCalendar.js';
import { ProblemList } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';
import { parseDecimal, separatorProblem, splitCsv, splitCsvLine } from './csvText.js';
import { readInputFile } from './readInputFile.js';

/** Whole-day price paths by day, validated: paths[j][t] [currency/MWh] for every period of each day. */
export interface ScenarioPathsFile {
  readonly file: string;
  /** By day YYYY-MM-DD: the day's complete paths in path order (path numbers 1..n). */
  readonly days: ReadonlyMap<string, readonly (readonly number[])[]>;
}

const HEADER = ['period_start', 'path', 'price'];

/** Reads a paths file (.csv or .csv.gz); see parseScenarioPaths. */
export function readScenarioPaths(path: string, market: MarketSpec): ScenarioPathsFile {
  const firstLine = (line: string, lineNumber: number) => {
    const separator = separatorProblem(line, path, lineNumber);
    if (separator !== null) return [separator];
    return headerProblem(splitCsvLine(line), path, lineNumber);
  };
  return parseScenarioPaths(readInputFile(path, { firstLine }), path, market);
}

/**
 * Reads whole-day scenario paths in the layout `quantbid forecast --paths` writes: `period_start,path,price`,
 * path a whole number >= 1, price a finite decimal (not bound by the floor and cap: a path is a scenario,
 * clamped into [floor, cap] where it is used). A day's paths must be numbered 1..n without a gap, each
 * over every period of the day exactly once; rows may come in any order. Every problem is collected and
 * thrown together as an InputError.
 */
export function parseScenarioPaths(text: string, file: string, market: MarketSpec): ScenarioPathsFile {
  const problems = new ProblemList();
  const split = splitCsv(text, file);
  if ('problems' in split) {
    split.problems.forEach((p) => problems.add(p));
    problems.throwIfAny();
    throw new Error('unreachable');
  }
  headerProblem(split.table.header, file, split.table.headerLine).forEach((p) => problems.add(p));
  problems.throwIfAny();
  const calendar = DayCalendar.of(market.timeZone, market.periodMinutes);
  const byDay = new Map<string, Map<number, (number | undefined)[]>>();
  for (const row of split.table.rows) {
    if (problems.full) break;
    const [stamp = '', pathCell = '', priceCell = ''] = row.cells;
    if (row.cells.length !== 3) {
      problems.add({ file, line: row.line, message: `${row.cells.length} fields, the header has 3`, fix: 'give period_start, path and price on every line' });
      continue;
    }
    const located = locatePeriod(stamp, calendar);
    if (!located.ok) {
      problems.add({ file, line: row.line, field: 'period_start', message: located.message, fix: located.fix });
      continue;
    }
    const pathNumber = Number(pathCell);
    if (!/^\d+$/.test(pathCell) || !(pathNumber >= 1)) {
      problems.add({ file, line: row.line, field: 'path', message: `"${shownText(pathCell)}" is not a path number`, fix: 'number the paths of each day 1, 2, 3, ...' });
      continue;
    }
    const price = parseDecimal(priceCell);
    if (!('value' in price)) {
      problems.add({ file, line: row.line, field: 'price', message: price.error, fix: price.fix });
      continue;
    }
    let paths = byDay.get(located.day);
    if (paths === undefined) byDay.set(located.day, (paths = new Map()));
    let values = paths.get(pathNumber);
    if (values === undefined) paths.set(pathNumber, (values = new Array<number | undefined>(calendar.periods(located.day).length)));
    if (values[located.index] !== undefined) {
      problems.add({ file, line: row.line, field: 'period_start', message: `path ${pathNumber} has ${stamp} twice`, fix: 'give each path one price per period' });
      continue;
    }
    values[located.index] = price.value;
  }
  problems.throwIfAny();
  const days = new Map<string, number[][]>();
  for (const [day, paths] of [...byDay].sort(([a], [b]) => (a < b ? -1 : 1))) {
    const count = paths.size;
    const out: number[][] = [];
    for (let j = 1; j <= count; j++) {
      const values = paths.get(j);
      if (values === undefined) {
        problems.add({ file, field: 'path', message: `day ${day} has ${count} paths but no path ${j}`, fix: 'number the paths of each day 1..n without a gap' });
        break;
      }
      const missing = values.findIndex((v) => v === undefined);
      if (missing >= 0 || values.length === 0) {
        problems.add({ file, field: 'period_start', message: `path ${j} of ${day} has no price for ${calendar.periods(day)[Math.max(0, missing)]?.start ?? day}`, fix: 'give every path a price in every period of its day' });
        break;
      }
      out.push(values as number[]);
    }
    days.set(day, out);
  }
  problems.throwIfAny();
  return { file, days };
}

function headerProblem(header: readonly string[], file: string, line: number) {
  return header.length === HEADER.length && header.every((h, i) => h === HEADER[i])
    ? []
    : [{ file, line, message: `the header is "${shownText(header.join(','))}"`, fix: `write the header ${HEADER.join(',')} (the layout quantbid forecast --paths writes)` }];
}
