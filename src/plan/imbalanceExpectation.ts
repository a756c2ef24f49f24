import type { MarketSpec, PriceHistory } from '../types.js';
import { shiftDay } from '../market/calendar.js';
import type { ImbalanceExpectation } from './planValues.js';

/**
 * The imbalance price a plan for `day` expects for its unaccepted orders, or null when nothing says
 * (planValues.ts). For a day not yet settled the market's own rule comes first (`imbalance` in
 * market.json: clearing +/- penalty); without one, the history's mean of imbalance price minus
 * clearing price over every period of the days complete before gate closure (days up to two before
 * `day`: gate closure falls on the day before delivery, so that day's imbalance prices are not yet
 * all known); null when the history has no imbalance prices on those days either.
 *
 * (A backtest settles days whose imbalance prices are known, and there the history's observed
 * price wins: docs/design.md section 5.4.)
 */
export function imbalanceExpectation(market: MarketSpec, history: PriceHistory | undefined, day: string): ImbalanceExpectation | null {
  if (market.imbalance !== undefined) return { kind: 'clearing-plus-penalty', penaltyPerMwh: market.imbalance.penaltyPerMwh };
  if (history === undefined) return null;
  const last = shiftDay(day, -2);
  let sum = 0;
  let periods = 0;
  let from: string | null = null;
  let to: string | null = null;
  for (const d of history.days) {
    if (d.day > last || d.imbalancePricePerMwh === null) continue;
    d.imbalancePricePerMwh.forEach((imbalance, t) => (sum += imbalance - (d.pricePerMwh[t] as number)));
    periods += d.periods.length;
    from ??= d.day;
    to = d.day;
  }
  if (periods === 0 || from === null || to === null) return null;
  return { kind: 'history-spread', meanSpreadPerMwh: sum / periods, from, to, periods };
}

/** The expectation in words, for the console and plan.json. */
export function imbalanceExpectationText(expectation: ImbalanceExpectation, currency: string): string {
  if (expectation.kind === 'clearing-plus-penalty') {
    return `the market's rule: clearing price + ${expectation.penaltyPerMwh} ${currency}/MWh for energy bought, - ${expectation.penaltyPerMwh} for energy sold`;
  }
  const spread = Number(expectation.meanSpreadPerMwh.toFixed(4));
  return `clearing price + ${spread} ${currency}/MWh, the history's mean imbalance-minus-clearing spread over ${expectation.periods} periods, ${expectation.from} to ${expectation.to}`;
}
