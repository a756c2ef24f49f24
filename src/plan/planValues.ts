import type { BatteryModel, MarketSpec, Order, QuantileDay } from '../types.js';
import { orderExpectation } from '../forecast/quantileDistribution.js';

/**
 * The price at which an unaccepted order is expected to be closed, for a day not yet settled
 * (docs/design.md section 4.5):
 * - `clearing-plus-penalty`: the market's rule: energy bought at the imbalance price costs clearing +
 *   penalty, energy sold at it earns clearing - penalty;
 * - `history-spread`: the history's mean of imbalance price minus clearing price over its periods
 *   (days complete before gate closure), added to the clearing price in both directions.
 */
export type ImbalanceExpectation =
  | { readonly kind: 'clearing-plus-penalty'; readonly penaltyPerMwh: number }
  | { readonly kind: 'history-spread'; readonly meanSpreadPerMwh: number; readonly from: string; readonly to: string; readonly periods: number };

/** The value of a plan under the forecast, its parts and what it expects of the auction. */
export interface ExpectedPlanValue {
  /** auctionCash + imbalanceCash - wearCost [currency]. */
  readonly value: number;
  /** Expected cash of accepted orders at the clearing price, + received, - paid [currency]. */
  readonly auctionCash: number;
  /** Expected cash of unaccepted orders closed at the imbalance price [currency]. */
  readonly imbalanceCash: number;
  /** Of imbalanceCash, the part beyond what the same energy would have cost or earned at the clearing price [currency]. */
  readonly imbalanceCostAgainstClearing: number;
  /** Wear cost of the planned discharge [currency]: the plan is followed whatever the auction accepts. */
  readonly wearCost: number;
  /** Expected share of the bought and of the sold energy the auction accepts [-]; null without such orders. */
  readonly buyAcceptance: number | null;
  readonly sellAcceptance: number | null;
  /** Expected energy closed at the imbalance price [MWh]. */
  readonly imbalanceMwh: number;
  /** Per order, in the orders' order: P(accepted) [-]. */
  readonly orderAcceptance: readonly number[];
}

/**
 * The value of the orders if every one is accepted and settles exactly at its limit, the worst price
 * an accepted order can get (a buy pays at most its limit, a sell receives at least its limit):
 *   sum_sells E_j L_j - sum_buys E_i L_i - deg sum_sells E_j,  E = quantity x dt [MWh].
 */
export function valueIfFilledAtLimits(orders: readonly Order[], periodHours: number, battery: BatteryModel): number {
  let value = 0;
  for (const o of orders) {
    const energy = o.quantityMw * periodHours;
    value += o.side === 'sell' ? energy * (o.limitPrice - battery.degradationCostPerMwh) : -energy * o.limitPrice;
  }
  return value;
}

/**
 * The expected value of the orders under the day's forecast, the plan followed whatever the auction
 * accepts (the `follow-plan` rule): per order of energy E, with the acceptance probability P and the
 * partial expectations of the clearing price from orderExpectation (forecast/quantileDistribution.ts),
 *   accepted:    +/- E x E[price 1{accepted}]                    (sells +, buys -)
 *   unaccepted:  +/- E x (E[price 1{not accepted}] + s (1 - P))   closed at the imbalance price,
 * where s is what the imbalance price adds to the clearing price: + penalty for a buy and - penalty
 * for a sell under the market's rule, the history's mean spread in both directions otherwise. Wear is
 * charged on the planned discharge. Expectation is linear, so the sum over orders is exact under the
 * convention without any assumption on how periods depend on each other.
 */
export function expectedPlanValue(orders: readonly Order[], forecast: QuantileDay, market: MarketSpec, imbalance: ImbalanceExpectation, battery: BatteryModel): ExpectedPlanValue {
  const dt = market.periodMinutes / 60;
  const index = new Map(forecast.periods.map((p, t) => [p.start, t]));
  let auctionCash = 0;
  let imbalanceCash = 0;
  let againstClearing = 0;
  let wearCost = 0;
  let imbalanceMwh = 0;
  const energy = { buy: 0, sell: 0 };
  const accepted = { buy: 0, sell: 0 };
  const orderAcceptance: number[] = [];
  for (const o of orders) {
    const t = index.get(o.periodStart);
    if (t === undefined) throw new RangeError(`expectedPlanValue: the order at ${o.periodStart} lies outside the forecast's day ${forecast.day}`);
    const e = o.quantityMw * dt;
    const x = orderExpectation(forecast.levels, forecast.prices[t] as number[], o.side, o.limitPrice, market);
    const sign = o.side === 'sell' ? 1 : -1;
    const spread = imbalance.kind === 'history-spread' ? imbalance.meanSpreadPerMwh : o.side === 'buy' ? imbalance.penaltyPerMwh : -imbalance.penaltyPerMwh;
    auctionCash += sign * e * x.acceptedPrice;
    imbalanceCash += sign * e * (x.unacceptedPrice + spread * (1 - x.acceptance));
    againstClearing += sign * e * spread * (1 - x.acceptance);
    if (o.side === 'sell') wearCost += battery.degradationCostPerMwh * e;
    imbalanceMwh += e * (1 - x.acceptance);
    energy[o.side] += e;
    accepted[o.side] += e * x.acceptance;
    orderAcceptance.push(x.acceptance);
  }
  return {
    value: auctionCash + imbalanceCash - wearCost,
    auctionCash,
    imbalanceCash,
    imbalanceCostAgainstClearing: againstClearing,
    wearCost,
    buyAcceptance: energy.buy > 0 ? accepted.buy / energy.buy : null,
    sellAcceptance: energy.sell > 0 ? accepted.sell / energy.sell : null,
    imbalanceMwh,
    orderAcceptance,
  };
}

/** A buy and a sell whose limits cannot break even, and by how much. */
export interface LosingPair {
  readonly buy: Order;
  readonly sell: Order;
  /** B - (S - deg) eta_c eta_d > 0: what one MWh bought at the grid loses at the limits [currency/MWh]. */
  readonly lossPerMwhBought: number;
}

/** Buy-sell pairs of a plan whose limits cannot break even: how many, and the worst. */
export interface LosingPairs {
  readonly count: number;
  /** Of all buy-sell pairs of the day whose orders set a limit (not at the cap or floor). */
  readonly pairs: number;
  readonly worst: LosingPair | null;
}

/**
 * Buy and sell orders of one day whose limit prices cannot break even after the round trip's losses
 * and wear, filled at their limits (the worst price each accepted order can get).
 *
 * Derivation: one MWh bought at the grid at price B stores eta_c MWh, which give eta_c eta_d MWh back
 * at the grid, sold at S with the wear cost deg per MWh discharged at the grid:
 *   net = eta_c eta_d (S - deg) - B,
 * so the pair breaks even exactly when (S - deg) eta_c eta_d >= B. Selling stored energy first and
 * buying it back later gives, per MWh stored, eta_d (S - deg) - B / eta_c: the same condition times
 * 1 / eta_c, so the order in time does not matter and every buy is paired with every sell of the day.
 * A pair that fails it loses money if both orders are accepted at their limits; the clearing prices
 * may still be better, but the limits do not protect the spread. A buy limited at the price cap or a
 * sell at the floor accepts any price: it sets no limit to check (price-taking orders, and the
 * periods that bring a start outside the window back into it), so it is left out.
 */
export function losingPairs(orders: readonly Order[], battery: BatteryModel, market: MarketSpec): LosingPairs {
  const roundTrip = battery.chargeEfficiency * battery.dischargeEfficiency;
  const buys = orders.filter((o) => o.side === 'buy' && o.limitPrice < market.priceCap);
  const sells = orders.filter((o) => o.side === 'sell' && o.limitPrice > market.priceFloor);
  let count = 0;
  let worst: LosingPair | null = null;
  for (const buy of buys) {
    for (const sell of sells) {
      const loss = buy.limitPrice - (sell.limitPrice - battery.degradationCostPerMwh) * roundTrip;
      if (loss > 1e-9 * Math.max(1, Math.abs(buy.limitPrice))) {
        count++;
        if (worst === null || loss > worst.lossPerMwhBought) worst = { buy, sell, lossPerMwhBought: loss };
      }
    }
  }
  return { count, pairs: buys.length * sells.length, worst };
}
