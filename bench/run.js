// `npm run bench`: the benchmarks one after another, each in its own process, each printing medians
// and ratios against a reference measured in the same run (never a lone absolute time).
//
//   npm run bench            the day solver, a year's backtest in and out of process, start-up, sweep and
//                            forecast (a few minutes)
//   npm run bench -- --all   also the 12 x 12 size grid, the forecast quality run and the scenario-bid
//                            trials and year (much longer)
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const all = process.argv.includes('--all');
const benches = [
  ['day solver against HiGHS (issue goal: 10x its kept model)', 'daySolver.js', ['--days', '1000']],
  ['one year backtest against reading its CSVs', 'yearBacktest.js', []],
  ['whole processes against plain Node: the year backtest, --version, --help, plan', 'wholeRun.js', []],
  ['one year sweep on 1 and 2 threads', 'sweepYear.js', []],
  ['one year of daily forecasts by arx-hs and the default method, share fitting, against reading the year', 'forecastYear.js', []],
  ['curve planning of a 96-period day on 100 paths against the extensive form (goal: at most 1.5 s, a tenth of 13.7 s)', 'scenarioBids/curveTiming.js', ['--days', '3']],
  ...(all
    ? [
        ['12 x 12 size grid over a year at hourly resolution', 'sizeGrid.js', ['--grid', '12']],
        ['forecast quality over the last year of the demo', 'forecastQuality.js', []],
        ['scenario bids: paths x steps and z on the known-distribution markets', 'scenarioBids/dayTrials.js', ['--days', '8']],
        ['scenario bids: a year of auto against price-taking on the known-distribution markets', 'scenarioBids/yearAuto.js', []],
      ]
    : []),
];
let failed = 0;
for (const [title, script, args] of benches) {
  console.log(`\n== ${title} (node bench/${script} ${args.join(' ')})`);
  const result = spawnSync(process.execPath, [join(here, script), ...args], { stdio: 'inherit' });
  if (result.status !== 0) {
    failed++;
    console.log(`bench/${script} ended with exit code ${result.status}`);
  }
}
process.exitCode = failed === 0 ? 0 : 1;
