import { Command } from 'commander';
import { cliHooks } from './cliHooks.js';
import type { CliIo } from './cliIo.js';
import { forceOption, jsonOption, outOption } from './options.js';
import { printResult } from './printResult.js';

export function demoCommand(io: CliIo): Command {
  return new Command('demo')
    .description('plan the next delivery day of the shipped fictional market (Halvorn) and print a summary')
    .addOption(outOption('also write the plan\'s files into this folder'))
    .addOption(forceOption())
    .addOption(jsonOption())
    .addHelpText('after', '\nExamples:\n  quantbid demo\n  quantbid demo --out runs/demo --force')
    .action(async (flags: { out?: string; force?: boolean; json?: boolean }) => {
      const settings = { ...(flags.out === undefined ? {} : { out: flags.out }), force: flags.force === true };
      const { demoUseCase } = await import('../app/plan/demoUseCase.js');
      const { loadHighsSolver } = await import('../app/solver/highsSolver.js');
      printResult(io, demoUseCase(settings, cliHooks(io, false), { lpSolver: await loadHighsSolver() }), flags.json === true);
    });
}
