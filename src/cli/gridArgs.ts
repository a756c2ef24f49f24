import { Option, InvalidArgumentError, type Command } from 'commander';
import { parseDecimal } from '../io/csvText.js';
import { InputError, type InputProblem } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';
import { parseDayArg, parsePathArg } from './argParsers.js';

/** Flags that `quantbid sweep` and `quantbid size` share. */
export interface GridFlags {
  readonly from?: string;
  readonly to?: string;
  readonly threads?: number;
  readonly restart?: boolean;
  readonly quiet?: boolean;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
}

/** A finite decimal with a dot, as in the input files, or NaN. */
function decimalArg(value: string): number {
  const parsed = parseDecimal(value.trim());
  return 'value' in parsed ? parsed.value : Number.NaN;
}

/** A whole number >= `min`, e.g. `--threads 2` or `--life-years 15`. */
export function wholeNumberArg(min: number, example: string): (value: string) => number {
  return (value) => {
    const n = decimalArg(value);
    if (!Number.isInteger(n) || n < min) throw new InvalidArgumentError(`"${shownText(value)}" must be a whole number >= ${min}, e.g. ${example}`);
    return n;
  };
}

/** A number > 0, e.g. `--life-cycles 6000`. */
export function parsePositiveArg(value: string): number {
  const x = decimalArg(value);
  if (!(x > 0)) throw new InvalidArgumentError(`"${shownText(value)}" must be a number > 0, e.g. 6000`);
  return x;
}

/** A rate per year > -1, e.g. `--discount-rate 0.07` for 7%. */
export function parseRateArg(value: string): number {
  const r = decimalArg(value);
  if (!(r > -1)) throw new InvalidArgumentError(`"${shownText(value)}" must be a rate per year > -1 written as a fraction, e.g. 0.07 for 7%`);
  return r;
}

/** Adds --from, --to and the run options of a grid command (threads, restart, quiet, out, force, json). */
export function addGridOptions(command: Command, table: string): Command {
  return command
    .option('--from <YYYY-MM-DD>', 'first delivery day (required)', parseDayArg)
    .option('--to <YYYY-MM-DD>', 'last delivery day, included (required)', parseDayArg)
    .addOption(new Option('--threads <n>', 'threads running settings, this one included; 1 runs without workers (default: the number of CPUs)').argParser(wholeNumberArg(1, '2')))
    .option('--restart', `discard the journal of an interrupted run in --out and start over (default: resume it)`)
    .option('--quiet', 'no progress bar and no notes on stderr, even on a terminal')
    .option('--out <dir>', `folder for ${table} and summary.json (required)`, parsePathArg)
    .option('--force', 'overwrite existing outputs')
    .option('--json', 'print summary.json on stdout');
}

/** --from, --to and --out, which a grid command needs; all missing ones are listed together. */
export function requireGridFlags(flags: GridFlags, table: string): { from: string; to: string; out: string } {
  return requireSpanAndOut(flags, { days: 'delivery day', outFolder: `${table} and summary.json` });
}

/**
 * --from, --to (not before --from) and --out of any command that runs over a span of days; every
 * missing one is listed together. `days` names the days ("delivery day to forecast"), `outFolder`
 * what the --out folder receives.
 */
export function requireSpanAndOut(
  flags: { readonly from?: string; readonly to?: string; readonly out?: string },
  texts: { readonly days: string; readonly outFolder: string },
): { from: string; to: string; out: string } {
  const problems: InputProblem[] = [];
  const need = (value: string | undefined, option: string, fix: string): string => {
    if (value === undefined) problems.push({ file: 'command line', field: option, message: `no ${option} given`, fix });
    return value ?? '';
  };
  const from = need(flags.from, '--from', `give --from YYYY-MM-DD, the first ${texts.days}`);
  const to = need(flags.to, '--to', `give --to YYYY-MM-DD, the last ${texts.days}`);
  const out = need(flags.out, '--out', `give --out DIR, the folder for ${texts.outFolder}`);
  if (problems.length === 0 && from > to) problems.push({ file: 'command line', field: '--to', message: `--to ${to} is before --from ${from}`, fix: 'give a --to on or after --from' });
  if (problems.length > 0) throw new InputError(problems);
  return { from, to, out };
}
