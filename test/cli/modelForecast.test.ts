import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../report/planFixtures.js';
import { checkBuild, quantbid, ROOT } from './sweepScenario.js';
import { stripYearWarning } from './yearWarning.js';

// `--model NAME` on backtest and sweep: forecasts made on the fly from the demo history
// (scenarios/halvorn, fictional) must be exactly those `quantbid forecast` writes, so a backtest with
// --model equals a backtest of that file; the forecast cache must serve a second run without fitting
// and refit a damaged entry. Early demo days keep the runs short: with the default options the first
// day arx-hs can forecast is 2025-03-05 (28 calibration days after 7 lag + 28 training days).

const SCENARIO = join(ROOT, 'scenarios/halvorn/scenario.json');
const SPAN = ['--from', '2025-03-04', '--to', '2025-03-09'];
let work = '';
let cache = '';
let viaModel = '';
let firstNote = '';

const read = (dir: string, name: string): string => readFileSync(join(dir, name), 'utf8');
/** Every file of a folder tree with its bytes and modification time. */
function snapshot(dir: string): Map<string, { text: string; mtimeMs: number }> {
  const files = new Map<string, { text: string; mtimeMs: number }>();
  for (const sub of readdirSync(dir)) for (const name of readdirSync(join(dir, sub))) {
    const path = join(dir, sub, name);
    files.set(path, { text: readFileSync(path, 'utf8'), mtimeMs: statSync(path).mtimeMs });
  }
  return files;
}
const noteOf = (stdout: string): string => stdout.split('\n').find((line) => line.startsWith('forecasts: ')) ?? '';

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'quantbid-model-'));
  cache = join(work, 'cache');
  viaModel = join(work, 'via-model');
  const run = await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--model', 'arx-hs', '--forecast-cache', cache, '--out', viaModel]);
  expect(stripYearWarning(run.stderr)).toBe('');
  expect(run.code).toBe(0);
  firstNote = noteOf(run.stdout);
}, 120_000);

describe('quantbid backtest --model', () => {
  it('--model auto records the method chosen each day, as quantbid forecast does, and equals the backtest of its file', async () => {
    const fc = join(work, 'fc-auto');
    const viaAuto = join(work, 'via-auto');
    const viaFile = join(work, 'via-auto-file');
    expect((await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--model', 'auto', '--no-forecast-cache', '--out', viaAuto])).code).toBe(0);
    expect((await runCli(['forecast', '--scenario', SCENARIO, ...SPAN, '--out', fc])).code).toBe(0);
    expect((await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--forecast', join(fc, 'quantiles.csv'), '--out', viaFile])).code).toBe(0);
    expect(read(viaAuto, 'days.csv')).toBe(read(viaFile, 'days.csv'));
    const chosen = JSON.parse(read(viaAuto, 'summary.json')).forecastModel.chosenMethods;
    expect(chosen).toEqual(JSON.parse(read(fc, 'forecast.json')).chosenMethods);
    expect(chosen.perDay.map((c: { day: string }) => c.day)).toEqual(['2025-03-05', '2025-03-06', '2025-03-07', '2025-03-08', '2025-03-09']);
    for (const c of chosen.perDay) expect(['driver-hs', 'arx-hs', 'driver-fhs', 'quantile-average']).toContain(c.method);
  }, 300_000);

  it('equals quantbid forecast followed by backtest --forecast of its file: days.csv and ledger.csv byte for byte', async () => {
    const fc = join(work, 'fc');
    const viaFile = join(work, 'via-file');
    expect((await runCli(['forecast', '--scenario', SCENARIO, ...SPAN, '--method', 'arx-hs', '--out', fc])).code).toBe(0);
    const run = await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--forecast', join(fc, 'quantiles.csv'), '--out', viaFile]);
    expect(run.code).toBe(0);
    expect(read(viaModel, 'days.csv')).toBe(read(viaFile, 'days.csv'));
    expect(read(viaModel, 'ledger.csv')).toBe(read(viaFile, 'ledger.csv'));
    const model = JSON.parse(read(viaModel, 'summary.json'));
    const file = JSON.parse(read(viaFile, 'summary.json'));
    expect(model.policies).toEqual(file.policies);
    expect(model.inputs.model).toBe('arx-hs');
    expect(model.inputs.forecast).toBeUndefined();
    // The forecast command skipped the same first day for the same reason.
    const forecastJson = JSON.parse(read(fc, 'forecast.json'));
    expect(model.forecastModel.skippedDays).toEqual(forecastJson.days.skippedDays);
    expect(model.forecastModel.daysForecast).toBe(forecastJson.days.forecast);
    expect(model.forecastModel.skippedDays.map((s: { day: string }) => s.day)).toEqual(['2025-03-04']);
  });

  it('a second run takes every day from the cache: nothing fitted, cache files untouched, the same output bytes', async () => {
    expect(firstNote).toBe(`forecasts: arx-hs at 19 levels, 5 days forecast, 1 skipped; 6 days fitted, 0 from the cache ${cache}`);
    const before = snapshot(cache);
    expect(before.size).toBe(6);
    const again = join(work, 'again');
    const run = await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--model', 'arx-hs', '--forecast-cache', cache, '--out', again]);
    expect(run.code).toBe(0);
    expect(noteOf(run.stdout)).toBe(`forecasts: arx-hs at 19 levels, 5 days forecast, 1 skipped; 0 days fitted, 6 from the cache ${cache}`);
    expect(snapshot(cache)).toEqual(before);
    for (const name of ['days.csv', 'ledger.csv', 'summary.json']) expect(read(again, name)).toBe(read(viaModel, name));
  });

  it('a damaged cache entry is refitted and written again, with the same result', async () => {
    const before = snapshot(cache);
    const [path, entry] = [...before.entries()].find(([, e]) => e.text.includes('"outcome":"forecast"'))!;
    writeFileSync(path, entry.text.slice(0, 1000)); // a partial write
    const out = join(work, 'damaged');
    const run = await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--model', 'arx-hs', '--forecast-cache', cache, '--out', out]);
    expect(run.code).toBe(0);
    expect(noteOf(run.stdout)).toBe(`forecasts: arx-hs at 19 levels, 5 days forecast, 1 skipped; 1 day fitted, 5 from the cache ${cache}, 1 damaged cache entry made again`);
    expect(read(path, '')).toBe(entry.text);
    for (const name of ['days.csv', 'ledger.csv', 'summary.json']) expect(read(out, name)).toBe(read(viaModel, name));
  });

  it('--levels sets the levels the forecasts are made at; the cache keeps them apart', async () => {
    const out = join(work, 'levels');
    const run = await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, '--model', 'arx-hs', '--levels', '0.1,0.5,0.9', '--forecast-cache', cache, '--out', out, '--json']);
    expect(run.code).toBe(0);
    const summary = JSON.parse(run.stdout);
    expect(summary.forecastModel.levels).toEqual([0.1, 0.5, 0.9]);
    expect(summary).toEqual(JSON.parse(read(out, 'summary.json')));
    expect(snapshot(cache).size).toBe(12);
  });

  it.each([
    ['--model with --forecast', ['--model', 'arx-hs', '--forecast', join(ROOT, 'scenarios/halvorn/quantiles.csv.gz')], /--model: --model arx-hs and --forecast .* were both given; give --forecast FILE .*, or --model NAME .*, not both/],
    ['an unknown model, with the list', ['--model', 'magic'], /"magic" must be one of auto, naive-hs, arx-hs, lasso-hs, arx-conformal, qra, driver-hs, driver-fhs, driver-qr/],
    ['--levels without --model', ['--levels', '0.1,0.9'], /--levels: is used only with --model/],
    ['--no-forecast-cache without --model', ['--no-forecast-cache'], /--no-forecast-cache: is used only with --model/],
    ['levels that do not hold the alpha, before any fitting', ['--model', 'naive-hs', '--levels', '0.2,0.5,0.8'], /--model naive-hs: --alpha: alpha 0.1 needs the levels 0.1 and 0.9, outside the forecast's levels \[0.2, 0.8\]/],
  ])('exits 2 and writes nothing for %s', async (name, args, message) => {
    const out = join(work, `bad-${name.replace(/\W+/g, '-')}`);
    const cacheArgs = args.includes('--no-forecast-cache') ? [] : ['--forecast-cache', join(work, 'bad-cache')];
    const run = await runCli(['backtest', '--scenario', SCENARIO, ...SPAN, ...args, ...cacheArgs, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
    expect(existsSync(join(work, 'bad-cache'))).toBe(false);
  });
});

describe('the compiled CLI with --model', () => {
  beforeAll(() => checkBuild());

  it('keeps the cache in .quantbid-cache/forecasts of the working folder by default; --no-forecast-cache writes none', () => {
    const cwd = mkdtempSync(join(tmpdir(), 'quantbid-model-cwd-'));
    const cli = (args: readonly string[]) => spawnSync(process.execPath, [join(ROOT, 'bin/quantbid.js'), 'backtest', '--scenario', SCENARIO, '--from', '2025-03-05', '--to', '2025-03-05', '--model', 'naive-hs', ...args], { cwd, encoding: 'utf8' });
    const plain = cli(['--out', 'a']);
    expect(plain.status).toBe(0);
    expect(snapshot(join(cwd, '.quantbid-cache', 'forecasts')).size).toBe(1);
    const none = cli(['--no-forecast-cache', '--out', 'b']);
    expect(none.status).toBe(0);
    expect(noteOf(none.stdout)).toMatch(/1 day fitted, no cache$/);
    expect(read(join(cwd, 'b'), 'days.csv')).toBe(read(join(cwd, 'a'), 'days.csv'));
    expect(snapshot(join(cwd, '.quantbid-cache', 'forecasts')).size).toBe(1);
  });

  it('sweep --model on 2 threads fits each day once (in the parent, before the workers) and equals the sweep of the forecast file', () => {
    const span = ['--from', '2025-03-05', '--to', '2025-03-09', '--alphas', '0.1,0.3', '--policies', 'quantile'];
    const sweepCache = join(work, 'sweep-cache');
    const first = quantbid(['sweep', '--scenario', SCENARIO, ...span, '--model', 'arx-hs', '--forecast-cache', sweepCache, '--threads', '2', '--out', join(work, 'sweep-model')]);
    expect(first).toMatchObject({ code: 0, stderr: '' });
    expect(noteOf(first.stdout)).toBe(`forecasts: arx-hs at 19 levels, 5 days forecast, 0 skipped; 5 days fitted, 0 from the cache ${sweepCache}`);
    const fc = join(work, 'sweep-fc');
    expect(quantbid(['forecast', '--scenario', SCENARIO, '--from', '2025-03-05', '--to', '2025-03-09', '--method', 'arx-hs', '--out', fc]).code).toBe(0);
    const viaFile = quantbid(['sweep', '--scenario', SCENARIO, ...span, '--forecast', join(fc, 'quantiles.csv'), '--threads', '2', '--out', join(work, 'sweep-file')]);
    expect(viaFile.code).toBe(0);
    expect(read(join(work, 'sweep-model'), 'sweep.csv')).toBe(read(join(work, 'sweep-file'), 'sweep.csv'));
    const summary = JSON.parse(read(join(work, 'sweep-model'), 'summary.json'));
    expect(summary.inputs.model).toBe('arx-hs');
    expect(summary.forecastModel.daysForecast).toBe(5);
  }, 300_000);

  it('size --model takes the days from the cache the sweep filled and equals the sizing of the forecast file', () => {
    const span = ['--from', '2025-03-05', '--to', '2025-03-09', '--energy-mwh', '5,10', '--power-mw', '5', '--alpha', '0.1'];
    const costs = ['--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--fixed-om-per-mw-year', '8000', '--life-years', '15', '--discount-rate', '0.07'];
    const sweepCache = join(work, 'sweep-cache');
    const viaModel = quantbid(['size', '--scenario', SCENARIO, ...span, ...costs, '--model', 'arx-hs', '--forecast-cache', sweepCache, '--threads', '2', '--out', join(work, 'size-model')]);
    expect(viaModel.code, viaModel.stderr).toBe(0);
    expect(noteOf(viaModel.stdout)).toBe(`forecasts: arx-hs at 19 levels, 5 days forecast, 0 skipped; 0 days fitted, 5 from the cache ${sweepCache}`);
    const viaFile = quantbid(['size', '--scenario', SCENARIO, ...span, ...costs, '--forecast', join(work, 'sweep-fc', 'quantiles.csv'), '--threads', '2', '--out', join(work, 'size-file')]);
    expect(viaFile.code, viaFile.stderr).toBe(0);
    expect(read(join(work, 'size-model'), 'size.csv')).toBe(read(join(work, 'size-file'), 'size.csv'));
  }, 300_000);
});
