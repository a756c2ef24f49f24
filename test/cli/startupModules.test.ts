import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bundledModules, moduleListing, ROOT } from './moduleListing.js';
import { COMMANDS } from './runMain.js';

// What a user waits for before `quantbid --version` or `quantbid COMMAND --help` answers is Node
// loading modules: the help needs commander and the options' words, never the validation library, the
// zone library, the LP solver, the readers, the use cases or the report code (they load when a command
// runs). The compiled CLI is run with a module hook that lists every module the process loads.
const listing = moduleListing();
const folder = listing.folder;
afterAll(() => listing.remove());

/** The modules `quantbid ...args` loads (moduleListing.ts); `files` keeps the bundle's files as they are. */
function loadedModules(args: readonly string[], files: 'modules' | 'files' = 'modules'): string[] {
  const result = listing.run(args);
  expect(result.status, result.stderr).toBe(0);
  return files === 'files' ? result.files : bundledModules(result.files);
}

/**
 * Heavy modules: a package other than commander, or a file of dist/ outside the CLI's own light modules
 * (the forecasting layer's error classes are light: the levels' words that the help prints use them).
 */
function heavy(modules: readonly string[]): string[] {
  return modules.filter(
    (m) =>
      /node_modules\/(zod|luxon|javascript-lp-solver|highs)\//.test(m) ||
      // The forecasting layer's error classes are light: the levels' words that the help prints use them.
      /^dist\/(report|plan\/warehouse|forecast\/models\/(?!errors\.js$)|io\/read)/.test(m) ||
      /UseCase\.js$/.test(m) ||
      m === 'node:zlib' ||
      m === 'node:worker_threads',
  );
}

describe('start-up: what --version and --help load', () => {
  it('--version and --help load commander and no heavy module', () => {
    for (const args of [['--version'], ['--help']]) {
      const modules = loadedModules(args);
      expect(modules.some((m) => m.includes('node_modules/commander/')), args.join(' ')).toBe(true);
      expect(heavy(modules), args.join(' ')).toEqual([]);
    }
  });

  it('every command\'s --help loads no heavy module', () => {
    for (const command of COMMANDS) expect(heavy(loadedModules([command, '--help'])), command).toEqual([]);
  });

  it('a command that runs loads its use case (the hook sees what a run loads)', () => {
    const modules = loadedModules(['backtest', '--scenario', 'scenarios/halvorn/scenario.json', '--from', '2026-03-01', '--to', '2026-03-01', '--out', join(folder, 'backtest'), '--quiet']);
    expect(modules).toContain('dist/app/backtest/backtestRun.js');
    expect(modules).toContain('dist/io/readPriceHistory.js');
  });
});

describe('start-up: what a plan loads', () => {
  // `quantbid plan` starts from the bundle of the compiled CLI (dist/bundle/), and the demo day's plan
  // with a schedule policy is checked by the hand-written checks (app/plan/planFastPath.ts): no module
  // of dist/cli or the rest of dist/, no validation library, no report code, no LP library (the day
  // solver does not need it), no history reader. (The default, auto, plans on scenarios: HiGHS and the
  // schemas.)
  it('the demo day\'s plan with a schedule policy loads the bundle\'s run and none of the validation library, the report, the LP library or the history reader', () => {
    const files = loadedModules(['plan', '--scenario', 'scenarios/halvorn/scenario.json', '--policy', 'quantile', '--json'], 'files');
    expect(files).toContain('dist/bundle/main.js');
    expect(files.filter((m) => /^dist\/(?!bundle\/)/.test(m))).toEqual([]);
    // Five files (scripts/bundlePlanCli.mjs): the entry, what it imports at once, the plan's checks, its
    // run and the bundler's helpers; commander and luxon are joined in, not loaded file by file.
    expect(files.filter((m) => m.startsWith('dist/bundle/')).sort()).toEqual(['dist/bundle/main.js', 'dist/bundle/planRunning.js', 'dist/bundle/planStart.js', 'dist/bundle/rolldown-runtime.js', 'dist/bundle/start.js']);
    expect(files.filter((m) => m.includes('node_modules/'))).toEqual([]);
    expect(files).not.toContain('node:crypto');
    const modules = loadedModules(['plan', '--scenario', 'scenarios/halvorn/scenario.json', '--policy', 'quantile', '--json']);
    expect(modules).toContain('dist/app/plan/planRun.js');
    expect(modules).toContain('dist/io/readQuantileForecastDay.js');
    expect(modules.filter((m) => /node_modules\/(zod|javascript-lp-solver)\/|^dist\/report\/|readPriceHistory|planUseCase/.test(m))).toEqual([]);
  });

  it('a plan whose market.json has a problem loads the schemas to word it', () => {
    const bad = join(folder, 'bad');
    mkdirSync(bad);
    const demo = join(ROOT, 'scenarios', 'halvorn');
    writeFileSync(join(bad, 'market.json'), readFileSync(join(demo, 'market.json'), 'utf8').replace('"priceCap"', '"priceCapp"'));
    const result = listing.run(['plan', '--market', join(bad, 'market.json'), '--battery', join(demo, 'battery.json'), '--forecast', join(demo, 'quantiles.csv.gz'), '--day', '2027-01-01']);
    expect(result.status).toBe(2);
    expect(result.stderr).toContain('priceCapp: unknown field');
    const modules = bundledModules(result.files);
    expect(modules).toContain('dist/app/plan/planUseCase.js');
    expect(modules.some((m) => m.includes('node_modules/zod/'))).toBe(true);
  });

  it('the default policy without a history or paths plans price-taking without loading HiGHS or the schemas', () => {
    const demo = join(ROOT, 'scenarios', 'halvorn');
    const result = listing.run(['plan', '--market', join(demo, 'market.json'), '--battery', join(demo, 'battery.json'), '--forecast', join(demo, 'quantiles.csv.gz'), '--day', '2027-01-01']);
    expect(result.status).toBe(0);
    expect(result.stderr).toContain("this plan is price-taking's, its fallback");
    expect(result.files.filter((m) => /node_modules\/(highs|zod)\//.test(m))).toEqual([]);
    expect(bundledModules(result.files).filter((m) => /highsSolver|planUseCase/.test(m))).toEqual([]);
  });
});
