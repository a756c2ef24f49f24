import { Command } from 'commander';
import { InputError, type InputProblem } from '../errors/inputError.js';
import { spanProblem } from '../app/settingRules.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import { addInputOptions, dayArg, forceOption, inputSources, jsonOption, outOption, pathArg, reportOption, type InputFlags } from './options.js';
import { printResult } from './printResult.js';

export interface ScoreFlags extends InputFlags {
  readonly against?: string;
  readonly paths?: string;
  readonly from?: string;
  readonly to?: string;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly report?: boolean;
}

export function scoreCommand(io: CliIo): Command {
  const command = new Command('score')
    .description('score a quantile forecast against the realised prices of a history: pinball, CRPS, coverage, calibration and their tests, per period of the day and overall')
    .option('--against <file>', 'a second quantile forecast (same levels): Diebold-Mariano test of the two on their common days', pathArg)
    .option('--paths <file>', 'whole-day scenario paths (paths.csv of quantbid forecast --paths): energy and variogram scores', pathArg)
    .option('--from <YYYY-MM-DD>', 'score only days from this one (default: the first forecast day)', dayArg)
    .option('--to <YYYY-MM-DD>', 'score only days up to this one, included (default: the last forecast day)', dayArg)
    .addOption(outOption('folder for score.json (required)'))
    .addOption(reportOption('also write report.html into --out: calibration chart, pinball loss by level and by period of the day'))
    .addOption(forceOption('overwrite an existing score.json'))
    .addOption(jsonOption('print score.json on stdout'));
  addInputOptions(command, ['market', 'history', 'forecast']);
  command.addHelpText(
    'after',
    `
Only days present in both the forecast and the history are scored; the other
forecast days are listed in score.json with the reason (a forecast with no day
in the history is an error, exit code 2). score.json holds crps (the mean
pinball loss over the levels and every scored period, each period counting
once: the factor 2 is not included, so it approximates CRPS/2),
pinball.<level>, coverage.<interval> (e.g. coverage["0.8"] for [q0.1, q0.9]),
calibration.<level> (share of prices below the quantile), Kupiec and
Christoffersen tests of each central interval, all overall and per period of
the day (byPeriod), and with --against the Diebold-Mariano test (HLN-corrected,
h = 1, on the days both forecast; each day's loss weighs its periods, so the
mean of the daily losses is the crps of those days). With --paths, score.json
also holds paths.energyScore and paths.variogramScore (order 0.5), the means
over the days the history has, beside the same scores with each period's values
shuffled across the paths (the marginals without the dependence between
periods).

Examples:
  quantbid score --scenario scenarios/halvorn/scenario.json \\
                 --from 2026-01-01 --to 2026-12-31 --out runs/vendor-score \\
                 --report
  quantbid score --scenario scenarios/halvorn/scenario.json \\
                 --forecast runs/fc/quantiles.csv \\
                 --against scenarios/halvorn/quantiles.csv.gz \\
                 --out runs/fc-score
  quantbid score --scenario scenarios/halvorn/scenario.json \\
                 --forecast runs/fc/quantiles.csv \\
                 --paths runs/fc/paths.csv --out runs/fc-score
  quantbid score --market market.json --history history.csv \\
                 --forecast quantiles.csv --out runs/score --json`,
  );
  command.action(async (flags: ScoreFlags) => {
    const out = requiredOut(flags);
    const settings = {
      inputs: inputSources(flags),
      ...(flags.against === undefined ? {} : { against: flags.against }),
      ...(flags.paths === undefined ? {} : { paths: flags.paths }),
      ...(flags.from === undefined ? {} : { from: flags.from }),
      ...(flags.to === undefined ? {} : { to: flags.to }),
      out,
      force: flags.force === true,
      report: flags.report === true,
    };
    const { scoreUseCase } = await import('../app/score/scoreUseCase.js');
    printResult(io, scoreUseCase(settings, cliHooks(io, false)), flags.json === true);
  });
  return command;
}

/** --out, which score needs, and --from not after --to; both problems listed together. */
function requiredOut(flags: ScoreFlags): string {
  const problems: InputProblem[] = [];
  if (flags.out === undefined) problems.push({ file: 'command line', field: '--out', message: 'no --out given', fix: 'give --out DIR, the folder for score.json' });
  const span = flags.from === undefined || flags.to === undefined ? null : spanProblem(flags.from, flags.to);
  if (span !== null) problems.push({ file: 'command line', field: '--to', message: span, fix: 'give a --to on or after --from' });
  if (problems.length > 0) throw new InputError(problems);
  return flags.out as string;
}
