import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { batteryModel } from '../../src/battery/batterySpec.js';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { planDay } from '../../src/plan/planDay.js';
import { fanBands, planReport, type OptimalPlan } from '../../src/report/index.js';
import type { MarketSpec, QuantileDay } from '../../src/types.js';
import { clockChangeInputs, PLAN_CHART_IDS, planWithReport, readReport, runCli } from './planFixtures.js';
import { deepFreeze, elements, texts } from './svgQuery.js';

const chartSource = (html: string, id: string) => html.slice(html.indexOf(`id="${id}"`), html.indexOf('</svg>', html.indexOf(`id="${id}"`)));

describe('quantbid plan --report', () => {
  const inputs = clockChangeInputs('HLV <&> "test"');
  let out = '';
  let html = '';
  beforeAll(async () => {
    out = await planWithReport(inputs.args);
    html = readReport(out);
  });

  it('writes report.html beside orders.csv, schedule.csv and plan.json', () => {
    for (const name of ['orders.csv', 'schedule.csv', 'plan.json', 'report.html']) expect(existsSync(join(out, name)), name).toBe(true);
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
  });

  it('the same inputs give a byte-identical report', async () => {
    expect(readReport(await planWithReport(inputs.args))).toBe(html);
  });

  it('has the three charts, each with one caption line, and one table row per order of orders.csv', () => {
    for (const id of PLAN_CHART_IDS) expect(texts(chartSource(html, id), 'caption'), id).toHaveLength(1);
    const orders = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n').slice(1);
    expect(orders.length).toBeGreaterThan(0);
    const tableRows = html.slice(html.indexOf('<section id="orders">'), html.indexOf('<section id="inputs">')).match(/<tr><td/g) ?? [];
    expect(tableRows).toHaveLength(orders.length);
    expect(elements(chartSource(html, 'plan-prices'), 'path', 'point')).toHaveLength(orders.length);
    expect(elements(chartSource(html, 'plan-prices'), 'path', 'band')).toHaveLength(3);
  });

  it("each limit marker names its order's side and the limit price of orders.csv", () => {
    const orders = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n').slice(1).map((l) => l.split(','));
    const tooltips = [...chartSource(html, 'plan-prices').matchAll(/<title>(buy|sell) limit[^<]*: (\S+) HLV/g)].map((m) => `${m[1]} ${Number(m[2]).toFixed(2)}`);
    expect(tooltips.sort()).toEqual(orders.map((o) => `${o[2]} ${Number(o[4]).toFixed(2)}`).sort());
  });

  it('labels the clock change on the axis and escapes the currency label everywhere', () => {
    expect(html).toContain('UTC offset +01:00 then +02:00');
    expect(html).toContain('HLV &lt;&amp;&gt; &quot;test&quot;/MWh');
    expect(html).not.toContain('HLV <&>');
  });

  it('--report without --out is a usage error (exit 2), nothing written', async () => {
    const run = await runCli(['plan', ...inputs.args, '--report']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/--report: report.html needs a folder to go to; add --out DIR/);
  });

  it('an existing report.html is kept without --force (exit 2) and replaced with it', async () => {
    const before = statSync(join(out, 'report.html')).mtimeMs;
    const again = await runCli(['plan', ...inputs.args, '--report', '--out', out]);
    expect(again.code).toBe(2);
    expect(again.stderr).toMatch(/already exist.*report\.html.*add --force/);
    expect(statSync(join(out, 'report.html')).mtimeMs).toBe(before);
    expect((await runCli(['plan', ...inputs.args, '--report', '--out', out, '--force'])).code).toBe(0);
  });

  it('without --report no report.html is written', async () => {
    const plain = join(inputs.dir, 'no-report');
    expect((await runCli(['plan', ...inputs.args, '--out', plain])).code).toBe(0);
    expect(existsSync(join(plain, 'report.html'))).toBe(false);
  });
});

describe('planReport as a function', () => {
  const market: MarketSpec = { timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' };
  const periods = deliveryPeriods('2027-06-15', 'Europe/Berlin', 60);
  const forecast: QuantileDay = {
    day: '2027-06-15',
    levels: [0.1, 0.5, 0.9],
    periods,
    prices: periods.map((_, t) => [40, 60, 80].map((p) => p + (t >= 8 && t < 12 ? -40 : t >= 18 && t < 21 ? 60 : 0))),
  };
  const battery = batteryModel({ energyMwh: 4, chargeMw: 2, dischargeMw: 2, roundTripEfficiency: 0.9, socMinFraction: 0, socMaxFraction: 1, socInitialFraction: 0.5, degradationCostPerMwh: 0 });
  const result = planDay({ forecast, market, battery, policy: 'quantile', alpha: 0.1, socStartMwh: 2 });
  if (result.status !== 'optimal') throw new Error('fixture plan is not optimal');
  const plan: OptimalPlan = result;

  it('draws only intervals at levels the forecast gives: 0.1, 0.5, 0.9 give the 80 % band alone', () => {
    expect(fanBands(forecast).map((b) => [b.lowerLevel, b.upperLevel])).toEqual([[0.1, 0.9]]);
  });

  it('does not mutate its (frozen) input and is deterministic', () => {
    const input = deepFreeze({ day: '2027-06-15', policy: 'quantile' as const, alpha: 0.1, market, forecast, plan });
    const first = planReport(input);
    expect(planReport(input)).toBe(first);
    expect(first).toContain('<section id="orders">');
    expect(first).not.toContain('<section id="inputs">');
  });

  it('says so when a plan has no orders', () => {
    const flat: QuantileDay = { ...forecast, prices: periods.map(() => [50, 50, 50]) };
    const none = planDay({ forecast: flat, market, battery, policy: 'quantile', alpha: 0.1, socStartMwh: 2 });
    if (none.status !== 'optimal') throw new Error('flat plan is not optimal');
    expect(none.orders).toEqual([]);
    expect(planReport({ day: '2027-06-15', policy: 'quantile', alpha: 0.1, market, forecast: flat, plan: none })).toContain('The plan has no orders');
  });
});
