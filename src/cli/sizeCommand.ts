import type { GridResult } from '../io/sweepOutputs.js';
import { Command, InvalidArgumentError } from 'commander';
import type { AlphaMode } from '../backtest/size/alphaChoice.js';
import { specRoundTripEfficiency } from '../backtest/size/scaledBattery.js';
import type { SizeCosts } from '../backtest/size/sizeEconomics.js';
import { SIZE_POLICIES } from '../backtest/size/sizeSettingRow.js';
import type { SizeTaskInput } from '../backtest/sizeBacktestTask.js';
import { parseAxes, parseNumberAxis, parseWordAxis, type SweepAxis } from '../backtest/sweep/sweepAxis.js';
import { daysBetween } from '../market/calendar.js';
import { InputError, type InputProblem } from '../errors/inputError.js';
import { jsonText } from '../io/planOutputs.js';
import { sizeSummary, sizeSummaryText } from '../io/sizeOutputs.js';
import { sizeReport } from '../report/sizeReport.js';
import { shownText } from '../errors/shownText.js';
import { checkOutputFolder } from '../io/writeOutputs.js';
import { UNACCEPTED_RULES, type UnacceptedRule } from '../settle/settleDay.js';
import { oneOf, parseAlphaArg, parseNonNegativeArg } from './argParsers.js';
import type { CliIo } from './cliIo.js';
import { addGridOptions, parsePositiveArg, parseRateArg, requireGridFlags, wholeNumberArg, type GridFlags } from './gridArgs.js';
import { GRID_INPUTS, readGridInputs } from './gridInputs.js';
import { inputDataSpan } from '../io/inputDataSpan.js';
import { runGrid } from './gridRun.js';
import { addInputOptions, type InputFlags } from './inputOptions.js';
import { addModelOptions, gridInputFiles, gridModel, resolveBacktestInputs, type ModelFlags } from './modelOptions.js';
import { packageVersion } from './version.js';

export interface SizeFlags extends InputFlags, GridFlags, ModelFlags {
  readonly energyMwh?: string;
  readonly powerMw?: string;
  readonly efficiency?: string;
  readonly policy: string;
  readonly alpha: number | 'best';
  readonly alphas?: string;
  readonly unaccepted: UnacceptedRule;
  readonly capexPerMwh?: number;
  readonly capexPerMw?: number;
  readonly fixedOmPerMwYear: number;
  readonly lifeYears?: number;
  readonly lifeCycles?: number;
  readonly discountRate?: number;
  readonly report?: boolean;
}

/** Defaults: the quantile policy at alpha 0.1, the grid of `--alpha best`, follow-plan, no fixed O&M. */
export const SIZE_COMMAND_DEFAULTS = Object.freeze({
  policy: 'quantile',
  alpha: 0.1,
  alphas: '0.05:0.45:0.05',
  unaccepted: 'follow-plan' as UnacceptedRule,
  fixedOmPerMwYear: 0,
});

const OUTPUTS = ['size.csv', 'summary.json'] as const;

/** `--alpha 0.1` or `--alpha best`. */
function parseAlphaOrBest(value: string): number | 'best' {
  if (value === 'best') return 'best';
  try {
    return parseAlphaArg(value);
  } catch {
    throw new InvalidArgumentError(`"${shownText(value)}" must be an alpha in (0, 0.5), e.g. 0.1, or best`);
  }
}

export function sizeCommand(io: CliIo): Command {
  const command = new Command('size')
    .description('backtest a grid of battery sizes (energy x power [x efficiency]) and value each as a project: size.csv with NPV, IRR and payback')
    .option('--energy-mwh <list>', 'energies [MWh]: values and ranges start:end:step, e.g. 5:60:5 (required)')
    .option('--power-mw <list>', 'powers [MW], charge = discharge, e.g. 2.5:30:2.5 (required)')
    .option('--efficiency <list>', 'round-trip efficiencies, e.g. 0.82,0.88 (default: the battery spec\'s)')
    .option('--policy <list>', `policies to score, from ${SIZE_POLICIES.join(', ')}; perfect-foresight rows are always added`, SIZE_COMMAND_DEFAULTS.policy)
    .option('--alpha <a|best>', 'alpha of the quantile and median policies, or best: chosen per size on the first half of the days, scored on the second', parseAlphaOrBest, SIZE_COMMAND_DEFAULTS.alpha)
    .option('--alphas <list>', `the alphas --alpha best chooses from (default ${SIZE_COMMAND_DEFAULTS.alphas})`)
    .option('--unaccepted <rule>', `unaccepted orders: ${UNACCEPTED_RULES.join(' | ')}`, oneOf<UnacceptedRule>(UNACCEPTED_RULES), SIZE_COMMAND_DEFAULTS.unaccepted)
    .option('--capex-per-mwh <x>', 'capital cost of the energy part [currency/MWh] (required)', parseNonNegativeArg)
    .option('--capex-per-mw <x>', 'capital cost of the power part [currency/MW] (required)', parseNonNegativeArg)
    .option('--fixed-om-per-mw-year <x>', 'fixed operation and maintenance [currency/(MW year)]', parseNonNegativeArg, SIZE_COMMAND_DEFAULTS.fixedOmPerMwYear)
    .option('--life-years <n>', 'project life [years], a whole number >= 1 (required)', wholeNumberArg(1, '15'))
    .option('--life-cycles <n>', 'equivalent full cycles one set of cells lasts; the cells are bought again when they run out before the end of life (default: no limit)', parsePositiveArg)
    .option('--discount-rate <r>', 'discount rate per year as a fraction, e.g. 0.07 (required)', parseRateArg);
  addGridOptions(command, 'size.csv');
  command.option('--report', 'also write report.html into --out: heat maps of NPV and profit per MWh over energy x power, best sizes');
  addInputOptions(command, GRID_INPUTS);
  addModelOptions(command);
  command.addHelpText(
    'after',
    `
Columns of size.csv: energy_mwh,power_mw,round_trip_efficiency,policy,alpha,profit,profit_per_year,npv,irr,
then days,capture_ratio,profit_per_mwh,profit_per_mw,revenue_per_mwh_year,revenue_per_mw_year,
spread_per_mwh_discharged,cycles_per_year,throughput_mwh_per_year,capex,annual_fixed_om,replacements,
simple_payback_years,discounted_payback_years and acceptance rates; irr is "none" and a payback "never"
when there is none. An interrupted run (Ctrl-C: exit code 130) resumes from its journal in --out.

Examples:
  quantbid size --scenario scenarios/halvorn/scenario.json --from 2026-01-01 --to 2026-12-31 \\
                --energy-mwh 5:40:5 --power-mw 2.5:20:2.5 --capex-per-mwh 180000 --capex-per-mw 60000 \\
                --fixed-om-per-mw-year 8000 --life-years 15 --discount-rate 0.07 --out runs/size-2026 --report
  quantbid size --scenario scenarios/halvorn/scenario.json --from 2025-01-01 --to 2026-12-31 \\
                --energy-mwh 10,20,40 --power-mw 5,10 --efficiency 0.82,0.88 --alpha best --alphas 0.05:0.45:0.05 \\
                --capex-per-mwh 180000 --capex-per-mw 60000 --life-years 15 --life-cycles 6000 --discount-rate 0.07 --out runs/size-best
  quantbid size --scenario scenarios/halvorn/scenario.json --from 2026-06-01 --to 2026-06-30 --energy-mwh 10 --power-mw 5 \\
                --policy quantile,point --capex-per-mwh 180000 --capex-per-mw 60000 --life-years 15 --discount-rate 0.07 \\
                --threads 1 --out runs/size-june --json --quiet`,
  );
  command.action((flags: SizeFlags) => runSizeCommand(flags, io));
  return command;
}

export async function runSizeCommand(flags: SizeFlags, io: CliIo): Promise<void> {
  const { from, to, out } = requireGridFlags(flags, 'size.csv');
  const { costs, alpha, sizeAxes } = checkSizeFlags(flags, from, to);
  const { paths } = resolveBacktestInputs(flags, GRID_INPUTS);
  const force = flags.force === true;
  checkOutputFolder(out, flags.report === true ? [...OUTPUTS, 'report.html'] : OUTPUTS, force);
  const [energyAxis, powerAxis, givenEfficiency, policyAxis] = sizeAxes;
  const policies = policyAxis.values as string[];
  const alphas = alpha.method === 'fixed' ? [alpha.alpha] : alpha.alphas;
  // With --model the forecasts are made here, once, before the workers start; they get the CSV text.
  const grid = gridModel(flags, paths.history, from, to, io);
  const data = readGridInputs(paths, from, to, { alphas, option: alpha.method === 'fixed' ? '--alpha' : '--alphas', policies }, grid);
  const model = grid?.made();
  const modelContext = model === undefined ? {} : { forecastModel: model.summary };
  const efficiencyAxis: SweepAxis = givenEfficiency ?? { name: 'round_trip_efficiency', option: '--efficiency', values: [specRoundTripEfficiency(data.batterySpec)] };
  const axes = [energyAxis, powerAxis, efficiencyAxis, { ...policyAxis, values: [...policies, 'perfect-foresight'] }];
  // The workers get the inputs as read here, cut to the span: none reads or parses a file again.
  const contextInput: SizeTaskInput = { paths, from, to, alpha, unaccepted: flags.unaccepted, costs, efficiencyGiven: givenEfficiency !== undefined, data: inputDataSpan(data, from, to) };
  // The summary of the finished grid, made once for summary.json, report.html and stdout.
  let made: { readonly results: readonly GridResult[]; readonly summary: ReturnType<typeof sizeSummary> } | undefined;
  const summaryOf = (results: readonly GridResult[]): ReturnType<typeof sizeSummary> => {
    if (made?.results !== results) made = { results, summary: sizeSummary(results, { from, to, data, paths, axes, alpha, unaccepted: flags.unaccepted, costs, ...modelContext }) };
    return made.summary;
  };
  const outcome = await runGrid(io, 'size', flags.quiet === true, {
    outDir: out,
    axes,
    taskModule: new URL('../backtest/sizeBacktestTask.js', import.meta.url),
    contextInput,
    identity: { command: 'size', version: packageVersion(), from, to, alpha, unaccepted: flags.unaccepted, costs, efficiencyGiven: contextInput.efficiencyGiven, ...(model === undefined ? {} : { forecastModel: model.identity }) },
    inputFiles: gridInputFiles(paths),
    ...(flags.threads === undefined ? {} : { threads: flags.threads }),
    restart: flags.restart === true,
    force,
    csvName: 'size.csv',
    // In one output set with size.csv: a run killed while writing leaves the old outputs or all the new ones.
    optionalOutputs: ['report.html'],
    moreOutputs: (results) => [
      { name: 'summary.json', text: jsonText(summaryOf(results)) },
      ...(flags.report === true ? [{ name: 'report.html', text: sizeReport({ results, summary: summaryOf(results) }) }] : []),
    ],
  });
  const summary = summaryOf(outcome.results);
  io.stdout(flags.json === true ? jsonText(summary) : `${sizeSummaryText(summary, outcome.resumed, outcome.files)}${model?.note ?? ''}`);
}

/**
 * The command-line checks of a sizing, all problems listed together: the size and policy axes, the
 * alpha (with `best`, a grid and at least two days), the required economics.
 */
function checkSizeFlags(flags: SizeFlags, from: string, to: string): { costs: SizeCosts; alpha: AlphaMode; sizeAxes: [SweepAxis, SweepAxis, SweepAxis | undefined, SweepAxis] } {
  const problems: InputProblem[] = [];
  const missing = (option: string, fix: string): void => {
    problems.push({ file: 'command line', field: option, message: `no ${option} given`, fix });
  };
  const numberAxis = (name: string, option: string, spec: string | undefined, accept: (x: number) => boolean, expected: string) =>
    spec === undefined ? [] : [() => parseNumberAxis(name, option, spec, { accept, expected })];
  const parsers = [
    ...numberAxis('energy_mwh', '--energy-mwh', flags.energyMwh, (x) => x > 0, 'a number > 0'),
    ...numberAxis('power_mw', '--power-mw', flags.powerMw, (x) => x > 0, 'a number > 0'),
    ...numberAxis('round_trip_efficiency', '--efficiency', flags.efficiency, (x) => x > 0 && x <= 1, 'an efficiency in (0, 1]'),
    ...numberAxis('alpha', '--alphas', flags.alpha === 'best' ? (flags.alphas ?? SIZE_COMMAND_DEFAULTS.alphas) : undefined, (a) => a > 0 && a < 0.5, 'an alpha in (0, 0.5)'),
    () => parseWordAxis('policy', '--policy', flags.policy, SIZE_POLICIES),
  ];
  let axes: SweepAxis[] = [];
  try {
    axes = parseAxes(parsers);
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    problems.push(...err.problems);
  }
  if (flags.energyMwh === undefined) missing('--energy-mwh', 'give the energies to try, e.g. --energy-mwh 5:60:5');
  if (flags.powerMw === undefined) missing('--power-mw', 'give the powers to try, e.g. --power-mw 2.5:30:2.5');
  if (flags.capexPerMwh === undefined) missing('--capex-per-mwh', 'give the capital cost per MWh of energy, e.g. --capex-per-mwh 180000');
  if (flags.capexPerMw === undefined) missing('--capex-per-mw', 'give the capital cost per MW of power, e.g. --capex-per-mw 60000');
  if (flags.lifeYears === undefined) missing('--life-years', 'give the project life in whole years, e.g. --life-years 15');
  if (flags.discountRate === undefined) missing('--discount-rate', 'give the discount rate per year as a fraction, e.g. --discount-rate 0.07');
  if (flags.alpha !== 'best' && flags.alphas !== undefined) {
    problems.push({ file: 'command line', field: '--alphas', message: 'is used only with --alpha best', fix: 'add --alpha best, or leave --alphas out' });
  }
  if (flags.alpha === 'best' && daysBetween(from, to).length < 2) {
    problems.push({ file: 'command line', field: '--alpha', message: 'best needs at least 2 days: it chooses on the first half and scores on the second', fix: 'give a longer span from --from to --to, or a fixed --alpha' });
  }
  if (problems.length > 0) throw new InputError(problems);
  const byName = (name: string): SweepAxis | undefined => axes.find((axis) => axis.name === name);
  const alphaAxis = byName('alpha');
  return {
    costs: {
      capexPerMwh: flags.capexPerMwh as number,
      capexPerMw: flags.capexPerMw as number,
      fixedOmPerMwYear: flags.fixedOmPerMwYear,
      lifeYears: flags.lifeYears as number,
      lifeCycles: flags.lifeCycles ?? null,
      discountRate: flags.discountRate as number,
    },
    alpha: flags.alpha === 'best' ? { method: 'best', alphas: (alphaAxis?.values ?? []) as number[] } : { method: 'fixed', alpha: flags.alpha },
    sizeAxes: [byName('energy_mwh') as SweepAxis, byName('power_mw') as SweepAxis, byName('round_trip_efficiency'), byName('policy') as SweepAxis],
  };
}
