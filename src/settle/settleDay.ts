import type { BatteryModel, Order } from '../types.js';
import { isAccepted } from './acceptance.js';
import type { ImbalancePrices } from './imbalancePrices.js';
import type { SettlementTotals } from './settlementTotals.js';

import type { UnacceptedRule } from './unacceptedRule.js';

export { UNACCEPTED_RULES, type UnacceptedRule } from './unacceptedRule.js';

/** One period's order as settlement reads it (an Order has these fields and more). */
export type PeriodOrder = Pick<Order, 'side' | 'quantityMw' | 'limitPrice'>;

export interface SettleDayInput {
  /** Period length dt [h]. */
  readonly periodHours: number;
  readonly battery: BatteryModel;
  /** State of charge at the start of the day [MWh], inside the battery's window. */
  readonly socStartMwh: number;
  /** The order of each period, or null; at most one order (one side) per period. */
  readonly orders: readonly (PeriodOrder | null)[];
  /** Realised clearing price per period [currency/MWh]. */
  readonly clearingPricePerMwh: readonly number[];
  readonly imbalance: ImbalancePrices;
  readonly unaccepted: UnacceptedRule;
  /** Whether to return every period's settlement (a ledger); without it `periods` is empty and only the totals are made. Default true. */
  readonly keepPeriods?: boolean;
}

/**
 * The settlement of one period: the energies and cash of SettlementTotals (energies at the grid [MWh],
 * cash + received, - paid [currency]) and what happened to the period's order.
 */
export interface SettledPeriod
  extends Omit<SettlementTotals, 'buys' | 'buysAccepted' | 'sells' | 'sellsAccepted' | 'imbalanceCostVsClearing' | 'deliberateImbalanceCash' | 'deliberateImbalancePeriods'> {
  /** Whether the period's order was accepted; null when the period has no order. */
  readonly accepted: boolean | null;
  /** State of charge at the end of the period [MWh]. */
  readonly socMwh: number;
}

export interface SettledDay {
  readonly periods: readonly SettledPeriod[];
  readonly totals: SettlementTotals;
  readonly socStartMwh: number;
  readonly socEndMwh: number;
}

/**
 * Energy below which a shortfall or excess is rounding, not a trade: this fraction of energyMwh (of at
 * least 1 MWh) [-]. Plans come from an LP solver that reports flows rounded to 1e-8 MW, so a plan may
 * overrun the window by about 1e-8 MWh per period; 1e-6 covers a day of 100 periods.
 */
export const SETTLE_TOLERANCE = 1e-6;

/**
 * Settles one delivery day's orders against the realised prices (docs/design.md section 5).
 *
 * Periods are settled in time order; each starts from the state of charge the previous one left.
 * In period t with an order of q MW (energy E = q dt):
 * 1. acceptance: a buy iff clearing <= limit, a sell iff clearing >= limit (isAccepted);
 * 2. the auction: an accepted buy pays clearing x E, an accepted sell receives clearing x E;
 * 3. the intended flow: `follow-plan` moves E whether accepted or not, and an unaccepted order's E is
 *    closed at the imbalance price (a buy bought at the imbalance buy price, a sell sold at the imbalance
 *    sell price); `follow-accepted` moves E only when accepted;
 * 4. the store's limits: at most min(chargeMw dt, (socMax - s) / eta_c) can be charged and at most
 *    min(dischargeMw dt, (s - socMin) eta_d) discharged. Energy an accepted buy cannot store is sold back
 *    at the imbalance sell price; the part of a sell the store cannot cover is bought back at the imbalance
 *    buy price. A plan made from the same starting state never meets these limits, so under
 *    `follow-plan` step 4 only absorbs rounding; under `follow-accepted` it settles accepted orders the
 *    battery cannot honour: that energy is the deliberate imbalance, counted on its own;
 * 5. s_t = s_{t-1} + eta_c x charged - discharged / eta_d, clamped into [socMin, socMax] (the clamp and
 *    SETTLE_TOLERANCE only remove floating-point dust);
 * 6. degradation = degradationCostPerMwh x discharged (energy actually discharged at the grid, as in the
 *    planning LP).
 *
 * Signs of cash: + received, - paid. A negative clearing price makes an accepted buy earn money.
 * The cost of imbalance against the clearing price is (imbalance buy - clearing) x bought at the
 * imbalance price - (imbalance sell - clearing) x sold at it, + cost (SettlementTotals).
 *
 * @throws RangeError when the series differ in length, a quantity is negative, or the starting state is
 *   outside the window.
 */
export function settleDay(input: SettleDayInput): SettledDay {
  const { battery, periodHours: dt } = input;
  const count = input.clearingPricePerMwh.length;
  checkInput(input, count);
  const tolMwh = SETTLE_TOLERANCE * Math.max(1, battery.energyMwh);
  const keepPeriods = input.keepPeriods ?? true;
  const periods: SettledPeriod[] = new Array<SettledPeriod>(keepPeriods ? count : 0);
  // Sums in period order, in plain variables (a settled year is ~175,000 periods per policy).
  let profit = 0, auction = 0, imbalanceSum = 0, costVsClearing = 0, degradation = 0, boughtAuction = 0, soldAuction = 0, boughtImbalance = 0, soldImbalance = 0;
  let deliberateMwh = 0, deliberateCash = 0, deliberatePeriods = 0;
  let charged = 0, discharged = 0, buys = 0, buysAccepted = 0, sells = 0, sellsAccepted = 0;
  let soc = input.socStartMwh;
  for (let t = 0; t < count; t++) {
    const order = input.orders[t] ?? null;
    const clearing = input.clearingPricePerMwh[t] as number;
    // What the order does in the auction and at the imbalance price, and the flow it asks for [MWh].
    let tradeBoughtAuction = 0;
    let tradeSoldAuction = 0;
    let tradeBoughtImbalance = 0;
    let tradeSoldImbalance = 0;
    let tradeCharge = 0;
    let tradeDischarge = 0;
    let accepted: boolean | null = null;
    if (order !== null) {
      accepted = isAccepted(order.side, order.limitPrice, clearing);
      const energy = order.quantityMw * dt;
      const moves = accepted || input.unaccepted === 'follow-plan';
      if (order.side === 'buy') {
        if (accepted) tradeBoughtAuction = energy;
        else if (moves) tradeBoughtImbalance = energy;
        if (moves) tradeCharge = energy;
      } else {
        if (accepted) tradeSoldAuction = energy;
        else if (moves) tradeSoldImbalance = energy;
        if (moves) tradeDischarge = energy;
      }
    }
    const storable = Math.max(0, Math.min(battery.chargeMw * dt, (battery.socMaxMwh - soc) / battery.chargeEfficiency));
    const deliverable = Math.max(0, Math.min(battery.dischargeMw * dt, (soc - battery.socMinMwh) * battery.dischargeEfficiency));
    const chargedMwh = tradeCharge <= storable + tolMwh ? tradeCharge : storable;
    const dischargedMwh = tradeDischarge <= deliverable + tolMwh ? tradeDischarge : deliverable;
    // Step 4: energy the store cannot absorb is sold back, energy it cannot deliver is bought back.
    const soldBackMwh = tradeCharge - chargedMwh;
    const boughtBackMwh = tradeDischarge - dischargedMwh;
    const soldImbalanceMwh = tradeSoldImbalance + soldBackMwh;
    const boughtImbalanceMwh = tradeBoughtImbalance + boughtBackMwh;
    soc += battery.chargeEfficiency * chargedMwh - dischargedMwh / battery.dischargeEfficiency;
    soc = Math.min(battery.socMaxMwh, Math.max(battery.socMinMwh, soc));
    const imbalanceSell = input.imbalance.sellPerMwh[t] as number;
    const imbalanceBuy = input.imbalance.buyPerMwh[t] as number;
    const auctionCash = clearing * (tradeSoldAuction - tradeBoughtAuction);
    const imbalanceCash = imbalanceSell * soldImbalanceMwh - imbalanceBuy * boughtImbalanceMwh;
    const degradationCost = battery.degradationCostPerMwh * dischargedMwh;
    const periodProfit = auctionCash + imbalanceCash - degradationCost;
    const deliberateImbalanceMwh = soldBackMwh + boughtBackMwh;
    if (keepPeriods) {
      periods[t] = new SettledPeriodRecord(
        accepted,
        tradeBoughtAuction,
        tradeSoldAuction,
        boughtImbalanceMwh,
        soldImbalanceMwh,
        chargedMwh,
        dischargedMwh,
        auctionCash,
        imbalanceCash,
        degradationCost,
        periodProfit,
        soc,
        deliberateImbalanceMwh,
      );
    }
    if (boughtImbalanceMwh !== 0 || soldImbalanceMwh !== 0) {
      costVsClearing += (imbalanceBuy - clearing) * boughtImbalanceMwh - (imbalanceSell - clearing) * soldImbalanceMwh;
      if (deliberateImbalanceMwh > 0) {
        deliberateMwh += deliberateImbalanceMwh;
        deliberateCash += imbalanceSell * soldBackMwh - imbalanceBuy * boughtBackMwh;
        deliberatePeriods++;
      }
    }
    profit += periodProfit;
    auction += auctionCash;
    imbalanceSum += imbalanceCash;
    degradation += degradationCost;
    boughtAuction += tradeBoughtAuction;
    soldAuction += tradeSoldAuction;
    boughtImbalance += boughtImbalanceMwh;
    soldImbalance += soldImbalanceMwh;
    charged += chargedMwh;
    discharged += dischargedMwh;
    if (order !== null) {
      if (order.side === 'buy') {
        buys++;
        if (accepted === true) buysAccepted++;
      } else {
        sells++;
        if (accepted === true) sellsAccepted++;
      }
    }
  }
  const totals: SettlementTotals = {
    profit,
    auctionCash: auction,
    imbalanceCash: imbalanceSum,
    imbalanceCostVsClearing: costVsClearing,
    deliberateImbalanceMwh: deliberateMwh,
    deliberateImbalanceCash: deliberateCash,
    deliberateImbalancePeriods: deliberatePeriods,
    degradationCost: degradation,
    boughtAuctionMwh: boughtAuction,
    soldAuctionMwh: soldAuction,
    boughtImbalanceMwh: boughtImbalance,
    soldImbalanceMwh: soldImbalance,
    chargedMwh: charged,
    dischargedMwh: discharged,
    buys,
    buysAccepted,
    sells,
    sellsAccepted,
  };
  return { periods, totals, socStartMwh: input.socStartMwh, socEndMwh: soc };
}

function checkInput(input: SettleDayInput, count: number): void {
  const { battery } = input;
  const lengths = [input.orders.length, input.imbalance.buyPerMwh.length, input.imbalance.sellPerMwh.length];
  if (lengths.some((n) => n !== count)) {
    throw new RangeError(`settleDay: orders (${lengths[0]}), imbalance prices (${lengths[1]}, ${lengths[2]}) and clearing prices (${count}) differ in length`);
  }
  const tol = SETTLE_TOLERANCE * Math.max(1, battery.energyMwh);
  if (!(input.socStartMwh >= battery.socMinMwh - tol && input.socStartMwh <= battery.socMaxMwh + tol)) {
    throw new RangeError(`settleDay: starting state of charge ${input.socStartMwh} MWh is outside [${battery.socMinMwh}, ${battery.socMaxMwh}] MWh`);
  }
  input.orders.forEach((order, t) => {
    if (order !== null && !(order.quantityMw >= 0)) throw new RangeError(`settleDay: the order of period ${t} has quantity ${order.quantityMw} MW; quantities are >= 0`);
  });
}

/**
 * A SettledPeriod made by a constructor rather than an object literal: the engine may decide, from a
 * few early days whose ledger was still being written, to allocate every object of a literal straight
 * into its old generation, where a long backtest's ledger (1.75 million periods in ten years) then
 * piles up as garbage; objects made by `new` are not placed that way. Same fields, same order (the
 * deliberate imbalance last).
 */
class SettledPeriodRecord implements SettledPeriod {
  // Parameter properties become fields in this order: the order of the fields as they always were.
  constructor(
    readonly accepted: boolean | null,
    readonly boughtAuctionMwh: number,
    readonly soldAuctionMwh: number,
    readonly boughtImbalanceMwh: number,
    readonly soldImbalanceMwh: number,
    readonly chargedMwh: number,
    readonly dischargedMwh: number,
    readonly auctionCash: number,
    readonly imbalanceCash: number,
    readonly degradationCost: number,
    readonly profit: number,
    readonly socMwh: number,
    readonly deliberateImbalanceMwh: number,
  ) {}
}
