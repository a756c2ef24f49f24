import { existsSync, readdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { FORECAST_METHODS } from '../../src/forecast/forecaster.js';
import { QUANTILE_AVERAGE } from '../../src/forecast/autoChoices.js';
import { parseQuantileForecast } from '../../src/io/readQuantileForecast.js';
import type { MarketSpec, PriceHistory } from '../../src/types.js';
import { syntheticHistory } from '../forecast/syntheticHistory.js';
import { runCli } from '../report/planFixtures.js';

// `quantbid forecast` in process on a seeded synthetic history (behaviour, not check values): hourly
// periods, a fictional market on a fixed UTC+1 clock (Etc/GMT-1), days from 2031-01-06.

const MARKET: MarketSpec = { timeZone: 'Etc/GMT-1', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' };
const history = syntheticHistory({ days: 100, periodMinutes: 60, seed: 5 });
const day = (i: number): string => history.days[i]!.day;

let dir = '';

/** Writes a history CSV (optionally without the exogenous column, or with prices changed) and returns its path. */
function writeHistory(name: string, h: PriceHistory, withLoad = true): string {
  const lines = [withLoad ? 'period_start,price,load_mw' : 'period_start,price'];
  for (const d of h.days) {
    d.periods.forEach((p, t) => {
      const cells = [p.start, d.pricePerMwh[t]!.toFixed(2)];
      if (withLoad) cells.push(d.exogenous.load_mw![t]!.toFixed(1));
      lines.push(cells.join(','));
    });
  }
  const path = join(dir, name);
  writeFileSync(path, `${lines.join('\n')}\n`);
  return path;
}

const inputs = (historyFile = join(dir, 'history.csv')) => ['--market', join(dir, 'market.json'), '--history', historyFile];
const read = (out: string, name: string) => readFileSync(join(out, name), 'utf8');

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'quantbid-forecast-'));
  writeFileSync(join(dir, 'market.json'), JSON.stringify(MARKET));
  writeHistory('history.csv', history);
});

describe('quantbid forecast', () => {
  it('writes a wide quantile CSV that parseQuantileForecast reads back with the right days and levels, and lists the days it could not forecast', async () => {
    const out = join(dir, 'fc');
    // Days 60..66. An ARX point forecast needs 7 lag days + 28 training days (first: day 35), and a
    // quantile forecast 28 calibration days with point forecasts (days 35..62), so 60-62 are skipped.
    const run = await runCli(['forecast', ...inputs(), '--from', day(60), '--to', day(66), '--out', out]);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const file = parseQuantileForecast(read(out, 'quantiles.csv'), 'quantiles.csv', MARKET);
    expect([...file.days.keys()]).toEqual([63, 64, 65, 66].map(day));
    expect(file.levels).toEqual([0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5, 0.55, 0.6, 0.65, 0.7, 0.75, 0.8, 0.85, 0.9, 0.95]);
    expect(read(out, 'quantiles.csv').split('\n')[0]).toBe('period_start,q0.05,q0.1,q0.15,q0.2,q0.25,q0.3,q0.35,q0.4,q0.45,q0.5,q0.55,q0.6,q0.65,q0.7,q0.75,q0.8,q0.85,q0.9,q0.95');
    expect(file.incompleteDays).toEqual([]);
    expect(file.repairedPeriods).toBe(0);
    const summary = JSON.parse(read(out, 'forecast.json')) as { method: string; days: { forecast: number; skippedDays: { day: string; reason: string }[] } };
    expect(summary.method).toBe(FORECAST_METHODS.find((m) => m === summary.method));
    expect(summary.days.forecast).toBe(4);
    expect(summary.days.skippedDays.map((s) => s.day)).toEqual([60, 61, 62].map(day));
    for (const s of summary.days.skippedDays) expect(s.reason).toMatch(/calibration needs at least 28 days, found \d+/);
  });

  it('records the method auto chose each day, and how often each was chosen', async () => {
    const out = join(dir, 'auto');
    expect((await runCli(['forecast', ...inputs(), '--from', day(90), '--to', day(92), '--method', 'auto', '--out', out])).code).toBe(0);
    const summary = JSON.parse(read(out, 'forecast.json')) as { chosenMethods: { perDay: { day: string; method: string; calibrationDays: number; averageOf?: { method: string; weight: number }[] }[]; counts: { days: number }[] } };
    expect(summary.chosenMethods.perDay.map((c) => c.day)).toEqual([90, 91, 92].map(day));
    for (const c of summary.chosenMethods.perDay) {
      // A single method, or a quantile average that names its members and their weights (summing to 1).
      if (c.method !== QUANTILE_AVERAGE) expect(FORECAST_METHODS).toContain(c.method);
      else expect(c.averageOf!.reduce((sum, m) => sum + m.weight, 0)).toBeCloseTo(1, 12);
      for (const m of c.averageOf ?? []) expect(FORECAST_METHODS).toContain(m.method);
    }
    expect(summary.chosenMethods.counts.reduce((n, c) => n + c.days, 0)).toBe(3);
    const single = join(dir, 'single');
    expect((await runCli(['forecast', ...inputs(), '--from', day(90), '--to', day(90), '--method', 'arx-hs', '--out', single])).code).toBe(0);
    expect((JSON.parse(read(single, 'forecast.json')) as { chosenMethods: unknown }).chosenMethods).toBeNull();
  });

  it('is deterministic: the same inputs give the same bytes in every file; the time spent is only printed', async () => {
    const args = ['forecast', ...inputs(), '--from', day(70), '--to', day(72), '--paths', '4'];
    const first = await runCli([...args, '--out', join(dir, 'det1')]);
    expect(first.code).toBe(0);
    expect((await runCli([...args, '--out', join(dir, 'det2')])).code).toBe(0);
    for (const name of ['quantiles.csv', 'paths.csv', 'forecast.json']) expect(read(join(dir, 'det1'), name)).toBe(read(join(dir, 'det2'), name));
    expect(read(join(dir, 'det1'), 'forecast.json')).not.toMatch(/elapsed|seconds/i);
    expect(first.stdout).toMatch(/skipped, \d+(\.\d)? s\n/);
  });

  it('--paths S writes S whole-day paths per day as period_start,path,price', async () => {
    const out = join(dir, 'paths');
    expect((await runCli(['forecast', ...inputs(), '--from', day(80), '--to', day(81), '--method', 'naive-hs', '--paths', '3', '--out', out])).code).toBe(0);
    const rows = read(out, 'paths.csv').trimEnd().split('\n');
    expect(rows[0]).toBe('period_start,path,price');
    expect(rows).toHaveLength(1 + 2 * 3 * 24);
    expect(rows.slice(1, 26).map((r) => r.split(',')[1])).toEqual([...Array(24).fill('1'), '2']);
    expect(rows[1]!.split(',')[0]).toBe(history.days[80]!.periods[0]!.start);
  });

  it('reads no price of the forecast day or after it: changing them leaves the forecast unchanged', async () => {
    const changed: PriceHistory = { ...history, days: history.days.map((d, i) => (i < 75 ? d : { ...d, pricePerMwh: d.pricePerMwh.map((p) => 3 * p + 50) })) };
    const file = writeHistory('changed.csv', changed);
    for (const [name, historyFile] of [['gate1', join(dir, 'history.csv')], ['gate2', file]] as const) {
      expect((await runCli(['forecast', ...inputs(historyFile), '--from', day(75), '--to', day(75), '--out', join(dir, name)])).code).toBe(0);
    }
    expect(read(join(dir, 'gate2'), 'quantiles.csv')).toBe(read(join(dir, 'gate1'), 'quantiles.csv'));
  });

  it('forecasts days after the end of a history without exogenous columns; with them, lists the days', async () => {
    const plain = writeHistory('plain.csv', history, false);
    const after = ['--from', '2031-04-15', '--to', '2031-04-16', '--method', 'naive-hs']; // the history ends 2031-04-15
    const out = join(dir, 'ahead');
    expect((await runCli(['forecast', ...inputs(plain), ...after, '--out', out])).code).toBe(0);
    expect([...parseQuantileForecast(read(out, 'quantiles.csv'), 'q', MARKET).days.keys()]).toEqual(['2031-04-15', '2031-04-16']);
    const withLoad = join(dir, 'ahead-load');
    const run = await runCli(['forecast', ...inputs(), ...after, '--out', withLoad, '--json']);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout) as { days: { skippedDays: { day: string; reason: string }[] } };
    expect(summary.days.skippedDays).toEqual([{ day: '2031-04-16', reason: "after the end of the history (2031-04-15); the history's exogenous columns (load_mw) are not known for it" }]);
  });

  it('--out DIR/NAME.csv writes the quantiles to that file with NAME.json beside it', async () => {
    const folder = join(dir, 'named');
    const run = await runCli(['forecast', ...inputs(), '--from', '2031-03-10', '--to', '2031-03-10', '--out', join(folder, 'march.csv')]);
    expect(run.code, run.stderr).toBe(0);
    expect(readdirSync(folder).sort()).toEqual(['march.csv', 'march.json']);
    expect([...parseQuantileForecast(read(folder, 'march.csv'), 'march.csv', MARKET).days.keys()]).toEqual(['2031-03-10']);
  });

  it.each([
    ['--to before --from', ['--from', '2031-03-10', '--to', '2031-03-09'], /--to: --to 2031-03-09 is before --from 2031-03-10/],
    ['an unknown method, with the list', ['--from', '2031-03-10', '--to', '2031-03-10', '--method', 'magic'], new RegExp(`"magic" must be one of ${FORECAST_METHODS.join(', ')}`)],
    ['levels outside [0.001, 0.999]', ['--from', '2031-03-10', '--to', '2031-03-10', '--levels', '0:1:0.25'], /levels 0, 1 outside \[0.001, 0.999\]/],
    ['a level of 1.2 in a list', ['--from', '2031-03-10', '--to', '2031-03-10', '--levels', '0.5,1.2'], /level 1.2 outside \[0.001, 0.999\]/],
    ['levels not increasing', ['--from', '2031-03-10', '--to', '2031-03-10', '--levels', '0.5,0.1'], /do not increase strictly/],
    ['no day that can be forecast', ['--from', '2030-01-01', '--to', '2030-01-31'], /no day from 2030-01-01 to 2030-01-31 could be forecast/],
    ['--paths beyond the most paths', ['--from', '2031-03-10', '--to', '2031-03-10', '--paths', '10001'], /whole number of paths from 0 to 10000/],
  ])('exits 2 and writes nothing for %s', async (_name, args, message) => {
    const out = join(dir, `bad-${_name.replace(/\W+/g, '-')}`);
    const run = await runCli(['forecast', ...inputs(), '--out', out, ...args]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
  });
});
