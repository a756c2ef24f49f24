/**
 * Sums of a settlement over periods, days or a whole backtest. Energies at the grid connection [MWh],
 * cash [currency] with + received, - paid; counts of orders.
 */
export interface SettlementTotals {
  /** auctionCash + imbalanceCash - degradationCost [currency]. */
  readonly profit: number;
  /** clearing price x (sold - bought in the auction) [currency]. */
  readonly auctionCash: number;
  /** imbalance sell price x energy sold at it - imbalance buy price x energy bought at it [currency]. */
  readonly imbalanceCash: number;
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
