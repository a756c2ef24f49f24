import type { HistoryDay, MarketSpec, PriceHistory } from '../types.js';

/**
 * Where the fallback (balancing) price comes from (docs/design.md section 5):
 * - `history`: the history's `fallback_price` column, the same price for energy bought and sold;
 * - `clearing-plus-penalty`: the market spec's rule: energy bought at fallback costs clearing + penalty,
 *   energy sold at fallback earns clearing - penalty (the penalty always works against the operator).
 */
export type FallbackSource =
  | { readonly kind: 'history' }
  | { readonly kind: 'clearing-plus-penalty'; readonly penaltyPerMwh: number };

/** Fallback prices of one day, per period [currency/MWh]. */
export interface FallbackPrices {
  /** Price paid per MWh bought at fallback (an unaccepted buy, or a sell the store cannot cover). */
  readonly buyPerMwh: readonly number[];
  /** Price received per MWh sold at fallback (an unaccepted sell, or energy the store cannot take). */
  readonly sellPerMwh: readonly number[];
}

/**
 * The history's fallback prices when it has a `fallback_price` column, else the market's rule, else
 * null (the caller must ask the user to add one). The history wins because it is the observed price.
 */
export function chooseFallbackSource(history: PriceHistory, market: MarketSpec): FallbackSource | null {
  if (history.days.some((day) => day.fallbackPricePerMwh !== null)) return { kind: 'history' };
  if (market.fallback !== undefined) return { kind: 'clearing-plus-penalty', penaltyPerMwh: market.fallback.penaltyPerMwh };
  return null;
}

/** The fallback prices of one history day under a source. */
export function dayFallbackPrices(day: HistoryDay, source: FallbackSource): FallbackPrices {
  if (source.kind === 'history') {
    if (day.fallbackPricePerMwh === null) throw new RangeError(`history day ${day.day} has no fallback prices`);
    return { buyPerMwh: day.fallbackPricePerMwh, sellPerMwh: day.fallbackPricePerMwh };
  }
  const penalty = source.penaltyPerMwh;
  return { buyPerMwh: day.pricePerMwh.map((p) => p + penalty), sellPerMwh: day.pricePerMwh.map((p) => p - penalty) };
}

/** Thrown when a backtest needs fallback prices and neither the history nor the market spec gives them. */
export class NoFallbackPriceError extends Error {
  constructor() {
    super('the history has no fallback_price column and the market spec has no fallback rule');
    this.name = 'NoFallbackPriceError';
  }
}
