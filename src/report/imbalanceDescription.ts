import { formatNumber } from '../io/formatNumber.js';
import type { ImbalanceSource } from '../settle/imbalancePrices.js';

/** Words for the summary: which imbalance price was used. */
export function imbalanceDescription(source: ImbalanceSource, currency: string): string {
  return source.kind === 'history'
    ? 'the history\'s imbalance_price column'
    : `the market spec's rule: unaccepted buys at clearing + ${formatNumber(source.penaltyPerMwh)} ${currency}/MWh, unaccepted sells at clearing - ${formatNumber(source.penaltyPerMwh)}`;
}
