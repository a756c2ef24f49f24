import { Command } from 'commander';
import { fileURLToPath } from 'node:url';
import { relative } from 'node:path';
import { packageRoot } from './version.js';
import { runPlan } from './planCommand.js';
import type { CliIo } from './cliIo.js';

/** The shipped fictional scenario (scenarios/halvorn), relative to the working folder. */
export function demoScenarioPath(): string {
  return relative(process.cwd(), fileURLToPath(new URL('scenarios/halvorn/scenario.json', packageRoot())));
}

export function demoCommand(io: CliIo): Command {
  return new Command('demo')
    .description('plan the next delivery day of the shipped fictional market (Halvorn) and print a summary')
    .option('--out <dir>', 'also write the plan\'s files into this folder')
    .option('--force', 'overwrite existing outputs')
    .option('--json', 'print the summary as JSON on stdout')
    .addHelpText('after', '\nExamples:\n  quantbid demo\n  quantbid demo --out runs/demo --force')
    .action((flags: { out?: string; force?: boolean; json?: boolean }) => {
      const scenario = demoScenarioPath();
      io.stderr(`demo: fictional market Halvorn (${scenario})\n`);
      runPlan({ scenario, alpha: 0.1, policy: 'quantile', ...flags }, io);
    });
}
