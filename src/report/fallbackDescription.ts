import { formatNumber } from '../io/formatNumber.js';
import type { FallbackSource } from '../settle/fallbackPrices.js';

/** Words for the summary: which fallback price was used. */
export function fallbackDescription(source: FallbackSource, currency: string): string {
  return source.kind === 'history'
    ? 'the history\'s fallback_price column'
    : `the market spec's rule: unaccepted buys at clearing + ${formatNumber(source.penaltyPerMwh)} ${currency}/MWh, unaccepted sells at clearing - ${formatNumber(source.penaltyPerMwh)}`;
}
