import { Command } from 'commander';
import type { PriceHistory } from '../types.js';
import { compareForecasts } from '../forecast/scoring/compareForecasts.js';
import { scoreForecasts, type ScoredDay } from '../forecast/scoring/scoreForecasts.js';
import { gatherProblems, InputError, type InputProblem } from '../errors/inputError.js';
import { jsonText } from '../io/planOutputs.js';
import { readPriceHistory } from '../io/readPriceHistory.js';
import { readQuantileForecast, type QuantileForecastFile } from '../io/readQuantileForecast.js';
import { readMarketSpec } from '../io/readSpecs.js';
import { scoreSummary, scoreSummaryText, type UnscoredDay } from '../io/scoreOutputs.js';
import { checkOutputFolder, writeOutputs } from '../io/writeOutputs.js';
import { scoreReport } from '../report/scoreReport.js';
import { parseDayArg, parsePathArg } from './argParsers.js';
import { addInputOptions, resolveInputs, type InputFlags } from './inputOptions.js';
import type { CliIo } from './cliIo.js';

export interface ScoreFlags extends InputFlags {
  readonly against?: string;
  readonly from?: string;
  readonly to?: string;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly report?: boolean;
}

const INPUTS = ['market', 'history', 'forecast'] as const;

export function scoreCommand(io: CliIo): Command {
  const command = new Command('score')
    .description('score a quantile forecast against the realised prices of a history: pinball, CRPS, coverage, calibration and their tests, per period of the day and overall')
    .option('--against <file>', 'a second quantile forecast (same levels): Diebold-Mariano test of the two on their common days', parsePathArg)
    .option('--from <YYYY-MM-DD>', 'score only days from this one (default: the first forecast day)', parseDayArg)
    .option('--to <YYYY-MM-DD>', 'score only days up to this one, included (default: the last forecast day)', parseDayArg)
    .option('--out <dir>', 'folder for score.json (required)', parsePathArg)
    .option('--report', 'also write report.html into --out: calibration chart, pinball loss by level and by period of the day')
    .option('--force', 'overwrite an existing score.json')
    .option('--json', 'print score.json on stdout');
  addInputOptions(command, INPUTS);
  command.addHelpText(
    'after',
    `
Only days present in both the forecast and the history are scored; the other forecast days are
listed in score.json with the reason (a forecast with no day in the history is an error, exit
code 2). score.json holds crps (the mean pinball loss over the levels:
the factor 2 is not included, so it approximates CRPS/2), pinball.<level>, coverage.<interval>
(e.g. coverage["0.8"] for [q0.1, q0.9]), calibration.<level> (share of prices below the quantile),
Kupiec and Christoffersen tests of each central interval, all overall and per period of the day
(byPeriod), and with --against the Diebold-Mariano test (HLN-corrected, h = 1, on the daily crps).

Examples:
  quantbid score --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-12-31 --out runs/vendor-score --report
  quantbid score --scenario scenarios/halvorn/scenario.json --forecast runs/fc/quantiles.csv \\
                 --against scenarios/halvorn/quantiles.csv.gz --out runs/fc-score
  quantbid score --market market.json --history history.csv --forecast quantiles.csv --out runs/score --json`,
  );
  command.action((flags: ScoreFlags) => runScore(flags, io));
  return command;
}

export function runScore(flags: ScoreFlags, io: CliIo): void {
  const out = requiredFlags(flags);
  const { paths } = resolveInputs(flags, INPUTS);
  const outputs = flags.report === true ? ['score.json', 'report.html'] : ['score.json'];
  checkOutputFolder(out, outputs, flags.force === true);
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => readMarketSpec(paths.market));
  const read = <T>(reader: (m: NonNullable<typeof market>) => T): T | undefined => (market === undefined ? undefined : gatherProblems(problems, () => reader(market)));
  const history = read((m) => readPriceHistory(paths.history, m));
  const forecast = read((m) => readQuantileForecast(paths.forecast, m));
  const against = flags.against === undefined ? null : read((m) => readQuantileForecast(flags.against as string, m));
  if (market === undefined || history === undefined || forecast === undefined || against === undefined) throw new InputError(problems);

  const range = { from: flags.from ?? '0000-01-01', to: flags.to ?? '9999-12-31' };
  const matched = matchDays(forecast, history, range);
  if (matched.scored.length === 0) throw noCommonDays(forecast, history, paths.history);
  const comparison = against === null ? null : compareOnCommonDays(matched.scored, against, history, range);
  const scored = {
    inputs: { ...paths, ...(against === null ? {} : { against: against.file }) },
    currency: market.currency,
    table: scoreForecasts(matched.scored),
    days: matched.scored.map((s) => s.forecast.day),
    unscored: matched.unscored,
    comparison,
  };
  const summary = scoreSummary(scored);
  const report = flags.report === true ? [{ name: 'report.html', text: scoreReport({ ...scored, timeZone: market.timeZone, periodMinutes: market.periodMinutes }) }] : [];
  writeOutputs(out, [{ name: 'score.json', text: jsonText(summary) }, ...report], flags.force === true, ['report.html']);
  reportRepairs(io, [forecast, ...(against === null ? [] : [against])]);
  io.stdout(flags.json === true ? jsonText(summary) : scoreSummaryText(summary, out, outputs));
}

function requiredFlags(flags: ScoreFlags): string {
  const problems: InputProblem[] = [];
  if (flags.out === undefined) problems.push({ file: 'command line', field: '--out', message: 'no --out given', fix: 'give --out DIR, the folder for score.json' });
  if (flags.from !== undefined && flags.to !== undefined && flags.from > flags.to) {
    problems.push({ file: 'command line', field: '--to', message: `--to ${flags.to} is before --from ${flags.from}`, fix: 'give a --to on or after --from' });
  }
  if (problems.length > 0) throw new InputError(problems);
  return flags.out as string;
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
  const other = new Map(matchDays(against, history, range).scored.map((s) => [s.forecast.day, s]));
  const first = scored.filter((s) => other.has(s.forecast.day));
  if (first.length < 2) {
    throw new InputError([{ file: against.file, field: 'period_start', message: `only ${first.length} scored day in common with the forecast`, fix: 'compare forecasts of at least two common days of the history' }]);
  }
  return compareForecasts(first, first.map((s) => other.get(s.forecast.day) as ScoredDay));
}

/** Crossing quantiles are repaired by the reader, not refused (docs/design.md section 6); said on stderr. */
function reportRepairs(io: CliIo, files: readonly QuantileForecastFile[]): void {
  for (const file of files) {
    if (file.repairedPeriods > 0) {
      io.stderr(`note: ${file.file}: ${file.repairedPeriods} periods had crossing quantiles, sorted into order (monotone rearrangement), e.g. ${file.repairedExamples[0] ?? ''}\n`);
    }
  }
}
