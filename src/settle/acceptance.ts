import type { Side } from '../types.js';

/**
 * Whether the auction accepts an order (docs/design.md section 2, uniform marginal pricing): a buy when the
 * clearing price is at or below its limit, a sell when the clearing price is at or above its limit.
 * A tie (clearing = limit) is accepted. An accepted order settles at the clearing price, never at its
 * limit.
 *
 * @param side `buy` or `sell`
 * @param limitPrice the order's limit [currency/MWh]
 * @param clearingPricePerMwh the auction's clearing price in the order's period [currency/MWh]
 * @example
 * isAccepted('buy', 30, 30);  // true: a tie is accepted
 * isAccepted('sell', 55, 45); // false: cleared below the sell limit
 */
export function isAccepted(side: Side, limitPrice: number, clearingPricePerMwh: number): boolean {
  return side === 'buy' ? clearingPricePerMwh <= limitPrice : clearingPricePerMwh >= limitPrice;
}
