import type { InputProblem } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';
import { isLevel, LEVEL_RANGE_TEXT } from '../forecast/quantiles/levels.js';

/** The layout a quantile forecast header names, with the levels of the wide layout. */
export interface QuantileHeader {
  readonly layout: 'wide' | 'long';
  /** Wide layout: the level of each column after period_start, in file order; long layout: empty. */
  readonly levels: readonly number[];
  readonly problems: readonly InputProblem[];
}

const LEVEL_HEADER = /^q(\d*\.?\d+)$/;
const LAYOUTS = 'use the header period_start,q0.05,...,q0.95 (wide) or period_start,level,price (long)';

/**
 * Checks the header of a quantile forecast (docs/design.md section 8): `period_start` first, then either
 * `level,price` (long layout) or one column `q<level>` per level, levels in (0, 1) and increasing
 * (wide layout). Every problem of the header is listed; levels written as percentages are named as such.
 *
 * @param line 1-based line of the header in the file
 */
export function readQuantileHeader(header: readonly string[], file: string, line: number): QuantileHeader {
  const problems: InputProblem[] = [];
  const first = header[0] ?? '';
  if (first !== 'period_start') {
    problems.push({ file, line, field: first, message: `the first column is "${shownText(first)}", expected "period_start"`, fix: LAYOUTS });
  }
  if (header.length === 3 && (header[1] === 'level' || header[2] === 'price')) {
    for (const [k, name] of [[1, 'level'], [2, 'price']] as const) {
      const given = header[k] as string;
      if (given !== name) problems.push({ file, line, field: given, message: `column ${k + 1} is "${shownText(given)}", expected "${name}" (long layout)`, fix: LAYOUTS });
    }
    return { layout: 'long', levels: [], problems };
  }
  if (header.length < 2) {
    problems.push({ file, line, message: 'no quantile columns', fix: 'add columns q<level>, e.g. q0.05,...,q0.95' });
  }
  const levels: number[] = [];
  header.slice(1).forEach((name, k) => {
    const problem = levelProblem(name, k + 2, levels[levels.length - 1]);
    if (problem !== null) problems.push({ file, line, field: name, ...problem });
    const match = LEVEL_HEADER.exec(name);
    levels.push(match === null ? Number.NaN : Number(match[1]));
  });
  return { layout: 'wide', levels, problems };
}

/** What is wrong with one level column's name, or null. `previous` is the level of the column before. */
function levelProblem(name: string, column: number, previous: number | undefined): { message: string; fix: string } | null {
  const match = LEVEL_HEADER.exec(name);
  if (match === null) {
    return { message: `column ${column} is "${shownText(name)}", not a level header`, fix: 'name quantile columns q<level> with the level in (0, 1), e.g. q0.05' };
  }
  const level = Number(match[1]);
  if (level >= 1 && level < 100) return { message: `level ${level} looks like a percentage`, fix: `write levels as fractions in (0, 1): q${level / 100} for ${level}%` };
  if (!isLevel(level)) return { message: `level ${level} is outside ${LEVEL_RANGE_TEXT}`, fix: `levels are probabilities in ${LEVEL_RANGE_TEXT}` };
  if (previous !== undefined && level <= previous) {
    return { message: `level ${level} does not increase from the column before (${previous})`, fix: 'order the quantile columns by increasing level, each level once' };
  }
  return null;
}
