import { formatProblem, type InputProblem } from '../errors/inputError.js';

/**
 * A command-line usage error as reported by commander, rewritten as one of our problems
 * (`command line: FIELD: what is wrong; what to do`), so that every error the CLI prints has one
 * format whether it came from an argument parser, commander, or an input file.
 *
 * The patterns are commander's message texts (commander 14); anything else keeps its text with a
 * pointer to the help.
 */
export function usageProblem(commanderMessage: string, commandPath: string): InputProblem {
  const text = commanderMessage.trim().replace(/^error: /, '');
  const [first = '', ...rest] = text.split('\n');
  const suggestion = rest.join(' ').match(/^\(Did you mean (.+)\?\)$/)?.[1];
  const hint = suggestion === undefined ? '' : ` (did you mean ${suggestion}?)`;
  const help = `see ${commandPath} --help`;
  let m = first.match(/^option '([^' ]+)[^']*' argument '(.*)' is invalid\. (.*)$/s);
  if (m) return { file: 'command line', field: m[1], message: `"${m[2]}" is not accepted: ${m[3]}`, fix: help };
  m = first.match(/^unknown option '(.+)'$/);
  if (m) return { file: 'command line', field: m[1], message: `unknown option${hint}`, fix: `${help} for the options` };
  m = first.match(/^unknown command '(.+)'$/);
  if (m) return { file: 'command line', field: m[1], message: `unknown command${hint}`, fix: `${help} for the commands` };
  m = first.match(/^option '([^' ]+)[^']*' argument missing$/);
  if (m) return { file: 'command line', field: m[1], message: 'the option needs a value', fix: `give ${m[1]} a value; ${help}` };
  m = first.match(/^too many arguments(?: for '(.+)')?\. Expected (\d+) arguments? but got (\d+)\.$/);
  if (m) return { file: 'command line', message: `${m[3]} stray argument(s) where ${m[2]} are expected`, fix: `options start with --; ${help}` };
  return { file: 'command line', message: `${first}${hint}`, fix: help };
}

/** The problem as the line the CLI prints. */
export function usageErrorText(commanderMessage: string, commandPath: string): string {
  return `${formatProblem(usageProblem(commanderMessage, commandPath))}\nnothing was written.\n`;
}
