import { Command } from 'commander';
import { PLAN_DEFAULTS, planUseCase } from '../app/plan/planUseCase.js';
import { PLAN_POLICIES, type PlanPolicy } from '../app/vocabulary.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import { RUN_LIMITS } from '../app/settingRules.js';
import { addInputOptions, alphaOption, dayArg, forceOption, inputSources, jsonOption, oneOf, outOption, rangeArg, reportOption, type InputFlags } from './options.js';
import { printResult } from './printResult.js';

export interface PlanFlags extends InputFlags {
  readonly day?: string;
  readonly alpha: number;
  readonly policy: PlanPolicy;
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
    .addOption(alphaOption('central interval [q(alpha), q(1-alpha)]: buys limited at q(1-alpha), sells at q(alpha)', PLAN_DEFAULTS.alpha))
    .option('--policy <name>', PLAN_POLICIES.join(' | '), oneOf<PlanPolicy>(PLAN_POLICIES), PLAN_DEFAULTS.policy)
    .option('--soc-start <MWh>', 'state of charge at the start of the day [MWh] (default: socInitialFraction x energyMwh)', rangeArg(RUN_LIMITS.socStartMwh, '5'))
    .addOption(outOption('folder for orders.csv, schedule.csv and plan.json'))
    .addOption(reportOption('also write report.html into --out: forecast fan with the limit prices, schedule charts, orders table'))
    .addOption(forceOption())
    .addOption(jsonOption());
  addInputOptions(command, ['market', 'battery', 'forecast']);
  command.addHelpText(
    'after',
    `
Examples:
  quantbid plan --scenario scenarios/halvorn/scenario.json --day 2027-01-01 --out plans/2027-01-01
  quantbid plan --market market.json --battery battery.json --forecast quantiles.csv \\
                --day 2027-03-28 --alpha 0.1 --out plans/2027-03-28
  quantbid plan --scenario scenarios/halvorn/scenario.json --policy median --alpha 0.2 --json`,
  );
  command.action((flags: PlanFlags) => {
    const settings = {
      inputs: inputSources(flags),
      ...(flags.day === undefined ? {} : { day: flags.day }),
      alpha: flags.alpha,
      policy: flags.policy,
      ...(flags.socStart === undefined ? {} : { socStartMwh: flags.socStart }),
      ...(flags.out === undefined ? {} : { out: flags.out }),
      force: flags.force === true,
      report: flags.report === true,
    };
    printResult(io, planUseCase(settings, cliHooks(io, false)), flags.json === true);
  });
  return command;
}
