import type { HistoryDay, MarketSpec, PriceHistory } from '../types.js';

/**
 * Where the imbalance (balancing) price comes from (docs/design.md section 5):
 * - `history`: the history's `imbalance_price` column, the same price for energy bought and sold;
 * - `clearing-plus-penalty`: the market spec's rule: energy bought at the imbalance price costs
 *   clearing + penalty, energy sold at it earns clearing - penalty (the penalty always works against
 *   the operator).
 */
export type ImbalanceSource =
  | { readonly kind: 'history' }
  | { readonly kind: 'clearing-plus-penalty'; readonly penaltyPerMwh: number };

/** Imbalance prices of one day, per period [currency/MWh]. */
export interface ImbalancePrices {
  /** Price paid per MWh bought at the imbalance price (an unaccepted buy, or a sell the store cannot cover). */
  readonly buyPerMwh: readonly number[];
  /** Price received per MWh sold at the imbalance price (an unaccepted sell, or energy the store cannot take). */
  readonly sellPerMwh: readonly number[];
}

/**
 * The history's imbalance prices when it has an `imbalance_price` column, else the market's rule, else
 * null (the caller must ask the user to add one). The history wins because it is the observed price.
 */
export function chooseImbalanceSource(history: PriceHistory, market: MarketSpec): ImbalanceSource | null {
  if (history.days.some((day) => day.imbalancePricePerMwh !== null)) return { kind: 'history' };
  if (market.imbalance !== undefined) return { kind: 'clearing-plus-penalty', penaltyPerMwh: market.imbalance.penaltyPerMwh };
  return null;
}

/** The imbalance prices of one history day under a source. */
export function dayImbalancePrices(day: HistoryDay, source: ImbalanceSource): ImbalancePrices {
  if (source.kind === 'history') {
    if (day.imbalancePricePerMwh === null) throw new RangeError(`history day ${day.day} has no imbalance prices`);
    return { buyPerMwh: day.imbalancePricePerMwh, sellPerMwh: day.imbalancePricePerMwh };
  }
  const penalty = source.penaltyPerMwh;
  return { buyPerMwh: day.pricePerMwh.map((p) => p + penalty), sellPerMwh: day.pricePerMwh.map((p) => p - penalty) };
}

/** Thrown when a backtest needs imbalance prices and neither the history nor the market spec gives them. */
export class NoImbalancePriceError extends Error {
  constructor() {
    super('the history has no imbalance_price column and the market spec has no imbalance rule');
    this.name = 'NoImbalancePriceError';
  }
}
