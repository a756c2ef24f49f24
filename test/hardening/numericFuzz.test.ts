import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CliIo } from '../../src/cli/cliIo.js';
import { checkBuild } from '../distBuild.js';
import { ROOT } from './cliProcess.js';
import { FIXTURES } from './corpusRunner.js';

/**
 * Every numeric field of every input file and every numeric flag of every command, given values from
 * 1e-320 to 1e308 of both signs and the spellings of the values no number should be (1e999, NaN,
 * Infinity, inf, ...), through the compiled CLI's main() in this process (the grid commands on one
 * thread). Each run must end with exit code 0 or 2, never 1 (a fault); print no NaN or Infinity; on
 * exit code 2 leave --out as it was (nothing written); and do bounded work.
 *
 * The work is bounded by construction and checked by count, not by time: the runs cover one day at
 * hourly periods (the forecast learns from 45 before it), the grids hold at most four settings; a value that would make
 * the work grow (a life of 1e9 years, 1e308 threads, a span of millennia) must be refused by its range
 * check before any arithmetic. Every run's output folder is measured: at most 1 MiB written.
 *
 * Seeded (fast-check), so every run of the suite tries the same values.
 */
type Command = 'plan' | 'backtest' | 'sweep' | 'size' | 'forecast';

interface Inputs {
  market: string;
  battery: string;
  forecast: string;
  history: string;
  /** Flags after the command's base arguments (a later value of a flag wins). */
  flags: string[];
}

/** A place a number goes: a field of a file or a flag, and the commands it is tried with. */
interface Target {
  readonly name: string;
  readonly commands: readonly Command[];
  readonly put: (inputs: Inputs, value: string) => void;
}

/**
 * The corpus's valid history day (2027-06-15, hourly, Europe/Berlin) repeated for the 45 days before it
 * with prices shifted day by day, so that `forecast` has days to learn from (summer time throughout).
 */
function longHistory(): string {
  const [header, ...rows] = readFileSync(join(FIXTURES, 'history/valid.csv'), 'utf8').trimEnd().split('\n');
  const days = Array.from({ length: 46 }, (_, k) => new Date(Date.UTC(2027, 4, 1 + k)).toISOString().slice(0, 10));
  const lines = days.flatMap((day, k) =>
    rows.map((row) => {
      const [stamp, price, imbalance, load] = row.split(',') as [string, string, string, string];
      const shift = ((k * 7) % 11) - 5;
      return [`${day}${stamp.slice(10)}`, (Number(price) + shift).toFixed(2), (Number(imbalance) + shift).toFixed(2), load].join(',');
    }),
  );
  return `${[header, ...lines].join('\n')}\n`;
}

const HISTORY = longHistory();

const base = (): Inputs => ({
  market: readFileSync(join(FIXTURES, 'base/market.json'), 'utf8'),
  battery: readFileSync(join(FIXTURES, 'base/battery.json'), 'utf8'),
  forecast: readFileSync(join(FIXTURES, 'base/quantilesWide.csv'), 'utf8'),
  history: HISTORY,
  flags: [],
});

/** Sets a top-level field of a JSON text to `value` as written (so that NaN stays NaN, 1e999 stays 1e999). */
function jsonField(text: string, field: string, value: string): string {
  const body = text.trim().replace(/\}$/, '');
  const kept = body.replace(new RegExp(`\\s*"${field}": [^,\\n]+,?`), '').replace(/,\s*$/, '');
  return `${kept},\n  "${field}": ${value}\n}\n`;
}

/** Sets cell `column` of data row `row` of a CSV text. */
function csvCell(text: string, row: number, column: number, value: string): string {
  const lines = text.split('\n');
  const cells = (lines[row + 1] as string).split(',');
  cells[column] = value;
  lines[row + 1] = cells.join(',');
  return lines.join('\n');
}

const field = (name: string, file: 'market' | 'battery', commands: readonly Command[]): Target => ({ name: `${file}.json ${name}`, commands, put: (i, v) => void (i[file] = jsonField(i[file], name, v)) });
const flag = (name: string, commands: readonly Command[], extra: readonly string[] = []): Target => ({ name, commands, put: (i, v) => void i.flags.push(...extra, name, v) });

const TARGETS: readonly Target[] = [
  field('priceFloor', 'market', ['plan', 'backtest']),
  field('priceCap', 'market', ['plan', 'sweep']),
  field('periodMinutes', 'market', ['plan']),
  field('quantityStepMw', 'market', ['plan', 'backtest']),
  field('minimumQuantityMw', 'market', ['plan', 'sweep']),
  field('priceTickPerMwh', 'market', ['plan', 'backtest']),
  { name: 'market.json imbalance.penaltyPerMwh', commands: ['backtest', 'size'], put: (i, v) => void (i.market = jsonField(i.market, 'imbalance', `{"kind": "clearing-plus-penalty", "penaltyPerMwh": ${v}}`)) },
  field('energyMwh', 'battery', ['plan', 'size']),
  field('chargeMw', 'battery', ['plan', 'backtest']),
  field('dischargeMw', 'battery', ['plan', 'sweep']),
  field('roundTripEfficiency', 'battery', ['plan', 'size']),
  {
    name: 'battery.json chargeEfficiency',
    commands: ['plan'],
    put: (i, v) => void (i.battery = jsonField(jsonField(i.battery.replace(/\s*"roundTripEfficiency": [^,\n]+,?/, ''), 'dischargeEfficiency', '0.94'), 'chargeEfficiency', v)),
  },
  {
    name: 'battery.json dischargeEfficiency',
    commands: ['backtest'],
    put: (i, v) => void (i.battery = jsonField(jsonField(i.battery.replace(/\s*"roundTripEfficiency": [^,\n]+,?/, ''), 'chargeEfficiency', '0.94'), 'dischargeEfficiency', v)),
  },
  field('socMinFraction', 'battery', ['plan']),
  field('socMaxFraction', 'battery', ['plan', 'size']),
  field('socInitialFraction', 'battery', ['plan', 'backtest']),
  field('socFinalMinFraction', 'battery', ['plan']),
  field('maxCyclesPerDay', 'battery', ['plan', 'sweep']),
  field('degradationCostPerMwh', 'battery', ['plan', 'size']),
  { name: 'forecast price cell', commands: ['plan', 'backtest'], put: (i, v) => void (i.forecast = csvCell(i.forecast, 7, 3, v)) },
  { name: 'forecast level in the header', commands: ['plan', 'sweep'], put: (i, v) => void (i.forecast = i.forecast.replace('q0.95', `q${v}`)) },
  { name: 'history price cell', commands: ['backtest', 'forecast'], put: (i, v) => void (i.history = csvCell(i.history, 45 * 24 + 5, 1, v)) },
  { name: 'history imbalance_price cell', commands: ['backtest', 'size'], put: (i, v) => void (i.history = csvCell(i.history, 45 * 24 + 9, 2, v)) },
  { name: 'history exogenous cell', commands: ['sweep', 'forecast'], put: (i, v) => void (i.history = csvCell(i.history, 40 * 24 + 11, 3, v)) },
  flag('--alpha', ['plan', 'backtest', 'size']),
  flag('--soc-start', ['plan']),
  flag('--alphas', ['sweep']),
  { name: '--alphas (size, --alpha best)', commands: ['size'], put: (i, v) => void i.flags.push('--alpha', 'best', '--alphas', v, '--from', '2027-06-14') },
  flag('--threads', ['sweep', 'size']),
  flag('--energy-mwh', ['size']),
  flag('--power-mw', ['size']),
  flag('--efficiency', ['size']),
  flag('--capex-per-mwh', ['size']),
  flag('--capex-per-mw', ['size']),
  flag('--fixed-om-per-mw-year', ['size']),
  flag('--life-years', ['size']),
  flag('--life-cycles', ['size']),
  flag('--discount-rate', ['size']),
  flag('--levels', ['forecast']),
  flag('--paths', ['forecast']),
  flag('--planning-paths', ['plan'], ['--policy', 'auto']),
  flag('--risk-weight', ['plan'], ['--policy', 'auto']),
  flag('--path-seed', ['plan'], ['--policy', 'auto']),
];

/** The spellings no number should be, and the ends of the doubles, each tried in every place. */
const HARD_VALUES = ['1e999', '-1e999', 'NaN', 'Infinity', '-Infinity', 'inf', '1e308', '-1e308', '1.7976931348623157e308', '1e-320', '-1e-320', '5e-324', '-0', '0'];

/** Values from 1e-320 to 1e308 of both signs (a mantissa and a decimal exponent), and the spellings. */
const anyValue: fc.Arbitrary<string> = fc.oneof(
  { weight: 3, arbitrary: fc.tuple(fc.integer({ min: 100, max: 999 }), fc.integer({ min: -322, max: 306 }), fc.boolean()).map(([m, e, negative]) => `${negative ? '-' : ''}${m / 100}e${e}`) },
  { weight: 1, arbitrary: fc.constantFrom(...HARD_VALUES, 'nan', '-NaN', '+Infinity', '-inf', 'INF', '1E999', '+1e999') },
);

let main: (argv: readonly string[], io: CliIo) => Promise<number>;
let scratch = '';
let count = 0;
beforeAll(async () => {
  checkBuild();
  main = ((await import(pathToFileURL(join(ROOT, 'dist/cli/main.js')).href)) as { main: typeof main }).main;
  scratch = mkdtempSync(join(tmpdir(), 'quantbid-fuzz-'));
});
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

function argvOf(command: Command, files: Record<'market' | 'battery' | 'forecast' | 'history', string>, out: string, flags: readonly string[]): string[] {
  const specs = ['--market', files.market, '--battery', files.battery];
  switch (command) {
    case 'plan':
      return ['plan', ...specs, '--forecast', files.forecast, '--day', '2027-06-15', '--out', out, ...flags];
    case 'backtest':
      return ['backtest', ...specs, '--forecast', files.forecast, '--history', files.history, '--from', '2027-06-15', '--to', '2027-06-15', '--out', out, ...flags];
    case 'sweep':
      return ['sweep', ...specs, '--forecast', files.forecast, '--history', files.history, '--from', '2027-06-15', '--to', '2027-06-15', '--alphas', '0.1,0.2', '--policies', 'quantile', '--threads', '1', '--quiet', '--out', out, ...flags];
    case 'size':
      return [
        'size', ...specs, '--forecast', files.forecast, '--history', files.history, '--from', '2027-06-15', '--to', '2027-06-15', '--energy-mwh', '5,10', '--power-mw', '5',
        '--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--life-years', '15', '--discount-rate', '0.07', '--threads', '1', '--quiet', '--out', out, ...flags,
      ];
    case 'forecast':
      return ['forecast', '--market', files.market, '--history', files.history, '--from', '2027-06-15', '--to', '2027-06-15', '--method', 'naive-hs', '--quiet', '--out', out, ...flags];
  }
}

/** Bytes of every file under a folder. */
function bytesUnder(path: string): number {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.size;
  return readdirSync(path).reduce((sum, name) => sum + bytesUnder(join(path, name)), 0);
}

/** Runs one command with `value` put into `target`, and checks the laws; returns the exit code. */
async function check(target: Target, command: Command, value: string): Promise<number> {
  const dir = join(scratch, `case-${++count}`);
  mkdirSync(dir);
  const inputs = base();
  target.put(inputs, value);
  const files = { market: join(dir, 'market.json'), battery: join(dir, 'battery.json'), forecast: join(dir, 'quantiles.csv'), history: join(dir, 'history.csv') };
  for (const name of ['market', 'battery', 'forecast', 'history'] as const) writeFileSync(files[name], inputs[name]);
  const out = join(dir, 'out');
  let stdout = '';
  let stderr = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: false };
  const code = await main(['node', 'quantbid', ...argvOf(command, files, out, inputs.flags)], io);
  const what = `${command} with ${target.name} = ${value}\n${stderr}`;
  expect([0, 2], what).toContain(code);
  expect(stderr, what).not.toMatch(/internal fault/);
  expect(stdout, what).not.toMatch(/\bNaN\b|Infinity/);
  if (code === 2) expect(existsSync(out), `${what}: --out was created`).toBe(false);
  else {
    for (const name of readdirSync(out)) expect(readFileSync(join(out, name), 'utf8'), `${what}: ${name}`).not.toMatch(/\bNaN\b|Infinity/);
    expect(bytesUnder(out), what).toBeLessThan(1024 * 1024);
  }
  rmSync(dir, { recursive: true, force: true });
  return code;
}

describe('numbers of every size and spelling in every field and flag', () => {
  it('lists every place (each file field and numeric flag of every command) with a command that reads it', () => {
    const commands = new Set(TARGETS.flatMap((t) => t.commands));
    expect([...commands].sort()).toEqual(['backtest', 'forecast', 'plan', 'size', 'sweep']);
    expect(TARGETS.length).toBeGreaterThanOrEqual(35);
  });

  it('the spellings and the ends of the doubles, in every place: exit code 0 or 2, nothing written on 2', async () => {
    const codes = new Map<number, number>();
    for (const target of TARGETS) {
      for (const [k, value] of HARD_VALUES.entries()) {
        // Each value with one of the target's commands, in turn.
        const code = await check(target, target.commands[k % target.commands.length] as Command, value);
        codes.set(code, (codes.get(code) ?? 0) + 1);
      }
    }
    // Both outcomes happen: some values are in range (0, 1e-320 where 0 is allowed), most are refused.
    expect(codes.get(0)).toBeGreaterThan(0);
    expect(codes.get(2)).toBeGreaterThan(0);
  }, 600_000);

  it('values from 1e-320 to 1e308 of both signs in random places (seeded)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...TARGETS), fc.nat(), anyValue, async (target, pick, value) => {
        await check(target, target.commands[pick % target.commands.length] as Command, value);
      }),
      { seed: 18_2027, numRuns: 80 },
    );
  }, 600_000);
});
