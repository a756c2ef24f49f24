import { existsSync, mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/cliIo.js';
import { deliveryPeriods } from '../../src/market/calendar.js';

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

async function run(args: string[]): Promise<Run> {
  let stdout = '';
  let stderr = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: false };
  const code = await main(['node', 'quantbid', ...args], io);
  return { code, stdout, stderr };
}

let dir = '';
const day = '2027-03-28'; // spring clock change in Europe/Berlin: 92 quarter-hours

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'quantbid-plan-'));
  writeFileSync(join(dir, 'market.json'), JSON.stringify({ timeZone: 'Europe/Berlin', periodMinutes: 15, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' }));
  writeFileSync(join(dir, 'battery.json'), JSON.stringify({ energyMwh: 10, chargeMw: 5, dischargeMw: 5, roundTripEfficiency: 0.88, socMinFraction: 0.1, socMaxFraction: 0.9, socInitialFraction: 0.5 }));
  const lines = ['period_start,q0.05,q0.1,q0.5,q0.9,q0.95'];
  deliveryPeriods(day, 'Europe/Berlin', 15).forEach((p, t) => {
    const mid = 60 + 40 * Math.sin((2 * Math.PI * t) / 92);
    lines.push([p.start, mid - 30, mid - 20, mid, mid + 20, mid + 30].map((x) => (typeof x === 'number' ? x.toFixed(2) : x)).join(','));
  });
  writeFileSync(join(dir, 'quantiles.csv'), `${lines.join('\n')}\n`);
});

// The quantile policy, named: the default (auto) needs paths or a history, which these inputs lack.
const inputs = () => ['--market', join(dir, 'market.json'), '--battery', join(dir, 'battery.json'), '--forecast', join(dir, 'quantiles.csv'), '--policy', 'quantile'];
const inputFiles = () => inputs().slice(0, 6);

describe('quantbid plan', () => {
  it('writes orders.csv, schedule.csv and plan.json for a 92-period day', async () => {
    const out = join(dir, 'plan-ok');
    const result = await run(['plan', ...inputs(), '--day', day, '--alpha', '0.1', '--out', out]);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    const orders = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n');
    expect(orders[0]).toBe('period_start,period_end,side,quantity_mw,limit_price,quantile_level');
    expect(orders.length).toBeGreaterThan(1);
    const schedule = readFileSync(join(out, 'schedule.csv'), 'utf8').trimEnd().split('\n');
    expect(schedule[0]).toBe('period_start,charge_mw,discharge_mw,soc_mwh');
    expect(schedule).toHaveLength(93);
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8')) as { solver: { status: string }; objective: number };
    expect(plan.solver.status).toBe('optimal');
    expect(plan.objective).toBeGreaterThan(0);
    // A buy's limit is q(0.9) and a sell's q(0.1), as the quantile policy says.
    for (const line of orders.slice(1)) expect(line).toMatch(/,(buy,[\d.]+,[\d.-]+,0\.9|sell,[\d.]+,[\d.-]+,0\.1)$/);
  });

  it('without --policy, --paths or a history: the plan is price-taking\'s (auto\'s fallback), said in a note', async () => {
    const out = join(dir, 'plan-default');
    const result = await run(['plan', ...inputFiles(), '--day', day, '--out', out, '--json']);
    expect(result.code).toBe(0);
    expect(result.stderr).toBe("note: the default policy, auto, scores its candidates on whole-day paths made from the forecast and a history; with no --history and no --paths this plan is price-taking's, its fallback\n");
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8')) as { policy: string };
    expect(plan.policy).toBe('price-taking');
    expect(JSON.parse(result.stdout)).toEqual(plan);
    // Price-taking: buys limited at the cap, sells at the floor, so that every order is accepted
    // whatever the clearing price (an order at the cap or floor always clears: common practice).
    const orders = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n').slice(1);
    expect(orders.length).toBeGreaterThan(0);
    for (const line of orders) expect(line).toMatch(/,(buy,[\d.]+,4000|sell,[\d.]+,-500),$/);
  });

  it('writes the same bytes twice (determinism)', async () => {
    await run(['plan', ...inputs(), '--day', day, '--out', join(dir, 'd1')]);
    await run(['plan', ...inputs(), '--day', day, '--out', join(dir, 'd2')]);
    for (const name of ['orders.csv', 'schedule.csv', 'plan.json']) {
      expect(readFileSync(join(dir, 'd1', name), 'utf8')).toBe(readFileSync(join(dir, 'd2', name), 'utf8'));
    }
  });

  it('refuses to overwrite existing outputs without --force (exit 2, files untouched)', async () => {
    const out = join(dir, 'plan-again');
    expect((await run(['plan', ...inputs(), '--day', day, '--out', out])).code).toBe(0);
    const before = statSync(join(out, 'orders.csv')).mtimeMs;
    const again = await run(['plan', ...inputs(), '--day', day, '--alpha', '0.2', '--out', out]);
    expect(again.code).toBe(2);
    expect(again.stderr).toMatch(/already exist.*add --force to overwrite/);
    expect(statSync(join(out, 'orders.csv')).mtimeMs).toBe(before);
    expect((await run(['plan', ...inputs(), '--day', day, '--alpha', '0.2', '--out', out, '--force'])).code).toBe(0);
  });

  it.each([
    [['--alpha', '0.7'], /alpha 0.7 must be a number in \[0.001, 0.5\)/],
    [['--alpha', '0.02'], /--alpha: alpha 0.02 needs the levels 0.02 and 0.98, outside the forecast's levels \[0.05, 0.95\]/],
    [['--policy', 'greedy'], /"greedy" must be one of quantile, median, point, price-taking/],
    [['--day', '2027-13-01'], /is not a day; write it as YYYY-MM-DD/],
    [['--day', '2027-03-29'], /quantiles.csv: period_start: no forecast for 2027-03-29 \(the file covers 2027-03-28 to 2027-03-28\)/],
    [['--soc-start', '12'], /--soc-start: 12 MWh is more than the battery's energy 10 MWh/],
  ])('bad usage %j exits 2, names the problem and writes nothing', async (extra, message) => {
    const out = join(dir, `bad-${extra.join('')}`);
    const result = await run(['plan', ...inputs(), '--day', day, ...extra, '--out', out]);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
  });

  it('bad files exit 2 with file, line and field, and nothing written', async () => {
    const bad = join(dir, 'bad-battery.json');
    writeFileSync(bad, '{\n  "energyMwh": 10,\n  "chargeMw": -5,\n  "dischargeMw": 5,\n  "roundTripEfficiency": 0.88\n}\n');
    const out = join(dir, 'bad-files');
    const result = await run(['plan', '--market', join(dir, 'market.json'), '--battery', bad, '--forecast', join(dir, 'quantiles.csv'), '--day', day, '--out', out]);
    expect(result.code).toBe(2);
    expect(result.stderr).toContain(`${bad}:3: chargeMw: chargeMw must be in [0.001, 100000]; give the charge power limit at the grid connection in MW, e.g. 5`);
    expect(existsSync(out)).toBe(false);
    const missing = await run(['plan', '--market', join(dir, 'nope.json'), '--battery', bad, '--forecast', dir, '--day', day]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/nope.json: cannot be read/);
  });

  it('lists every missing input at once', async () => {
    const result = await run(['plan', '--day', day]);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/--market: no market file given[\s\S]*--battery: no battery file given[\s\S]*--forecast: no forecast file given/);
  });

  it('prints --help with examples and --version (exit 0)', async () => {
    const help = await run(['plan', '--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/Examples:\n {2}quantbid plan/);
    const version = await run(['--version']);
    expect(version.stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
  });

  it('--soc-start outside the window: a warning, and the plan sells back into it in the first period, bid at the floor', async () => {
    // Window [1, 9] MWh; from 9.8 MWh one quarter-hour at 5 MW takes 1.25 / sqrt(0.88) = 1.33 MWh out
    // of the store: the first period crosses into the window, so no period is forced beyond it.
    const out = join(dir, 'plan-outside');
    const result = await run(['plan', ...inputs(), '--day', day, '--soc-start', '9.8', '--out', out]);
    expect(result.code).toBe(0);
    expect(result.stderr).toMatch(/warning: the starting state of charge 9.8 MWh is above the battery's window \[1, 9\] MWh; the plan discharges back to 9 MWh as fast as the power allows, within the first 1 period/);
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8')) as { recovery: { direction: string; forcedPeriods: number; periodsAtCapOrFloor: number }; warnings: { kind: string }[] };
    expect(plan.recovery).toEqual({ direction: 'discharge', forcedPeriods: 0, forcedMwh: 0, periodsAtCapOrFloor: 1 });
    expect(plan.warnings.map((w) => w.kind)).toContain('start-outside-window');
    const schedule = readFileSync(join(out, 'schedule.csv'), 'utf8').trimEnd().split('\n');
    const [, , discharge, soc] = (schedule[1] as string).split(',');
    expect(Number(discharge)).toBeGreaterThan(0);
    expect(Number(soc)).toBeLessThanOrEqual(9 + 1e-6);
    const firstOrder = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n')[1] as string;
    expect(firstOrder).toMatch(/,sell,[\d.]+,-500,$/);
  });

  it('notes crossing quantiles of the planned day only, counted in that day', async () => {
    // Two days in the file; the day after the planned one has two crossing periods, the planned day none.
    const next = '2027-03-29';
    const rows = (d: string, crossing: number) =>
      deliveryPeriods(d, 'Europe/Berlin', 15).map((p, t) => [p.start, ...(t < crossing ? [50, 40, 60, 70, 80] : [30, 40, 60, 70, 80])].join(','));
    const file = join(dir, 'two-days.csv');
    writeFileSync(file, `${['period_start,q0.05,q0.1,q0.5,q0.9,q0.95', ...rows(day, 0), ...rows(next, 2)].join('\n')}\n`);
    const args = ['plan', '--market', join(dir, 'market.json'), '--battery', join(dir, 'battery.json'), '--forecast', file];
    const clean = await run([...args, '--day', day, '--json']);
    expect(clean.stderr).not.toMatch(/crossing/);
    // Only the planned day's rows are parsed (docs/design.md, plan.json): the other day's repairs are not counted.
    const cleanForecast = (JSON.parse(clean.stdout) as { forecast: Record<string, unknown> }).forecast;
    expect(Object.keys(cleanForecast)).toEqual(['levels', 'rowsChecked', 'checks', 'repairedPeriodsInDay', 'repairedExamples']);
    expect(cleanForecast).toMatchObject({ rowsChecked: 'day', repairedPeriodsInDay: 0, repairedExamples: [] });
    expect(cleanForecast.checks).toMatch(/the rows of 2027-03-28 \(the lines that hold its date\): .*; the rows of other days are not parsed$/);
    const crossed = await run([...args, '--day', next, '--json']);
    expect(crossed.stderr).toMatch(/note: .*two-days.csv: 2 of the 96 periods of 2027-03-29 had crossing quantiles, sorted into order/);
    const crossedStarts = deliveryPeriods(next, 'Europe/Berlin', 15).slice(0, 2).map((p) => p.start);
    expect((JSON.parse(crossed.stdout) as { forecast: unknown }).forecast).toMatchObject({ rowsChecked: 'day', repairedPeriodsInDay: 2, repairedExamples: crossedStarts });
  });

  it('parses only the planned day\'s rows: a bad row of another day does not stop the plan, a bad row of the day does, named by its line', async () => {
    const next = '2027-03-29';
    const rows = (d: string) => deliveryPeriods(d, 'Europe/Berlin', 15).map((p) => [p.start, 30, 40, 60, 70, 80].join(','));
    const nextRows = rows(next);
    nextRows[5] = (nextRows[5] as string).replace(',60,', ',sixty,');
    const file = join(dir, 'bad-other-day.csv');
    writeFileSync(file, `${['period_start,q0.05,q0.1,q0.5,q0.9,q0.95', ...rows(day), ...nextRows].join('\n')}\n`);
    const args = ['plan', '--market', join(dir, 'market.json'), '--battery', join(dir, 'battery.json'), '--forecast', file];
    const planned = await run([...args, '--day', day, '--json']);
    expect(planned.code).toBe(0);
    expect((JSON.parse(planned.stdout) as { forecast: { rowsChecked: string } }).forecast.rowsChecked).toBe('day');
    // The bad row is line 1 (header) + 92 rows of the spring day + 6: line 99.
    const refused = await run([...args, '--day', next]);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain(`${file}:99: q0.5: "sixty" is not a number; give a decimal number with a dot, e.g. 42.5`);
  });
});

describe('quantbid plan with the exchange\'s order steps in market.json', () => {
  it('orders on the quantity step and the tick, the schedule to match, the loss from rounding in plan.json and on the console', async () => {
    const stepped = join(dir, 'market-steps.json');
    writeFileSync(stepped, JSON.stringify({ ...JSON.parse(readFileSync(join(dir, 'market.json'), 'utf8')), quantityStepMw: 0.5, minimumQuantityMw: 1, priceTickPerMwh: 1 }));
    const plainOut = join(dir, 'plan-unrounded');
    const out = join(dir, 'plan-rounded');
    expect((await run(['plan', ...inputs(), '--day', day, '--out', plainOut])).code).toBe(0);
    const result = await run(['plan', ...inputs(), '--market', stepped, '--day', day, '--out', out]);
    expect(result.code).toBe(0);
    // Without the steps plan.json has no rounding (and is as before); with them it says what the rounding cost.
    const plain = JSON.parse(readFileSync(join(plainOut, 'plan.json'), 'utf8'));
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect('rounding' in plain).toBe(false);
    expect(plan.rounding).toMatchObject({ quantityStepMw: 0.5, minimumQuantityMw: 1, priceTickPerMwh: 1 });
    expect(plan.rounding.valueBeforeRounding).toBeCloseTo(plain.objective, 6);
    expect(plan.rounding.lossFromRounding).toBeCloseTo(plan.rounding.valueBeforeRounding - plan.rounding.valueAfterRounding, 6);
    expect(plan.objective).toBeCloseTo(plan.rounding.valueAfterRounding, 6);
    expect(result.stdout).toMatch(/rounded to the exchange \(quantity step 0\.5 MW, minimum 1 MW, price tick 1\): loss from rounding -?[\d.]+ HLV/);
    // Each order: a whole number of 0.5 MW steps, at least 1 MW, its limit a whole number; buys limited at
    // or below q(0.9), sells at or above q(0.1), read from the unrounded plan's orders of the same period.
    const rows = (folder: string) => readFileSync(join(folder, 'orders.csv'), 'utf8').trimEnd().split('\n').slice(1).map((l) => l.split(','));
    const before = new Map(rows(plainOut).map((r) => [r[0], r]));
    for (const [start, , side, quantity, limit] of rows(out)) {
      expect(Number(quantity) * 2).toBe(Math.round(Number(quantity) * 2));
      expect(Number(quantity)).toBeGreaterThanOrEqual(1);
      expect(Number(limit)).toBe(Math.round(Number(limit)));
      const planned = before.get(start as string);
      if (planned?.[2] === side) expect(side === 'buy' ? Number(limit) <= Number(planned?.[4]) : Number(limit) >= Number(planned?.[4])).toBe(true);
    }
    // schedule.csv is the rounded schedule: its flows are the orders.
    const schedule = readFileSync(join(out, 'schedule.csv'), 'utf8').trimEnd().split('\n').slice(1).map((l) => l.split(','));
    const ordered = new Map(rows(out).map((r) => [r[0], r]));
    for (const [start, charge, discharge] of schedule) {
      const o = ordered.get(start as string);
      expect([Number(charge), Number(discharge)]).toEqual(o === undefined ? [0, 0] : o[2] === 'buy' ? [Number(o[3]), 0] : [0, Number(o[3])]);
    }
  });
});
