import type { GridResult } from '../io/sweepOutputs.js';
import { Command } from 'commander';
import { parseAxes, parseNumberAxis, parseWordAxis } from '../backtest/sweep/sweepAxis.js';
import type { SweepTaskInput } from '../backtest/sweepBacktestTask.js';
import { inputDataSpan } from '../io/inputDataSpan.js';
import { SWEEP_POLICIES } from '../backtest/sweepSettingRow.js';
import { jsonText } from '../io/planOutputs.js';
import { sweepSummary, sweepSummaryText } from '../io/sweepOutputs.js';
import { sweepReport } from '../report/sweepReport.js';
import { checkOutputFolder } from '../io/writeOutputs.js';
import { UNACCEPTED_RULES } from '../settle/settleDay.js';
import type { CliIo } from './cliIo.js';
import { addGridOptions, requireGridFlags, type GridFlags } from './gridArgs.js';
import { GRID_INPUTS, readGridInputs } from './gridInputs.js';
import { runGrid } from './gridRun.js';
import { addInputOptions, type InputFlags } from './inputOptions.js';
import { addModelOptions, gridInputFiles, gridModel, resolveBacktestInputs, type ModelFlags } from './modelOptions.js';
import { packageVersion } from './version.js';

export interface SweepFlags extends InputFlags, GridFlags, ModelFlags {
  readonly alphas: string;
  readonly policies: string;
  readonly unaccepted: string;
  readonly report?: boolean;
}

/** Defaults of the axes: alphas the demo forecast's levels (0.05 to 0.95) allow, both alpha policies, follow-plan. */
export const SWEEP_COMMAND_DEFAULTS = Object.freeze({ alphas: '0.05:0.45:0.05', policies: SWEEP_POLICIES.join(','), unaccepted: 'follow-plan' });

const OUTPUTS = ['sweep.csv', 'summary.json'] as const;

export function sweepCommand(io: CliIo): Command {
  const command = new Command('sweep')
    .description('backtest every setting of a grid of alpha x policy x unaccepted rule, in parallel, into sweep.csv (one row per setting)')
    .option('--alphas <list>', 'alphas: values and ranges start:end:step, e.g. 0.02:0.48:0.02 or 0.05,0.1,0.2', SWEEP_COMMAND_DEFAULTS.alphas)
    .option('--policies <list>', `policies whose orders depend on alpha: ${SWEEP_POLICIES.join(', ')}`, SWEEP_COMMAND_DEFAULTS.policies)
    .option('--unaccepted <list>', `rules for unaccepted orders: ${UNACCEPTED_RULES.join(', ')}`, SWEEP_COMMAND_DEFAULTS.unaccepted);
  addGridOptions(command, 'sweep.csv');
  command.option('--report', 'also write report.html into --out: profit and acceptance against alpha, best setting marked, top settings');
  addInputOptions(command, GRID_INPUTS);
  addModelOptions(command);
  command.addHelpText(
    'after',
    `
Columns of sweep.csv: alpha,policy,unaccepted, then days,profit,mean_daily_profit,capture_ratio,
perfect_foresight_profit,point_profit,edge_vs_point,p_value_vs_point (one-sided Diebold-Mariano/HLN
test that the setting earns more than the point policy), acceptance rates, fallback energy and cash,
cycles and the daily-profit risk measures. An interrupted sweep (Ctrl-C: exit code 130) resumes from
its journal in --out when run again with the same arguments.

Examples:
  quantbid sweep --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-03-31 --out runs/sweep-q1 --report
  quantbid sweep --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-12-31 \\
                 --alphas 0.05:0.45:0.025 --policies quantile --unaccepted follow-plan,follow-accepted --threads 2 --out runs/sweep-2026
  quantbid sweep --market market.json --battery battery.json --forecast quantiles.csv --history history.csv \\
                 --from 2025-01-01 --to 2025-06-30 --alphas 0.1,0.2,0.3 --out runs/sweep-h1 --json --quiet
  quantbid sweep --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-03-31 \\
                 --model arx-hs --out runs/sweep-q1-arx      (forecasts made from the history, each day fitted once)`,
  );
  command.action((flags: SweepFlags) => runSweepCommand(flags, io));
  return command;
}

export async function runSweepCommand(flags: SweepFlags, io: CliIo): Promise<void> {
  const { from, to, out } = requireGridFlags(flags, 'sweep.csv');
  const axes = parseAxes([
    () => parseNumberAxis('alpha', '--alphas', flags.alphas, { accept: (a) => a > 0 && a < 0.5, expected: 'an alpha in (0, 0.5)' }),
    () => parseWordAxis('policy', '--policies', flags.policies, SWEEP_POLICIES),
    () => parseWordAxis('unaccepted', '--unaccepted', flags.unaccepted, UNACCEPTED_RULES),
  ]);
  const { paths } = resolveBacktestInputs(flags, GRID_INPUTS);
  const force = flags.force === true;
  checkOutputFolder(out, flags.report === true ? [...OUTPUTS, 'report.html'] : OUTPUTS, force);
  const [alphaAxis, policyAxis] = axes as [(typeof axes)[number], (typeof axes)[number]];
  // With --model the forecasts are made here, once, before the workers start; they get the CSV text.
  const grid = gridModel(flags, paths.history, from, to, io);
  const data = readGridInputs(paths, from, to, { alphas: alphaAxis.values as number[], option: '--alphas', policies: policyAxis.values as string[] }, grid);
  const model = grid?.made();
  const modelContext = model === undefined ? {} : { forecastModel: model.summary };
  // The workers get the inputs as read here, cut to the span: none reads or parses a file again.
  const contextInput: SweepTaskInput = { paths, from, to, data: inputDataSpan(data, from, to) };
  // The summary of the finished grid, made once for summary.json, report.html and stdout.
  let made: { readonly results: readonly GridResult[]; readonly summary: ReturnType<typeof sweepSummary> } | undefined;
  const summaryOf = (results: readonly GridResult[]): ReturnType<typeof sweepSummary> => {
    if (made?.results !== results) made = { results, summary: sweepSummary(results, { from, to, data, paths, axes, ...modelContext }) };
    return made.summary;
  };
  const outcome = await runGrid(io, 'sweep', flags.quiet === true, {
    outDir: out,
    axes,
    taskModule: new URL('../backtest/sweepBacktestTask.js', import.meta.url),
    contextInput,
    identity: { command: 'sweep', version: packageVersion(), from, to, ...(model === undefined ? {} : { forecastModel: model.identity }) },
    inputFiles: gridInputFiles(paths),
    ...(flags.threads === undefined ? {} : { threads: flags.threads }),
    restart: flags.restart === true,
    force,
    csvName: 'sweep.csv',
    // In one output set with sweep.csv: a run killed while writing leaves the old outputs or all the new ones.
    optionalOutputs: ['report.html'],
    moreOutputs: (results) => [
      { name: 'summary.json', text: jsonText(summaryOf(results)) },
      ...(flags.report === true ? [{ name: 'report.html', text: sweepReport({ results, summary: summaryOf(results) }) }] : []),
    ],
  });
  const summary = summaryOf(outcome.results);
  io.stdout(flags.json === true ? jsonText(summary) : `${sweepSummaryText(summary, outcome.resumed, outcome.files)}${model?.note ?? ''}`);
}
