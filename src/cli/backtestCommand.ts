import { Command, InvalidArgumentError, Option } from 'commander';
import { BACKTEST_DEFAULTS, BACKTEST_POLICIES, type BacktestPolicy, type UnacceptedRule } from '../app/vocabulary.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import {
  addInputOptions,
  addModelOptions,
  alphaOption,
  forceOption,
  inputSources,
  jsonOption,
  modelSettings,
  outOption,
  quietOption,
  reportOption,
  requireSpanAndOut,
  spanOptions,
  unacceptedOption,
  addScenarioOptions,
  scenarioSettings,
  type InputFlags,
  type ModelFlags,
  type ScenarioFlags,
} from './options.js';
import { printResult } from './printResult.js';

export interface BacktestFlags extends InputFlags, ModelFlags, ScenarioFlags {
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
  const [from, to] = spanOptions();
  const command = new Command('backtest')
    .description('replay the policies day by day over history: what the quantile policy would have earned, against the simple baselines (point, price-taking) and perfect foresight')
    .addOption(from)
    .addOption(to)
    .addOption(alphaOption('tail level of the quantile and median policies: buys limited at q(1-alpha), sells at q(alpha); [q(alpha), q(1-alpha)] covers 1 - 2 alpha', BACKTEST_DEFAULTS.alpha))
    .addOption(unacceptedOption('unaccepted orders: follow-plan (close them at the imbalance price) | follow-accepted (move only with accepted orders)', BACKTEST_DEFAULTS.unaccepted))
    .addOption(new Option('--policies <list>', `comma-separated, from ${BACKTEST_POLICIES.join(', ')}; the first other than perfect-foresight is the one tested; curve and auto plan on whole-day paths: --paths, else made from the forecast and the history`).argParser(parsePoliciesArg).default([...BACKTEST_DEFAULTS.policies], 'all five'))
  addScenarioOptions(command)
    .addOption(outOption('folder for ledger.csv, days.csv and summary.json (required)'))
    .addOption(reportOption('also write report.html into --out: cumulative profit, daily profit, acceptance, imbalance energy, month table'))
    .addOption(quietOption())
    .addOption(forceOption())
    .addOption(jsonOption());
  addInputOptions(command, ['market', 'battery', 'forecast', 'history']);
  addModelOptions(command);
  command.addHelpText(
    'after',
    `
The first policy of --policies other than perfect-foresight is tested against
every other one (Diebold-Mariano with the Harvey-Leybourne-Newbold correction,
on daily profits); the console and summary.json lead with it against the
strongest simple baseline, the more profitable of point and price-taking.

Examples:
  quantbid backtest --scenario scenarios/halvorn/scenario.json \\
                    --from 2026-01-01 --to 2026-01-31 --out runs/jan --report
  quantbid backtest --market market.json --battery battery.json \\
                    --forecast quantiles.csv --history history.csv \\
                    --from 2025-01-01 --to 2025-12-31 --alpha 0.2 \\
                    --unaccepted follow-accepted --out runs/2025
  quantbid backtest --scenario scenarios/halvorn/scenario.json \\
                    --from 2026-06-01 --to 2026-06-30 \\
                    --policies quantile,point,perfect-foresight \\
                    --out runs/june --json
  quantbid backtest --scenario scenarios/halvorn/scenario.json \\
                    --from 2026-03-01 --to 2026-03-31 \\
                    --model arx-hs --levels 0.05:0.95:0.05 --out runs/march-arx
  quantbid backtest --scenario scenarios/halvorn/scenario.json \\
                    --from 2026-12-01 --to 2026-12-07 \\
                    --policies price-taking,auto --paths runs/fc/paths.csv \\
                    --out runs/auto`,
  );
  command.action(async (flags: BacktestFlags) => {
    const span = requireSpanAndOut(flags, { days: 'delivery day', outFolder: 'ledger.csv, days.csv and summary.json' });
    const model = modelSettings(flags);
    const scenarios = scenarioSettings(flags);
    const settings = {
      inputs: inputSources(flags),
      ...(model === undefined ? {} : { model }),
      ...span,
      alpha: flags.alpha,
      unaccepted: flags.unaccepted,
      policies: [...flags.policies],
      ...(scenarios === undefined ? {} : { scenarios }),
      force: flags.force === true,
      report: flags.report === true,
    };
    // The backtest without the validation library when nothing is wrong (backtestFastPath.ts).
    const { backtestFastPath } = await import('../app/backtest/backtestFastPath.js');
    // HiGHS is loaded only when a policy plans on scenarios.
    const onScenarios = flags.policies.some((p) => p === 'curve' || p === 'auto');
    const tools = onScenarios ? { lpSolver: await (await import('../app/solver/highsSolver.js')).loadHighsSolver() } : {};
    printResult(io, await backtestFastPath(settings, cliHooks(io, flags.quiet === true), tools), flags.json === true);
  });
  return command;
}
