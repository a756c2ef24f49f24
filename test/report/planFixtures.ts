/**
 * Plan reports for tests, made through the real pipeline: the Halvorn demo scenario's day through
 * `quantbid plan --report`, and a clock-change day (92 quarter-hours) from invented inputs.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/cliIo.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

export const HALVORN_SCENARIO = fileURLToPath(new URL('../../scenarios/halvorn/scenario.json', import.meta.url));

export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

export async function runCli(args: readonly string[]): Promise<CliRun> {
  let stdout = '';
  let stderr = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: false };
  const code = await main(['node', 'quantbid', ...args], io);
  return { code, stdout, stderr };
}

/** Runs `quantbid plan ... --report --out <fresh folder>` and returns the folder. */
export async function planWithReport(args: readonly string[]): Promise<string> {
  const out = join(mkdtempSync(join(tmpdir(), 'quantbid-report-')), 'plan');
  const run = await runCli(['plan', ...args, '--report', '--out', out]);
  if (run.code !== 0) throw new Error(`plan --report failed with ${run.code}: ${run.stderr}`);
  return out;
}

/**
 * Inputs for the spring clock-change day 2027-03-28 in Europe/Berlin (92 quarter-hours): a daily
 * price wave with a spread wide enough for a charge and a discharge, five levels (0.05 ... 0.95),
 * and a currency label with characters that must be escaped. Invented numbers.
 */
export function clockChangeInputs(currency = 'HLV'): { readonly dir: string; readonly args: readonly string[]; readonly day: string } {
  const dir = mkdtempSync(join(tmpdir(), 'quantbid-report-dst-'));
  const day = '2027-03-28';
  writeFileSync(join(dir, 'market.json'), JSON.stringify({ timeZone: 'Europe/Berlin', periodMinutes: 15, priceFloor: -500, priceCap: 4000, currency, gateClosure: '12:00' }));
  writeFileSync(join(dir, 'battery.json'), JSON.stringify({ energyMwh: 10, chargeMw: 5, dischargeMw: 5, roundTripEfficiency: 0.88, socMinFraction: 0.1, socMaxFraction: 0.9, socInitialFraction: 0.5 }));
  const lines = ['period_start,q0.05,q0.1,q0.25,q0.5,q0.75,q0.9,q0.95'];
  deliveryPeriods(day, 'Europe/Berlin', 15).forEach((p, t) => {
    const mid = 60 + 40 * Math.sin((2 * Math.PI * t) / 92);
    lines.push([p.start, ...[-30, -20, -9, 0, 9, 20, 30].map((d) => (mid + d).toFixed(2))].join(','));
  });
  writeFileSync(join(dir, 'quantiles.csv'), `${lines.join('\n')}\n`);
  // The quantile policy, named: its limits are what the report's markers show.
  const args = ['--market', join(dir, 'market.json'), '--battery', join(dir, 'battery.json'), '--forecast', join(dir, 'quantiles.csv'), '--day', day, '--policy', 'quantile'];
  return { dir, args, day };
}

export function readReport(outDir: string): string {
  return readFileSync(join(outDir, 'report.html'), 'utf8');
}

export const PLAN_CHART_IDS = ['plan-prices', 'plan-power', 'plan-soc'] as const;
