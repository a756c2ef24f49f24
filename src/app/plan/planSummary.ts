import type { QuantileForecastFile } from '../../io/readQuantileForecast.js';
import type { MarketSpec, PlanPolicy, QuantileDay } from '../../types.js';
import { formatNumber } from '../../io/formatNumber.js';
import type { PlanResult } from '../../plan/planDay.js';

/** What plan.json says about the run besides the plan. */
export interface PlanSummaryContext {
  readonly day: string;
  readonly policy: PlanPolicy;
  readonly alpha: number;
  readonly paths: Record<'market' | 'battery' | 'forecast', string>;
  readonly market: MarketSpec;
  readonly forecastFile: QuantileForecastFile;
}

/** The content of plan.json and of `--json`: inputs, objective, solver status, order totals. */
export function planSummary(result: Extract<PlanResult, { status: 'optimal' }>, context: PlanSummaryContext) {
  const dt = result.problem.periodHours;
  const buys = result.orders.filter((o) => o.side === 'buy');
  const sells = result.orders.filter((o) => o.side === 'sell');
  const mwh = (orders: typeof buys) => orders.reduce((sum, o) => sum + o.quantityMw * dt, 0);
  const soc = result.outcome.schedule.socMwh;
  return {
    day: context.day,
    policy: context.policy,
    alpha: context.policy === 'point' ? null : context.alpha,
    currency: context.market.currency,
    inputs: { ...context.paths },
    socStartMwh: result.problem.socStartMwh,
    socEndMwh: soc[soc.length - 1] ?? result.problem.socStartMwh,
    socEndMinMwh: result.problem.socEndMinMwh,
    objective: result.outcome.objective,
    expectedValueAtMedian: result.expectedValueAtMedian,
    solver: { status: result.outcome.status, method: result.outcome.solver, nodes: result.outcome.nodes },
    orders: { buys: buys.length, sells: sells.length, boughtMwh: mwh(buys), soldMwh: mwh(sells) },
    ...roundingPart(result),
    forecast: {
      levels: context.forecastFile.levels,
      repairedPeriodsInFile: context.forecastFile.repairedPeriods,
      repairedExamples: context.forecastFile.repairedExamples,
    },
  };
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

/**
 * The short human summary of a plan: orders, the spread the plan expects to capture, and the state
 * of charge hour by hour.
 */
export function planSummaryText(
  result: Extract<PlanResult, { status: 'optimal' }>,
  forecast: QuantileDay,
  market: MarketSpec,
  day: string,
  options: { readonly policy: string; readonly alpha: number },
  outDir: string | undefined,
  written: readonly string[] = ['orders.csv', 'schedule.csv', 'plan.json'],
): string {
  const dt = result.problem.periodHours;
  const money = (x: number) => `${formatNumber(x, 2)} ${market.currency}`;
  const buys = result.orders.filter((o) => o.side === 'buy');
  const sells = result.orders.filter((o) => o.side === 'sell');
  const boughtMwh = buys.reduce((s, o) => s + o.quantityMw * dt, 0);
  const soldMwh = sells.reduce((s, o) => s + o.quantityMw * dt, 0);
  const policy = options.policy === 'point' ? 'point (median)' : `${options.policy}, alpha ${options.alpha}`;
  const lines = [
    `plan for ${day} (${forecast.periods.length} periods of ${market.periodMinutes} min), policy ${policy}`,
    `  orders: ${buys.length} buys, ${formatNumber(boughtMwh, 3)} MWh; ${sells.length} sells, ${formatNumber(soldMwh, 3)} MWh`,
    `  value at the policy's prices: ${money(result.outcome.objective)}; at the median forecast: ${money(result.expectedValueAtMedian)}`,
    ...roundingLines(result, market.currency),
    `  state of charge [MWh] from ${formatNumber(result.problem.socStartMwh, 2)}, at the end of each hour:`,
    `    ${hourlySoc(forecast, result.outcome.schedule.socMwh).join(' ')}`,
  ];
  if (outDir !== undefined) lines.push(`  wrote ${written.map((name, i) => (i === 0 ? `${outDir}/${name}` : name)).join(', ')}`);
  return `${lines.join('\n')}\n`;
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
