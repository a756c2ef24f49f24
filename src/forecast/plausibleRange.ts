import type { PriceHistory } from '../types.js';

/** A closed price interval [currency/MWh]. */
export interface PriceRange {
  readonly low: number;
  readonly high: number;
}

/**
 * Per history day, the range a forecast of that day may span before `auto` treats it as a runaway
 * extrapolation: the lowest and highest realised price of the days before it, widened on both sides by
 * their own span, [low - (high - low), high + (high - low)]. Only the days before each day are read. A
 * model on the asinh scale maps a forecast back by P = a + b sinh(Z), so a regressor far outside what
 * the fit saw (e.g. yesterday's spike as a lag) can send the forecast orders of magnitude beyond any
 * price of the market; a forecast that leaves this range is such a case, not a view of the market.
 * The first day has no range (null): nothing is excluded there.
 */
export function plausibleRanges(history: PriceHistory): (PriceRange | null)[] {
  const out: (PriceRange | null)[] = [];
  let low = Infinity;
  let high = -Infinity;
  for (const day of history.days) {
    const span = high - low;
    out.push(Number.isFinite(span) ? { low: low - span, high: high + span } : null);
    for (const p of day.pricePerMwh) {
      if (p < low) low = p;
      if (p > high) high = p;
    }
  }
  return out;
}

/** Whether every quantile of a day's forecast, prices[t][k], lies within `range` (always, without a range). */
export function withinRange(prices: readonly (readonly number[])[], range: PriceRange | null): boolean {
  if (range === null) return true;
  return prices.every((row) => row.every((v) => v >= range.low && v <= range.high));
}
