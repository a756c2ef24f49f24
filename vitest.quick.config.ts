import { defineConfig, mergeConfig } from 'vitest/config';
import base from './vitest.config.js';

/**
 * `npm run test:quick`, the inner loop: the unit tests, without the browser, without child processes
 * (the compiled CLI, killed runs), without what needs a fresh dist/ (worker threads), without the
 * long solver comparisons against HiGHS (`*.vs-highs.test.ts`) and without the files that replay the
 * demo's years in-process or fit many forecasts (over 3 s each on 2 shared cores). `npm test` runs
 * everything; CI runs `npm test`. Name a new long comparison `*.vs-highs.test.ts` and it stays out of
 * the quick run. The test files share one module cache per worker (isolate: false), which halves the
 * time spent importing; `npm test` keeps every file isolated.
 */
export const SLOW_OR_SPAWNING = [
  '**/*.browser.test.ts',
  '**/*.vs-highs.test.ts',
  'test/packaging/**',
  'test/cli/backtestCommand.test.ts',
  'test/cli/sweepCommand.test.ts',
  'test/cli/sizeCommand.test.ts',
  'test/cli/modelForecast.test.ts',
  'test/cli/scenarioPolicies.test.ts',
  'test/cli/forecastPathsToAuto.test.ts',
  'test/grid/runGrid.test.ts',
  'test/grid/killResume.test.ts',
  'test/hardening/killedRuns.test.ts',
  'test/hardening/concurrentRuns.test.ts',
  'test/hardening/fullDisk.test.ts',
  'test/hardening/journalTampering.test.ts',
  'test/hardening/numericFuzz.test.ts',
  'test/hardening/determinism.test.ts',
  'test/io/forecastCache.test.ts',
  'test/report/sweepReport.test.ts',
  'test/report/sizeReport.test.ts',
  'test/report/backtestReport.test.ts',
  'test/report/scoreReport.test.ts',
  'test/cli/quietFlag.test.ts',
  'test/cli/startupModules.test.ts',
  'test/hardening/cliProperties.test.ts',
  'test/forecast/forecaster.test.ts',
  'test/forecast/fitStopwatch.test.ts',
  // Whole years of odd zones compared with luxon, and the readers' long property runs.
  'test/io/periodLocator.test.ts',
  'test/market/steadyDays.test.ts',
  'test/market/civilDays.test.ts',
  'test/io/plainRow.test.ts',
];

export default mergeConfig(base, defineConfig({ test: { exclude: ['**/node_modules/**', ...SLOW_OR_SPAWNING], isolate: false } }));
