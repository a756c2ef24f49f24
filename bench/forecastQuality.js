// Quality of the quantile forecasts `quantbid forecast` makes, measured on the fictional demo market
// (scenarios/halvorn) over one year: for every method of FORECAST_METHODS, with the default options,
// and for the scenario's own quantiles.csv.gz as a comparison, the CRPS (mean pinball loss over the 19
// levels 0.05..0.95, factor 2 not included), its improvement over naive-hs, the coverage of the 80%
// and 90% central intervals, Kupiec (1995) p-values over all periods, the number of periods of the day
// whose own Kupiec and Christoffersen (1998) conditional coverage tests reject at 5%, the share of
// prices below the median, and the Diebold-Mariano test (HLN, h = 1, daily crps) of each method
// against the default. Prints a markdown table; docs/forecast-quality.md holds its output.
//
//   npm run build && node bench/forecastQuality.js [--from 2026-01-01] [--to 2026-12-31]
//        [--methods naive-hs,arx-hs,...] [--scenario scenarios/halvorn/scenario.json]
//        [--options '{"calibrationDays": 182, "errorScale": "price"}']   (Forecaster options over DEFAULTS)
//
// Uses the compiled project (dist/), the same functions as `quantbid forecast` and `quantbid score`.
import { basename, resolve } from 'node:path';
import { loadDist } from './lib/reference.js';

const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const FROM = arg('from', '2026-01-01');
const TO = arg('to', '2026-12-31');
const SCENARIO = resolve(arg('scenario', 'scenarios/halvorn/scenario.json'));
const LEVELS = Array.from({ length: 19 }, (_, i) => Number(((i + 1) * 0.05).toFixed(2)));

const { DEFAULT_METHOD, FORECAST_METHODS } = await loadDist('forecast/forecaster.js');
const { forecastRange } = await loadDist('forecast/forecastRange.js');
const { scoreForecasts } = await loadDist('forecast/scoring/scoreForecasts.js');
const { compareForecasts } = await loadDist('forecast/scoring/compareForecasts.js');
const { readScenario } = await loadDist('io/readScenario.js');
const { readMarketSpec } = await loadDist('io/readSpecs.js');
const { readPriceHistory } = await loadDist('io/readPriceHistory.js');
const { readQuantileForecast } = await loadDist('io/readQuantileForecast.js');
const { DayCalendar } = await loadDist('market/dayCalendar.js');

const METHODS = arg('methods', FORECAST_METHODS.join(',')).split(',');
const OPTIONS = JSON.parse(arg('options', '{}'));
const scenario = readScenario(SCENARIO);
const market = readMarketSpec(scenario.market);
const history = readPriceHistory(scenario.history, market);
const realised = new Map(history.days.map((d) => [d.day, d.pricePerMwh]));
const calendar = new DayCalendar(market.timeZone, market.periodMinutes);

/** Scored days of a list of quantile days, restricted to the history (time order). */
const scored = (days) => days.filter((q) => realised.has(q.day)).map((forecast) => ({ forecast, realised: realised.get(forecast.day) }));

const rows = [];
for (const method of METHODS) {
  const started = performance.now();
  const run = forecastRange(history, { from: FROM, to: TO, method, levels: LEVELS, priceFloor: market.priceFloor, priceCap: market.priceCap, periodsOf: (d) => calendar.periods(d) }, OPTIONS);
  const seconds = (performance.now() - started) / 1000;
  process.stderr.write(`${method}: ${run.forecasts.length} days in ${seconds.toFixed(0)} s, ${run.skipped.length} skipped\n`);
  rows.push({ name: method, days: scored(run.forecasts.map((f) => f.quantiles)), seconds });
}
if (scenario.forecast !== undefined) {
  const file = readQuantileForecast(scenario.forecast, market);
  const days = [...file.days.values()].filter((q) => q.day >= FROM && q.day <= TO).sort((a, b) => (a.day < b.day ? -1 : 1));
  rows.push({ name: `scenario's ${basename(scenario.forecast)}`, days: scored(days), seconds: null });
}

const nominal = (scores, c) => scores.coverage.find((x) => Math.abs(x.nominal - c) < 1e-9);
const naive = rows.find((r) => r.name === 'naive-hs');
const reference = rows.find((r) => r.name === DEFAULT_METHOD);
const fmt = (x, d) => (x === null || x === undefined || Number.isNaN(x) ? '-' : x.toFixed(d));
const p = (x) => (x < 0.001 ? '<0.001' : x.toFixed(3));

for (const row of rows) {
  const table = scoreForecasts(row.days);
  row.table = table;
  row.crps = table.overall.crps;
}
const header = [
  'method', 'days', 'CRPS/2', 'vs naive-hs', 'cov. 80%', 'Kupiec p 80%', 'cov. 90%', 'Kupiec p 90%',
  'periods rej. Kupiec 80/90', 'periods rej. Christoffersen cc 80/90', 'below median', `DM vs ${DEFAULT_METHOD} (p)`, 'targets met', 'time [s]',
];
const lines = [`| ${header.join(' | ')} |`, `|${header.map(() => '---').join('|')}|`];
const best = [];
for (const row of rows) {
  const o = row.table.overall;
  const c80 = nominal(o, 0.8);
  const c90 = nominal(o, 0.9);
  const rejected = (c, test) => row.table.bySlot.filter((slot) => {
    const s = nominal(slot, c);
    const value = s === undefined ? undefined : test(s);
    return value !== undefined && value !== null && value < 0.05;
  }).length;
  const kupiecRej = `${rejected(0.8, (s) => s.kupiec?.pValue)}/${rejected(0.9, (s) => s.kupiec?.pValue)}`;
  const ccRej = `${rejected(0.8, (s) => s.christoffersen?.pValueConditionalCoverage)}/${rejected(0.9, (s) => s.christoffersen?.pValueConditionalCoverage)}`;
  const improvement = naive === undefined ? null : 1 - row.crps / naive.crps;
  let dm = '-';
  if (reference !== undefined && row !== reference) {
    const common = new Set(reference.days.map((d) => d.forecast.day));
    const mine = row.days.filter((d) => common.has(d.forecast.day));
    const theirs = new Map(reference.days.map((d) => [d.forecast.day, d]));
    const test = compareForecasts(mine, mine.map((d) => theirs.get(d.forecast.day))).test;
    dm = test.status === 'ok' ? `${fmt(test.hln, 2)} (${p(test.pValueTwoSided)})` : test.status;
  }
  const met =
    Math.abs(c80.observed - 0.8) <= 0.03 && Math.abs(c90.observed - 0.9) <= 0.03 && c80.kupiec.pValue >= 0.05 && c90.kupiec.pValue >= 0.05 && (improvement ?? 0) >= 0.25;
  if (met && row.seconds !== null) best.push(row);
  lines.push(
    `| ${[
      row.name, row.days.length, fmt(row.crps, 3), improvement === null ? '-' : `${fmt(100 * improvement, 1)}%`,
      `${fmt(100 * c80.observed, 2)}%`, p(c80.kupiec.pValue), `${fmt(100 * c90.observed, 2)}%`, p(c90.kupiec.pValue),
      kupiecRej, ccRej, fmt(o.belowShare[LEVELS.indexOf(0.5)], 3), dm, met ? 'yes' : 'no', row.seconds === null ? '-' : fmt(row.seconds, 0),
    ].join(' | ')} |`,
  );
}
best.sort((a, b) => a.crps - b.crps);
console.log(`Forecast quality on ${scenario.name}, ${FROM} to ${TO}, ${rows[0]?.table.bySlot.length ?? 0} periods of the day, levels 0.05..0.95, options ${JSON.stringify(OPTIONS)} over DEFAULTS\n`);
console.log(lines.join('\n'));
console.log(`\nlowest CRPS among the methods that meet every target: ${best[0]?.name ?? 'none'}; default method: ${DEFAULT_METHOD}`);
