// A year of daily quantile forecasts at 15 minutes on the fictional demo market (scenarios/halvorn),
// 19 levels 0.05..0.95, default options, by each method of --methods (default: arx-hs, the default
// before auto, and the default method), through forecastRange as `quantbid forecast` calls it: one
// fresh Forecaster per method, so the time includes the point forecasts of the calibration days before
// the first day. Prints per method the median wall time per day, the total, the share of it spent
// fitting models (least squares / LASSO per slot and window, QRA's quantile regressions; the
// forecaster's fit stopwatch, src/forecast/fitStopwatch.ts), all against the time to read and validate
// that year's history CSV (cut to the year, uncompressed), and each method's year against the first
// method's, measured in the same process.
//
//   npm run build && node bench/forecastYear.js [--year 2026] [--methods arx-hs,auto] [--reads 3] [--options '{"driverCentre":"recent"}']
//
// --options: Forecaster options over DEFAULTS for every method (and every process of --rounds / --baseline).
//
// The day times are the gaps between forecastRange's per-day callbacks; the first day carries the
// calibration days' point forecasts, so it is shown apart and the median is over all days.
//
//   node bench/forecastYear.js --methods arx-hs,auto --rounds 3 [--root DIR]
//
// with --rounds and without --baseline: each method's year in a process of its own, the methods
// interleaved round by round, and prints per method the median CPU and wall time and their ratios to
// the first method's (the goal of `auto`: at most 3x `arx-hs`'s year), and whether every round of a
// method made the same forecasts; with --root, of the dist/ of another built checkout.
//
//   node bench/forecastYear.js --baseline DIR [--rounds 3] [--method NAME]
//
// times the same year of one method (--method, default the default method) with the dist/ of DIR (another built checkout, e.g. of main) in separate
// processes, interleaved round by round with this checkout's, and prints the median CPU and wall time
// of each, the ratio of the medians, and whether both made the same forecasts (a SHA-256 of every
// quantile, point and path price, bit for bit).
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { gunzipSync } from 'node:zlib';
import { median } from './lib/args.js';
import { timedNode } from './lib/processTime.js';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
/** The checkout whose dist/ is timed (--root, default this one); the demo's data is always this checkout's. */
const root = arg('root', here);
const demo = join(here, 'scenarios', 'halvorn');
const loadDist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);
const BASELINE = arg('baseline', null);
if (BASELINE !== null) {
  compareWithBaseline(BASELINE, Number(arg('rounds', 3)));
  process.exit(process.exitCode ?? 0);
}
if (arg('rounds', null) !== null && !process.argv.includes('--json')) {
  compareMethods(Number(arg('rounds', null)));
  process.exit(process.exitCode ?? 0);
}

/** Times each method of --methods (default arx-hs,auto) in its own processes, interleaved round by round. */
function compareMethods(rounds) {
  const methods = (arg('methods', null) ?? arg('method', null) ?? 'arx-hs,auto').split(',');
  const passOn = ['year', 'reads', 'root', 'options'].flatMap((name) => (arg(name, null) === null ? [] : [`--${name}`, arg(name, null)]));
  const results = new Map(methods.map((m) => [m, []]));
  for (let round = 0; round < rounds; round++) {
    for (const method of methods) {
      const { stdout } = timedNode([fileURLToPath(import.meta.url), '--json', '--method', method, ...passOn]);
      results.get(method).push(JSON.parse(stdout));
    }
  }
  const cpu = (m) => median(results.get(m).map((r) => r.cpuMs));
  const wall = (m) => median(results.get(m).map((r) => r.totalMs));
  const first = methods[0];
  console.log(`a year of daily forecasts of the demo (${arg('year', '2026')}), ${methods.join(', ')} each in its own process, ${rounds} interleaved rounds`);
  for (const m of methods) {
    const same = new Set(results.get(m).map((r) => r.digest)).size === 1;
    console.log(
      `  ${m.padEnd(14)} median ${(cpu(m) / 1000).toFixed(1)} s CPU, ${(wall(m) / 1000).toFixed(1)} s wall = ` +
        `${(cpu(m) / cpu(first)).toFixed(2)}x ${first}'s CPU, ${(wall(m) / wall(first)).toFixed(2)}x its wall` +
        `${m === 'auto' && first === 'arx-hs' ? ' (goal: at most 3x)' : ''}; forecasts ${same ? 'the same in every round' : 'DIFFER between rounds'}`,
    );
    if (!same) process.exitCode = 1;
  }
}

/** Times this checkout and `baseline` in interleaved rounds (each a process of this script with --json). */
function compareWithBaseline(baseline, rounds) {
  const passOn = ['year', 'method', 'reads', 'options'].flatMap((name) => (arg(name, null) === null ? [] : [`--${name}`, arg(name, null)]));
  const runs = { this: here, baseline };
  const results = { this: [], baseline: [] };
  for (let round = 0; round < rounds; round++) {
    for (const [name, checkout] of Object.entries(runs)) {
      const { stdout } = timedNode([fileURLToPath(import.meta.url), '--root', checkout, '--json', ...passOn]);
      results[name].push(JSON.parse(stdout));
    }
  }
  const cpu = (name) => median(results[name].map((r) => r.cpuMs));
  const wall = (name) => median(results[name].map((r) => r.totalMs));
  const digests = new Set([...results.this, ...results.baseline].map((r) => r.digest));
  console.log(`a year of daily forecasts (${results.this[0].method}, ${results.this[0].days} days), this checkout against ${baseline}, ${rounds} interleaved rounds`);
  for (const name of ['this', 'baseline']) console.log(`  ${name.padEnd(9)} median ${(cpu(name) / 1000).toFixed(1)} s CPU, ${(wall(name) / 1000).toFixed(1)} s wall`);
  console.log(`  ratio     ${(cpu('this') / cpu('baseline')).toFixed(2)}x the baseline's CPU, ${(wall('this') / wall('baseline')).toFixed(2)}x its wall time (goal: at most 0.5x)`);
  console.log(`  forecasts ${digests.size === 1 ? 'identical, bit for bit' : 'DIFFER'}`);
  if (digests.size !== 1) process.exitCode = 1;
}

const { DEFAULT_METHOD, FORECAST_METHODS } = await loadDist('forecast/forecaster.js');
const { forecastRange } = await loadDist('forecast/forecastRange.js');
const { readMarketSpec } = await loadDist('io/readSpecs.js');
const { readPriceHistory } = await loadDist('io/readPriceHistory.js');
const { DayCalendar } = await loadDist('market/dayCalendar.js');

const YEAR = arg('year', '2026');
const METHODS = (arg('methods', null) ?? arg('method', null) ?? [...new Set(['arx-hs', DEFAULT_METHOD])].join(',')).split(',');
const READS = Number(arg('reads', 3));
/** --options: Forecaster options over DEFAULTS (default none), for every method. */
const OPTIONS = JSON.parse(arg('options', '{}'));
for (const method of METHODS) {
  if (!FORECAST_METHODS.includes(method)) {
    console.error(`--methods ${method}: expected one of ${FORECAST_METHODS.join(', ')}`);
    process.exit(2);
  }
}
/** --json (one process of a --baseline comparison): the first method only. */
const JSON_OUT = process.argv.includes('--json');
const LEVELS = Array.from({ length: 19 }, (_, i) => Number(((i + 1) * 0.05).toFixed(2)));

/** The CSV's header and the rows whose local timestamp starts with the year. */
function cutToYear(gzPath) {
  const [header, ...rows] = gunzipSync(readFileSync(gzPath)).toString('utf8').trimEnd().split('\n');
  return [header, ...rows.filter((row) => row.startsWith(YEAR))].join('\n') + '\n';
}

const folder = mkdtempSync(join(tmpdir(), 'quantbid-forecast-year-'));
try {
  const market = readMarketSpec(join(demo, 'market.json'));
  const yearPath = join(folder, 'history.csv');
  writeFileSync(yearPath, cutToYear(join(demo, 'history.csv.gz')));
  const readMs = [];
  for (let i = 0; i < READS; i++) {
    const started = performance.now();
    readPriceHistory(yearPath, market);
    readMs.push(performance.now() - started);
  }
  const read = median(readMs);

  // The forecaster reads the whole history: the year before gives the calibration days.
  const history = readPriceHistory(join(demo, 'history.csv.gz'), market);
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  if (!JSON_OUT) {
    console.log(`year ${YEAR} of the demo market at 15 minutes, 19 levels, default options (default method ${DEFAULT_METHOD})`);
    console.log(`read and validate the year's CSV   median ${(read / 1000).toFixed(3)} s over ${READS} reads (the reference)`);
  }
  let firstMs = null;
  for (const METHOD of JSON_OUT ? METHODS.slice(0, 1) : METHODS) {
    const request = {
      from: `${YEAR}-01-01`, to: `${YEAR}-12-31`, method: METHOD, levels: LEVELS,
      priceFloor: market.priceFloor, priceCap: market.priceCap, periodsOf: (d) => calendar.periods(d),
    };
    const stopwatch = { now: () => performance.now(), spentMs: 0, calls: 0 };
    const dayMs = [];
    const cpuStarted = process.cpuUsage();
    const started = performance.now();
    let last = started;
    const run = forecastRange(history, request, { ...OPTIONS, stopwatch }, () => {
      const now = performance.now();
      dayMs.push(now - last);
      last = now;
    });
    const totalMs = performance.now() - started;
    const cpu = process.cpuUsage(cpuStarted);
    const cpuMs = (cpu.user + cpu.system) / 1000;
    const perDay = median(dayMs);
    const days = run.forecasts.length;
    if (JSON_OUT) {
      const digest = createHash('sha256');
      for (const f of run.forecasts) {
        for (const row of f.quantiles.prices) digest.update(new Float64Array(row));
        digest.update(new Float64Array(f.point));
        for (const path of f.paths) digest.update(new Float64Array(path));
      }
      console.log(JSON.stringify({ method: METHOD, days, cpuMs, totalMs, perDay, digest: digest.digest('hex') }));
      continue;
    }
    firstMs ??= totalMs;
    console.log(`\nmethod ${METHOD}${METHOD === DEFAULT_METHOD ? ' (default)' : ''}`);
    console.log(`days forecast                      ${days} (${run.skipped.length} skipped)`);
    console.log(`forecast, median per day           ${(perDay / 1000).toFixed(3)} s = ${(perDay / read).toFixed(2)} x the read`);
    console.log(`forecast, first day                ${((dayMs[0] ?? 0) / 1000).toFixed(1)} s (the calibration days' point forecasts)`);
    console.log(`forecast, the whole year           ${(totalMs / 1000).toFixed(1)} s wall, ${(cpuMs / 1000).toFixed(1)} s CPU = ${(totalMs / read).toFixed(1)} x the read = ${(totalMs / firstMs).toFixed(2)} x ${METHODS[0]}'s year`);
    console.log(`share of the time fitting models   ${(100 * stopwatch.spentMs / totalMs).toFixed(1)} % (${stopwatch.calls} models fitted, ${(1000 * stopwatch.spentMs / stopwatch.calls).toFixed(1)} us each)`);
  }
} finally {
  rmSync(folder, { recursive: true, force: true });
}
