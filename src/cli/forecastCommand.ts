import { Command, InvalidArgumentError, Option } from 'commander';
import { shownText } from '../errors/shownText.js';
import { DEFAULT_LEVELS_TEXT, FORECAST_DEFAULTS } from '../app/commandDefaults.js';
import { AUTO_CANDIDATES, AUTO_FALLBACK, entryMembers, AUTO_VALIDATION_DAYS, FORECAST_METHODS, LEVEL_RANGE_TEXT, MAX_PATHS, type ForecastMethod } from '../app/vocabulary.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import { addInputOptions, forceOption, parseSeedArg, inputSources, jsonOption, levelsArg, oneOf, outOption, quietOption, requireSpanAndOut, spanOptions, type InputFlags } from './options.js';
import { printResult } from './printResult.js';

export interface ForecastFlags extends InputFlags {
  readonly from?: string;
  readonly to?: string;
  readonly method: ForecastMethod;
  readonly levels: readonly number[];
  readonly paths: number;
  readonly pathSeed: number;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly quiet?: boolean;
}

/** `--paths S`: a whole number of scenario paths per day, 0 to MAX_PATHS. */
export function parsePathCountArg(value: string): number {
  const count = Number(value);
  if (!/^\d+$/.test(value.trim()) || count > MAX_PATHS) {
    throw new InvalidArgumentError(`"${shownText(value)}" must be a whole number of paths from 0 to ${MAX_PATHS}`);
  }
  return count;
}

export function forecastCommand(io: CliIo): Command {
  const [from, to] = spanOptions();
  const command = new Command('forecast')
    .description('quantile forecasts of day-ahead prices from price history, day by day, each from the days before it only')
    .addOption(from)
    .addOption(to)
    .option('--method <name>', `${FORECAST_METHODS.join(' | ')}; auto chooses each day among ${autoCandidatesText()} by their pinball loss on the ${AUTO_VALIDATION_DAYS} days before, ${AUTO_FALLBACK.method} for a history without load and renewables (docs/forecast-quality.md compares them)`, oneOf<ForecastMethod>(FORECAST_METHODS), FORECAST_DEFAULTS.method)
    .addOption(new Option('--levels <list>', `quantile levels in ${LEVEL_RANGE_TEXT}: a range start:end:step or a list 0.1,0.5,0.9`).argParser(levelsArg).default(levelsArg(DEFAULT_LEVELS_TEXT), DEFAULT_LEVELS_TEXT))
    .option('--paths <S>', 'also write S whole-day scenario paths per day to paths.csv', parsePathCountArg, FORECAST_DEFAULTS.paths)
    .option('--path-seed <N>', 'seed of the paths: the same seed and inputs give the same paths', parseSeedArg, FORECAST_DEFAULTS.pathSeed)
    .addOption(outOption('folder for quantiles.csv, forecast.json and (with --paths) paths.csv, or the quantile file itself, NAME.json and NAME.paths.csv going beside it (required)', 'folder-or-csv-file'))
    .addOption(quietOption())
    .addOption(forceOption())
    .addOption(jsonOption('print the summary (forecast.json) on stdout'));
  addInputOptions(command, ['market', 'history']);
  command.addHelpText(
    'after',
    `
Outputs, in the folder --out (or, for --out DIR/NAME.csv, NAME.csv, NAME.json
and NAME.paths.csv in DIR):
  quantiles.csv  wide quantile forecast period_start,q0.05,...,q0.95 (the
                 layout --forecast reads); days that could not be forecast are
                 left out and listed in forecast.json
  paths.csv      with --paths S: period_start,path,price, per day S whole-day
                 price curves: in every period the S values are the day's own
                 quantiles at (j - 1/2)/S, ordered across the periods like the
                 whole-day errors of S past days (Schaake shuffle), so paths
                 keep the dependence between periods; seeded by --path-seed
  forecast.json  method, levels, options, days forecast and skipped with the
                 reason, and with auto the method chosen each day; the same
                 inputs give byte-identical files (the time spent is printed,
                 not written)

Examples:
  quantbid forecast --scenario scenarios/halvorn/scenario.json \\
                    --from 2026-01-01 --to 2026-12-31 --out runs/fc
  quantbid forecast --market market.json --history history.csv \\
                    --from 2026-06-01 --to 2026-06-30 --method qra \\
                    --levels 0.1,0.5,0.9 --paths 20 --out runs/june
  quantbid score --scenario scenarios/halvorn/scenario.json \\
                 --forecast runs/fc/quantiles.csv --out runs/fc-score`,
  );
  command.action(async (flags: ForecastFlags) => {
    const span = requireSpanAndOut(flags, { days: 'delivery day to forecast', outFolder: 'quantiles.csv and forecast.json' });
    const settings = { inputs: inputSources(flags), ...span, method: flags.method, levels: [...flags.levels], scenarioPaths: flags.paths, pathSeed: flags.pathSeed, force: flags.force === true };
    const { forecastUseCase } = await import('../app/forecast/forecastUseCase.js');
    printResult(io, forecastUseCase(settings, cliHooks(io, flags.quiet === true)), flags.json === true);
  });
  return command;
}

/** auto's candidates for --help: the methods, then each quantile average, e.g. "driver-hs, driver-fhs and the quantile average of driver-fhs's 364 and 728 calibration days". */
function autoCandidatesText(): string {
  const singles = [...new Set(AUTO_CANDIDATES.flatMap((e) => ('averageOf' in e ? [] : [e.method])))];
  const averages = AUTO_CANDIDATES.flatMap((e) => {
    if (!('averageOf' in e)) return [];
    const members = entryMembers(e);
    const methods = [...new Set(members.map((m) => m.method))];
    return [methods.length === 1 ? `the quantile average of ${methods[0]}'s ${members.map((m) => m.calibrationDays).join(' and ')} calibration days` : `the quantile average of ${members.map((m) => `${m.method} (${m.calibrationDays})`).join(', ')}`];
  });
  const all = [...singles, ...averages];
  return all.length === 1 ? (all[0] as string) : `${all.slice(0, -1).join(', ')} and ${all[all.length - 1]}`;
}
