// Writes the known-distribution markets of bench/knownMarkets/ as quantbid input files, one folder per
// setting: market.json, battery.json, history.csv (price, imbalance price, load and renewables forecast
// columns, three years), truth.csv (the TRUE predictive quantiles of the last year at the 19 levels
// 0.05..0.95, in the wide layout quantbid reads), truth-mean.csv (the true mean price of each period of
// that year, for the expected profit of a plan) and scenario.json. Any forecast can then be scored
// against the truth, e.g.
//
//   npm run build && node bench/knownMarkets/generate.js --out runs/known
//   quantbid forecast --scenario runs/known/convex-hetero/scenario.json --from 2031-01-01 --to 2031-12-31 --out runs/fc
//   quantbid score --scenario runs/known/convex-hetero/scenario.json --forecast runs/fc/quantiles.csv \
//                  --against runs/known/convex-hetero/truth.csv --out runs/fc-score
//
// Options: --out DIR (default bench/.cache/knownMarkets), --settings name,name (default all), --draw N
// (default 0, the bench's own draw; another whole number draws every stream afresh: the same settings,
// independent data, for a check that nothing was fitted to one draw).
// Same seed streams, same files, byte for byte.
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { simulateMarket } from './process.js';
import { BATTERY, SETTINGS, SPAN } from './settings.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const dist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);

/** The 19 levels 0.05, 0.10, ..., 0.95. */
export const LEVELS = Object.freeze(Array.from({ length: 19 }, (_, i) => Number(((i + 1) * 0.05).toFixed(2))));

/** Simulates one setting (the project's calendar and normal distribution functions from dist/); draw 0 is the bench's own. */
export async function simulateSetting(setting, draw = 0) {
  const { deliveryPeriods, daysBetween } = await dist('market/calendar.js');
  const { normalCdf } = await dist('stats/normalCdf.js');
  const { normalQuantile } = await dist('stats/normalQuantile.js');
  return simulateMarket(setting, { deliveryPeriods, days: daysBetween, normal: { cdf: normalCdf, quantile: normalQuantile } }, { ...SPAN, levels: LEVELS, draw });
}

/** The market.json of one setting (as an object). */
export function marketSpecOf(setting) {
  return {
    timeZone: setting.market.timeZone,
    periodMinutes: setting.market.periodMinutes,
    priceFloor: setting.market.floor,
    priceCap: setting.market.cap,
    currency: 'KNW',
    gateClosure: '12:00',
  };
}

/** The files of one setting, as { name: text }. */
export async function settingFiles(setting, simulation) {
  const { quantileForecastCsv } = await dist('io/quantileForecastCsv.js');
  const { formatNumber } = await dist('io/formatNumber.js');
  const market = marketSpecOf(setting);
  const history = ['period_start,price,imbalance_price,load_forecast_mw,renewables_forecast_mw'];
  for (const d of simulation.days) {
    d.periods.forEach((p, t) => history.push(`${p.start},${formatNumber(d.price[t], 2)},${formatNumber(d.imbalance[t], 2)},${formatNumber(d.load[t], 1)},${formatNumber(d.renewables[t], 1)}`));
  }
  const truth = simulation.days.filter((d) => d.truth !== null).map((d) => ({ day: d.day, levels: LEVELS, periods: d.periods, prices: d.truth }));
  const means = ['period_start,mean_price'];
  for (const d of simulation.days.filter((x) => x.mean !== null)) d.periods.forEach((p, t) => means.push(`${p.start},${formatNumber(d.mean[t], 4)}`));
  const scenario = {
    name: `known-distribution market "${setting.name}" (bench, invented)`,
    description: `${setting.summary}. Seeded synthetic history ${SPAN.from} to ${SPAN.to}; truth.csv holds the true predictive quantiles from ${SPAN.truthFrom}. No real market, place or data.`,
    market: 'market.json',
    battery: 'battery.json',
    history: 'history.csv',
    forecast: 'truth.csv',
  };
  const json = (value) => `${JSON.stringify(value, null, 2)}\n`;
  return {
    'market.json': json(market),
    'battery.json': json(BATTERY),
    'history.csv': `${history.join('\n')}\n`,
    'truth.csv': quantileForecastCsv(truth),
    'truth-mean.csv': `${means.join('\n')}\n`,
    'scenario.json': json(scenario),
  };
}

/**
 * Simulates and writes the settings named (all by default) into `out`/<name>/; returns the folders.
 * With `simulations` (a Map), each setting's simulation is also kept there by its folder (the periods'
 * laws, for the expected pinball loss of bench/forecastKnownMarkets.js).
 */
export async function writeSettings(out, names = SETTINGS.map((s) => s.name), draw = 0, simulations = null) {
  const folders = [];
  for (const name of names) {
    const setting = SETTINGS.find((s) => s.name === name);
    if (setting === undefined) throw new Error(`no setting "${name}"; the settings are ${SETTINGS.map((s) => s.name).join(', ')}`);
    const folder = join(out, name);
    mkdirSync(folder, { recursive: true });
    const simulation = await simulateSetting(setting, draw);
    simulations?.set(folder, simulation);
    const files = await settingFiles(setting, simulation);
    for (const [file, text] of Object.entries(files)) writeFileSync(join(folder, file), text);
    folders.push(folder);
  }
  return folders;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const arg = (name, fallback) => {
    const i = process.argv.indexOf(`--${name}`);
    return i > 0 ? process.argv[i + 1] : fallback;
  };
  const out = resolve(arg('out', join(root, 'bench', '.cache', 'knownMarkets')));
  const names = arg('settings', SETTINGS.map((s) => s.name).join(',')).split(',');
  const folders = await writeSettings(out, names, Number(arg('draw', 0)));
  for (const folder of folders) console.log(`wrote ${folder}`);
}
