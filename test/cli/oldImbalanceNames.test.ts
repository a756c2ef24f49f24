import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { runMain } from './runMain.js';
import { stripYearWarning, withoutYearWarning } from './yearWarning.js';

// The imbalance price under its old names (docs/design.md section 2): the history column
// `fallback_price` and the market.json field `fallback` are still read, each with a one-line note on
// stderr, and a run on them writes exactly what a run on the new names writes. Inputs: the demo
// scenario cut to a few days, once with the new names and once with the old ones. (A sweep's notes,
// which need the compiled task module, are checked in sweepCommand.test.ts.)

const DEMO = 'scenarios/halvorn';
const FROM = '2026-03-01';
const TO = '2026-03-02';

/** The header and the rows of a gzip CSV whose period starts fall on the days given. */
function cut(gzFile: string, days: readonly string[]): { header: string; rows: string[] } {
  const [header, ...rows] = gunzipSync(readFileSync(join(DEMO, gzFile))).toString('utf8').trimEnd().split('\n');
  return { header: header as string, rows: rows.filter((row) => days.some((day) => row.startsWith(day))) };
}

interface Inputs {
  readonly scenario: string;
  readonly market: string;
  readonly history: string;
}

/** A file as the CLI names it when a scenario names it: relative to the working folder. */
const shown = (file: string): string => relative(process.cwd(), file);

/** A scenario folder with the demo's battery, the cut forecast, and the history and market spec under `names`. */
function writeInputs(dir: string, names: { readonly column: string; readonly field: string }): Inputs {
  // Six weeks of history before the span, what `forecast --method naive-hs` needs for its week and its calibration.
  const history = cut('history.csv.gz', ['2026-01-1', '2026-01-2', '2026-01-3', '2026-02', FROM, TO]);
  const forecast = cut('quantiles.csv.gz', ['2026-02-28', FROM, TO]);
  const market = JSON.parse(readFileSync(join(DEMO, 'market.json'), 'utf8')) as Record<string, unknown>;
  const { imbalance, ...rest } = market;
  const paths = { scenario: join(dir, 'scenario.json'), market: join(dir, 'market.json'), history: join(dir, 'history.csv') };
  writeFileSync(paths.market, `${JSON.stringify({ ...rest, [names.field]: imbalance }, null, 2)}\n`);
  writeFileSync(paths.history, `${[history.header.replace('imbalance_price', names.column), ...history.rows].join('\n')}\n`);
  writeFileSync(join(dir, 'quantiles.csv'), `${[forecast.header, ...forecast.rows].join('\n')}\n`);
  writeFileSync(join(dir, 'battery.json'), readFileSync(join(DEMO, 'battery.json')));
  writeFileSync(paths.scenario, JSON.stringify({ market: 'market.json', battery: 'battery.json', history: 'history.csv', forecast: 'quantiles.csv', demoDay: FROM }));
  return paths;
}

let work = '';
let renamed: Inputs;
let old: Inputs;

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), 'quantbid-old-names-'));
  const folder = (name: string): string => mkdtempSync(join(work, `${name}-`));
  renamed = writeInputs(folder('new'), { column: 'imbalance_price', field: 'imbalance' });
  old = writeInputs(folder('old'), { column: 'fallback_price', field: 'fallback' });
});

const historyNote = (file: string): string => `note: ${shown(file)}:1: the column fallback_price is read as imbalance_price; rename the column to imbalance_price\n`;
const marketNote = (file: string): string => `note: ${shown(file)}:8: the field "fallback" is read as "imbalance"; rename it to "imbalance"\n`;

describe('the old names of the imbalance price', () => {
  it('the demo ships the new names: imbalance_price in the history, "imbalance" in market.json', () => {
    expect(gunzipSync(readFileSync(join(DEMO, 'history.csv.gz'))).toString('utf8').split('\n', 1)[0]).toBe('period_start,price,imbalance_price,load_forecast_mw,renewables_forecast_mw');
    expect(Object.keys(JSON.parse(readFileSync(join(DEMO, 'market.json'), 'utf8')))).toContain('imbalance');
  });

  it('backtest: one note per old name on stderr, and the same ledger.csv, days.csv and figures as with the new names', async () => {
    const run = async (inputs: Inputs, name: string) => {
      const out = join(work, name);
      const result = await runMain(['backtest', '--scenario', inputs.scenario, '--from', FROM, '--to', TO, '--out', out]);
      return { ...result, out };
    };
    const now = await run(renamed, 'bt-new');
    const then = await run(old, 'bt-old');
    expect(withoutYearWarning(now)).toMatchObject({ code: 0, stderr: '' });
    expect(then.code).toBe(0);
    expect(stripYearWarning(then.stderr)).toBe(`${marketNote(old.market)}${historyNote(old.history)}`);
    for (const file of ['ledger.csv', 'days.csv']) expect(readFileSync(join(then.out, file), 'utf8')).toBe(readFileSync(join(now.out, file), 'utf8'));
    const summary = (out: string) => {
      const { inputs: _inputs, ...rest } = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as Record<string, unknown>;
      return rest;
    };
    expect(summary(then.out)).toEqual(summary(now.out));
    expect(then.stdout.replaceAll(then.out, now.out)).toBe(now.stdout);
  });

  it('backtest --quiet: the notes are silenced with the rest', async () => {
    const run = await runMain(['backtest', '--scenario', old.scenario, '--from', FROM, '--to', FROM, '--policies', 'quantile', '--quiet', '--out', join(work, 'bt-quiet')]);
    expect(run).toMatchObject({ code: 0, stderr: '' });
  });

  it('plan, forecast and score: the note of each old name they read', async () => {
    const plan = await runMain(['plan', '--scenario', old.scenario]);
    expect(plan.code).toBe(0);
    // The default policy (auto) reads the history for the day's paths and its imbalance spread.
    expect(plan.stderr).toBe(`${marketNote(old.market)}${historyNote(old.history)}`);
    const forecast = await runMain(['forecast', '--scenario', old.scenario, '--from', TO, '--to', TO, '--method', 'naive-hs', '--out', join(work, 'fc-old')]);
    expect(forecast.code, forecast.stderr).toBe(0);
    expect(forecast.stderr).toBe(`${marketNote(old.market)}${historyNote(old.history)}`);
    const score = await runMain(['score', '--scenario', old.scenario, '--from', FROM, '--to', TO, '--out', join(work, 'score-old')]);
    expect(score.code).toBe(0);
    expect(score.stderr).toBe(`${marketNote(old.market)}${historyNote(old.history)}`);
  });

  it('both names in one file is bad input (exit 2) naming the file, the line and the old name', async () => {
    const both = mkdtempSync(join(work, 'both-'));
    const inputs = writeInputs(both, { column: 'imbalance_price', field: 'imbalance' });
    const market = JSON.parse(readFileSync(inputs.market, 'utf8')) as Record<string, unknown>;
    writeFileSync(inputs.market, `${JSON.stringify({ ...market, fallback: market.imbalance }, null, 2)}\n`);
    const [header, ...rows] = readFileSync(inputs.history, 'utf8').trimEnd().split('\n');
    writeFileSync(inputs.history, `${[`${header},fallback_price`, ...rows.map((row) => `${row},${row.split(',')[2]}`)].join('\n')}\n`);
    const out = join(work, 'bt-both');
    const run = await runMain(['backtest', '--scenario', inputs.scenario, '--from', FROM, '--to', TO, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      `${shown(inputs.market)}:12: fallback: both "imbalance" and its old name "fallback" are given; keep only "imbalance", the same rule under its new name\n` +
        'nothing was written.\n',
    );
    const fixed = JSON.parse(readFileSync(inputs.market, 'utf8')) as Record<string, unknown>;
    delete fixed.fallback;
    writeFileSync(inputs.market, `${JSON.stringify(fixed, null, 2)}\n`);
    const again = await runMain(['backtest', '--scenario', inputs.scenario, '--from', FROM, '--to', TO, '--out', out]);
    expect(again.code).toBe(2);
    expect(again.stderr).toBe(
      `${shown(inputs.history)}:1: fallback_price: both imbalance_price and its old name fallback_price are given; keep one of them, named imbalance_price\n` +
        'nothing was written.\n',
    );
  });
});
