import { Command } from 'commander';
import { SWEEP_DEFAULTS } from '../app/commandDefaults.js';
import { SWEEP_POLICIES, UNACCEPTED_RULES } from '../app/vocabulary.js';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import {
  addGridOptions,
  addInputOptions,
  addModelOptions,
  addScenarioOptions,
  inputSources,
  modelSettings,
  reportOption,
  requireSpanAndOut,
  scenarioSettings,
  type InputFlags,
  type ModelFlags,
  type ScenarioFlags,
} from './options.js';
import { printResult } from './printResult.js';

/** Flags that `quantbid sweep` and `quantbid size` share. */
export interface GridFlags {
  readonly from?: string;
  readonly to?: string;
  readonly threads?: number;
  readonly restart?: boolean;
  readonly quiet?: boolean;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly report?: boolean;
}

export interface SweepFlags extends InputFlags, GridFlags, ModelFlags, ScenarioFlags {
  readonly alphas: string;
  readonly policies: string;
  readonly unaccepted: string;
}

/** The run options of a grid command's flags, for its settings. */
export function gridRunSettings(flags: GridFlags & InputFlags & ModelFlags, out: string) {
  const model = modelSettings(flags);
  return {
    inputs: inputSources(flags),
    ...(model === undefined ? {} : { model }),
    ...(flags.threads === undefined ? {} : { threads: flags.threads }),
    restart: flags.restart === true,
    out,
    force: flags.force === true,
    report: flags.report === true,
  };
}

export function sweepCommand(io: CliIo): Command {
  const command = new Command('sweep')
    .description('backtest every setting of a grid of alpha x policy x unaccepted rule, in parallel, into sweep.csv (one row per setting)')
    .option('--alphas <list>', 'tail levels alpha (buys limited at q(1-alpha), sells at q(alpha)): values and ranges start:end:step, e.g. 0.02:0.48:0.02 or 0.05,0.1,0.2', SWEEP_DEFAULTS.alphas)
    .option('--policies <list>', `from ${SWEEP_POLICIES.join(', ')}: quantile and median depend on alpha; curve and auto plan on --paths (else on paths made from the forecast and the history) and ignore it`, SWEEP_DEFAULTS.policies)
    .option('--unaccepted <list>', `rules for unaccepted orders: ${UNACCEPTED_RULES.join(', ')}`, SWEEP_DEFAULTS.unaccepted);
  addScenarioOptions(command);
  addGridOptions(command, 'sweep.csv');
  command.addOption(reportOption('also write report.html into --out: profit and acceptance against alpha, best setting marked, top settings'));
  addInputOptions(command, ['market', 'battery', 'forecast', 'history']);
  addModelOptions(command);
  command.addHelpText(
    'after',
    `
Columns of sweep.csv: alpha,policy,unaccepted, then days,profit,
mean_daily_profit,capture_ratio,perfect_foresight_profit,point_profit,
edge_vs_point,p_value_vs_point (one-sided Diebold-Mariano/HLN test that the
setting earns more than the point policy), acceptance rates, imbalance energy
and cash, cycles, the daily-profit risk measures, and price_taking_profit,
edge_vs_price_taking,p_value_vs_price_taking. After the grid, rows of the
reference policies point, price-taking and perfect-foresight for each rule
(alpha empty). The best setting is chosen within each rule, never across rules.
An interrupted sweep (Ctrl-C: exit code 130; SIGTERM: 143) resumes from its
journal in --out when run again with the same arguments.

Examples:
  quantbid sweep --scenario scenarios/halvorn/scenario.json \\
                 --from 2026-01-01 --to 2026-03-31 --out runs/sweep-q1 --report
  quantbid sweep --scenario scenarios/halvorn/scenario.json \\
                 --from 2026-01-01 --to 2026-12-31 --alphas 0.05:0.45:0.025 \\
                 --policies quantile --unaccepted follow-plan,follow-accepted \\
                 --threads 2 --out runs/sweep-2026
  quantbid sweep --market market.json --battery battery.json \\
                 --forecast quantiles.csv --history history.csv \\
                 --from 2025-01-01 --to 2025-06-30 --alphas 0.1,0.2,0.3 \\
                 --out runs/sweep-h1 --json --quiet
  quantbid sweep --scenario scenarios/halvorn/scenario.json \\
                 --from 2026-01-01 --to 2026-03-31 --model arx-hs \\
                 --out runs/sweep-q1-arx   (forecasts made from the history)
  quantbid sweep --scenario scenarios/halvorn/scenario.json \\
                 --from 2026-12-01 --to 2026-12-07 --alphas 0.1 \\
                 --policies quantile,auto --paths runs/fc/paths.csv \\
                 --unaccepted follow-plan,follow-accepted --out runs/sweep-auto`,
  );
  command.action(async (flags: SweepFlags) => {
    const { from, to, out } = requireSpanAndOut(flags, { days: 'delivery day', outFolder: 'sweep.csv and summary.json' });
    // The workers boot while the use case loads and reads the inputs.
    const workers = (await import('../app/sweep/sweepWorkers.js')).startSweepWorkers(flags);
    try {
      const { sweepAxesFromText, sweepUseCase } = await import('../app/sweep/sweepUseCase.js');
      const axes = sweepAxesFromText(flags);
      const scenarios = scenarioSettings(flags);
      const settings = { ...gridRunSettings(flags, out), from, to, ...axes, ...(scenarios === undefined ? {} : { scenarios }) };
      printResult(io, await sweepUseCase(settings, cliHooks(io, flags.quiet === true), workers), flags.json === true);
    } finally {
      await workers.stop();
    }
  });
  return command;
}
