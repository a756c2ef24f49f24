import { z } from 'zod';
import { gatherProblems, InputError, type InputProblem } from '../../errors/inputError.js';
import { compareForecasts } from '../../forecast/scoring/compareForecasts.js';
import { scoreForecasts, type ScoredDay } from '../../forecast/scoring/scoreForecasts.js';
import { jsonText } from '../../io/planOutputs.js';
import { readPriceHistory } from '../../io/readPriceHistory.js';
import { readQuantileForecast, type QuantileForecastFile } from '../../io/readQuantileForecast.js';
import { readScenarioPaths, type ScenarioPathsFile } from '../../io/readScenarioPaths.js';
import { scorePaths, type ScoredPathDay } from '../../forecast/scoring/scorePaths.js';
import { readMarketSpec } from '../../io/readSpecs.js';
import type { OutputLock } from '../../io/outputLock.js';
import { checkOutputFolder, writeOutputs } from '../../io/writeOutputs.js';
import { scoreReport, type UnscoredDay } from '../../report/scoreReport.js';
import type { PriceHistory } from '../../types.js';
import type { Done } from '../commandResult.js';
import { inputFiles, runInputFiles } from '../inputFiles.js';
import { lockedRun } from '../lockedRun.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { checkSpan, daySchema, inputSourcesSchema, outFolderSchema, pathSchema, validSettings } from '../settingSchemas.js';
import { scoreSummary, scoreSummaryText, type PathScoresInput } from './scoreSummary.js';

/** The settings of `quantbid score`, checked once when it starts. */
export const scoreSettingsSchema = z
  .strictObject({
    /** The market, history and forecast files, or a scenario naming them. */
    inputs: inputSourcesSchema,
    /** A second quantile forecast at the same levels, compared with the first (Diebold-Mariano). */
    against: pathSchema.optional(),
    /** Whole-day scenario paths (paths.csv of `quantbid forecast --paths`), scored by the energy and variogram scores. */
    paths: pathSchema.optional(),
    /** Score only days from `from` to `to`, both included; default every forecast day. */
    from: daySchema.optional(),
    to: daySchema.optional(),
    /** Folder for score.json (and report.html). */
    out: outFolderSchema,
    /** Overwrite existing outputs. */
    force: z.boolean().default(false),
    /** Also write report.html. */
    report: z.boolean().default(false),
  })
  .superRefine(checkSpan);

export type ScoreSettings = z.input<typeof scoreSettingsSchema>;

export type ScoreSummary = ReturnType<typeof scoreSummary>;

const INPUTS = ['market', 'history', 'forecast'] as const;

/**
 * `quantbid score`: the forecast's days that the history has, scored against the realised prices
 * (scoreForecasts), with `against` a Diebold-Mariano comparison on their common days; score.json and,
 * when asked, report.html.
 */
export function scoreUseCase(settings: ScoreSettings, hooks: RunHooks = QUIET_HOOKS): Done<ScoreSummary> {
  const s = validSettings(scoreSettingsSchema, settings, 'score');
  const { paths } = inputFiles(s.inputs, INPUTS);
  const outputs = s.report ? ['score.json', 'report.html'] : ['score.json'];
  checkOutputFolder(s.out, outputs, s.force, runInputFiles(s.inputs, paths, { 'the --against forecast': s.against }));
  return lockedRun(s.out, 'score', (lock) => scoreRun(s, paths, outputs, lock as OutputLock, hooks));
}

/** The scores of the checked settings, from reading the inputs to score.json, under the output folder's lock. */
function scoreRun(s: z.output<typeof scoreSettingsSchema>, paths: Record<(typeof INPUTS)[number], string>, outputs: readonly string[], lock: OutputLock, hooks: RunHooks): Done<ScoreSummary> {
  const problems: InputProblem[] = [];
  const note = (text: string): void => hooks.note(text);
  const market = gatherProblems(problems, () => readMarketSpec(paths.market, note));
  const read = <T>(reader: (m: NonNullable<typeof market>) => T): T | undefined => (market === undefined ? undefined : gatherProblems(problems, () => reader(market)));
  const history = read((m) => readPriceHistory(paths.history, m, note));
  const forecast = read((m) => readQuantileForecast(paths.forecast, m));
  const against = s.against === undefined ? null : read((m) => readQuantileForecast(s.against as string, m));
  const pathsFile = s.paths === undefined ? null : read((m) => readScenarioPaths(s.paths as string, m));
  if (market === undefined || history === undefined || forecast === undefined || against === undefined || pathsFile === undefined) throw new InputError(problems);

  const range = { from: s.from ?? '0000-01-01', to: s.to ?? '9999-12-31' };
  const matched = matchDays(forecast, history, range);
  if (matched.scored.length === 0) throw noCommonDays(forecast, history, paths.history);
  const comparison = against === null ? null : compareOnCommonDays(matched.scored, against, history, range);
  const scored = {
    inputs: { ...paths, ...(against === null ? {} : { against: against.file }), ...(pathsFile === null ? {} : { paths: pathsFile.file }) },
    currency: market.currency,
    table: scoreForecasts(matched.scored),
    days: matched.scored.map((d) => d.forecast.day),
    unscored: matched.unscored,
    comparison,
  };
  const summary = scoreSummary(scored, pathsFile === null ? null : scoreScenarioPaths(pathsFile, history, range));
  const report = s.report ? [{ name: 'report.html', text: scoreReport({ ...scored, timeZone: market.timeZone, periodMinutes: market.periodMinutes }) }] : [];
  writeOutputs(s.out, [{ name: 'score.json', text: jsonText(summary) }, ...report], s.force, ['report.html'], lock);
  // Crossing quantiles are repaired by the reader, not refused (docs/design.md section 6): a note.
  for (const file of [forecast, ...(against === null ? [] : [against])]) {
    if (file.repairedPeriods > 0) {
      hooks.note(`note: ${file.file}: ${file.repairedPeriods} periods had crossing quantiles, sorted into order (monotone rearrangement), e.g. ${file.repairedExamples[0] ?? ''}\n`);
    }
  }
  return { status: 'done', summary, text: scoreSummaryText(summary, s.out, outputs) };
}

/**
 * The forecast's complete days within the range that the history has, with their realised prices,
 * in day order; every other forecast day of the range is listed with the reason.
 */
function matchDays(file: QuantileForecastFile, history: PriceHistory, range: { from: string; to: string }): { scored: ScoredDay[]; unscored: UnscoredDay[] } {
  const inRange = (day: string) => day >= range.from && day <= range.to;
  const realised = new Map(history.days.map((d) => [d.day, d.pricePerMwh]));
  const incompleteInHistory = new Map(history.incompleteDays.map((d) => [d.day, d.reason]));
  const scored: ScoredDay[] = [];
  const unscored: UnscoredDay[] = file.incompleteDays.filter((d) => inRange(d.day)).map((d) => ({ day: d.day, reason: `incomplete in the forecast: ${d.reason}` }));
  for (const [day, forecast] of [...file.days].sort(([a], [b]) => (a < b ? -1 : 1))) {
    if (!inRange(day)) continue;
    const prices = realised.get(day);
    if (prices !== undefined) scored.push({ forecast, realised: prices });
    else {
      const reason = incompleteInHistory.get(day);
      unscored.push({ day, reason: reason === undefined ? 'not in the history: no realised prices' : `incomplete in the history: ${reason}` });
    }
  }
  unscored.sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  return { scored, unscored };
}

function noCommonDays(file: QuantileForecastFile, history: PriceHistory, historyFile: string): InputError {
  const days = [...file.days.keys()].sort();
  const span = (list: readonly string[]) => (list.length === 0 ? 'no complete day' : `${list[0]} to ${list[list.length - 1]}`);
  return new InputError([
    {
      file: file.file,
      field: 'period_start',
      message: `no day to score: the forecast covers ${span(days)}, the history ${historyFile} ${span(history.days.map((d) => d.day))} (within --from/--to where given)`,
      fix: 'score a forecast of days the history covers, or give the history of the forecast days',
    },
  ]);
}

/** Diebold-Mariano comparison of the scored days that `against` also forecasts. */
function compareOnCommonDays(scored: readonly ScoredDay[], against: QuantileForecastFile, history: PriceHistory, range: { from: string; to: string }) {
  const levels = scored[0]?.forecast.levels ?? [];
  if (against.levels.length !== levels.length || against.levels.some((tau, k) => tau !== levels[k])) {
    throw new InputError([
      { file: against.file, field: 'header', message: `its levels (${against.levels.join(', ')}) differ from the forecast's (${levels.join(', ')})`, fix: 'compare forecasts made at the same levels: their mean pinball losses are comparable only then' },
    ]);
  }
  const other = new Map(matchDays(against, history, range).scored.map((d) => [d.forecast.day, d]));
  const first = scored.filter((d) => other.has(d.forecast.day));
  if (first.length < 2) {
    throw new InputError([{ file: against.file, field: 'period_start', message: `only ${first.length} scored day in common with the forecast`, fix: 'compare forecasts of at least two common days of the history' }]);
  }
  return compareForecasts(first, first.map((d) => other.get(d.forecast.day) as ScoredDay));
}

/** Energy and variogram scores of the paths file's complete days within the range that the history has. */
function scoreScenarioPaths(file: ScenarioPathsFile, history: PriceHistory, range: { from: string; to: string }): PathScoresInput {
  const realised = new Map(history.days.map((d) => [d.day, d.pricePerMwh]));
  const days: ScoredPathDay[] = [];
  const unscoredDays: UnscoredDay[] = [];
  for (const [day, paths] of [...file.days].sort(([a], [b]) => (a < b ? -1 : 1))) {
    if (day < range.from || day > range.to) continue;
    const prices = realised.get(day);
    if (prices === undefined) unscoredDays.push({ day, reason: 'not in the history: no realised prices' });
    else days.push({ day, paths, realised: prices });
  }
  if (days.length === 0) {
    throw new InputError([{ file: file.file, field: 'period_start', message: 'no day of the paths file has realised prices in the history (within --from/--to where given)', fix: 'score paths of days the history covers' }]);
  }
  unscoredDays.sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  return { file: file.file, scores: scorePaths(days), unscoredDays };
}
