// Wall and CPU time of `quantbid size` on an energy x power grid over one year at hourly resolution,
// one policy (quantile, alpha 0.1) plus the price-taking and perfect-foresight rows every size has.
//
//   npm run build && node bench/sizeGrid.js [--grid 12] [--from 2026-01-01] [--to 2026-12-31] [--threads 2] [--keep]
//
// The hourly inputs are made on the fly in a temporary folder from the demo scenario scenarios/halvorn
// (quarter-hourly): each hour's price, imbalance price and each quantile level is the mean of its four
// quarter-hours (grouped by the instant, so the doubled autumn hour stays two hours). A mean of
// quantiles is not a quantile of the mean; for timing that does not matter. The battery is the demo's
// 10 MWh / 5 MW, scaled to energies 5, 10, ... MWh and powers 2.5, 5, ... MW (grid x grid sizes).
//
// CPU time is process.cpuUsage() of this process, which counts every thread (the sweep's workers run
// in this process), so it says how much work was done even when the machine is busy with other work.
// A policy-day is one policy planned and settled on one day. Each size runs the quantile policy,
// price-taking and perfect foresight; every setting also needs perfect foresight's profit (capture
// ratio), which a worker reuses when it also ran another setting of the size, so a size costs 3 to 5
// policy-runs: the time per policy-day is given for both counts.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gunzipSync } from 'node:zlib';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const demo = join(root, 'scenarios', 'halvorn');
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const GRID = Number(arg('grid', 12));
const FROM = arg('from', '2026-01-01');
const TO = arg('to', '2026-12-31');
const THREADS = arg('threads', '2');

/** The CSV text with each hour's rows replaced by the mean of every numeric column (2 decimals). */
function hourlyMeans(csvText) {
  const [header, ...rows] = csvText.trimEnd().split('\n');
  const hours = new Map();
  for (const row of rows) {
    const [start, ...cells] = row.split(',');
    const hour = Math.floor(Date.parse(start) / 3_600_000);
    const group = hours.get(hour) ?? { start, sums: cells.map(() => 0), n: 0 };
    cells.forEach((cell, k) => (group.sums[k] += Number(cell)));
    group.n++;
    hours.set(hour, group);
  }
  const lines = [...hours.entries()].sort(([a], [b]) => a - b).map(([, g]) => `${g.start},${g.sums.map((s) => (s / g.n).toFixed(2)).join(',')}`);
  return `${header}\n${lines.join('\n')}\n`;
}

function hourlyScenario() {
  const dir = mkdtempSync(join(tmpdir(), 'quantbid-bench-size-'));
  const market = { ...JSON.parse(readFileSync(join(demo, 'market.json'), 'utf8')), periodMinutes: 60 };
  writeFileSync(join(dir, 'market.json'), JSON.stringify(market, null, 2));
  writeFileSync(join(dir, 'battery.json'), readFileSync(join(demo, 'battery.json')));
  writeFileSync(join(dir, 'history.csv'), hourlyMeans(gunzipSync(readFileSync(join(demo, 'history.csv.gz'))).toString('utf8')));
  writeFileSync(join(dir, 'quantiles.csv'), hourlyMeans(gunzipSync(readFileSync(join(demo, 'quantiles.csv.gz'))).toString('utf8')));
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify({ market: 'market.json', battery: 'battery.json', history: 'history.csv', forecast: 'quantiles.csv' }));
  return dir;
}

const dir = hourlyScenario();
const { main } = await import('../dist/cli/main.js');
const io = { stdout: () => undefined, stderr: (text) => process.stderr.write(text), stderrIsTerminal: false };
const args = [
  'size', '--scenario', join(dir, 'scenario.json'), '--from', FROM, '--to', TO,
  '--energy-mwh', `5:${5 * GRID}:5`, '--power-mw', `2.5:${2.5 * GRID}:2.5`, '--policies', 'quantile', '--alpha', '0.1',
  '--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--fixed-om-per-mw-year', '8000', '--life-years', '15', '--discount-rate', '0.07',
  '--threads', THREADS, '--quiet', '--json', '--out', join(dir, 'out'),
];
const cpu0 = process.cpuUsage();
const t0 = performance.now();
const code = await main(['node', 'quantbid', ...args], io);
const wallS = (performance.now() - t0) / 1000;
const cpu = process.cpuUsage(cpu0);
const cpuS = (cpu.user + cpu.system) / 1e6;
if (code !== 0) throw new Error(`quantbid size exited with code ${code}`);
const summary = JSON.parse(readFileSync(join(dir, 'out', 'summary.json'), 'utf8'));
const days = summary.daysCovered;
const sizes = GRID * GRID;
const ms = (seconds, count) => ((1000 * seconds) / count).toFixed(2);
console.log(`quantbid size, ${GRID} x ${GRID} sizes, quantile + price-taking + perfect-foresight, ${days} hourly days (${FROM} to ${TO}), --threads ${THREADS}`);
console.log(`  wall ${wallS.toFixed(1)} s, CPU ${cpuS.toFixed(1)} s (all threads, load and parse included)`);
console.log(`  per size-day: wall ${ms(wallS, sizes * days)} ms, CPU ${ms(cpuS, sizes * days)} ms`);
console.log(`  per policy-day: CPU ${ms(cpuS, 5 * sizes * days)} to ${ms(cpuS, 3 * sizes * days)} ms (5 or 3 policy-runs per size)`);
console.log(`  highest NPV (quantile): ${JSON.stringify(summary.best[0]?.highestNpv && { energyMwh: summary.best[0].highestNpv.energyMwh, powerMw: summary.best[0].highestNpv.powerMw, npv: summary.best[0].highestNpv.row.npv })}`);
if (!process.argv.includes('--keep')) rmSync(dir, { recursive: true, force: true });
else console.log(`  kept ${dir}`);
