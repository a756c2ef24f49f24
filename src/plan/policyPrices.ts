import type { MarketSpec, PlanPolicy, QuantileDay } from '../types.js';
import { pricesAtLevel } from '../forecast/quantileSet.js';

/** Prices one policy schedules on, and the limit prices (with the levels they came from) it bids. */
export interface PolicyPrices {
  /** Price the objective charges per MWh bought, per period [currency/MWh]. */
  readonly buyPricePerMwh: number[];
  /** Price the objective credits per MWh sold, per period [currency/MWh]. */
  readonly sellPricePerMwh: number[];
  /** Limit price of a buy order, clamped into [floor, cap] [currency/MWh]. */
  readonly buyLimitPerMwh: number[];
  /** Limit price of a sell order, clamped into [floor, cap] [currency/MWh]. */
  readonly sellLimitPerMwh: number[];
  /** Level the buy limit was read at (1 - alpha, or 0.5 for point); null for a limit at the price cap. */
  readonly buyLevel: number | null;
  /** Level the sell limit was read at (alpha, or 0.5 for point); null for a limit at the price floor. */
  readonly sellLevel: number | null;
}

/**
 * The policies of docs/design.md section 4, with alpha the tail level (the central interval
 * [q(alpha), q(1 - alpha)] covers 1 - 2 alpha):
 * - `quantile`:     schedule and limits on the pessimistic side: buy at q(1 - alpha), sell at q(alpha);
 * - `median`:       schedule on the median, limits at q(1 - alpha) for buys and q(alpha) for sells;
 * - `point`:        schedule and limits on the median;
 * - `price-taking`: schedule on the median, buy limits at the price cap and sell limits at the floor,
 *                   so that every clearing price accepts every order (the `point` schedule, always
 *                   executed). The backtest's price-taking policy is this one (planPolicyDay.ts).
 * Quantiles between given levels are interpolated linearly; limits are clamped into [floor, cap].
 */
export function policyPrices(forecast: QuantileDay, policy: PlanPolicy, alpha: number, market: MarketSpec): PolicyPrices {
  const at = (tau: number): number[] => pricesAtLevel(forecast.levels, forecast.prices, tau);
  const median = at(0.5);
  const clampAll = (prices: number[]): number[] => prices.map((p) => Math.min(market.priceCap, Math.max(market.priceFloor, p)));
  if (policy === 'point') {
    return { buyPricePerMwh: median, sellPricePerMwh: median, buyLimitPerMwh: clampAll(median), sellLimitPerMwh: clampAll(median), buyLevel: 0.5, sellLevel: 0.5 };
  }
  if (policy === 'price-taking') {
    return {
      buyPricePerMwh: median,
      sellPricePerMwh: median,
      buyLimitPerMwh: median.map(() => market.priceCap),
      sellLimitPerMwh: median.map(() => market.priceFloor),
      buyLevel: null,
      sellLevel: null,
    };
  }
  const upper = at(1 - alpha);
  const lower = at(alpha);
  const limits = { buyLimitPerMwh: clampAll(upper), sellLimitPerMwh: clampAll(lower), buyLevel: 1 - alpha, sellLevel: alpha };
  return policy === 'quantile'
    ? { buyPricePerMwh: upper, sellPricePerMwh: lower, ...limits }
    : { buyPricePerMwh: median, sellPricePerMwh: median, ...limits };
}
