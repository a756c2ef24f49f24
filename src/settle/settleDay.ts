import type { BatteryModel } from '../types.js';
import { isAccepted } from './acceptance.js';
import type { ImbalancePrices } from './imbalancePrices.js';
import { bidOrders, isCurve, type PeriodBid } from './periodBid.js';
import { PeriodOutcome, settlePeriod, type PeriodContext } from './settlePeriod.js';
import type { SettlementTotals } from './settlementTotals.js';
import type { UnacceptedRule } from './unacceptedRule.js';

export { UNACCEPTED_RULES, type UnacceptedRule } from './unacceptedRule.js';
export type { PeriodBid, PeriodOrder } from './periodBid.js';

export interface SettleDayInput {
  /** Period length dt [h]. */
  readonly periodHours: number;
  readonly battery: BatteryModel;
  /** State of charge at the start of the day [MWh], inside the battery's window. */
  readonly socStartMwh: number;
  /** The bid of each period: null, one order, or a curve (a stack of limit orders, periodBid.ts). */
  readonly orders: readonly PeriodBid[];
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
 * Periods are settled in time order; each starts from the state of charge the previous one left,
 * by settlePeriod (settlePeriod.ts: acceptance, the auction, the flow the rule asks for, the store's
 * limits, the state of charge, wear). A plan made from the same starting state never meets the store's
 * limits, so under `follow-plan` they only absorb rounding; under `follow-accepted` they do real work,
 * because the store then drifts from the plan. A period may carry a curve (a stack of limit orders,
 * periodBid.ts), settled by what cleared: allowed under `follow-accepted` only. Energy an accepted
 * order (or the net of a curve's accepted steps) asks for that the store cannot take or give is settled
 * at the imbalance price: that is the deliberate imbalance, counted on its own.
 *
 * Signs of cash: + received, - paid. A negative clearing price makes an accepted buy earn money.
 * The cost of imbalance against the clearing price is (imbalance buy - clearing) x bought at the
 * imbalance price - (imbalance sell - clearing) x sold at it, + cost (SettlementTotals).
 *
 * @throws RangeError when the series differ in length, a quantity is negative, the starting state is
 *   outside the window, or a curve is to be settled under follow-plan.
 */
export function settleDay(input: SettleDayInput): SettledDay {
  const { battery } = input;
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
  const context: PeriodContext = { battery, periodHours: input.periodHours, unaccepted: input.unaccepted, toleranceMwh: tolMwh };
  const outcome = new PeriodOutcome();
  for (let t = 0; t < count; t++) {
    const bid = input.orders[t] ?? null;
    const clearing = input.clearingPricePerMwh[t] as number;
    const imbalanceBuy = input.imbalance.buyPerMwh[t] as number;
    const imbalanceSell = input.imbalance.sellPerMwh[t] as number;
    const o = settlePeriod(bid, clearing, imbalanceBuy, imbalanceSell, soc, context, outcome);
    soc = o.socMwh;
    if (keepPeriods) {
      periods[t] = new SettledPeriodRecord(
        o.accepted,
        o.boughtAuctionMwh,
        o.soldAuctionMwh,
        o.boughtImbalanceMwh,
        o.soldImbalanceMwh,
        o.chargedMwh,
        o.dischargedMwh,
        o.auctionCash,
        o.imbalanceCash,
        o.degradationCost,
        o.profit,
        soc,
        o.deliberateImbalanceMwh,
      );
    }
    if (o.boughtImbalanceMwh !== 0 || o.soldImbalanceMwh !== 0) {
      costVsClearing += (imbalanceBuy - clearing) * o.boughtImbalanceMwh - (imbalanceSell - clearing) * o.soldImbalanceMwh;
      if (o.deliberateImbalanceMwh > 0) {
        deliberateMwh += o.deliberateImbalanceMwh;
        deliberateCash += o.deliberateImbalanceCash;
        deliberatePeriods++;
      }
    }
    profit += o.profit;
    auction += o.auctionCash;
    imbalanceSum += o.imbalanceCash;
    degradation += o.degradationCost;
    boughtAuction += o.boughtAuctionMwh;
    soldAuction += o.soldAuctionMwh;
    boughtImbalance += o.boughtImbalanceMwh;
    soldImbalance += o.soldImbalanceMwh;
    charged += o.chargedMwh;
    discharged += o.dischargedMwh;
    if (bid !== null) {
      // Counts per order: a curve counts each of its steps.
      for (const order of bidOrders(bid)) {
        const stepAccepted = isAccepted(order.side, order.limitPrice, clearing);
        if (order.side === 'buy') {
          buys++;
          if (stepAccepted) buysAccepted++;
        } else {
          sells++;
          if (stepAccepted) sellsAccepted++;
        }
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
  input.orders.forEach((bid, t) => {
    if (isCurve(bid) && input.unaccepted === 'follow-plan') throw new RangeError(`settleDay: period ${t} carries a curve; a curve is settled by what cleared, under follow-accepted`);
    for (const order of bidOrders(bid)) {
      if (!(order.quantityMw >= 0)) throw new RangeError(`settleDay: an order of period ${t} has quantity ${order.quantityMw} MW; quantities are >= 0`);
    }
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
