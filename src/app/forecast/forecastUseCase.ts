import { basename, dirname } from 'node:path';
import { z } from 'zod';
import { gatherProblems, InputError, type InputProblem } from '../../errors/inputError.js';
import { chosenMethodsRecord, choiceLabel } from '../../forecast/autoChoices.js';
import { DEFAULTS, FORECAST_METHODS, MAX_PATHS } from '../../forecast/forecaster.js';
import { forecastRange, type ForecastRangeResult } from '../../forecast/forecastRange.js';
import { formatNumber } from '../../io/formatNumber.js';
import { jsonText } from '../../io/planOutputs.js';
import { quantileForecastCsv, scenarioPathsCsv } from '../../io/quantileForecastCsv.js';
import { readPriceHistory } from '../../io/readPriceHistory.js';
import { readMarketSpec } from '../../io/readSpecs.js';
import type { OutputLock } from '../../io/outputLock.js';
import { checkOutputFolder, writeOutputs } from '../../io/writeOutputs.js';
import { daysBetween } from '../../market/calendar.js';
import { DayCalendar } from '../../market/dayCalendar.js';
import { FORECAST_DEFAULTS } from '../commandDefaults.js';
import type { Done } from '../commandResult.js';
import { inputFiles, runInputFiles } from '../inputFiles.js';
import { lockedRun } from '../lockedRun.js';
import { defaultLevels } from '../modelForecast.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { outFolderProblem } from '../settingRules.js';
import { checkSpan, daySchema, inputSourcesSchema, levelsSchema, validSettings } from '../settingSchemas.js';

export { FORECAST_DEFAULTS } from '../commandDefaults.js';

/** The settings of `quantbid forecast`, checked once when it starts. */
export const forecastSettingsSchema = z
  .strictObject({
    /** The market and history files, or a scenario naming them. */
    inputs: inputSourcesSchema,
    /** First and last delivery day to forecast, YYYY-MM-DD, both included. */
    from: daySchema,
    to: daySchema,
    /** Forecast method; default auto. */
    method: z.enum(FORECAST_METHODS).default(FORECAST_DEFAULTS.method),
    /** Quantile levels; default 0.05 to 0.95 in steps of 0.05. */
    levels: levelsSchema.optional(),
    /** Whole-day scenario paths per day written to paths.csv, 0 to MAX_PATHS; default 0. */
    scenarioPaths: z.number().int().min(0).max(MAX_PATHS).default(FORECAST_DEFAULTS.paths),
    /** Seed of the paths (each day draws with its own seed made from it); default 1. */
    pathSeed: z.number().int().min(0).max(2 ** 32 - 1).default(FORECAST_DEFAULTS.pathSeed),
    /** Folder for quantiles.csv and forecast.json, or the quantile file itself (NAME.csv). */
    out: z.string().superRefine((out, ctx) => {
      const problem = outFolderProblem(out, 'folder-or-csv-file');
      if (problem !== null) ctx.addIssue({ code: 'custom', message: problem });
    }),
    /** Overwrite existing outputs. */
    force: z.boolean().default(false),
  })
  .superRefine(checkSpan);

export type ForecastSettings = z.input<typeof forecastSettingsSchema>;
type CheckedSettings = z.output<typeof forecastSettingsSchema> & { readonly levels: readonly number[] };

export type ForecastSummary = ReturnType<typeof forecastSummary>;

const INPUTS = ['market', 'history'] as const;

/**
 * `quantbid forecast`: quantile forecasts of each day of the span from the days before it only
 * (forecastRange), written as quantiles.csv (the layout --forecast reads), forecast.json and, with
 * scenario paths, paths.csv.
 */
export function forecastUseCase(settings: ForecastSettings, hooks: RunHooks = QUIET_HOOKS): Done<ForecastSummary> {
  const checked = validSettings(forecastSettingsSchema, settings, 'forecast');
  const s: CheckedSettings = { ...checked, levels: checked.levels ?? defaultLevels() };
  const { paths } = inputFiles(s.inputs, INPUTS);
  const target = outputTarget(s.out);
  const out = target.dir;
  const outputs = [target.quantiles, ...(s.scenarioPaths > 0 ? [target.paths] : []), target.summary];
  checkOutputFolder(out, outputs, s.force, runInputFiles(s.inputs, paths));
  return lockedRun(out, 'forecast', (lock) => forecastRun(s, paths, { out, outputs, target, lock: lock as OutputLock }, hooks));
}

/** The forecasts of the checked settings, from reading the inputs to the outputs, under the output folder's lock. */
function forecastRun(
  s: CheckedSettings,
  paths: Record<(typeof INPUTS)[number], string>,
  run: { readonly out: string; readonly outputs: readonly string[]; readonly target: ReturnType<typeof outputTarget>; readonly lock: OutputLock },
  hooks: RunHooks,
): Done<ForecastSummary> {
  const { out, outputs, target } = run;
  const problems: InputProblem[] = [];
  const note = (text: string): void => hooks.note(text);
  const market = gatherProblems(problems, () => readMarketSpec(paths.market, note));
  const history = market === undefined ? undefined : gatherProblems(problems, () => readPriceHistory(paths.history, market, note));
  if (market === undefined || history === undefined) throw new InputError(problems);

  const started = performance.now();
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const progress = hooks.progress('forecast', daysBetween(s.from, s.to).length);
  const result = forecastRange(
    history,
    { from: s.from, to: s.to, method: s.method, levels: s.levels, priceFloor: market.priceFloor, priceCap: market.priceCap, periodsOf: (day) => calendar.periods(day) },
    { scenarioPaths: s.scenarioPaths, pathSeed: s.pathSeed },
    (done) => progress.update(done),
  );
  progress.finish();
  if (result.forecasts.length === 0) throw nothingForecast(result, paths.history, s.from, s.to);
  const elapsedSeconds = (performance.now() - started) / 1000;
  const summary = forecastSummary(s, { inputs: paths, outputs, result });
  writeOutputs(
    out,
    [
      { name: target.quantiles, text: quantileForecastCsv(result.forecasts.map((f) => f.quantiles)) },
      ...(s.scenarioPaths > 0 ? [{ name: target.paths, text: scenarioPathsCsv(result.forecasts.map((f) => ({ periods: f.quantiles.periods, paths: f.paths }))) }] : []),
      { name: target.summary, text: jsonText(summary) },
    ],
    s.force,
    [],
    run.lock,
  );
  return { status: 'done', summary, text: forecastSummaryText(summary, out, elapsedSeconds) };
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
  readonly inputs: Record<(typeof INPUTS)[number], string>;
  readonly outputs: readonly string[];
  readonly result: ForecastRangeResult;
}

/** The content of forecast.json and of `--json`. */
function forecastSummary(s: CheckedSettings, context: SummaryContext) {
  const { forecasts, skipped, clampedValues } = context.result;
  return {
    method: s.method,
    levels: [...s.levels],
    paths: s.scenarioPaths,
    pathSeed: s.pathSeed,
    from: s.from,
    to: s.to,
    inputs: { ...context.inputs },
    options: { ...DEFAULTS, scenarioPaths: s.scenarioPaths, pathSeed: s.pathSeed },
    days: {
      forecast: forecasts.length,
      first: forecasts[0]?.quantiles.day ?? null,
      last: forecasts[forecasts.length - 1]?.quantiles.day ?? null,
      skipped: skipped.length,
      skippedDays: skipped,
    },
    chosenMethods: chosenMethodsRecord(forecasts.flatMap((f) => (f.chosen === null ? [] : [{ ...f.chosen, day: f.quantiles.day }]))),
    crossedPeriodsSorted: forecasts.reduce((sum, f) => sum + f.crossedSlots, 0),
    pricesClampedToFloorOrCap: clampedValues,
    notes: [...new Set(forecasts.flatMap((f) => f.notes))],
    outputs: [...context.outputs],
  };
}

/** The human summary on stdout; the time spent is shown here only, so that forecast.json stays byte-identical between runs. */
function forecastSummaryText(summary: ForecastSummary, out: string, elapsedSeconds: number): string {
  const { days } = summary;
  const lines = [
    `forecast ${summary.method} at ${summary.levels.length} levels (${summary.levels[0]}..${summary.levels[summary.levels.length - 1]}), ${summary.from} to ${summary.to}: ${days.forecast} days forecast (${days.first} to ${days.last}), ${days.skipped} skipped, ${formatNumber(elapsedSeconds, 1)} s`,
    ...(summary.chosenMethods === null ? [] : [`  chosen: ${summary.chosenMethods.counts.map((c) => `${choiceLabel(c)} ${c.days} ${c.days === 1 ? 'day' : 'days'}`).join('; ')}`]),
    ...days.skippedDays.slice(0, 5).map((d) => `  skipped ${d.day}: ${d.reason}`),
    ...(days.skipped > 5 ? [`  ... and ${days.skipped - 5} more (see forecast.json)`] : []),
    `  wrote ${summary.outputs.map((name, i) => (i === 0 ? `${out}/${name}` : name)).join(', ')}`,
  ];
  return `${lines.join('\n')}\n`;
}

/**
 * Where the outputs go: `out` a folder takes quantiles.csv, forecast.json and paths.csv; `out`
 * `DIR/NAME.csv` is the quantile file itself, with NAME.json and NAME.paths.csv beside it.
 */
export function outputTarget(out: string): { readonly dir: string; readonly quantiles: string; readonly summary: string; readonly paths: string } {
  if (!/\.csv$/i.test(out)) return { dir: out, quantiles: 'quantiles.csv', summary: 'forecast.json', paths: 'paths.csv' };
  const file = basename(out);
  const stem = file.replace(/\.csv$/i, '');
  return { dir: dirname(out), quantiles: file, summary: `${stem}.json`, paths: `${stem}.paths.csv` };
}
