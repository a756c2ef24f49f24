import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bundledModules, moduleListing, ROOT } from './moduleListing.js';

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
  it('schedule policies from a forecast file: no forecast model, scenario path, report or LP solver module, and no validation library', () => {
    const { modules, out } = backtestModules('plain', []);
    // Checked by the hand-written checks of the fast path (app/backtest/backtestFastPath.ts): zod and the schemas load only to word a problem.
    expect(modules).toContain('app/backtest/backtestRun.js');
    expect(modules.filter((m) => /node_modules\/zod\/|backtestUseCase\.js$|readSpecs\.js$|readScenario\.js$|settingSchemas\.js$/.test(m))).toEqual([]);
    expect(modules.filter((m) => LAZY.test(m))).toEqual([]);
    expect(existsSync(join(out, 'ledger.csv'))).toBe(true);
    expect(existsSync(join(out, 'report.html'))).toBe(false);
  });

  it('--report loads the report code and writes report.html', () => {
    const { modules, out } = backtestModules('report', ['--report']);
    expect(modules).toContain('report/backtestReport.js');
    expect(existsSync(join(out, 'report.html'))).toBe(true);
  });

  it('a market.json with a problem loads the schemas to word it', () => {
    const bad = join(listing.folder, 'bad-market');
    mkdirSync(bad);
    const demo = join(ROOT, 'scenarios', 'halvorn');
    writeFileSync(join(bad, 'market.json'), readFileSync(join(demo, 'market.json'), 'utf8').replace('"priceCap"', '"priceCapp"'));
    const run = listing.run(['backtest', '--scenario', 'scenarios/halvorn/scenario.json', '--market', join(bad, 'market.json'), '--from', '2026-02-01', '--to', '2026-02-02', '--out', join(bad, 'out'), '--quiet']);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('priceCapp: unknown field');
    expect(bundledModules(run.files).map((file) => file.replace(/^dist\//, ''))).toContain('app/backtest/backtestUseCase.js');
  });
});
