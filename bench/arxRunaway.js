// Does the ARX run away? On the known-distribution markets (bench/knownMarkets/), over the last year
// (2031), for the default calibration windows and for one 56-day window, counts
//   - the days whose `arx-hs` median (q0.5, before any clamping into [floor, cap]) leaves the market's
//     [floor, cap] in some period, and the median farthest out;
//   - the days whose ARX point forecast (the mean over the windows, models/arx.ts) leaves the range of
//     the training days' prices (the longest window's days before the delivery day; by more than 1e-9
//     of its span), and those that leave it widened on both sides by its own span, as `auto`'s
//     plausibility check does.
// Prints a markdown table. Run it on this checkout and, with --root DIR, on another built checkout
// (e.g. main) to see what a change to the ARX does.
//
//   npm run build && node bench/arxRunaway.js [--settings outage-spikes,persistent-level] [--draw 1]
//        [--root DIR]
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { writeSettings } from './knownMarkets/generate.js';
import { SETTINGS, SPAN } from './knownMarkets/settings.js';

const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const ROOT = resolve(arg('root', '.'));
const DRAW = Number(arg('draw', 0));
const OUT = resolve(arg('out', join('bench', '.cache', DRAW === 0 ? 'knownMarkets' : `knownMarkets-draw${DRAW}`)));
const NAMES = arg('settings', SETTINGS.map((s) => s.name).join(',')).split(',');
const dist = (path) => import(pathToFileURL(join(ROOT, 'dist', path)).href);

const { forecastRange } = await dist('forecast/forecastRange.js');
const { DEFAULTS } = await dist('forecast/forecaster.js');
const { arxForecast } = await dist('forecast/models/arx.js');
const { HistoryView } = await dist('forecast/models/historyView.js');
const { readScenario } = await dist('io/readScenario.js');
const { readMarketSpec } = await dist('io/readSpecs.js');
const { readPriceHistory } = await dist('io/readPriceHistory.js');
const { DayCalendar } = await dist('market/dayCalendar.js');

const WINDOWS = [DEFAULTS.windowsDays, [56]];
const fmt = (x) => (Math.abs(x) >= 1e6 ? x.toExponential(1) : x.toFixed(0));
const lines = [
  '| setting | windows | medians outside [floor, cap]: days | farthest median | point forecasts outside the training prices: days | ... outside them widened by their span: days |',
  '|---|---|---|---|---|---|',
];
for (const folder of await writeSettings(OUT, NAMES, DRAW)) {
  const scenario = readScenario(join(folder, 'scenario.json'));
  const market = readMarketSpec(scenario.market);
  const history = readPriceHistory(scenario.history, market);
  const calendar = new DayCalendar(market.timeZone, market.periodMinutes);
  const name = folder.split(/[\\/]/).pop();
  for (const windowsDays of WINDOWS) {
    const options = { windowsDays };
    const run = forecastRange(
      history,
      { from: SPAN.truthFrom, to: SPAN.to, method: 'arx-hs', levels: [0.5], priceFloor: -Number.MAX_VALUE, priceCap: Number.MAX_VALUE, periodsOf: (d) => calendar.periods(d) },
      options,
    );
    let medianDays = 0;
    let farthest = 0;
    for (const f of run.forecasts) {
      const medians = f.quantiles.prices.map((row) => row[0]);
      if (medians.some((p) => p < market.priceFloor || p > market.priceCap)) medianDays++;
      for (const p of medians) if (Math.abs(p) > Math.abs(farthest)) farthest = p;
    }
    const settings = { windowsDays, estimator: 'least-squares', lasso: DEFAULTS.lasso, minTrainingDays: DEFAULTS.minTrainingDays };
    const longest = Math.max(...windowsDays);
    let outside = 0;
    let widened = 0;
    history.days.forEach((day, d) => {
      if (day.day < SPAN.truthFrom || day.day > SPAN.to) return;
      const point = arxForecast(HistoryView.before(history, d), settings);
      if (point === null) return;
      let low = Infinity;
      let high = -Infinity;
      for (let i = Math.max(0, d - longest); i < d; i++) for (const p of history.days[i].pricePerMwh) [low, high] = [Math.min(low, p), Math.max(high, p)];
      const span = high - low;
      // Held at an end of that range, a + b sinh(asinh((end - a) / b)) may differ from it by rounding.
      const slack = 1e-9 * span;
      if (point.mean.some((p) => p < low - slack || p > high + slack)) outside++;
      if (point.mean.some((p) => p < low - span || p > high + span)) widened++;
    });
    lines.push(`| ${name} | ${windowsDays.join(', ')} | ${medianDays} | ${fmt(farthest)} | ${outside} | ${widened} |`);
  }
}
console.log(`ARX runaways on the known markets, ${SPAN.truthFrom} to ${SPAN.to}, draw ${DRAW}, dist of ${ROOT}\n`);
console.log(lines.join('\n'));
