/**
 * Sums of a settlement over periods, days or a whole backtest. Energies at the grid connection [MWh],
 * cash [currency] with + received, - paid; counts of orders.
 */
export interface SettlementTotals {
  /** auctionCash + imbalanceCash - degradationCost [currency]. */
  readonly profit: number;
  /** clearing price x (sold - bought in the auction) [currency]. */
  readonly auctionCash: number;
  /**
   * Gross imbalance cash: imbalance sell price x energy sold at it - imbalance buy price x energy bought
   * at it [currency]. Gross: it counts the whole price, not what the imbalance price cost over the
   * clearing price (that is imbalanceCostVsClearing).
   */
  readonly imbalanceCash: number;
  /**
   * Cost of imbalance against the clearing price [currency], + cost, - gain: sum over periods of
   * (imbalance buy price - clearing) x energy bought at the imbalance price
   * - (imbalance sell price - clearing) x energy sold at it. What settling that energy at the imbalance
   * price instead of the clearing price took away, so that
   * profit = clearing x (all energy sold - all energy bought) - imbalanceCostVsClearing - degradationCost.
   */
  readonly imbalanceCostVsClearing: number;
  /**
   * Deliberate imbalance: energy of an order the store could not deliver (a sell beyond what it held)
   * or absorb (a buy beyond its room or power), bought back or sold back at the imbalance price (step 4
   * of docs/design.md section 5.2) [MWh]. Under follow-accepted these are accepted orders the battery
   * cannot honour; under follow-plan a plan made from the same state never meets the limits. Part of
   * the imbalance energies above.
   */
  readonly deliberateImbalanceMwh: number;
  /** Cash of that energy at the imbalance price, + received, - paid [currency]; part of imbalanceCash. */
  readonly deliberateImbalanceCash: number;
  /** Periods with deliberate imbalance [-]. */
  readonly deliberateImbalancePeriods: number;
  /** degradationCostPerMwh x dischargedMwh [currency], >= 0. */
  readonly degradationCost: number;
  /** Energy bought and sold in the auction (accepted orders) [MWh]. */
  readonly boughtAuctionMwh: number;
  readonly soldAuctionMwh: number;
  /** Energy bought and sold at the imbalance price [MWh]. */
  readonly boughtImbalanceMwh: number;
  readonly soldImbalanceMwh: number;
  /** Energy taken from the grid into the battery [MWh]. */
  readonly chargedMwh: number;
  /** Energy given from the battery to the grid [MWh]; degradation is charged on it. */
  readonly dischargedMwh: number;
  /** Buy orders placed, and accepted. */
  readonly buys: number;
  readonly buysAccepted: number;
  /** Sell orders placed, and accepted. */
  readonly sells: number;
  readonly sellsAccepted: number;
}

export const ZERO_TOTALS: SettlementTotals = Object.freeze({
  profit: 0,
  auctionCash: 0,
  imbalanceCash: 0,
  imbalanceCostVsClearing: 0,
  deliberateImbalanceMwh: 0,
  deliberateImbalanceCash: 0,
  deliberateImbalancePeriods: 0,
  degradationCost: 0,
  boughtAuctionMwh: 0,
  soldAuctionMwh: 0,
  boughtImbalanceMwh: 0,
  soldImbalanceMwh: 0,
  chargedMwh: 0,
  dischargedMwh: 0,
  buys: 0,
  buysAccepted: 0,
  sells: 0,
  sellsAccepted: 0,
});

const KEYS = Object.keys(ZERO_TOTALS) as (keyof SettlementTotals)[];

/** Field-by-field sum. */
export function addTotals(a: SettlementTotals, b: SettlementTotals): SettlementTotals {
  const sum = {} as Record<keyof SettlementTotals, number>;
  for (const key of KEYS) sum[key] = a[key] + b[key];
  return sum;
}
