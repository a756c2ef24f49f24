/**
 * The rules of the settings that several commands share, each written once: the CLI's option parsers
 * (cli/options.ts) and the use cases' settings schemas (settingSchemas.ts) both call these, so a rule
 * and its words cannot drift apart between commands.
 */
import { dirname, parse, resolve } from 'node:path';
import { shownText } from '../errors/shownText.js';
import { parseDecimalRange } from '../grid/decimalRange.js';
import { parseDecimal } from '../io/csvText.js';
import { dayNumber } from '../market/civilDays.js';
import { isLevel, LEVEL_RANGE_TEXT } from '../forecast/quantiles/levels.js';

/** A decimal number with a dot, as in the input files (no hex, no Infinity, no blanks around it kept), or NaN. */
export function decimalOf(text: string): number {
  const parsed = parseDecimal(text.trim());
  return 'value' in parsed ? parsed.value : Number.NaN;
}

/** Why a path cannot name an input or output, or null: an empty path is an unset shell variable. */
export function pathProblem(path: string): string | null {
  return path.trim() === '' ? 'the path is empty; give a file or folder name (is a shell variable unset?)' : null;
}

/**
 * Why `out` cannot take a command's outputs, or null: an empty path (else the outputs would land in
 * the working folder) or the root folder. With `csvFile`, `out` may name a CSV file, whose folder
 * takes the outputs. An existing file where a folder belongs is found when the folder is checked
 * (io/writeOutputs.ts checkOutputFolder), with the other problems of the folder.
 */
export function outFolderProblem(out: string, form: 'folder' | 'folder-or-csv-file' = 'folder'): string | null {
  const empty = pathProblem(out);
  if (empty !== null) return empty;
  const path = resolve(out);
  const folder = form === 'folder-or-csv-file' && /\.csv$/i.test(out) ? dirname(path) : path;
  if (folder === parse(folder).root) return `${shownText(out)} is the root folder; give a folder for the outputs, e.g. runs/out`;
  return null;
}

/**
 * The first and last delivery day of a run, both included: the first not after the last, and at most
 * MAX_SPAN_YEARS apart, so that a run never walks through millennia of days without data.
 */
export function spanProblem(from: string, to: string): string | null {
  if (from > to) return `--to ${to} is before --from ${from}`;
  const first = dayNumber(from);
  const last = dayNumber(to);
  if (first === null || last === null) return null;
  const years = (last - first + 1) / 365.2425;
  if (years > MAX_SPAN_YEARS) return `--from ${from} to --to ${to} spans ${Math.round(years)} years, more than the ${MAX_SPAN_YEARS} a run may cover`;
  return null;
}

/** Most quantile levels one forecast may have [-] (0.01:0.99:0.01 is 99). */
export const MAX_LEVELS = 99;

/** How levels are written, for the problem texts. */
const LEVELS_FORM = `give levels in ${LEVEL_RANGE_TEXT} as a range start:end:step (e.g. 0.05:0.95:0.05) or a list (e.g. 0.1,0.5,0.9)`;

/**
 * Quantile levels from text: a range `start:end:step` (exact decimals, end included when on the grid,
 * e.g. `0.05:0.95:0.05`) or a comma-separated list (`0.1,0.5,0.9`); checked by levelsProblem.
 */
export function levelsFromText(text: string): { readonly levels: number[] } | { readonly problem: string } {
  const bad = (why: string) => ({ problem: `"${shownText(text)}": ${why}; ${LEVELS_FORM}` });
  let levels: number[];
  if (text.includes(':')) {
    const range = parseDecimalRange(text);
    if (range.status === 'bad') return bad(range.message);
    if (range.count > BigInt(MAX_LEVELS)) return bad(`${range.count} levels, more than ${MAX_LEVELS}`);
    levels = Array.from({ length: Number(range.count) }, (_, i) => Number(range.valueText(i)));
  } else {
    levels = [];
    for (const cell of text.split(',')) {
      const parsed = parseDecimal(cell.trim());
      if (!('value' in parsed)) return bad(`"${shownText(cell.trim())}" is not a number`);
      levels.push(parsed.value);
    }
  }
  const problem = levelsProblem(levels);
  return problem === null ? { levels } : bad(problem);
}

/** Why these cannot be a forecast's levels, or null: at most MAX_LEVELS, each in LEVEL_RANGE, strictly increasing. */
export function levelsProblem(levels: readonly number[]): string | null {
  if (levels.length > MAX_LEVELS) return `${levels.length} levels, more than ${MAX_LEVELS}`;
  const outside = levels.filter((tau) => !isLevel(tau));
  if (outside.length > 0) return `level${outside.length > 1 ? 's' : ''} ${outside.join(', ')} outside ${LEVEL_RANGE_TEXT}`;
  if (levels.some((tau, k) => k > 0 && !(tau > (levels[k - 1] as number)))) return 'the levels do not increase strictly';
  return null;
}

/**
 * The ranges of the numbers a run takes from its flags or settings, beside the battery's own
 * (battery/batterySpec.ts BATTERY_LIMITS, also the size axes') and alpha's (plan/alpha.ts): sane
 * physically and economically, and small enough that no sum, power or product of them overflows or
 * runs for long. Capital costs up to 1e9 currency per MWh or MW (a battery costs some 2e5 EUR/MWh;
 * the bound leaves room for currencies of small units), fixed O&M up to 1e8 per MW-year, a life of 1 to
 * 100 whole years and of 100 to 1,000,000 equivalent full cycles (cells last some thousands, common
 * practice), a discount rate from -50% to +100% a year, 1 to 1024 threads, and a span of days of at
 * most MAX_SPAN_YEARS.
 */
export const RUN_LIMITS = Object.freeze({
  socStartMwh: [0, 100_000],
  capexPerMwh: [0, 1e9],
  capexPerMw: [0, 1e9],
  fixedOmPerMwYear: [0, 1e8],
  lifeYears: [1, 100],
  lifeCycles: [100, 1_000_000],
  discountRate: [-0.5, 1],
  threads: [1, 1024],
  /** Paths the curves are planned on (curve, auto). */
  planningPaths: [2, 10_000],
  /** lambda of mean + lambda x CVaR 5 % (curve, auto). */
  riskWeight: [0, 1000],
} as const satisfies Record<string, readonly [number, number]>);

/** Longest span of delivery days a run may cover [years]: ten years of quarter-hours are 350,000 periods. */
export const MAX_SPAN_YEARS = 50;

/** Why `value` is not a number in [lo, hi] (a whole number when `whole`), or null. */
export function rangeProblem(value: number, [lo, hi]: readonly [number, number], whole = false): string | null {
  if (whole ? Number.isInteger(value) && value >= lo && value <= hi : value >= lo && value <= hi) return null;
  return `must be a ${whole ? 'whole number' : 'number'} in [${lo}, ${hi}]`;
}
