import { Command, CommanderError } from 'commander';
import { InputError, formatProblem } from '../io/inputError.js';
import { backtestCommand } from './backtestCommand.js';
import { demoCommand } from './demoCommand.js';
import { forecastCommand } from './forecastCommand.js';
import { planCommand } from './planCommand.js';
import { processIo, type CliIo } from './cliIo.js';
import { scoreCommand } from './scoreCommand.js';
import { sizeCommand } from './sizeCommand.js';
import { sweepCommand } from './sweepCommand.js';
import { packageVersion } from './version.js';

/** Exit codes (DESIGN.md section 7). */
export const EXIT = Object.freeze({ ok: 0, internal: 1, badInput: 2 });

export function buildProgram(io: CliIo): Command {
  const program = new Command('quantbid')
    .description('plan, backtest and size a grid battery\'s day-ahead orders from quantile price forecasts')
    .version(packageVersion(), '--version', 'print the version')
    .showHelpAfterError('(add --help for usage)')
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) })
    .exitOverride();
  for (const command of [planCommand(io), backtestCommand(io), sweepCommand(io), sizeCommand(io), forecastCommand(io), scoreCommand(io), demoCommand(io)]) {
    command.exitOverride().configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) }).showHelpAfterError('(add --help for usage)');
    program.addCommand(command);
  }
  return program;
}

/**
 * Runs the CLI and returns the exit code: 0 ok, 1 internal fault, 2 bad input or usage.
 * Bad input prints every problem as `file:line: field: what is wrong; what to do`.
 */
export async function main(argv: readonly string[], io: CliIo = processIo): Promise<number> {
  const program = buildProgram(io);
  try {
    await program.parseAsync([...argv]);
    return EXIT.ok;
  } catch (err) {
    if (err instanceof CommanderError) {
      // --help and --version end with exit code 0; usage errors, and help shown because no command
      // was given, with a non-zero code: bad usage.
      return err.exitCode === 0 ? EXIT.ok : EXIT.badInput;
    }
    if (err instanceof InputError) {
      for (const problem of err.problems) io.stderr(`${formatProblem(problem)}\n`);
      io.stderr('nothing was written.\n');
      return EXIT.badInput;
    }
    io.stderr(`quantbid: internal fault, please report it: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    return EXIT.internal;
  }
}
