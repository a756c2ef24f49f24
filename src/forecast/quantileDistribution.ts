/**
 * A period's price distribution read from its quantiles, to ask what an order with a limit price can
 * expect: the probability that the auction accepts it, and the price it settles at.
 *
 * Convention (the quantiles say nothing more, so nothing more is assumed):
 * - between two given levels tau_k < tau_(k+1) the quantile function is linear, i.e. the probability
 *   tau_(k+1) - tau_k is spread uniformly over [q_k, q_(k+1)] (the same linear interpolation as
 *   priceAtLevel); where two quantiles are equal that probability sits at that one price;
 * - beyond the outermost levels the quantile function is flat: the lower tail's probability tau_1
 *   sits at q_1 and the upper tail's 1 - tau_K at q_K, taken as lying just outside them (below q_1,
 *   above q_K). A limit at an outermost quantile therefore gets exactly the level's share: a buy
 *   limited at q_K is accepted with probability tau_K, a sell limited at q_1 with 1 - tau_1. Where an
 *   outermost quantile is the price floor or cap, its tail sits at the floor or cap itself (no price
 *   lies beyond them).
 * - Ties: an order is accepted at a clearing price equal to its limit (docs/design.md section 2), so a
 *   limit equal to a price that carries probability (equal quantiles) takes that probability in.
 * The tails' prices are their outermost quantiles: the forecast does not say how far a tail reaches,
 * so a price beyond them is read as the quantile itself.
 */

/** What one order can expect under the distribution. */
export interface OrderExpectation {
  /** P(accepted): P(price <= limit) for a buy, P(price >= limit) for a sell. */
  readonly acceptance: number;
  /** E[price x 1{accepted}] [currency/MWh]: divided by `acceptance`, the expected clearing price when accepted. */
  readonly acceptedPrice: number;
  /** E[price x 1{not accepted}] [currency/MWh]. */
  readonly unacceptedPrice: number;
}

/** Price limits of the market, which no tail crosses [currency/MWh]. */
export interface PriceBounds {
  readonly priceFloor: number;
  readonly priceCap: number;
}

/**
 * The mean price under the convention above:
 *   E[price] = tau_1 q_1 + sum_k (tau_(k+1) - tau_k) (q_k + q_(k+1)) / 2 + (1 - tau_K) q_K.
 *
 * @param levels strictly increasing levels in (0, 1)
 * @param prices non-decreasing prices at those levels [currency/MWh]
 */
export function meanPrice(levels: readonly number[], prices: readonly number[]): number {
  const last = levels.length - 1;
  let sum = (levels[0] as number) * (prices[0] as number) + (1 - (levels[last] as number)) * (prices[last] as number);
  for (let k = 0; k < last; k++) sum += ((levels[k + 1] as number) - (levels[k] as number)) * (((prices[k] as number) + (prices[k + 1] as number)) / 2);
  return sum;
}

/**
 * Acceptance probability and partial expectations of the clearing price for one order, by the
 * convention above. The pieces: the lower tail (probability tau_1 at q_1, just below it), each
 * interval between levels (uniform), the upper tail (probability 1 - tau_K at q_K, just above it).
 *
 * Example (worked by hand): levels [0.1, 0.5, 0.9] at prices [10, 20, 40], a buy limited at 30:
 * lower tail 0.1 accepted; [10, 20] with 0.4 wholly accepted; [20, 40] with 0.4 half accepted (0.2,
 * mean 25); upper tail not: acceptance 0.7, acceptedPrice 0.1 x 10 + 0.4 x 15 + 0.2 x 25 = 12,
 * unacceptedPrice 0.2 x 35 + 0.1 x 40 = 11 (their sum, 23, is meanPrice).
 */
export function orderExpectation(levels: readonly number[], prices: readonly number[], side: 'buy' | 'sell', limitPerMwh: number, bounds: PriceBounds): OrderExpectation {
  const last = levels.length - 1;
  const low = prices[0] as number;
  const high = prices[last] as number;
  let acceptance = 0;
  let acceptedPrice = 0;
  let unacceptedPrice = 0;
  const point = (mass: number, price: number, accepted: boolean): void => {
    if (accepted) {
      acceptance += mass;
      acceptedPrice += mass * price;
    } else {
      unacceptedPrice += mass * price;
    }
  };
  // The tails lie just outside q_1 and q_K, unless those are the floor or the cap.
  const lowerTailAccepted = side === 'buy' ? limitPerMwh >= low : limitPerMwh < low || (low <= bounds.priceFloor && limitPerMwh <= bounds.priceFloor);
  const upperTailAccepted = side === 'buy' ? limitPerMwh > high || (high >= bounds.priceCap && limitPerMwh >= bounds.priceCap) : limitPerMwh <= high;
  point(levels[0] as number, low, lowerTailAccepted);
  for (let k = 0; k < last; k++) {
    const mass = (levels[k + 1] as number) - (levels[k] as number);
    const a = prices[k] as number;
    const b = prices[k + 1] as number;
    if (!(b > a)) {
      point(mass, a, side === 'buy' ? a <= limitPerMwh : a >= limitPerMwh);
      continue;
    }
    // The accepted share of [a, b]: below the limit for a buy, above it for a sell.
    const cut = Math.min(b, Math.max(a, limitPerMwh));
    const below = (cut - a) / (b - a);
    const belowPart = { mass: mass * below, price: (a + cut) / 2 };
    const abovePart = { mass: mass * (1 - below), price: (cut + b) / 2 };
    const [yes, no] = side === 'buy' ? [belowPart, abovePart] : [abovePart, belowPart];
    acceptance += yes.mass;
    acceptedPrice += yes.mass * yes.price;
    unacceptedPrice += no.mass * no.price;
  }
  point(1 - (levels[last] as number), high, upperTailAccepted);
  return { acceptance, acceptedPrice, unacceptedPrice };
}
