import { Command, InvalidArgumentError } from 'commander';
import { gatherProblems, InputError, type InputProblem } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';
import { SIZE_DEFAULTS } from '../app/commandDefaults.js';
import type { SizeSettings } from '../app/size/sizeUseCase.js';
import { ALPHA_RANGE, SIZE_POLICIES, UNACCEPTED_RULES, type UnacceptedRule } from '../app/vocabulary.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import { RUN_LIMITS } from '../app/settingRules.js';
import { addGridOptions, addInputOptions, addModelOptions, addScenarioOptions, alphaArg, oneOf, rangeArg, reportOption, requireSpanAndOut, scenarioSettings, type InputFlags, type ModelFlags, type ScenarioFlags } from './options.js';
import { printResult } from './printResult.js';
import { gridRunSettings, type GridFlags } from './sweepCommand.js';

export interface SizeFlags extends InputFlags, GridFlags, ModelFlags, ScenarioFlags {
  readonly energyMwh?: string;
  readonly powerMw?: string;
  readonly efficiency?: string;
  readonly policies?: string;
  /** The old spelling of --policies, still read (with a note). */
  readonly policy?: string;
  readonly alpha: number | 'best';
  readonly alphas?: string;
  readonly unaccepted: UnacceptedRule;
  readonly capexPerMwh?: number;
  readonly capexPerMw?: number;
  readonly fixedOmPerMwYear: number;
  readonly lifeYears?: number;
  readonly lifeCycles?: number;
  readonly discountRate?: number;
}

/** `--alpha 0.1` or `--alpha best`. */
function parseAlphaOrBest(value: string): number | 'best' {
  if (value === 'best') return 'best';
  try {
    return alphaArg(value);
  } catch {
    throw new InvalidArgumentError(`"${shownText(value)}" must be an alpha in ${ALPHA_RANGE}, e.g. 0.1, or best`);
  }
}

export function sizeCommand(io: CliIo): Command {
  const command = new Command('size')
    .description('backtest a grid of battery sizes (energy x power [x efficiency]) and value each as a project: size.csv with NPV, IRR and payback')
    .option('--energy-mwh <list>', 'energies [MWh]: values and ranges start:end:step, e.g. 5:60:5 (required)')
    .option('--power-mw <list>', 'powers [MW], charge = discharge, e.g. 2.5:30:2.5 (required)')
    .option('--efficiency <list>', 'round-trip efficiencies, e.g. 0.82,0.88 (default: the battery spec\'s)')
    .option('--policies <list>', `policies to score, from ${SIZE_POLICIES.join(', ')} (default: ${SIZE_DEFAULTS.policies}; curve and auto plan on --paths, else on paths made from the forecast and the history); price-taking and perfect-foresight rows are always added`)
    .option('--policy <list>', 'the former name of --policies, still read (with a note)')
    .option('--alpha <a|best>', 'tail level of the quantile and median policies, or best: chosen per size on the first half of the days, scored on the second', parseAlphaOrBest, SIZE_DEFAULTS.alpha)
    .option('--alphas <list>', `the alphas --alpha best chooses from (default ${SIZE_DEFAULTS.alphas})`)
    .option('--unaccepted <rule>', `unaccepted orders: ${UNACCEPTED_RULES.join(' | ')}`, oneOf<UnacceptedRule>(UNACCEPTED_RULES), SIZE_DEFAULTS.unaccepted)
    .option('--capex-per-mwh <x>', 'capital cost of the energy part [currency/MWh] (required)', rangeArg(RUN_LIMITS.capexPerMwh, '180000'))
    .option('--capex-per-mw <x>', 'capital cost of the power part [currency/MW] (required)', rangeArg(RUN_LIMITS.capexPerMw, '60000'))
    .option('--fixed-om-per-mw-year <x>', 'fixed operation and maintenance [currency/(MW year)]', rangeArg(RUN_LIMITS.fixedOmPerMwYear, '8000'), SIZE_DEFAULTS.fixedOmPerMwYear)
    .option('--life-years <n>', 'project life [years], a whole number from 1 to 100 (required)', rangeArg(RUN_LIMITS.lifeYears, '15', true))
    .option('--life-cycles <n>', 'equivalent full cycles one set of cells lasts; the cells are bought again when they run out before the end of life (default: no limit)', rangeArg(RUN_LIMITS.lifeCycles, '6000'))
    .option('--discount-rate <r>', 'discount rate per year as a fraction, e.g. 0.07 (required)', rangeArg(RUN_LIMITS.discountRate, '0.07 for 7%'));
  addScenarioOptions(command);
  addGridOptions(command, 'size.csv');
  command.addOption(reportOption('also write report.html into --out: heat maps of NPV and profit per MWh over energy x power, best sizes'));
  addInputOptions(command, ['market', 'battery', 'forecast', 'history']);
  addModelOptions(command);
  command.addHelpText(
    'after',
    `
Columns of size.csv: energy_mwh,power_mw,round_trip_efficiency,policy,alpha,
profit,profit_per_year,npv,irr, then days,capture_ratio,profit_per_mwh,
profit_per_mw,revenue_per_mwh_year,revenue_per_mw_year,
spread_per_mwh_discharged,cycles_per_year,throughput_mwh_per_year,capex,
annual_fixed_om,replacements,simple_payback_years,discounted_payback_years,
acceptance rates, days_without_plan and residual_value; irr is "none" and a
payback "never" when there is none. Cells bought again during the life are
credited their residual value (straight-line) in the last year; yearly figures
from less than a year of days are flagged as extrapolated. Every size has
price-taking and perfect-foresight rows beside the policies asked for.
An interrupted run (Ctrl-C: exit code 130; SIGTERM: 143) resumes from its
journal in --out.

Examples:
  quantbid size --scenario scenarios/halvorn/scenario.json \\
                --from 2026-01-01 --to 2026-12-31 \\
                --energy-mwh 5:40:5 --power-mw 2.5:20:2.5 \\
                --capex-per-mwh 180000 --capex-per-mw 60000 \\
                --fixed-om-per-mw-year 8000 --life-years 15 \\
                --discount-rate 0.07 --out runs/size-2026 --report
  quantbid size --scenario scenarios/halvorn/scenario.json \\
                --from 2025-01-01 --to 2026-12-31 \\
                --energy-mwh 10,20,40 --power-mw 5,10 --efficiency 0.82,0.88 \\
                --alpha best --alphas 0.05:0.45:0.05 \\
                --capex-per-mwh 180000 --capex-per-mw 60000 --life-years 15 \\
                --life-cycles 6000 --discount-rate 0.07 --out runs/size-best
  quantbid size --scenario scenarios/halvorn/scenario.json \\
                --from 2026-06-01 --to 2026-06-30 --energy-mwh 10 --power-mw 5 \\
                --policies quantile,point --capex-per-mwh 180000 \\
                --capex-per-mw 60000 --life-years 15 --discount-rate 0.07 \\
                --threads 1 --out runs/size-june --json --quiet`,
  );
  command.action(async (flags: SizeFlags) => {
    const { from, to, out } = requireSpanAndOut(flags, { days: 'delivery day', outFolder: 'size.csv and summary.json' });
    const size = await import('../app/size/sizeUseCase.js');
    const settings: SizeSettings = { ...gridRunSettings(flags, out), from, to, ...sizeFlagSettings(flags, from, to, size) };
    const hooks = cliHooks(io, flags.quiet === true);
    if (flags.policy !== undefined) hooks.note('note: --policy is read as --policies (one spelling for lists of policies, as in backtest and sweep); write --policies\n');
    printResult(io, await size.sizeUseCase(settings, hooks), flags.json === true);
  });
  return command;
}

/**
 * The sizing's own settings from its flags, all problems listed together: the size and policy axes,
 * the alpha (with `best`, a grid and at least two days), the required economics; `rules` are the use
 * case's, loaded with it.
 */
function sizeFlagSettings(flags: SizeFlags, from: string, to: string, rules: Pick<typeof import('../app/size/sizeUseCase.js'), 'sizeAxesFromText' | 'alphaBestSpanProblem'>): Omit<SizeSettings, 'inputs' | 'model' | 'threads' | 'restart' | 'out' | 'force' | 'report' | 'from' | 'to'> {
  const problems: InputProblem[] = [];
  const missing = (option: string, fix: string): void => {
    problems.push({ file: 'command line', field: option, message: `no ${option} given`, fix });
  };
  if (flags.policy !== undefined && flags.policies !== undefined) {
    problems.push({ file: 'command line', field: '--policy', message: 'was given with --policies, its new name', fix: 'give the policies once, as --policies' });
  }
  const policies = flags.policies ?? flags.policy ?? SIZE_DEFAULTS.policies;
  const axes = gatherProblems(problems, () =>
    rules.sizeAxesFromText({ energyMwh: flags.energyMwh, powerMw: flags.powerMw, efficiency: flags.efficiency, alphas: flags.alpha === 'best' ? (flags.alphas ?? SIZE_DEFAULTS.alphas) : undefined, policies, policiesOption: flags.policies === undefined && flags.policy !== undefined ? '--policy' : '--policies' }),
  );
  if (flags.energyMwh === undefined) missing('--energy-mwh', 'give the energies to try, e.g. --energy-mwh 5:60:5');
  if (flags.powerMw === undefined) missing('--power-mw', 'give the powers to try, e.g. --power-mw 2.5:30:2.5');
  if (flags.capexPerMwh === undefined) missing('--capex-per-mwh', 'give the capital cost per MWh of energy, e.g. --capex-per-mwh 180000');
  if (flags.capexPerMw === undefined) missing('--capex-per-mw', 'give the capital cost per MW of power, e.g. --capex-per-mw 60000');
  if (flags.lifeYears === undefined) missing('--life-years', 'give the project life in whole years, e.g. --life-years 15');
  if (flags.discountRate === undefined) missing('--discount-rate', 'give the discount rate per year as a fraction, e.g. --discount-rate 0.07');
  if (flags.alpha !== 'best' && flags.alphas !== undefined) {
    problems.push({ file: 'command line', field: '--alphas', message: 'is used only with --alpha best', fix: 'add --alpha best, or leave --alphas out' });
  }
  const best = flags.alpha === 'best' ? rules.alphaBestSpanProblem(from, to) : null;
  if (best !== null) problems.push({ file: 'command line', field: '--alpha', message: best, fix: 'give a longer span from --from to --to, or a fixed --alpha' });
  const scenarios = gatherProblems(problems, () => scenarioSettings(flags));
  if (problems.length > 0 || axes === undefined) throw new InputError(problems);
  return {
    ...(scenarios === undefined ? {} : { scenarios }),
    energiesMwh: axes.energiesMwh as number[],
    powersMw: axes.powersMw as number[],
    ...(axes.efficiencies === undefined ? {} : { efficiencies: axes.efficiencies }),
    policies: axes.policies,
    alpha: flags.alpha,
    ...(axes.alphas === undefined ? {} : { alphas: axes.alphas }),
    unaccepted: flags.unaccepted,
    costs: {
      capexPerMwh: flags.capexPerMwh as number,
      capexPerMw: flags.capexPerMw as number,
      fixedOmPerMwYear: flags.fixedOmPerMwYear,
      lifeYears: flags.lifeYears as number,
      lifeCycles: flags.lifeCycles ?? null,
      discountRate: flags.discountRate as number,
    },
  };
}
