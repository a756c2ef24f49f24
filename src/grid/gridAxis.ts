import { InputError, type InputProblem } from '../errors/inputError.js';
import { parseDecimalRange, parseExactDecimal, exactDecimalText } from './decimalRange.js';

/** A value of one axis of a grid: a number (alpha, energy) or a word (policy name). */
export type AxisValue = number | string;

/**
 * One axis of a grid: a named parameter and the values it takes, in the order given. The type names
 * the axis and its values (e.g. `GridAxis<'alpha', number>`), so that the settings of a grid have a
 * type of their own (SettingOf, expandGrid.ts): values are checked once, when the axis is parsed.
 */
export interface GridAxis<Name extends string = string, Value extends AxisValue = AxisValue> {
  /** Name in setting keys and CSV header, lower snake case, e.g. `alpha` or `energy_mwh`. */
  readonly name: Name;
  /** Command-line option the values came from, e.g. `--alphas`; named in every problem. */
  readonly option: string;
  readonly values: readonly Value[];
}

export interface NumberAxisOptions {
  /** Whether a value is allowed, e.g. `(a) => a > 0 && a < 0.5`. Default: every number. */
  readonly accept?: (value: number) => boolean;
  /** What `accept` wants, for the problem text, e.g. `a number in (0, 0.5)`. */
  readonly expected?: string;
  /** Most values one axis may have [-], default 100,000 (GRID_DEFAULTS.maxSettings). */
  readonly maxValues?: number;
}

export const AXIS_DEFAULTS = Object.freeze({ maxValues: 100_000, expected: 'an allowed value' });

/** Exact text of an axis value in keys and CSV cells: the shortest decimal for numbers. */
export function axisValueText(value: AxisValue): string {
  return typeof value === 'number' ? String(value) : value;
}

/**
 * Parses a number axis: comma-separated items, each a decimal (`0.1`) or an inclusive range
 * `start:end:step` expanded exactly (see decimalRange.ts), e.g. `0.02:0.1:0.02,0.2,0.3`.
 * Values keep the order written; a value given twice is a problem. Every problem is listed.
 */
export function parseNumberAxis<Name extends string>(name: Name, option: string, spec: string, options: NumberAxisOptions = {}): GridAxis<Name, number> {
  const { accept, expected, maxValues } = { ...AXIS_DEFAULTS, ...options };
  const problem = problemFor(option);
  const problems: InputProblem[] = [];
  const texts: string[] = [];
  for (const item of items(spec)) {
    if (item.includes(':')) {
      const range = parseDecimalRange(item);
      if (range.status === 'bad') {
        problems.push(problem(range.message, 'write start:end:step with start <= end and a step > 0, e.g. 0.02:0.48:0.02'));
      } else if (range.count + BigInt(texts.length) > BigInt(maxValues)) {
        problems.push(problem(`"${item}" gives ${range.count} values, more than the ${maxValues} one sweep may have`, 'use a larger step or a shorter range'));
      } else {
        for (let i = 0; i < Number(range.count); i++) texts.push(range.valueText(i));
      }
    } else {
      const decimal = parseExactDecimal(item);
      if (decimal === undefined) problems.push(problem(`"${item}" is not a plain decimal number`, 'write a number such as 0.1, or a range start:end:step'));
      else texts.push(exactDecimalText(decimal));
    }
  }
  const values: number[] = [];
  for (const text of texts) {
    const value = Number(text);
    if (String(value) !== text) problems.push(problem(`${text} has more digits than a number holds exactly`, 'use at most 15 significant digits'));
    else if (accept !== undefined && !accept(value)) problems.push(problem(`${text} is not ${expected}`, `give only ${expected}`));
    else values.push(value);
  }
  problems.push(...duplicateProblems(values.map(axisValueText), problem));
  return checked(problems, { name, option, values });
}

/** Parses a word axis: a comma-separated list of allowed words, e.g. `follow-plan,follow-accepted`. */
export function parseWordAxis<Name extends string, Word extends string>(name: Name, option: string, spec: string, allowed: readonly Word[]): GridAxis<Name, Word> {
  const problem = problemFor(option);
  const values = items(spec);
  const problems = values
    .filter((word) => !(allowed as readonly string[]).includes(word))
    .map((word) => problem(`"${word}" is not one of ${allowed.join(', ')}`, `give a comma-separated list of ${allowed.join(', ')}`));
  problems.push(...duplicateProblems(values, problem));
  return checked(problems, { name, option, values: values as Word[] });
}

/** Runs several axis parsers and reports the problems of all of them together; the axes in the parsers' order. */
export function parseAxes<const Parsers extends readonly (() => GridAxis)[]>(parsers: Parsers): { -readonly [K in keyof Parsers]: ReturnType<Parsers[K]> } {
  const axes: GridAxis[] = [];
  const problems: InputProblem[] = [];
  for (const parse of parsers) {
    try {
      axes.push(parse());
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
      problems.push(...err.problems);
    }
  }
  return checked(problems, axes) as { -readonly [K in keyof Parsers]: ReturnType<Parsers[K]> };
}

function items(spec: string): string[] {
  return spec.split(',').map((item) => item.trim());
}

function problemFor(option: string): (message: string, fix: string) => InputProblem {
  return (message, fix) => ({ file: 'command line', field: option, message, fix });
}

function duplicateProblems(texts: readonly string[], problem: (message: string, fix: string) => InputProblem): InputProblem[] {
  const seen = new Set<string>();
  const twice = new Set<string>();
  for (const text of texts) (seen.has(text) ? twice : seen).add(text);
  return [...twice].map((text) => problem(`${text === '' ? 'an empty item' : text} is given more than once`, 'list each value once'));
}

function checked<T>(problems: readonly InputProblem[], value: T): T {
  if (problems.length > 0) throw new InputError(problems);
  return value;
}
