import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bundledModules, moduleListing } from './moduleListing.js';

// A backtest of schedule policies from a forecast file loads neither the forecast models (--model),
// nor the scenario paths of curve and auto, nor the report code (--report): each loads when a run asks
// for it. Module loading is a large part of a short run's time (README, Speed). The demo scenario,
// fictional, two days; a module hook lists every module the process loads.
const listing = moduleListing();
afterAll(() => listing.remove());

/** The modules (dist/ ones without the dist/) a backtest of the demo's first two February days loads, with `extra` options; its output folder. */
function backtestModules(name: string, extra: readonly string[]): { modules: string[]; out: string } {
  const out = join(listing.folder, name);
  const run = listing.run(['backtest', '--scenario', 'scenarios/halvorn/scenario.json', '--from', '2026-02-01', '--to', '2026-02-02', '--out', out, '--quiet', ...extra]);
  expect(run.status, run.stderr).toBe(0);
  const modules = bundledModules(run.files).map((file) => file.replace(/^dist\//, ''));
  return { modules, out };
}

// The summary's sentences (report/edgeText.js, report/imbalanceDescription.js) are printed by every run.
// javascript-lp-solver is the LP path's, which the demo's days never take (src/plan/lpSolver.ts loads it on first use).
const LAZY = /^(node_modules\/javascript-lp-solver\/|report\/(?!edgeText\.js$|imbalanceDescription\.js$)|app\/modelForecast\.js$|app\/scenarios\/(quantilePaths|scenarioPlanningOf)\.js$|forecast\/models\/(?!errors\.js$))/;

describe('backtest loads what the run needs', () => {
  it('schedule policies from a forecast file: no forecast model, scenario path, report or LP solver module', () => {
    const { modules, out } = backtestModules('plain', []);
    expect(modules).toContain('app/backtest/backtestUseCase.js');
    expect(modules.filter((m) => LAZY.test(m))).toEqual([]);
    expect(existsSync(join(out, 'ledger.csv'))).toBe(true);
    expect(existsSync(join(out, 'report.html'))).toBe(false);
  });

  it('--report loads the report code and writes report.html', () => {
    const { modules, out } = backtestModules('report', ['--report']);
    expect(modules).toContain('report/backtestReport.js');
    expect(existsSync(join(out, 'report.html'))).toBe(true);
  });
});
