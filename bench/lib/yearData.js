// One year of the demo market (scenarios/halvorn) as plain CSV files, for the benches that time a
// year: the history and the 19-level quantile forecast cut to the year (with the last day of the year
// before, which the history needs for the first day's state), uncompressed, and a scenario.json that
// names them with the demo's market and battery specs.
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gunzipSync } from 'node:zlib';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const demoFolder = join(root, 'scenarios', 'halvorn');

/** The CSV's header and the rows whose local timestamp starts with the year (or is the eve's). */
function cutToYear(gzPath, year) {
  const [header, ...rows] = gunzipSync(readFileSync(gzPath)).toString('utf8').trimEnd().split('\n');
  const eve = `${Number(year) - 1}-12-31`;
  return [header, ...rows.filter((row) => row.startsWith(String(year)) || row.startsWith(eve))].join('\n') + '\n';
}

/**
 * Writes history.csv, quantiles.csv and scenario.json for `year` into `folder`; returns their paths
 * and the demo's market.json and battery.json.
 */
export function writeYearInputs(folder, year) {
  const historyPath = join(folder, 'history.csv');
  const forecastPath = join(folder, 'quantiles.csv');
  const scenarioPath = join(folder, 'scenario.json');
  const marketPath = join(demoFolder, 'market.json');
  const batteryPath = join(demoFolder, 'battery.json');
  writeFileSync(historyPath, cutToYear(join(demoFolder, 'history.csv.gz'), year));
  writeFileSync(forecastPath, cutToYear(join(demoFolder, 'quantiles.csv.gz'), year));
  const scenario = { name: `demo market, ${year} only`, market: marketPath, battery: batteryPath, history: historyPath, forecast: forecastPath };
  writeFileSync(scenarioPath, `${JSON.stringify(scenario, null, 2)}\n`);
  return { historyPath, forecastPath, scenarioPath, marketPath, batteryPath };
}
