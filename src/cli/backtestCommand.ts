import { requireGridFlags } from './gridArgs.js';
import { Command, InvalidArgumentError } from 'commander';
import { batteryModel } from '../battery/batterySpec.js';
import { daysBetween } from '../market/calendar.js';
import { backtestMetrics } from '../backtest/backtestMetrics.js';
import { BACKTEST_POLICIES, type BacktestPolicy } from '../backtest/backtestPolicy.js';
import { BACKTEST_DEFAULTS, runBacktest, type BacktestDay } from '../backtest/runBacktest.js';
import { backtestSummary, backtestSummaryText, daysCsv, LEDGER_COLUMNS, ledgerRows } from '../io/backtestOutputs.js';
import { backtestReport } from '../report/backtestReport.js';
import { InputError } from '../errors/inputError.js';
import { jsonText } from '../io/planOutputs.js';
import { readInputFile } from '../io/readInputFile.js';
import { readPriceHistory } from '../io/readPriceHistory.js';
import { parseQuantileForecast } from '../io/readQuantileForecast.js';
import { readBatterySpec, readMarketSpec } from '../io/readSpecs.js';
import { checkOutputFolder, OutputStage } from '../io/writeOutputs.js';
import { chooseFallbackSource } from '../settle/fallbackPrices.js';
import { UNACCEPTED_RULES, type UnacceptedRule } from '../settle/settleDay.js';
import { oneOf, parseAlphaArg, parseDayArg } from './argParsers.js';
import { addInputOptions, type InputFlags } from './inputOptions.js';
import type { CliIo } from './cliIo.js';
import { createProgress } from './progress.js';
import { addModelOptions, inputsShown, makeModelForecast, modelLevels, resolveBacktestInputs, type ModelFlags } from './modelOptions.js';

export interface BacktestFlags extends InputFlags, ModelFlags {
  readonly from?: string;
  readonly to?: string;
  readonly alpha: number;
  readonly unaccepted: UnacceptedRule;
  readonly policies: readonly BacktestPolicy[];
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly report?: boolean;
  readonly quiet?: boolean;
}

const BACKTEST_OUTPUTS = ['ledger.csv', 'days.csv', 'summary.json'] as const;
const INPUTS = ['market', 'battery', 'forecast', 'history'] as const;

/** `--policies quantile,point,...`: known names, each once. */
export function parsePoliciesArg(value: string): BacktestPolicy[] {
  const names = value.split(',').map((s) => s.trim());
  const known = BACKTEST_POLICIES as readonly string[];
  const unknown = names.filter((name) => !known.includes(name));
  if (unknown.length > 0) throw new InvalidArgumentError(`"${unknown.join(', ')}" is not a policy; choose from ${BACKTEST_POLICIES.join(', ')}`);
  if (new Set(names).size !== names.length) throw new InvalidArgumentError('each policy may appear once');
  return names as BacktestPolicy[];
}

export function backtestCommand(io: CliIo): Command {
  const command = new Command('backtest')
    .description('replay the policies day by day over history: what the quantile policy would have earned, against point and perfect foresight')
    .option('--from <YYYY-MM-DD>', 'first delivery day (required)', parseDayArg)
    .option('--to <YYYY-MM-DD>', 'last delivery day, included (required)', parseDayArg)
    .option('--alpha <a>', 'central interval [q(alpha), q(1-alpha)] of the quantile and median policies', parseAlphaArg, BACKTEST_DEFAULTS.alpha)
    .option('--unaccepted <rule>', 'unaccepted orders: follow-plan (close them at the fallback price) | follow-accepted (move only with accepted orders)', oneOf<UnacceptedRule>(UNACCEPTED_RULES), BACKTEST_DEFAULTS.unaccepted)
    .option('--policies <list>', `comma-separated, from ${BACKTEST_POLICIES.join(', ')}`, parsePoliciesArg, [...BACKTEST_DEFAULTS.policies])
    .option('--out <dir>', 'folder for ledger.csv, days.csv and summary.json (required)')
    .option('--report', 'also write report.html into --out: cumulative profit, daily profit, acceptance, fallback energy, month table')
    .option('--quiet', 'no progress bar and no notes on stderr, even on a terminal')
    .option('--force', 'overwrite existing outputs')
    .option('--json', 'print the summary as JSON on stdout');
  addInputOptions(command, INPUTS);
  addModelOptions(command);
  command.addHelpText(
    'after',
    `
Examples:
  quantbid backtest --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-01-31 --out runs/jan --report
  quantbid backtest --market market.json --battery battery.json --forecast quantiles.csv --history history.csv \\
                    --from 2025-01-01 --to 2025-12-31 --alpha 0.2 --unaccepted follow-accepted --out runs/2025
  quantbid backtest --scenario scenarios/halvorn/scenario.json --from 2026-06-01 --to 2026-06-30 \\
                    --policies quantile,point,perfect-foresight --out runs/june --json
  quantbid backtest --scenario scenarios/halvorn/scenario.json --from 2026-03-01 --to 2026-03-31 \\
                    --model arx-hs --levels 0.05:0.95:0.05 --out runs/march-arx`,
  );
  command.action((flags: BacktestFlags) => runBacktestCommand(flags, io));
  return command;
}

export function runBacktestCommand(flags: BacktestFlags, io: CliIo): void {
  const { from, to, out } = requireGridFlags(flags, 'ledger.csv, days.csv');
  const { paths } = resolveBacktestInputs(flags, INPUTS);
  const outputs = flags.report === true ? [...BACKTEST_OUTPUTS, 'report.html'] : BACKTEST_OUTPUTS;
  checkOutputFolder(out, outputs, flags.force === true);
  const market = readMarketSpec(paths.market);
  const battery = batteryModel(readBatterySpec(paths.battery));
  const history = readPriceHistory(paths.history, market);
  const forecastFile = paths.forecast === undefined ? undefined : parseQuantileForecast(readInputFile(paths.forecast), paths.forecast, market);
  if (chooseFallbackSource(history, market) === null) {
    throw new InputError([
      { file: paths.history, field: 'fallback_price', message: 'the history has no fallback_price column and the market spec has no fallback rule', fix: `add a fallback_price column to the history, or "fallback": {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15} to ${paths.market}` },
    ]);
  }
  checkForecastLevels(flags, forecastFile?.levels ?? modelLevels(flags), forecastFile?.file ?? `--model ${flags.model}`);
  // With --model the forecasts are made here, day by day from the history (through the forecast cache).
  const model = flags.model === undefined ? undefined : makeModelForecast({ ...flags, model: flags.model }, market, history, paths.history, from, to, io);
  const forecast = model?.file ?? (forecastFile as NonNullable<typeof forecastFile>);
  // A progress bar on stderr, drawn only when stderr is a terminal and not --quiet (createProgress decides).
  const progress = createProgress(io, { total: daysBetween(from, to).length, label: 'backtest', quiet: flags.quiet === true });
  const onDay = ({ done }: { done: number }): void => progress.update(done);
  // ledger.csv goes into the output stage day by day (writeOutputs.ts): ten years keep no ledger in memory.
  const stage = OutputStage.begin(out, outputs, flags.force === true, ['report.html']);
  try {
    const ledger = stage.open('ledger.csv');
    ledger.append(`${LEDGER_COLUMNS.join(',')}\n`);
    const onLedgerDay = (day: BacktestDay): void => ledger.append(ledgerRows(day));
    const result = runBacktest({ market, battery, history, forecast, from, to }, { alpha: flags.alpha, unaccepted: flags.unaccepted, policies: flags.policies, onDay, keepLedger: false, onLedgerDay });
    progress.finish();
    const metrics = backtestMetrics(result, battery);
    const inputs = inputsShown(paths, flags.model);
    const summary = { ...backtestSummary(result, metrics, { market, battery, inputs }), ...(model === undefined ? {} : { forecastModel: model.summary }) };
    stage.write('days.csv', daysCsv(result));
    stage.write('summary.json', jsonText(summary));
    if (flags.report === true) stage.write('report.html', backtestReport({ result, metrics, market, battery, inputs }));
    stage.commit();
    io.stdout(flags.json === true ? jsonText(summary) : `${backtestSummaryText(result, metrics, market, out, outputs)}${model?.note ?? ''}`);
  } finally {
    stage.discard();
  }
}


/**
 * Every level a chosen policy reads must lie within the forecast's levels (no extrapolation): alpha and
 * 1 - alpha for quantile and median, 0.5 for median, point and price-taking.
 */
function checkForecastLevels(flags: BacktestFlags, levels: readonly number[], file: string): void {
  const lowest = levels[0] ?? Number.NaN;
  const highest = levels[levels.length - 1] ?? Number.NaN;
  const needed = new Set<number>();
  for (const policy of flags.policies) {
    if (policy === 'quantile' || policy === 'median') [flags.alpha, Number((1 - flags.alpha).toFixed(12))].forEach((level) => needed.add(level));
    if (policy === 'median' || policy === 'point' || policy === 'price-taking') needed.add(0.5);
  }
  const outside = [...needed].filter((level) => level < lowest - 1e-9 || level > highest + 1e-9).sort((a, b) => a - b);
  if (outside.length > 0) {
    throw new InputError([
      { file, field: '--alpha', message: `the policies need the levels ${outside.join(' and ')}, outside the forecast's levels [${lowest}, ${highest}]`, fix: `choose --alpha so that alpha and 1 - alpha lie within [${lowest}, ${highest}], or give a forecast with those levels` },
    ]);
  }
}
