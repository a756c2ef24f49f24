import type { BatteryModel } from '../types.js';
import { isAccepted } from './acceptance.js';
import { isCurve, type PeriodBid, type PeriodOrder } from './periodBid.js';
import type { UnacceptedRule } from './unacceptedRule.js';

/**
 * The settlement of one period, written into a reused record (settleDay runs it once per period of a
 * year, the scenario evaluator once per period and path): energies at the grid [MWh], cash + received,
 * - paid [currency], the state of charge after the period [MWh].
 */
export class PeriodOutcome {
  /** Whether the bid was accepted (a curve: whether any of its steps was); null without a bid. */
  accepted: boolean | null = null;
  boughtAuctionMwh = 0;
  soldAuctionMwh = 0;
  boughtImbalanceMwh = 0;
  soldImbalanceMwh = 0;
  chargedMwh = 0;
  dischargedMwh = 0;
  auctionCash = 0;
  imbalanceCash = 0;
  degradationCost = 0;
  profit = 0;
  socMwh = 0;
  /** Energy accepted orders asked for that the store could not take or give, settled at the imbalance price [MWh]. */
  deliberateImbalanceMwh = 0;
  /** Its cash at the imbalance prices [currency]. */
  deliberateImbalanceCash = 0;
}

/** What settlePeriod needs besides the bid and the prices; the same for every period of a day. */
export interface PeriodContext {
  readonly battery: BatteryModel;
  /** Period length dt [h]. */
  readonly periodHours: number;
  readonly unaccepted: UnacceptedRule;
  /** Energy below which a shortfall or excess is rounding, not a trade [MWh]. */
  readonly toleranceMwh: number;
}

/**
 * Settles one period (docs/design.md section 5.2) from the state of charge `soc` [MWh]:
 * 1. acceptance: a buy iff clearing <= limit, a sell iff clearing >= limit (isAccepted);
 * 2. the auction: an accepted buy pays clearing x E, an accepted sell receives clearing x E (E = q dt);
 * 3. the intended flow: one order under `follow-plan` moves E whether accepted or not, an unaccepted
 *    order's E closed at the imbalance price (a buy bought at the imbalance buy price, a sell sold at
 *    the imbalance sell price); under `follow-accepted` it moves E only when accepted. A curve moves
 *    the net of its accepted steps (bought - sold, at most one of the two is left);
 * 4. the store's limits: at most min(chargeMw dt, (socMax - s) / eta_c) can be charged and at most
 *    min(dischargeMw dt, (s - socMin) eta_d) discharged; energy a buy cannot store is sold back at the
 *    imbalance sell price, the part of a sell the store cannot cover is bought back at the imbalance
 *    buy price (within toleranceMwh the asked flow is taken as it is: floating-point dust); that energy
 *    is the deliberate imbalance, counted on its own;
 * 5. s <- s + eta_c x charged - discharged / eta_d, clamped into [socMin, socMax];
 * 6. degradation = degradationCostPerMwh x discharged.
 * profit = auction cash + imbalance cash - degradation.
 *
 * @throws RangeError for a curve under follow-plan (a curve is settled by what cleared)
 */
export function settlePeriod(bid: PeriodBid, clearing: number, imbalanceBuy: number, imbalanceSell: number, soc: number, context: PeriodContext, out: PeriodOutcome): PeriodOutcome {
  const { battery, periodHours: dt } = context;
  let tradeBoughtAuction = 0;
  let tradeSoldAuction = 0;
  let tradeBoughtImbalance = 0;
  let tradeSoldImbalance = 0;
  let tradeCharge = 0;
  let tradeDischarge = 0;
  let accepted: boolean | null = null;
  if (bid !== null) {
    if (isCurve(bid)) {
      if (context.unaccepted === 'follow-plan') throw new RangeError('settlePeriod: a curve is settled by what cleared; settle it under follow-accepted');
      accepted = false;
      for (let i = 0; i < bid.length; i++) {
        const order = bid[i] as PeriodOrder;
        if (!isAccepted(order.side, order.limitPrice, clearing)) continue;
        accepted = true;
        if (order.side === 'buy') tradeBoughtAuction += order.quantityMw * dt;
        else tradeSoldAuction += order.quantityMw * dt;
      }
      if (tradeBoughtAuction >= tradeSoldAuction) tradeCharge = tradeBoughtAuction - tradeSoldAuction;
      else tradeDischarge = tradeSoldAuction - tradeBoughtAuction;
    } else {
      const order = bid as PeriodOrder;
      accepted = isAccepted(order.side, order.limitPrice, clearing);
      const energy = order.quantityMw * dt;
      const moves = accepted || context.unaccepted === 'follow-plan';
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
  }
  const tol = context.toleranceMwh;
  const storable = Math.max(0, Math.min(battery.chargeMw * dt, (battery.socMaxMwh - soc) / battery.chargeEfficiency));
  const deliverable = Math.max(0, Math.min(battery.dischargeMw * dt, (soc - battery.socMinMwh) * battery.dischargeEfficiency));
  const chargedMwh = tradeCharge <= storable + tol ? tradeCharge : storable;
  const dischargedMwh = tradeDischarge <= deliverable + tol ? tradeDischarge : deliverable;
  // Energy the store cannot absorb is sold back, energy it cannot deliver is bought back: the deliberate imbalance.
  const soldBackMwh = tradeCharge - chargedMwh;
  const boughtBackMwh = tradeDischarge - dischargedMwh;
  const soldImbalanceMwh = tradeSoldImbalance + soldBackMwh;
  const boughtImbalanceMwh = tradeBoughtImbalance + boughtBackMwh;
  let next = soc + battery.chargeEfficiency * chargedMwh - dischargedMwh / battery.dischargeEfficiency;
  next = Math.min(battery.socMaxMwh, Math.max(battery.socMinMwh, next));
  const auctionCash = clearing * (tradeSoldAuction - tradeBoughtAuction);
  const imbalanceCash = imbalanceSell * soldImbalanceMwh - imbalanceBuy * boughtImbalanceMwh;
  const degradationCost = battery.degradationCostPerMwh * dischargedMwh;
  out.accepted = accepted;
  out.boughtAuctionMwh = tradeBoughtAuction;
  out.soldAuctionMwh = tradeSoldAuction;
  out.boughtImbalanceMwh = boughtImbalanceMwh;
  out.soldImbalanceMwh = soldImbalanceMwh;
  out.chargedMwh = chargedMwh;
  out.dischargedMwh = dischargedMwh;
  out.auctionCash = auctionCash;
  out.imbalanceCash = imbalanceCash;
  out.degradationCost = degradationCost;
  out.profit = auctionCash + imbalanceCash - degradationCost;
  out.socMwh = next;
  out.deliberateImbalanceMwh = soldBackMwh + boughtBackMwh;
  out.deliberateImbalanceCash = imbalanceSell * soldBackMwh - imbalanceBuy * boughtBackMwh;
  return out;
}
