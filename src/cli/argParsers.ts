import { InvalidArgumentError } from 'commander';
import { parseDecimal } from '../io/csvText.js';
import { shownText } from '../errors/shownText.js';
import { isValidDay } from '../market/calendar.js';

/** Value parsers for command-line options; each throws commander's typed error (exit code 2). */

export function parseDayArg(value: string): string {
  if (!isValidDay(value)) throw new InvalidArgumentError(`"${shownText(value)}" is not a day; write it as YYYY-MM-DD, e.g. 2027-03-28`);
  return value;
}

/** A decimal number with a dot, as in the input files (no hex, no Infinity, no blanks), or NaN. */
function decimalArg(value: string): number {
  const parsed = parseDecimal(value);
  return 'value' in parsed ? parsed.value : Number.NaN;
}

export function parseAlphaArg(value: string): number {
  const alpha = decimalArg(value);
  if (!(alpha > 0 && alpha < 0.5)) {
    throw new InvalidArgumentError(`alpha ${shownText(value)} must be a number in (0, 0.5): the central interval [q(alpha), q(1 - alpha)], e.g. 0.1`);
  }
  return alpha;
}

export function parseNonNegativeArg(value: string): number {
  const x = decimalArg(value);
  if (!Number.isFinite(x) || x < 0) throw new InvalidArgumentError(`"${shownText(value)}" must be a number >= 0, e.g. 5 or 2.5`);
  return x;
}

export function oneOf<T extends string>(allowed: readonly T[]): (value: string) => T {
  return (value: string) => {
    if (!(allowed as readonly string[]).includes(value)) throw new InvalidArgumentError(`"${shownText(value)}" must be one of ${allowed.join(', ')}`);
    return value as T;
  };
}

/** A file or folder path: anything but empty (an unset shell variable gives an empty argument). */
export function parsePathArg(value: string): string {
  if (value.trim() === '') throw new InvalidArgumentError('the path is empty; give a file or folder name (is a shell variable unset?)');
  return value;
}
