import { priceAtLevel } from '../forecast/quantileSet.js';
import type { PlanResult } from '../plan/planDay.js';
import type { MarketSpec, Order, PlanPolicy, QuantileDay } from '../types.js';
import { barChart } from './barChart.js';
import type { Guide } from './chartTypes.js';
import { fanChart, type FanBand } from './fanChart.js';
import { htmlPage, paragraph, type PageSection } from './htmlPage.js';
import { lineChart } from './lineChart.js';
import type { Markup } from './markup.js';
import { ROLE_COLOURS } from './palette.js';
import { localTime, periodAxis } from './periodAxis.js';
import { factList, htmlTable } from './table.js';
import { numberText } from './tickLabel.js';

/** A plan that was solved to optimality (the only kind that has orders). */
export type OptimalPlan = Extract<PlanResult, { status: 'optimal' }>;

export interface PlanReportInput {
  /** Delivery day, YYYY-MM-DD. */
  readonly day: string;
  readonly policy: PlanPolicy;
  /** Tail level: buys limited at q(1 - alpha), sells at q(alpha) (ignored by point and price-taking). */
  readonly alpha: number;
  readonly market: MarketSpec;
  /** The day's quantile forecast the plan was made from. */
  readonly forecast: QuantileDay;
  /** planDay's result: policy prices, schedule, orders, objective, value at the median. */
  readonly plan: OptimalPlan;
  /** Input files by role as the user named them (market, battery, forecast), listed in the report. */
  readonly inputs?: Readonly<Record<string, string>>;
  /** What the plan is worth if every order fills at its limit, and expected under the forecast (plan.json's `value`), with the price-taking plan's expectation beside it. */
  readonly worth?: { readonly ifFilledAtLimits: number; readonly expected: number | null; readonly baselineExpected: number | null };
}

/** Central intervals drawn in the fan, widest first, where the forecast's levels reach them. */
export const FAN_LEVEL_PAIRS: readonly (readonly [number, number])[] = Object.freeze([
  [0.05, 0.95],
  [0.1, 0.9],
  [0.25, 0.75],
]);

/**
 * The plan report, `report.html`: a summary, the price forecast as a fan of central intervals with
 * the orders' limit prices on it, the planned charge and discharge, the state of charge, and the
 * table of orders. Same input, same bytes.
 */
export function planReport(input: PlanReportInput): string {
  const { day, market, forecast, plan } = input;
  const unit = `${market.currency}/MWh`;
  const axis = periodAxis(forecast.periods, market.timeZone);
  const sections: PageSection[] = [
    { id: 'summary', heading: 'Summary', blocks: [factList(summaryFacts(input))] },
    { id: 'prices', heading: 'Price forecast and limit prices', blocks: [pricesChart(input, axis, unit)] },
    { id: 'schedule', heading: 'Schedule', blocks: [powerChart(input, axis), stateOfChargeChart(input, axis)] },
    { id: 'orders', heading: 'Orders', blocks: ordersBlocks(plan.orders, plan.problem.periodHours, unit) },
  ];
  if (input.inputs !== undefined) {
    sections.push({ id: 'inputs', heading: 'Inputs', blocks: [htmlTable({ columns: [{ header: 'input' }, { header: 'file' }], rows: Object.entries(input.inputs).map(([k, v]) => [k, v]) })] });
  }
  return htmlPage({
    title: `Plan for delivery day ${day}`,
    subtitle: `${forecast.periods.length} delivery periods of ${market.periodMinutes} min, ${market.timeZone}; ${policyText(input)}; prices in ${unit}.`,
    sections,
    footer:
      'Written by quantbid. The orders are a market position, not a control signal: the battery\'s own management system, its limits and the market rules always take precedence (see SAFETY.md). This page is self-contained: it runs no scripts and loads nothing from the network.',
  });
}

function policyText(input: PlanReportInput): string {
  const { policy, plan } = input;
  if (policy === 'point') return 'policy point: schedule and limits at the median forecast';
  if (policy === 'price-taking') return 'policy price-taking: scheduled on the median, buys limited at the price cap and sells at the floor (always accepted)';
  const levels = `buys limited at q${numberText(plan.prices.buyLevel ?? Number.NaN, 4)}, sells at q${numberText(plan.prices.sellLevel ?? Number.NaN, 4)}`;
  return policy === 'quantile' ? `policy quantile, alpha ${numberText(input.alpha, 4)}: scheduled and ${levels}` : `policy median, alpha ${numberText(input.alpha, 4)}: scheduled on the median, ${levels}`;
}

function summaryFacts(input: PlanReportInput): [string, string][] {
  const { plan, market, forecast } = input;
  const dt = plan.problem.periodHours;
  const money = (x: number) => `${numberText(x, 2)} ${market.currency}`;
  const mwh = (x: number) => `${numberText(x, 3)} MWh`;
  const buys = plan.orders.filter((o) => o.side === 'buy');
  const sells = plan.orders.filter((o) => o.side === 'sell');
  const energy = (orders: readonly Order[]) => orders.reduce((sum, o) => sum + o.quantityMw * dt, 0);
  const soc = plan.outcome.schedule.socMwh;
  return [
    ['policy', policyText(input)],
    ['orders', `${buys.length} buys, ${mwh(energy(buys))}; ${sells.length} sells, ${mwh(energy(sells))}`],
    ["value at the policy's prices", money(plan.outcome.objective)],
    ['value at the median forecast', money(plan.expectedValueAtMedian)],
    ...worthFacts(input, money),
    ['state of charge', `${mwh(plan.problem.socStartMwh)} at the start, ${mwh(soc[soc.length - 1] ?? plan.problem.socStartMwh)} at the end (floor ${mwh(plan.problem.socEndMinMwh)})`],
    ['solver', `${plan.outcome.solver}, ${plan.outcome.nodes} branch-and-bound nodes`],
    ['forecast levels', `${forecast.levels.map((l) => numberText(l, 4)).join(', ')} (${forecast.levels.length} levels)`],
  ];
}

function worthFacts(input: PlanReportInput, money: (x: number) => string): [string, string][] {
  const w = input.worth;
  if (w === undefined) return [];
  const facts: [string, string][] = [['value if every order fills at its limit', money(w.ifFilledAtLimits)]];
  if (w.expected !== null) facts.push(['expected value under the forecast', `${money(w.expected)} (acceptance read from the quantiles; unaccepted orders at the expected imbalance price)`]);
  if (w.expected !== null && w.baselineExpected !== null) {
    const gap = w.expected - w.baselineExpected;
    facts.push(['price-taking plan of the day, expected', `${money(w.baselineExpected)}: this plan expects ${money(Math.abs(gap))} ${gap < 0 ? 'LESS' : 'more'}`]);
  }
  return facts;
}

/**
 * The central intervals of FAN_LEVEL_PAIRS whose two levels the forecast gives (no band is drawn
 * from interpolated levels); when it gives none of them, its outermost pair of levels.
 */
export function fanBands(forecast: QuantileDay): FanBand[] {
  const has = (tau: number) => forecast.levels.some((l) => Math.abs(l - tau) < 1e-9);
  const lowest = forecast.levels[0];
  const highest = forecast.levels[forecast.levels.length - 1];
  const pairs = FAN_LEVEL_PAIRS.filter(([lo, hi]) => has(lo) && has(hi));
  if (pairs.length === 0 && lowest !== undefined && highest !== undefined && lowest < 0.5 && highest > 0.5) pairs.push([lowest, highest]);
  return pairs.map(([lo, hi]) => ({
    lowerLevel: lo,
    upperLevel: hi,
    lower: forecast.prices.map((row) => priceAtLevel(forecast.levels, row, lo)),
    upper: forecast.prices.map((row) => priceAtLevel(forecast.levels, row, hi)),
  }));
}

function pricesChart(input: PlanReportInput, axis: ReturnType<typeof periodAxis>, unit: string): Markup {
  const { forecast, plan } = input;
  const index = new Map(forecast.periods.map((p, t) => [p.start, t]));
  const limits = (side: Order['side']) => {
    const values: (number | null)[] = forecast.periods.map(() => null);
    for (const o of plan.orders) {
      const t = index.get(o.periodStart);
      if (o.side === side && t !== undefined) values[t] = o.limitPrice;
    }
    return values;
  };
  const level = (tau: number | null) => (input.policy === 'point' ? 'median' : `q${numberText(tau ?? Number.NaN, 4)}`);
  // Price-taking limits sit at the cap and floor, far off the forecast's scale: they are said, not drawn.
  const drawLimits = input.policy !== 'price-taking';
  return fanChart({
    id: 'plan-prices',
    title: `Price forecast with the limit prices of the orders, ${input.day}`,
    caption: drawLimits
      ? 'Bands: forecast intervals, darker is narrower; line: median. \u25bc a buy is accepted at or below its limit, \u25b2 a sell at or above.'
      : 'Bands: forecast intervals, darker is narrower; line: median. The price-taking orders are limited at the price cap (buys) and floor (sells), off this scale: every clearing price accepts them.',
    x: axis,
    y: { label: 'price', unit },
    bands: fanBands(forecast),
    median: { name: 'median (q0.5)', values: forecast.prices.map((row) => priceAtLevel(forecast.levels, row, 0.5)) },
    markers: drawLimits
      ? [
          { name: `buy limit (${level(plan.prices.buyLevel)})`, values: limits('buy'), shape: 'triangle-down', colour: ROLE_COLOURS.buy },
          { name: `sell limit (${level(plan.prices.sellLevel)})`, values: limits('sell'), shape: 'triangle-up', colour: ROLE_COLOURS.sell },
        ]
      : [],
  });
}

function powerChart(input: PlanReportInput, axis: ReturnType<typeof periodAxis>): Markup {
  const { schedule } = input.plan.outcome;
  const { battery } = input.plan.problem;
  return barChart({
    id: 'plan-power',
    title: 'Planned charge and discharge',
    caption: 'Below zero: charging with energy bought; above zero: discharging with energy sold; held over each delivery period.',
    x: axis,
    y: { label: 'power, charge negative', unit: 'MW', min: -battery.chargeMw, max: battery.dischargeMw },
    layout: 'overlaid',
    plotHeight: 160,
    series: [
      { name: 'charge (buy)', values: schedule.chargeMw.map((v) => -v), colour: ROLE_COLOURS.buy },
      { name: 'discharge (sell)', values: schedule.dischargeMw, colour: ROLE_COLOURS.sell },
    ],
  });
}

function stateOfChargeChart(input: PlanReportInput, axis: ReturnType<typeof periodAxis>): Markup {
  const { problem, outcome } = input.plan;
  const { battery } = problem;
  return lineChart({
    id: 'plan-soc',
    title: 'Planned state of charge',
    caption: 'Stored energy at the start of the day and after each period if every order is accepted; dashed: allowed window, end-of-day floor.',
    x: axis,
    y: { label: 'state of charge', unit: 'MWh', min: 0, max: battery.energyMwh },
    plotHeight: 160,
    series: [{ name: 'state of charge', values: [problem.socStartMwh, ...outcome.schedule.socMwh], colour: ROLE_COLOURS.stateOfCharge, position: 'boundary' }],
    guides: mergeGuides([
      { value: battery.socMaxMwh, label: 'highest allowed' },
      { value: battery.socMinMwh, label: 'lowest allowed' },
      { value: problem.socEndMinMwh, label: 'end-of-day floor' },
    ]),
  });
}

/** Guides at the same value become one, their labels joined. */
function mergeGuides(guides: readonly Guide[]): Guide[] {
  const merged: Guide[] = [];
  for (const g of guides) {
    const k = merged.findIndex((m) => Math.abs(m.value - g.value) < 1e-9);
    if (k < 0) merged.push(g);
    else merged[k] = { ...(merged[k] as Guide), label: `${(merged[k] as Guide).label}, ${g.label}` };
  }
  return merged;
}

/** The orders table of a plan report (as orders.csv), or `empty` when there are none. */
export function ordersBlocks(orders: readonly Order[], periodHours: number, unit: string, empty = 'The plan has no orders: at the policy\'s prices no charge and later discharge pays for itself.'): Markup[] {
  if (orders.length === 0) return [paragraph(empty)];
  const rows = orders.map((o) => {
    const start = localTime(o.periodStart);
    return [`${start.text}\u2013${localTime(o.periodEnd).text}`, start.offset, o.side, o.quantityMw, o.quantityMw * periodHours, o.limitPrice, o.quantileLevel];
  });
  return [
    htmlTable({
      caption: `${orders.length} orders, in period order (as in orders.csv)`,
      columns: [
        { header: 'delivery period', unit: 'local time' },
        { header: 'UTC offset' },
        { header: 'side' },
        { header: 'quantity', unit: 'MW', decimals: 3 },
        { header: 'energy', unit: 'MWh', decimals: 3 },
        { header: 'limit price', unit, decimals: 2 },
        { header: 'quantile level', unit: '-' },
      ],
      rows,
    }),
  ];
}
