import type { DeliveryPeriod, Order, Schedule } from '../types.js';
import { csvLine } from './formatNumber.js';

/** `orders.csv`: period_start,period_end,side,quantity_mw,limit_price,quantile_level (docs/design.md section 8). */
export function ordersCsv(orders: readonly Order[]): string {
  const lines = ['period_start,period_end,side,quantity_mw,limit_price,quantile_level'];
  for (const o of orders) {
    lines.push(csvLine([o.periodStart, o.periodEnd, o.side, o.quantityMw, o.limitPrice, o.quantileLevel === null ? '' : o.quantileLevel]));
  }
  return `${lines.join('\n')}\n`;
}

/** `schedule.csv`: period_start,charge_mw,discharge_mw,soc_mwh, the state of charge at the end of the period. */
export function scheduleCsv(periods: readonly DeliveryPeriod[], schedule: Schedule): string {
  const lines = ['period_start,charge_mw,discharge_mw,soc_mwh'];
  periods.forEach((p, t) => {
    lines.push(csvLine([p.start, schedule.chargeMw[t] as number, schedule.dischargeMw[t] as number, schedule.socMwh[t] as number]));
  });
  return `${lines.join('\n')}\n`;
}

/** Pretty JSON with a final newline; key order is the construction order, so output is deterministic. */
export function jsonText(value: unknown): string {
  return `${JSON.stringify(value, (key, v: unknown) => (typeof v === 'number' ? roundForJson(key, v) : v), 2)}\n`;
}

function roundForJson(key: string, v: number): number {
  // JSON.stringify would write NaN and infinities as null without a word: a non-finite result is a fault.
  if (!Number.isFinite(v)) throw new RangeError(`jsonText: ${key} is ${v}, not a finite number`);
  if (Number.isInteger(v)) return v;
  return Number(v.toPrecision(12));
}
