// One year of the demo market at 15 minutes, five policies, one setting (alpha 0.1, follow-plan):
// the backtest's days per second and the share of its time spent solving day problems, against the
// time quantbid's readers take to read and validate that year's history and forecast CSVs, measured in
// the same process (medians, so the cold first read does not count). What a user waits for, the whole
// process against a plain read, is bench/wholeRun.js. Both CSVs are cut to the year (with the last day of
// the year before, which the history needs for the first day's state) and written uncompressed to a
// temporary folder first.
//
//   npm run build && node bench/yearBacktest.js [--year 2026] [--reads 5] [--runs 3]
//
// Times are medians over --reads reads and --runs backtests; CPU time is process.cpuUsage().
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { writeYearInputs } from './lib/yearData.js';
import { median, option } from './lib/args.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const YEAR = option('year', '2026');
const READS = Number(option('reads', 5));
const RUNS = Number(option('runs', 3));
const dist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);

const { readMarketSpec, readBatterySpec } = await dist('io/readSpecs.js');
const { batteryModel } = await dist('battery/batterySpec.js');
const { readPriceHistory } = await dist('io/readPriceHistory.js');
const { readQuantileForecast } = await dist('io/readQuantileForecast.js');
const { runBacktest } = await dist('backtest/runBacktest.js');

const folder = mkdtempSync(join(tmpdir(), 'quantbid-year-'));
try {
  const { historyPath, forecastPath, marketPath, batteryPath } = writeYearInputs(folder, YEAR);
  const market = readMarketSpec(marketPath);
  const battery = batteryModel(readBatterySpec(batteryPath));

  const readMs = [];
  let history;
  let forecast;
  for (let i = 0; i < READS; i++) {
    const started = performance.now();
    history = readPriceHistory(historyPath, market);
    forecast = readQuantileForecast(forecastPath, market);
    readMs.push(performance.now() - started);
  }

  const from = `${YEAR}-01-01`;
  const to = `${YEAR}-12-31`;
  // Two measures: the day loop alone (plan and settle every policy, the totals a sweep or a summary
  // needs) and the same loop keeping every period's orders and settlement (what ledger.csv is made of).
  const measure = (keepLedger) => {
    const runMs = [];
    const solveShare = [];
    let result;
    for (let i = 0; i < RUNS; i++) {
      const stopwatch = { now: () => performance.now(), spentMs: 0, calls: 0 };
      const started = performance.now();
      result = runBacktest({ market, battery, history, forecast, from, to }, { keepLedger, solveOptions: { stopwatch } });
      const ms = performance.now() - started;
      runMs.push(ms);
      solveShare.push(stopwatch.spentMs / ms);
    }
    return { result, ms: median(runMs), solveShare: median(solveShare) };
  };
  const totals = measure(false);
  const ledger = measure(true);
  const days = totals.result.days.length;
  const policies = totals.result.days[0]?.runs.length ?? 0;
  const read = median(readMs);
  console.log(`year ${YEAR} of the demo market at 15 minutes: ${days} days covered, ${policies} policies, alpha 0.1, follow-plan`);
  console.log(`read and validate history + forecast CSVs   median ${(read / 1000).toFixed(3)} s over ${READS} reads (the reference)`);
  console.log(`backtest, plan and settle every policy      median ${(totals.ms / 1000).toFixed(3)} s over ${RUNS} runs = ${(totals.ms / read).toFixed(2)} x the read`);
  console.log(`  days per second                          ${(days / (totals.ms / 1000)).toFixed(0)} (${((days * policies) / (totals.ms / 1000)).toFixed(0)} policy-days per second)`);
  console.log(`  share of the time solving day problems   ${(100 * totals.solveShare).toFixed(1)} %`);
  console.log(`the same, keeping every period's ledger     median ${(ledger.ms / 1000).toFixed(3)} s = ${(ledger.ms / read).toFixed(2)} x the read, ${(100 * ledger.solveShare).toFixed(1)} % solving`);
} finally {
  rmSync(folder, { recursive: true, force: true });
}
