import { Command, CommanderError } from 'commander';
import { InputError, formatProblem } from '../errors/inputError.js';
import { shownText, terminalText } from '../errors/shownText.js';
import { packageVersion } from '../app/packageInfo.js';
import { backtestCommand } from './backtestCommand.js';
import { forecastCommand } from './forecastCommand.js';
import { demoCommand } from './demoCommand.js';
import { planCommand } from './planCommand.js';
import { processIo, type CliIo } from './cliIo.js';
import { scoreCommand } from './scoreCommand.js';
import { sizeCommand } from './sizeCommand.js';
import { sweepCommand } from './sweepCommand.js';
import { usageErrorText } from './usageError.js';

/** Exit codes (docs/design.md section 7). */
export const EXIT = Object.freeze({ ok: 0, internal: 1, badInput: 2 });

/**
 * Width that help text is wrapped to [columns], whatever the terminal: the same help on every
 * machine (the tests compare it with stored snapshots), and 80 columns fit any terminal.
 */
export const HELP_WIDTH = 80;

/** Where commander writes: through `io`, at HELP_WIDTH, without colour; usage errors in our format. */
function outputOf(io: CliIo, commandPath: string) {
  return {
    outputError: (message: string, write: (s: string) => void) => write(usageErrorText(message, commandPath)),
    writeOut: (s: string) => io.stdout(s),
    writeErr: (s: string) => io.stderr(s),
    getOutHelpWidth: () => HELP_WIDTH,
    getErrHelpWidth: () => HELP_WIDTH,
    getOutHasColors: () => false,
    getErrHasColors: () => false,
  };
}

/** The commands, each made when asked. */
const COMMAND_MAKERS: Readonly<Record<string, (io: CliIo) => Command>> = {
  plan: planCommand,
  backtest: backtestCommand,
  sweep: sweepCommand,
  size: sizeCommand,
  forecast: forecastCommand,
  score: scoreCommand,
  demo: demoCommand,
};

/**
 * The program with every command, or only `only` when it names one: a command's run and its help
 * read nothing of the others (its options, help and errors are its own; the program's options are
 * kept), and making the seven costs a run about 3 ms it never uses.
 */
export function buildProgram(io: CliIo, only?: string): Command {
  const program = new Command('quantbid')
    .description('plan, backtest and size a grid battery\'s day-ahead orders from quantile price forecasts')
    .version(packageVersion(), '--version', 'print the version')
    .configureOutput(outputOf(io, 'quantbid'))
    .exitOverride();
  const makers = only !== undefined && Object.hasOwn(COMMAND_MAKERS, only) ? [COMMAND_MAKERS[only] as (io: CliIo) => Command] : Object.values(COMMAND_MAKERS);
  for (const command of makers.map((make) => make(io))) {
    command.exitOverride().configureOutput(outputOf(io, `quantbid ${command.name()}`));
    program.addCommand(command);
  }
  return program;
}

/**
 * Runs the CLI and returns the exit code: 0 ok, 1 internal fault, 2 bad input or usage.
 * Bad input prints every problem as `file:line: field: what is wrong; what to do`.
 */
export async function main(argv: readonly string[], io: CliIo = processIo): Promise<number> {
  // argv[2]: the first argument, which names the command when one runs (the program has no option that takes a value).
  const program = buildProgram(io, argv[2]);
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
      io.stderr(err.kept === undefined ? 'nothing was written.\n' : `${shownText(err.kept, 1000)}\n`);
      return EXIT.badInput;
    }
    io.stderr(terminalText(`quantbid: internal fault, please report it: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`));
    return EXIT.internal;
  }
}
