import type { QuantileForecastForDay } from '../../io/readQuantileForecastDay.js';
import type { BatteryModel, MarketSpec, Order, PlanPolicy, QuantileDay } from '../../types.js';
import { formatNumber } from '../../io/formatNumber.js';
import { imbalanceExpectationText } from '../../plan/imbalanceExpectation.js';
import type { PlanResult } from '../../plan/planDay.js';
import { expectedPlanValue, losingPairs, valueIfFilledAtLimits, type ExpectedPlanValue, type ImbalanceExpectation, type LosingPairs } from '../../plan/planValues.js';

type OptimalPlan = Extract<PlanResult, { status: 'optimal' }>;

/**
 * What a plan is worth, three ways (docs/design.md section 4.5): at the prices it was scheduled on,
 * if every order fills exactly at its limit, and expected under the forecast (null with the reason
 * when no imbalance price is known for its unaccepted orders).
 */
export interface PlanWorth {
  readonly atScheduledPrices: number;
  readonly atMedianForecast: number;
  readonly ifFilledAtLimits: number;
  readonly expected: (ExpectedPlanValue & { readonly imbalancePrice: string }) | null;
  readonly expectedMissing: string | null;
  readonly losingPairs: LosingPairs;
}

/** A plan's worth under the forecast and the imbalance price its unaccepted orders expect. */
export function planWorth(plan: OptimalPlan, forecast: QuantileDay, market: MarketSpec, battery: BatteryModel, imbalance: ImbalanceExpectation | null): PlanWorth {
  const expected = imbalance === null ? null : { ...expectedPlanValue(plan.orders, forecast, market, imbalance, battery), imbalancePrice: imbalanceExpectationText(imbalance, market.currency) };
  return {
    atScheduledPrices: plan.outcome.objective,
    atMedianForecast: plan.expectedValueAtMedian,
    ifFilledAtLimits: valueIfFilledAtLimits(plan.orders, plan.problem.periodHours, battery),
    expected,
    expectedMissing: imbalance === null ? 'no imbalance price for unaccepted orders: the market spec has no imbalance rule and no history with imbalance prices was given (--history)' : null,
    losingPairs: losingPairs(plan.orders, battery, market),
  };
}

/** A warning of a plan, for stderr and plan.json. */
export interface PlanWarning {
  readonly kind: 'pairs-cannot-break-even' | 'start-outside-window';
  readonly message: string;
}

/** What an operator must read before submitting: limits that cannot break even, a start outside the window. */
export function planWarnings(plan: OptimalPlan, battery: BatteryModel, currency: string, pairs: LosingPairs): PlanWarning[] {
  const warnings: PlanWarning[] = [];
  const recovery = plan.recovery;
  if (recovery !== null) {
    const side = recovery.direction === 'charge' ? 'below' : 'above';
    const edge = recovery.direction === 'charge' ? battery.socMinMwh : battery.socMaxMwh;
    const periods = recovery.periodsAtCapOrFloor;
    warnings.push({
      kind: 'start-outside-window',
      message:
        `the starting state of charge ${formatNumber(plan.problem.socStartMwh, 3)} MWh is ${side} the battery's window [${formatNumber(battery.socMinMwh, 3)}, ${formatNumber(battery.socMaxMwh, 3)}] MWh; ` +
        `the plan ${recovery.direction}s back to ${formatNumber(edge, 3)} MWh as fast as the power allows, within the first ${periods} period${periods === 1 ? '' : 's'}, ` +
        `and bids ${periods === 1 ? 'that period' : 'those periods'} at the price ${recovery.direction === 'charge' ? 'cap' : 'floor'} so that the auction accepts ${periods === 1 ? 'it' : 'them'}; check the battery with its management system first`,
    });
  }
  if (pairs.worst !== null) {
    const { buy, sell, lossPerMwhBought } = pairs.worst;
    const roundTrip = battery.chargeEfficiency * battery.dischargeEfficiency;
    warnings.push({
      kind: 'pairs-cannot-break-even',
      message:
        `${pairs.count} of the ${pairs.pairs} buy-sell pairs cannot break even if filled at their limits: a pair needs (sell limit - wear) x round-trip efficiency >= buy limit; ` +
        `worst: buy ${periodText(buy)} at ${formatNumber(buy.limitPrice, 2)}, sell ${periodText(sell)} at ${formatNumber(sell.limitPrice, 2)}: ` +
        `(${formatNumber(sell.limitPrice, 2)} - ${formatNumber(battery.degradationCostPerMwh, 2)}) x ${formatNumber(roundTrip, 4)} = ${formatNumber((sell.limitPrice - battery.degradationCostPerMwh) * roundTrip, 2)}, ` +
        `${formatNumber(lossPerMwhBought, 2)} ${currency} short per MWh bought`,
    });
  }
  return warnings;
}

/** `2027-01-01 03:15` of an order's period start. */
function periodText(order: Order): string {
  return `${order.periodStart.slice(0, 10)} ${order.periodStart.slice(11, 16)}`;
}

/** What plan.json says about the run besides the plan. */
export interface PlanSummaryContext {
  readonly day: string;
  readonly policy: PlanPolicy;
  readonly alpha: number;
  readonly paths: Record<'market' | 'battery' | 'forecast', string> & { readonly history?: string };
  readonly market: MarketSpec;
  readonly forecastFile: QuantileForecastForDay;
  readonly worth: PlanWorth;
  /** The price-taking plan of the same day, valued the same way; null for price-taking itself. */
  readonly baseline: PlanWorth | null;
  readonly warnings: readonly PlanWarning[];
}

/** The conventions behind the values of plan.json, stated in it. */
export const PLAN_VALUE_CONVENTIONS = Object.freeze({
  atScheduledPrices: "the schedule's value at the prices the policy scheduled on, wear included (the objective)",
  atMedianForecast: 'the same schedule valued at the median forecast, wear included',
  ifFilledAtLimits: 'every order accepted and settled exactly at its limit, the worst price an accepted order can get (a buy pays at most its limit, a sell gets at least its limit), wear included',
  expected:
    'expected under the forecast with the plan followed whatever the auction accepts (follow-plan): each order accepted with P(clearing <= buy limit) or P(clearing >= sell limit), settled at the clearing price when accepted and closed at the expected imbalance price when not; wear on the planned discharge',
  forecastDistribution:
    "read from the quantiles: linear between levels (uniform probability between neighbouring quantiles), flat beyond the outermost levels (the tail's probability at the outermost quantile, just outside it, or at the floor or cap when the quantile is there); an order is accepted at a clearing price equal to its limit",
  acceptance: 'buyAcceptance and sellAcceptance: expected share of the bought and of the sold energy the auction accepts',
  pairsBreakEven: 'a buy and a sell break even at their limits when (sell limit - wear) x chargeEfficiency x dischargeEfficiency >= buy limit',
});

/** The content of plan.json and of `--json`: inputs, objective, solver status, order totals, the plan's worth. */
export function planSummary(result: OptimalPlan, context: PlanSummaryContext) {
  const dt = result.problem.periodHours;
  const buys = result.orders.filter((o) => o.side === 'buy');
  const sells = result.orders.filter((o) => o.side === 'sell');
  const mwh = (orders: typeof buys) => orders.reduce((sum, o) => sum + o.quantityMw * dt, 0);
  const soc = result.outcome.schedule.socMwh;
  const { worth, baseline } = context;
  return {
    day: context.day,
    policy: context.policy,
    alpha: context.policy === 'point' || context.policy === 'price-taking' ? null : context.alpha,
    currency: context.market.currency,
    inputs: { ...context.paths },
    socStartMwh: result.problem.socStartMwh,
    socEndMwh: soc[soc.length - 1] ?? result.problem.socStartMwh,
    socEndMinMwh: result.problem.socEndMinMwh,
    objective: result.outcome.objective,
    expectedValueAtMedian: result.expectedValueAtMedian,
    value: worthJson(worth),
    baseline: baseline === null ? null : { policy: 'price-taking', description: 'the point schedule bid at the price cap (buys) and floor (sells): every order accepted', value: worthJson(baseline) },
    warnings: context.warnings.map((w) => ({ ...w })),
    recovery:
      result.recovery === null
        ? null
        : { direction: result.recovery.direction, forcedPeriods: result.recovery.forcedPeriods, forcedMwh: result.recovery.forcedMwh, periodsAtCapOrFloor: result.recovery.periodsAtCapOrFloor },
    solver: { status: result.outcome.status, method: result.outcome.solver, nodes: result.outcome.nodes },
    orders: { buys: buys.length, sells: sells.length, boughtMwh: mwh(buys), soldMwh: mwh(sells) },
    ...roundingPart(result),
    forecast: {
      levels: context.forecastFile.levels,
      rowsChecked: context.forecastFile.rowsChecked,
      checks: forecastChecks(context.forecastFile.rowsChecked, context.day),
      repairedPeriodsInDay: context.forecastFile.repairedByDay.get(context.day)?.periods ?? 0,
      // The day's first repaired periods (up to five); the rows of other days are not read.
      repairedExamples: context.forecastFile.repairedExamples.filter((start) => start.startsWith(context.day)),
    },
    valueConventions: { ...PLAN_VALUE_CONVENTIONS },
  };
}

/** What plan.json's `forecast.checks` says was checked of the forecast file, by `rowsChecked`. */
function forecastChecks(rowsChecked: QuantileForecastForDay['rowsChecked'], day: string): string {
  const file = 'the file as a file (size, compression, UTF-8 text) and its header';
  const row = "every price a number inside the market's [priceFloor, priceCap], every period_start a period start with the zone's offset, each period once";
  return rowsChecked === 'day'
    ? `${file}; the rows of ${day} (the lines that hold its date): ${row}; the rows of other days are not parsed`
    : `${file}; every row: ${row}`;
}

/** plan.json's `rounding` when the market has order steps (no key without them, so plan.json is as before). */
function roundingPart(result: Extract<PlanResult, { status: 'optimal' }>) {
  return result.rounding === null ? {} : { rounding: result.rounding };
}

/** The console line on rounding to the market's order steps; none without them. */
function roundingLines(result: Extract<PlanResult, { status: 'optimal' }>, currency: string): string[] {
  const r = result.rounding;
  if (r === null) return [];
  const steps = [
    ...(r.quantityStepMw === null ? [] : [`quantity step ${formatNumber(r.quantityStepMw)} MW`]),
    ...(r.minimumQuantityMw === null ? [] : [`minimum ${formatNumber(r.minimumQuantityMw)} MW`]),
    ...(r.priceTickPerMwh === null ? [] : [`price tick ${formatNumber(r.priceTickPerMwh)}`]),
  ].join(', ');
  const short = r.socEndShortMwh > 0 ? `; the day ends ${formatNumber(r.socEndShortMwh, 3)} MWh below its end-of-day floor` : '';
  return [
    `  rounded to the exchange (${steps}): loss from rounding ${formatNumber(r.lossFromRounding, 2)} ${currency} (value ${formatNumber(r.valueBeforeRounding, 2)} before, ${formatNumber(r.valueAfterRounding, 2)} after); ${r.ordersDropped} orders dropped, ${r.limitsMoved} limits moved onto the tick${short}`,
  ];
}

function worthJson(worth: PlanWorth) {
  const e = worth.expected;
  return {
    atScheduledPrices: worth.atScheduledPrices,
    atMedianForecast: worth.atMedianForecast,
    ifFilledAtLimits: worth.ifFilledAtLimits,
    expected:
      e === null
        ? null
        : {
            value: e.value,
            auctionCash: e.auctionCash,
            imbalanceCash: e.imbalanceCash,
            imbalanceCostAgainstClearing: e.imbalanceCostAgainstClearing,
            wearCost: e.wearCost,
            buyAcceptance: e.buyAcceptance,
            sellAcceptance: e.sellAcceptance,
            imbalanceMwh: e.imbalanceMwh,
            imbalancePrice: e.imbalancePrice,
          },
    ...(worth.expectedMissing === null ? {} : { expectedMissing: worth.expectedMissing }),
    pairsThatCannotBreakEven: worth.losingPairs.count,
  };
}

/** The parts of the console summary besides the plan itself. */
export interface PlanTextExtras {
  readonly worth: PlanWorth;
  readonly baseline: PlanWorth | null;
  readonly warnings: readonly PlanWarning[];
  /** List every order with its acceptance probability under the forecast. */
  readonly listOrders?: boolean;
}

/**
 * The short human summary of a plan: orders, what the plan is worth three ways, the price-taking
 * baseline, and the state of charge hour by hour.
 */
export function planSummaryText(
  result: OptimalPlan,
  forecast: QuantileDay,
  market: MarketSpec,
  day: string,
  options: { readonly policy: string; readonly alpha: number },
  outDir: string | undefined,
  written: readonly string[] = ['orders.csv', 'schedule.csv', 'plan.json'],
  extras?: PlanTextExtras,
): string {
  const dt = result.problem.periodHours;
  const money = (x: number) => `${formatNumber(x, 2)} ${market.currency}`;
  const buys = result.orders.filter((o) => o.side === 'buy');
  const sells = result.orders.filter((o) => o.side === 'sell');
  const boughtMwh = buys.reduce((s, o) => s + o.quantityMw * dt, 0);
  const soldMwh = sells.reduce((s, o) => s + o.quantityMw * dt, 0);
  const policy = options.policy === 'point' ? 'point (median)' : options.policy === 'price-taking' ? 'price-taking (median schedule, limits at cap and floor)' : `${options.policy}, alpha ${options.alpha}`;
  const lines = [
    `plan for ${day} (${forecast.periods.length} periods of ${market.periodMinutes} min), policy ${policy}`,
    `  orders: ${buys.length} buys, ${formatNumber(boughtMwh, 3)} MWh; ${sells.length} sells, ${formatNumber(soldMwh, 3)} MWh`,
    `  value at the policy's prices: ${money(result.outcome.objective)}; at the median forecast: ${money(result.expectedValueAtMedian)}`,
    ...roundingLines(result, market.currency),
  ];
  if (extras?.listOrders === true) lines.push(...orderLines(result.orders, extras.worth.expected?.orderAcceptance, market));
  if (extras !== undefined) lines.push(...worthLines(extras, money));
  lines.push(`  state of charge [MWh] from ${formatNumber(result.problem.socStartMwh, 2)}, at the end of each hour:`, `    ${hourlySoc(forecast, result.outcome.schedule.socMwh).join(' ')}`);
  if (outDir !== undefined) lines.push(`  wrote ${written.map((name, i) => (i === 0 ? `${outDir}/${name}` : name)).join(', ')}`);
  return `${lines.join('\n')}\n`;
}

function worthLines(extras: PlanTextExtras, money: (x: number) => string): string[] {
  const { worth, baseline } = extras;
  const share = (x: number | null) => (x === null ? '-' : `${formatNumber(100 * x, 1)}%`);
  const lines = [`  if every order fills at its limit: ${money(worth.ifFilledAtLimits)}`];
  const e = worth.expected;
  if (e === null) {
    lines.push(`  expected under the forecast: not valued (${worth.expectedMissing ?? ''})`);
  } else {
    lines.push(
      `  expected under the forecast: ${money(e.value)} (auction ${money(e.auctionCash)}, imbalance ${money(e.imbalanceCash)}, wear ${money(-e.wearCost)}); ` +
        `energy accepted: buys ${share(e.buyAcceptance)}, sells ${share(e.sellAcceptance)}`,
      `    unaccepted orders closed at ${e.imbalancePrice}`,
    );
  }
  if (baseline?.expected != null && e !== null) {
    const gap = e.value - baseline.expected.value;
    const verdict = gap < 0 ? `this plan expects ${money(-gap)} LESS` : `this plan expects ${money(gap)} more`;
    lines.push(`  price-taking (same forecast, median schedule, always accepted) expects ${money(baseline.expected.value)}: ${verdict}`);
  }
  return lines;
}

/**
 * Every order: delivery period (local time), side, quantity, limit and the level it was read at (the
 * cap or floor, or a curve's step), and P(accepted) under the forecast when it is known.
 */
export function orderLines(orders: readonly Order[], acceptance: readonly number[] | undefined, market: MarketSpec): string[] {
  if (orders.length === 0) return ['  no orders: at the policy\'s prices no charge and later discharge pays for itself'];
  // Fixed decimals, so that the column lines up; never "-0.00".
  const fixed = (x: number, d: number) => (Number(x.toFixed(d)) === 0 ? (0).toFixed(d) : x.toFixed(d));
  const rows = orders.map((o, i) => {
    const level = o.quantileLevel !== null ? `q${o.quantileLevel}` : o.limitPrice === market.priceCap ? 'cap' : o.limitPrice === market.priceFloor ? 'floor' : 'step';
    const p = acceptance?.[i];
    return [
      `${o.periodStart.slice(11, 16)}-${o.periodEnd.slice(11, 16)}`,
      o.side,
      `${fixed(o.quantityMw, 3)} MW`,
      `at ${fixed(o.limitPrice, 2)} (${level})`,
      p === undefined ? '' : `P(accepted) ${fixed(p, 2)}`,
    ];
  });
  const widths = rows[0]!.map((_, k) => Math.max(...rows.map((r) => r[k]!.length)));
  const line = (r: readonly string[]) => `    ${r.map((c, k) => (k === 2 || k === 3 ? c.padStart(widths[k]!) : c.padEnd(widths[k]!))).join('  ').trimEnd()}`;
  const said = acceptance === undefined ? 'the level it was read at, or a curve\'s step' : 'the level it was read at; P(accepted) under the forecast';
  return [`  orders (local time; limit in ${market.currency}/MWh, ${said}):`, ...rows.map(line)];
}

function hourlySoc(forecast: QuantileDay, soc: readonly number[]): string[] {
  const out: string[] = [];
  forecast.periods.forEach((p, t) => {
    // Period ends are ISO 8601 local times: minutes sit at characters 14-15 of YYYY-MM-DDTHH:MM.
    if (p.end.slice(14, 16) === '00' || t === forecast.periods.length - 1) {
      out.push(formatNumber(soc[t] as number, 2));
    }
  });
  return out;
}
