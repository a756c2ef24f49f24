import { requireSpanAndOut } from './gridArgs.js';
import { basename, dirname } from 'node:path';
import { Command, InvalidArgumentError, Option } from 'commander';
import { DEFAULT_METHOD, DEFAULTS, FORECAST_METHODS, type ForecastMethod } from '../forecast/forecaster.js';
import { forecastRange, type ForecastRangeResult } from '../forecast/forecastRange.js';
import { daysBetween } from '../market/calendar.js';
import { DayCalendar } from '../market/dayCalendar.js';
import { formatNumber } from '../io/formatNumber.js';
import { gatherProblems, InputError, type InputProblem } from '../errors/inputError.js';
import { jsonText } from '../io/planOutputs.js';
import { quantileForecastCsv, scenarioPathsCsv } from '../io/quantileForecastCsv.js';
import { readPriceHistory } from '../io/readPriceHistory.js';
import { readMarketSpec } from '../io/readSpecs.js';
import { shownText } from '../errors/shownText.js';
import { checkOutputFolder, writeOutputs } from '../io/writeOutputs.js';
import { oneOf, parseDayArg, parsePathArg } from './argParsers.js';
import { addInputOptions, resolveInputs, type InputFlags } from './inputOptions.js';
import { parseLevelsArg } from './levelsArg.js';
import { createProgress } from './progress.js';
import type { CliIo } from './cliIo.js';

export interface ForecastFlags extends InputFlags {
  readonly from?: string;
  readonly to?: string;
  readonly method: ForecastMethod;
  readonly levels: readonly number[];
  readonly paths: number;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly quiet?: boolean;
}

/** Defaults of `quantbid forecast`: the method of docs/forecast-quality.md, 19 levels, no paths. */
export const FORECAST_COMMAND_DEFAULTS = Object.freeze({ method: DEFAULT_METHOD, levels: '0.05:0.95:0.05', paths: 0 });

const INPUTS = ['market', 'history'] as const;

/** `--paths S`: a whole number of scenario paths per day, 0 to calibrationDays. */
export function parsePathCountArg(value: string): number {
  const count = Number(value);
  if (!/^\d+$/.test(value.trim()) || count > DEFAULTS.calibrationDays) {
    throw new InvalidArgumentError(`"${shownText(value)}" must be a whole number of paths from 0 to ${DEFAULTS.calibrationDays} (one per calibration day at most)`);
  }
  return count;
}

export function forecastCommand(io: CliIo): Command {
  const command = new Command('forecast')
    .description('quantile forecasts of day-ahead prices from price history, day by day, each from the days before it only')
    .option('--from <YYYY-MM-DD>', 'first delivery day (required)', parseDayArg)
    .option('--to <YYYY-MM-DD>', 'last delivery day, included (required)', parseDayArg)
    .option('--method <name>', `${FORECAST_METHODS.join(' | ')} (docs/forecast-quality.md compares them)`, oneOf<ForecastMethod>(FORECAST_METHODS), FORECAST_COMMAND_DEFAULTS.method)
    .addOption(
      new Option('--levels <list>', 'quantile levels in (0, 1): a range start:end:step or a list 0.1,0.5,0.9')
        .argParser(parseLevelsArg)
        .default(parseLevelsArg(FORECAST_COMMAND_DEFAULTS.levels), FORECAST_COMMAND_DEFAULTS.levels),
    )
    .option('--paths <S>', 'also write S whole-day scenario paths per day to paths.csv', parsePathCountArg, FORECAST_COMMAND_DEFAULTS.paths)
    .option('--out <dir|file.csv>', 'folder for quantiles.csv, forecast.json and (with --paths) paths.csv, or the quantile file itself, NAME.json and NAME.paths.csv going beside it (required)', parsePathArg)
    .option('--quiet', 'no progress bar and no notes on stderr, even on a terminal')
    .option('--force', 'overwrite existing outputs')
    .option('--json', 'print the summary (forecast.json) on stdout');
  addInputOptions(command, INPUTS);
  command.addHelpText(
    'after',
    `
Outputs, in the folder --out (or, for --out DIR/NAME.csv, NAME.csv, NAME.json and NAME.paths.csv in DIR):
  quantiles.csv  wide quantile forecast period_start,q0.05,...,q0.95 (the layout --forecast reads);
                 days that could not be forecast are left out and listed in forecast.json
  paths.csv      with --paths S: period_start,path,price, per day S whole-day price curves
                 (the day's point forecast plus the errors of one calibration day, period by
                 period, most recent day first: paths keep the dependence between periods)
  forecast.json  method, levels, options, days forecast and skipped with the reason; the same
                 inputs give byte-identical files (the time spent is printed, not written)

Examples:
  quantbid forecast --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-12-31 --out runs/fc
  quantbid forecast --market market.json --history history.csv --from 2026-06-01 --to 2026-06-30 \\
                    --method qra --levels 0.1,0.5,0.9 --paths 20 --out runs/june
  quantbid score --scenario scenarios/halvorn/scenario.json --forecast runs/fc/quantiles.csv --out runs/fc-score`,
  );
  command.action((flags: ForecastFlags) => runForecast(flags, io));
  return command;
}

export function runForecast(flags: ForecastFlags, io: CliIo): void {
  const { from, to, out: outArg } = requiredFlags(flags);
  const { paths } = resolveInputs(flags, INPUTS);
  const target = outputTarget(outArg);
  const out = target.dir;
  const outputs = [target.quantiles, ...(flags.paths > 0 ? [target.paths] : []), target.summary];
  checkOutputFolder(out, outputs, flags.force === true);
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => readMarketSpec(paths.market));
  const history = market === undefined ? undefined : gatherProblems(problems, () => readPriceHistory(paths.history, market));
  if (market === undefined || history === undefined) throw new InputError(problems);

  const started = performance.now();
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const progress = createProgress(io, { total: daysBetween(from, to).length, label: 'forecast', quiet: flags.quiet === true });
  const result = forecastRange(
    history,
    { from, to, method: flags.method, levels: flags.levels, priceFloor: market.priceFloor, priceCap: market.priceCap, periodsOf: (day) => calendar.periods(day) },
    { scenarioPaths: flags.paths },
    (done) => progress.update(done),
  );
  progress.finish();
  if (result.forecasts.length === 0) throw nothingForecast(result, paths.history, from, to);
  const elapsedSeconds = (performance.now() - started) / 1000;
  const summary = forecastSummary(flags, { from, to, inputs: paths, outputs, result });
  writeOutputs(
    out,
    [
      { name: target.quantiles, text: quantileForecastCsv(result.forecasts.map((f) => f.quantiles)) },
      ...(flags.paths > 0 ? [{ name: target.paths, text: scenarioPathsCsv(result.forecasts.map((f) => ({ periods: f.quantiles.periods, paths: f.paths }))) }] : []),
      { name: target.summary, text: jsonText(summary) },
    ],
    flags.force === true,
  );
  io.stdout(flags.json === true ? jsonText(summary) : forecastSummaryText(summary, out, elapsedSeconds));
}

function requiredFlags(flags: ForecastFlags): { from: string; to: string; out: string } {
  return requireSpanAndOut(flags, { days: 'delivery day to forecast', outFolder: 'quantiles.csv and forecast.json' });
}

function nothingForecast(result: ForecastRangeResult, historyFile: string, from: string, to: string): InputError {
  const first = result.skipped[0];
  return new InputError([
    {
      file: historyFile,
      message: `no day from ${from} to ${to} could be forecast (${result.skipped.length} skipped; ${first?.day}: ${first?.reason})`,
      fix: 'choose days the history covers, after enough history for the method',
    },
  ]);
}

interface SummaryContext {
  readonly from: string;
  readonly to: string;
  readonly inputs: Record<(typeof INPUTS)[number], string>;
  readonly outputs: readonly string[];
  readonly result: ForecastRangeResult;
}

/** The content of forecast.json and of `--json`. */
function forecastSummary(flags: ForecastFlags, context: SummaryContext) {
  const { forecasts, skipped, clampedValues } = context.result;
  return {
    method: flags.method,
    levels: [...flags.levels],
    paths: flags.paths,
    from: context.from,
    to: context.to,
    inputs: { ...context.inputs },
    options: { ...DEFAULTS, scenarioPaths: flags.paths },
    days: {
      forecast: forecasts.length,
      first: forecasts[0]?.quantiles.day ?? null,
      last: forecasts[forecasts.length - 1]?.quantiles.day ?? null,
      skipped: skipped.length,
      skippedDays: skipped,
    },
    crossedPeriodsSorted: forecasts.reduce((sum, f) => sum + f.crossedSlots, 0),
    pricesClampedToFloorOrCap: clampedValues,
    notes: [...new Set(forecasts.flatMap((f) => f.notes))],
    outputs: [...context.outputs],
  };
}

/** The human summary on stdout; the time spent is shown here only, so that forecast.json stays byte-identical between runs. */
function forecastSummaryText(summary: ReturnType<typeof forecastSummary>, out: string, elapsedSeconds: number): string {
  const { days } = summary;
  const lines = [
    `forecast ${summary.method} at ${summary.levels.length} levels (${summary.levels[0]}..${summary.levels[summary.levels.length - 1]}), ${summary.from} to ${summary.to}: ${days.forecast} days forecast (${days.first} to ${days.last}), ${days.skipped} skipped, ${formatNumber(elapsedSeconds, 1)} s`,
    ...days.skippedDays.slice(0, 5).map((s) => `  skipped ${s.day}: ${s.reason}`),
    ...(days.skipped > 5 ? [`  ... and ${days.skipped - 5} more (see forecast.json)`] : []),
    `  wrote ${summary.outputs.map((name, i) => (i === 0 ? `${out}/${name}` : name)).join(', ')}`,
  ];
  return `${lines.join('\n')}\n`;
}

/**
 * Where the outputs go: `--out DIR` writes quantiles.csv, forecast.json and paths.csv into DIR;
 * `--out DIR/NAME.csv` writes the quantiles to that file, with NAME.json and NAME.paths.csv beside it.
 */
export function outputTarget(out: string): { readonly dir: string; readonly quantiles: string; readonly summary: string; readonly paths: string } {
  if (!/\.csv$/i.test(out)) return { dir: out, quantiles: 'quantiles.csv', summary: 'forecast.json', paths: 'paths.csv' };
  const file = basename(out);
  const stem = file.replace(/\.csv$/i, '');
  return { dir: dirname(out), quantiles: file, summary: `${stem}.json`, paths: `${stem}.paths.csv` };
}
