/**
 * A tiny invented scenario for the sweep and size command tests, written into a fresh temporary
 * folder: a UTC market of hourly periods, a 10 MWh / 5 MW battery, `days` days of realised prices and
 * an 11-level quantile forecast from 2026-03-02 on. Prices come from a seeded Lehmer generator (seed
 * from the name), around a daily shape with a morning and an evening peak. Inputs only: never check
 * values. Also the helpers that run the compiled CLI in a child process.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { daysBetween, shiftDay } from '../../src/market/calendar.js';

export const SCENARIO_FIRST_DAY = '2026-03-02';
export const SCENARIO_LEVELS = Object.freeze([0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95]);

export interface ScenarioOptions {
  /** Delivery days [-]. */
  readonly days: number;
  /** Battery spec fields to replace. */
  readonly battery?: Readonly<Record<string, number>>;
  /** Add this to every realised price [currency/MWh] (e.g. to keep them all positive). */
  readonly priceShift?: number;
}

export interface Scenario {
  readonly dir: string;
  readonly scenario: string;
  readonly from: string;
  readonly to: string;
}

/** Lehmer (Park-Miller) generator, uniform in (0, 1), seeded from a name. */
function seeded(name: string): () => number {
  let state = [...name].reduce((h, c) => (h * 31 + c.charCodeAt(0)) % 2147483647, 7) || 1;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

export function writeScenario(name: string, options: ScenarioOptions): Scenario {
  const dir = mkdtempSync(join(tmpdir(), `quantbid-${name}-`));
  const random = seeded(name);
  const to = shiftDay(SCENARIO_FIRST_DAY, options.days - 1);
  const history = ['period_start,price'];
  const quantiles = [`period_start,${SCENARIO_LEVELS.map((l) => `q${l}`).join(',')}`];
  for (const day of daysBetween(SCENARIO_FIRST_DAY, to)) {
    const level = 40 + 40 * random();
    for (let h = 0; h < 24; h++) {
      const start = `${day}T${String(h).padStart(2, '0')}:00:00+00:00`;
      const shape = 25 * Math.exp(-((h - 8) ** 2) / 4) + 45 * Math.exp(-((h - 19) ** 2) / 5) - 20 * Math.exp(-((h - 13) ** 2) / 6);
      const median = level + shape;
      const spread = 8 + 12 * random();
      // Spread per level: a right-skewed fan, z-like offsets times the spread.
      const offsets = SCENARIO_LEVELS.map((l) => spread * (l < 0.5 ? -1.2 : 1.6) * Math.abs(Math.log(l / (1 - l))) / 2.9);
      quantiles.push(`${start},${offsets.map((o) => (median + o).toFixed(2)).join(',')}`);
      const surprise = (random() - 0.5) * 2.6 * spread;
      history.push(`${start},${(median + surprise + (options.priceShift ?? 0)).toFixed(2)}`);
    }
  }
  const market = { timeZone: 'UTC', periodMinutes: 60, priceFloor: -500, priceCap: 3000, currency: 'TST', gateClosure: '12:00', imbalance: { kind: 'clearing-plus-penalty', penaltyPerMwh: 10 } };
  const battery = {
    energyMwh: 10, chargeMw: 5, dischargeMw: 5, roundTripEfficiency: 0.88, socMinFraction: 0.05, socMaxFraction: 0.95, socInitialFraction: 0.5, maxCyclesPerDay: 2, degradationCostPerMwh: 2,
    ...options.battery,
  };
  writeFileSync(join(dir, 'market.json'), `${JSON.stringify(market, null, 2)}\n`);
  writeFileSync(join(dir, 'battery.json'), `${JSON.stringify(battery, null, 2)}\n`);
  writeFileSync(join(dir, 'history.csv'), `${history.join('\n')}\n`);
  writeFileSync(join(dir, 'quantiles.csv'), `${quantiles.join('\n')}\n`);
  const scenario = join(dir, 'scenario.json');
  writeFileSync(scenario, `${JSON.stringify({ name, market: 'market.json', battery: 'battery.json', history: 'history.csv', forecast: 'quantiles.csv' }, null, 2)}\n`);
  return { dir, scenario, from: SCENARIO_FIRST_DAY, to };
}

/** The repository root, where `bin/quantbid.js` runs the compiled CLI. */
export const ROOT = fileURLToPath(new URL('../../', import.meta.url));

export interface Run {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Runs the compiled CLI (`npm run build` first) in a child process and waits for it. */
export function quantbid(args: readonly string[]): Run {
  const result = spawnSync(process.execPath, ['bin/quantbid.js', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 300_000 });
  return { code: result.status, signal: result.signal, stdout: result.stdout, stderr: result.stderr };
}

/**
 * Runs the compiled CLI and sends `signal` once the journal `journal` holds at least `after` finished
 * settings (its header line not counted).
 */
export function quantbidStoppedAfter(args: readonly string[], journal: string, after: number, signal: NodeJS.Signals): Promise<Run> {
  const child = spawn(process.execPath, ['bin/quantbid.js', ...args], { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const poll = setInterval(() => {
    if (!existsSync(journal) || journalKeys(journal).length < after) return;
    clearInterval(poll);
    child.kill(signal);
  }, 2);
  return new Promise((resolve) => {
    child.on('close', (code, got) => {
      clearInterval(poll);
      resolve({ code, signal: got, stdout, stderr });
    });
  });
}

/** Keys of the finished settings in a journal (whole lines only, header left out). */
export function journalKeys(journal: string): string[] {
  return readFileSync(journal, 'utf8')
    .split('\n')
    .slice(1, -1)
    .map((line) => (JSON.parse(line) as { key: string }).key);
}

export { checkBuild } from '../distBuild.js';

/** CSV text as rows of cells (our CSV never quotes). */
export function csvRows(text: string): string[][] {
  return text.trimEnd().split('\n').map((line) => line.split(','));
}
