// Forecast quality on markets whose true predictive distribution is known (bench/knownMarkets/): for each
// setting and method, over the last year of the setting's history (2031),
//   - pinball loss (mean over the 19 levels 0.05..0.95 and all periods) as a RATIO to that of the true
//     quantiles on the same prices (1 = as good as the truth; the truth minimises the expected loss);
//   - the same ratio in EXPECTED pinball loss: each period's loss averaged over its exact law
//     (knownMarkets/expectedPinball.js) instead of taken at the one price the year drew. The realised
//     ratio of one year moves with the draw (a persistent market's year holds few independent days); the
//     expected ratio keeps only what the forecast itself gets wrong (its history is still one draw);
//     likewise the coverage of the 80% and 90% intervals in expectation (the exact law's probability
//     between the forecast's q0.1 and q0.9, q0.05 and q0.95);
//   - coverage of the central 80% and 90% intervals, and the share of prices below q0.5;
//   - the profit over the year of a `price-taking` plan (schedule on the median, limits at the cap and
//     floor) and of a `median` plan (schedule on the median, limits at q0.9 / q0.1) made on the forecast,
//     as a SHARE of the same plan made on the true quantiles (backtest, follow-plan, the demo's battery);
//   - the same share for price-taking in EXPECTED profit: every accepted MWh valued at the period's true
//     mean price instead of the realised one (truth-mean.csv). Realised profit in a market with rare
//     spikes near the cap is a lottery (a plan that happens to charge in a spike hour loses what a year
//     earns); the expected profit measures the plans, not the draw;
//   - the seconds the method took;
//   - the centre: the share below q0.5 with its standard error, the days as clusters, and the share
//     expected under the truth (the truth's probability below the forecast's q0.5, which one year's
//     draw does not move).
// The truth's own row shows what sampling alone does to coverage and the median share over one year.
// Prints markdown tables (docs/forecast-quality.md holds them).
//
//   npm run build && node bench/forecastKnownMarkets.js [--settings a,b] [--methods auto,arx-hs]
//        [--from 2031-01-01] [--to 2031-12-31] [--options '{"calibrationDays":182}'] [--out DIR] [--draw N]
//
// --draw N (N > 0) scores a fresh, independent draw of every setting (generate.js --draw) instead of the
// bench's own, written to bench/.cache/knownMarkets-drawN.
//
// The input files are written to --out (default bench/.cache/knownMarkets) and read back through the
// project's readers, as `quantbid` reads them; the forecasts are made by forecastRange, as `quantbid
// forecast` makes them.
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { loadDist } from './lib/reference.js';
import { expectedPinballScorer } from './knownMarkets/expectedPinball.js';
import { LEVELS, writeSettings } from './knownMarkets/generate.js';
import { SETTINGS, SPAN } from './knownMarkets/settings.js';

const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};

const { DEFAULT_METHOD, FORECAST_METHODS } = await loadDist('forecast/forecaster.js');
const { forecastRange } = await loadDist('forecast/forecastRange.js');
const { scoreForecasts } = await loadDist('forecast/scoring/scoreForecasts.js');
const { runBacktest } = await loadDist('backtest/runBacktest.js');
const { readScenario } = await loadDist('io/readScenario.js');
const { readMarketSpec, readBatterySpec } = await loadDist('io/readSpecs.js');
const { readPriceHistory } = await loadDist('io/readPriceHistory.js');
const { readQuantileForecast } = await loadDist('io/readQuantileForecast.js');
const { batteryModel } = await loadDist('battery/batterySpec.js');
const { DayCalendar } = await loadDist('market/dayCalendar.js');
const { orderExpectation } = await loadDist('forecast/quantileDistribution.js');
const { normalCdf } = await loadDist('stats/normalCdf.js');

const FROM = arg('from', SPAN.truthFrom);
const TO = arg('to', SPAN.to);
const DRAW = Number(arg('draw', 0));
const OUT = resolve(arg('out', join('bench', '.cache', DRAW === 0 ? 'knownMarkets' : `knownMarkets-draw${DRAW}`)));
const NAMES = arg('settings', SETTINGS.map((s) => s.name).join(',')).split(',');
const METHODS = arg('methods', FORECAST_METHODS.join(',')).split(',');
const OPTIONS = JSON.parse(arg('options', '{}'));
const POLICIES = ['price-taking', 'median'];

const simulations = new Map();
const folders = await writeSettings(OUT, NAMES, DRAW, simulations);
const fmt = (x, d) => (x === null || x === undefined || Number.isNaN(x) ? '-' : x.toFixed(d));
const percent = (x) => `${fmt(100 * x, 1)}%`;
const summary = [];

for (const folder of folders) {
  const scenario = readScenario(join(folder, 'scenario.json'));
  const market = readMarketSpec(scenario.market);
  const battery = batteryModel(readBatterySpec(scenario.battery));
  const history = readPriceHistory(scenario.history, market);
  const truthFile = readQuantileForecast(scenario.forecast, market);
  const meanPrice = new Map();
  for (const line of readFileSync(join(folder, 'truth-mean.csv'), 'utf8').trim().split('\n').slice(1)) {
    const [start, mean] = line.split(',');
    const day = start.slice(0, 10);
    if (!meanPrice.has(day)) meanPrice.set(day, []);
    meanPrice.get(day).push(Number(mean));
  }
  const realised = new Map(history.days.map((d) => [d.day, d.pricePerMwh]));
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const name = folder.split(/[\\/]/).pop();
  const setting = SETTINGS.find((s) => s.name === name);
  const scored = simulations.get(folder).days.filter((d) => d.truth !== null);
  simulations.delete(folder);
  const expectedPinball = expectedPinballScorer(
    new Map(scored.map((d) => [d.day, d.laws])),
    new Map(scored.map((d) => [d.day, d.mean])),
    truthFile.days,
    setting,
    normalCdf,
  );

  /** Scores and profits of a list of quantile days (only those the truth also has). */
  const evaluate = (days) => {
    const kept = days.filter((q) => truthFile.days.has(q.day) && realised.has(q.day) && q.day >= FROM && q.day <= TO);
    const scored = kept.map((forecast) => ({ forecast, realised: realised.get(forecast.day) }));
    const table = scoreForecasts(scored);
    const backtest = runBacktest(
      { market, battery, history, forecast: { days: new Map(kept.map((q) => [q.day, q])), incompleteDays: [] }, from: FROM, to: TO },
      { policies: POLICIES, keepLedger: true },
    );
    const profit = Object.fromEntries(POLICIES.map((p, i) => [p, backtest.days.reduce((sum, day) => sum + day.runs[i].totals.profit, 0)]));
    // Price-taking: every order accepted, no imbalance; valued at the true means instead of the draws.
    const taking = POLICIES.indexOf('price-taking');
    profit.expected = backtest.days.reduce((sum, day) => {
      const means = meanPrice.get(day.day);
      const periods = day.runs[taking].ledger.periods;
      let surprise = 0;
      periods.forEach((p, t) => (surprise += (day.clearingPricePerMwh[t] - means[t]) * (p.soldAuctionMwh - p.boughtAuctionMwh)));
      return sum + day.runs[taking].totals.profit - surprise;
    }, 0);
    return { days: kept.map((q) => q.day), table, profit, centre: centreShares(kept), expected: expectedPinball(kept) };
  };

  /**
   * The share of prices below the forecast's q0.5 two more ways: its standard error with the days as
   * clusters (the periods of a day share the day's surprise, so a year's share varies as a mean of ~365
   * day means, not of every period), and the share EXPECTED under the truth, the mean over periods of
   * the truth's P(price <= forecast q0.5) (orderExpectation's acceptance of a buy limited there), which
   * the draw's sampling does not move: 0.5 for the truth itself.
   * Cluster-robust variance of a mean (Liang and Zeger 1986; Cameron and Miller 2015, J. Human
   * Resources 50(2), 317-372, with the small-sample factor D / (D - 1)):
   *   Var(p) = D / (D - 1) sum_d (sum_t (b_dt - p))^2 / N^2,  b_dt = 1{y_dt < q0.5}, N periods, D days.
   */
  const centreShares = (forecasts) => {
    const bounds = { priceFloor: market.priceFloor, priceCap: market.priceCap };
    let below = 0;
    let expected = 0;
    let count = 0;
    const perDay = [];
    for (const q of forecasts) {
      const k = q.levels.indexOf(0.5);
      const truthDay = truthFile.days.get(q.day);
      const y = realised.get(q.day);
      let dayBelow = 0;
      q.prices.forEach((row, t) => {
        dayBelow += y[t] < row[k] ? 1 : 0;
        expected += orderExpectation(truthDay.levels, truthDay.prices[t], 'buy', row[k], bounds).acceptance;
      });
      perDay.push([dayBelow, q.prices.length]);
      below += dayBelow;
      count += q.prices.length;
    }
    const share = below / count;
    const D = perDay.length;
    const squares = perDay.reduce((sum, [b, n]) => sum + (b - n * share) ** 2, 0);
    return { share, standardError: Math.sqrt((D / (D - 1)) * squares) / count, expected: expected / count };
  };

  const truthDays = [...truthFile.days.values()].sort((a, b) => (a.day < b.day ? -1 : 1));
  const truth = evaluate(truthDays);
  const rows = [{ name: 'true quantiles', ...truth, seconds: null, chosen: null }];
  for (const method of METHODS) {
    const started = performance.now();
    const run = forecastRange(
      history,
      { from: FROM, to: TO, method, levels: LEVELS, priceFloor: market.priceFloor, priceCap: market.priceCap, periodsOf: (d) => calendar.periods(d) },
      OPTIONS,
    );
    const seconds = (performance.now() - started) / 1000;
    const result = evaluate(run.forecasts.map((f) => f.quantiles));
    const chosen = countChosen(run.forecasts);
    rows.push({ name: method, ...result, seconds, chosen });
    process.stderr.write(`${name} ${method}: ${run.forecasts.length} days in ${seconds.toFixed(0)} s, ${run.skipped.length} skipped\n`);
  }

  const truthPinballOn = (days) => {
    const set = new Set(days);
    return scoreForecasts(truthDays.filter((q) => set.has(q.day)).map((forecast) => ({ forecast, realised: realised.get(forecast.day) }))).overall.crps;
  };
  const header = ['method', 'days', 'pinball / truth', 'pinball / truth, expected', 'cov. 80% (expected)', 'cov. 90% (expected)', 'cov. 80%', 'cov. 90%', 'below q0.5', 'price-taking / truth', 'price-taking / truth, expected', 'median / truth', 'time [s]'];
  const lines = [`| ${header.join(' | ')} |`, `|${header.map(() => '---').join('|')}|`];
  for (const row of rows) {
    const o = row.table.overall;
    const cov = (c) => o.coverage.find((x) => Math.abs(x.nominal - c) < 1e-9).observed;
    const sameDays = row.days.length === truth.days.length ? truth : evaluate(truthDays.filter((q) => row.days.includes(q.day)));
    const ratio = o.crps / (row === rows[0] ? o.crps : truthPinballOn(row.days));
    const share = (p) => row.profit[p] / sameDays.profit[p];
    const label = row.name === DEFAULT_METHOD ? `**${row.name}** (default)` : row.name;
    const expectedRatio = row.expected.ratio;
    lines.push(`| ${[label, row.days.length, fmt(ratio, 3), fmt(expectedRatio, 3), percent(row.expected.coverage80), percent(row.expected.coverage90), percent(cov(0.8)), percent(cov(0.9)), fmt(o.belowShare[LEVELS.indexOf(0.5)], 3), percent(share('price-taking')), percent(share('expected')), percent(share('median')), row.seconds === null ? '-' : fmt(row.seconds, 0)].join(' | ')} |`);
    if (row !== rows[0]) summary.push({ setting: name, method: row.name, belowExpected: row.centre.expected, ratio, expectedRatio, cov80Expected: row.expected.coverage80, cov90Expected: row.expected.coverage90, cov80: cov(0.8), cov90: cov(0.9), below: o.belowShare[LEVELS.indexOf(0.5)], priceTaking: share('price-taking'), expected: share('expected'), median: share('median'), chosen: row.chosen });
  }
  console.log(`\n### ${name}: ${setting.summary}\n`);
  console.log(`${truth.days.length} days ${FROM} to ${TO}; true pinball ${fmt(truth.table.overall.crps, 3)} ${market.currency}/MWh (expected ${fmt(truth.expected.truth, 3)}); profit on the true quantiles: price-taking ${fmt(truth.profit['price-taking'], 0)} (expected ${fmt(truth.profit.expected, 0)}), median ${fmt(truth.profit.median, 0)} ${market.currency}\n`);
  console.log(lines.join('\n'));
  console.log(`\nThe centre: share below q0.5 with its standard error (days as clusters), and the share expected under the truth (0.5 for the truth itself): read between the truth's quantiles, and from the exact law\n`);
  console.log(['| method | below q0.5 | standard error | below q0.5, expected under the truth | below q0.5, expected under the exact law |', '|---|---|---|---|---|', ...rows.map((row) => `| ${row.name} | ${fmt(row.centre.share, 3)} | ${fmt(row.centre.standardError, 3)} | ${fmt(row.centre.expected, 3)} | ${fmt(row.expected.belowMedian, 3)} |`)].join('\n'));
  const autoRow = rows.find((r) => r.chosen !== null);
  if (autoRow !== undefined) console.log(`\n${autoRow.name} chose: ${Object.entries(autoRow.chosen).sort((a, b) => b[1] - a[1]).map(([m, n]) => `${m} ${n} days`).join(', ')}`);
}

// Across settings: per method, the worst figure of every goal.
const methods = [...new Set(summary.map((r) => r.method))];
const header = ['method', 'worst pinball / truth', 'worst pinball / truth, expected', 'expected coverage 80% range', 'expected coverage 90% range', 'coverage 80% range', 'coverage 90% range', 'below q0.5 range', 'worst price-taking / truth', 'worst price-taking / truth, expected', 'worst median / truth'];
const lines = [`| ${header.join(' | ')} |`, `|${header.map(() => '---').join('|')}|`];
for (const method of methods) {
  const rows = summary.filter((r) => r.method === method);
  const range = (key, scale, d) => `${fmt(scale * Math.min(...rows.map((r) => r[key])), d)} - ${fmt(scale * Math.max(...rows.map((r) => r[key])), d)}`;
  lines.push(`| ${[method, fmt(Math.max(...rows.map((r) => r.ratio)), 3), fmt(Math.max(...rows.map((r) => r.expectedRatio)), 3), range('cov80Expected', 100, 1), range('cov90Expected', 100, 1), range('cov80', 100, 1), range('cov90', 100, 1), range('below', 1, 3), percent(Math.min(...rows.map((r) => r.priceTaking))), percent(Math.min(...rows.map((r) => r.expected))), percent(Math.min(...rows.map((r) => r.median)))].join(' | ')} |`);
}
console.log(`\n### Across the ${folders.length} settings (worst or range over settings)\n`);
console.log(lines.join('\n'));
for (const method of methods) {
  const shares = summary.filter((r) => r.method === method).map((r) => r.belowExpected);
  console.log(`\n${method}: below q0.5 expected under the truth ${fmt(Math.min(...shares), 3)} - ${fmt(Math.max(...shares), 3)}`);
}
console.log(`\noptions ${JSON.stringify(OPTIONS)} over DEFAULTS; goals: pinball <= 1.08x the truth's, coverage within 2 points, below q0.5 in 0.48-0.52, price-taking >= 90% of the truth's`);

/** Days per chosen method, for a method that records its choice (auto); else null. */
function countChosen(forecasts) {
  const counts = {};
  let any = false;
  for (const f of forecasts) {
    if (f.chosen === null || f.chosen === undefined) continue;
    any = true;
    const key = f.chosen.averageOf === undefined ? `${f.chosen.method} (${f.chosen.calibrationDays} d)` : `quantile average of ${f.chosen.averageOf.map((m) => `${m.method} (${m.calibrationDays} d)`).join(' and ')}`;
    counts[key] = (counts[key] ?? 0) + 1;
  }
  return any ? counts : null;
}
