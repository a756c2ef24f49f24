import { Command } from 'commander';
import { PLAN_COMMAND_POLICIES, PLAN_DEFAULTS, type PlanCommandPolicy } from '../app/commandDefaults.js';
import type { UnacceptedRule } from '../app/vocabulary.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import { RUN_LIMITS } from '../app/settingRules.js';
import {
  addInputOptions,
  addScenarioOptions,
  alphaOption,
  dayArg,
  forceOption,
  inputSources,
  jsonOption,
  oneOf,
  outOption,
  rangeArg,
  reportOption,
  scenarioSettings,
  unacceptedOption,
  type InputFlags,
  type ScenarioFlags,
} from './options.js';
import { printResult } from './printResult.js';

export interface PlanFlags extends InputFlags, ScenarioFlags {
  readonly day?: string;
  readonly alpha: number;
  readonly policy: PlanCommandPolicy;
  readonly unaccepted: UnacceptedRule;
  readonly socStart?: number;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly report?: boolean;
}

export function planCommand(io: CliIo): Command {
  const command = new Command('plan')
    .description('plan one delivery day: orders (buy/sell, quantity, limit price) and a schedule from a quantile forecast')
    .option('--day <YYYY-MM-DD>', 'delivery day to plan (default: the scenario\'s demoDay)', dayArg)
    .addOption(alphaOption('tail level: buys limited at q(1-alpha), sells at q(alpha); the interval [q(alpha), q(1-alpha)] covers 1 - 2 alpha', PLAN_DEFAULTS.alpha))
    .option('--policy <name>', `${PLAN_COMMAND_POLICIES.join(' | ')} (auto: every candidate scored on whole-day paths, price-taking submitted unless another is clearly ahead; price-taking: the median schedule with limits at the price cap and floor, the baseline every plan is compared with; curve and auto plan on paths: --paths, else made from the forecast and the history; the default auto is price-taking without either)`, oneOf<PlanCommandPolicy>(PLAN_COMMAND_POLICIES), PLAN_DEFAULTS.policy)
    .option('--soc-start <MWh>', 'state of charge at the start of the day [MWh] (default: socInitialFraction x energyMwh); outside the window: a warning, and the plan comes back into it at full power', rangeArg(RUN_LIMITS.socStartMwh, '5'));
  addScenarioOptions(command)
    .addOption(unacceptedOption('with curve or auto: what the battery does about unaccepted orders, follow-plan | follow-accepted', PLAN_DEFAULTS.unaccepted))
    .addOption(outOption('folder for orders.csv, schedule.csv and plan.json'))
    .addOption(reportOption('also write report.html into --out: forecast fan with the limit prices, schedule charts, orders table'))
    .addOption(forceOption())
    .addOption(jsonOption());
  addInputOptions(command, ['market', 'battery', 'forecast', 'history']);
  command.addHelpText(
    'after',
    `
By default (auto) the day's candidates (price-taking, the quantile and median
policies over a grid of alphas, point, bid curves) are scored on whole-day
price paths and the table of their mean, CVaR and loss probability is shown;
price-taking is submitted unless another is ahead by more than 3 standard
errors. Without --history and --paths there are no paths: the plan is then
price-taking's, with a note.

A schedule policy's plan (quantile, median, point, price-taking) is valued
three ways: at the prices it was scheduled on, if every order fills at its
limit, and expected under the forecast (acceptance read from the quantiles;
unaccepted orders closed at the market's imbalance rule, or else at the
--history's mean imbalance-minus-clearing spread); beside it, the
price-taking plan of the same day.

Examples:
  quantbid plan --scenario scenarios/halvorn/scenario.json --day 2027-01-01 \\
                --out plans/2027-01-01      (auto: paths from the quantile
                                             file and the history)
  quantbid plan --market market.json --battery battery.json \\
                --forecast quantiles.csv --day 2027-03-28 \\
                --policy quantile --alpha 0.1 \\
                --out plans/2027-03-28
  quantbid plan --scenario scenarios/halvorn/scenario.json --policy median \\
                --alpha 0.2 --json
  quantbid plan --scenario scenarios/halvorn/scenario.json --day 2027-01-01 \\
                --policy auto --paths runs/fc/paths.csv \\
                --unaccepted follow-accepted --out plans/auto
  quantbid plan --scenario scenarios/halvorn/scenario.json \\
                --policy price-taking --out plans/price-taking`,
  );
  command.action(async (flags: PlanFlags) => {
    const scenarios = scenarioSettings(flags);
    const settings = {
      inputs: inputSources(flags),
      ...(flags.day === undefined ? {} : { day: flags.day }),
      alpha: flags.alpha,
      // Left out when not given: the default policy falls back to price-taking without paths (planRun.ts).
      ...(command.getOptionValueSource('policy') === 'default' ? {} : { policy: flags.policy }),
      unaccepted: flags.unaccepted,
      ...(scenarios === undefined ? {} : { scenarios }),
      ...(flags.socStart === undefined ? {} : { socStartMwh: flags.socStart }),
      ...(flags.out === undefined ? {} : { out: flags.out }),
      force: flags.force === true,
      report: flags.report === true,
    };
    // The plan without the validation library when nothing is wrong (planFastPath.ts).
    const { planFastPath } = await import('../app/plan/planFastPath.js');
    // HiGHS is loaded only when the plan runs on scenarios (planFastPath asks): other plans, the default's
    // fallback to price-taking among them, never pay its start-up.
    const scenarioTools = async () => ({ lpSolver: await (await import('../app/solver/highsSolver.js')).loadHighsSolver() });
    printResult(io, await planFastPath(settings, cliHooks(io, false), scenarioTools), flags.json === true);
  });
  return command;
}
