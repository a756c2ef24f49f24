import { STRONGEST_BASELINE_RULE, type BacktestMetrics } from '../backtest/backtestMetrics.js';
import type { EdgeTest } from '../backtest/edgeTest.js';
import { formatPValue } from '../io/formatNumber.js';

/** Writes a number with at most `decimals` decimals (formatNumber on the console, numberText in a report). */
export type NumberWriter = (value: number, decimals: number) => string;

/** The level at which a difference is called significant in the texts [-]. */
export const SIGNIFICANCE_LEVEL = 0.05;

/**
 * One edge test in words, saying which policy earns more: "quantile earns 72.89 HLV per day LESS than
 * price-taking (Diebold-Mariano/HLN -3.104, one-sided p = 0.0013 that price-taking earns more:
 * significant at 5%)". The p-value is the one-sided one in the direction of the observed difference.
 */
export function edgeSentence(edge: EdgeTest, currency: string, write: NumberWriter): string {
  if (edge.status !== 'ok') {
    const diff = edge.meanDifference === null ? '' : `${write(edge.meanDifference, 2)} ${currency} per day, `;
    return `${edge.tested} against ${edge.reference}: ${diff}not tested (${edge.reason})`;
  }
  const d = edge.meanDifference;
  const more = d >= 0;
  const winner = more ? edge.tested : edge.reference;
  const p = more ? edge.pValueTestedEarnsMore : edge.pValueReferenceEarnsMore;
  const verdict = p < SIGNIFICANCE_LEVEL ? `significant at ${write(100 * SIGNIFICANCE_LEVEL, 0)}%` : `not significant at ${write(100 * SIGNIFICANCE_LEVEL, 0)}%`;
  const amount = `${write(Math.abs(d), 2)} ${currency} per day ${more ? 'more' : 'LESS'} than ${edge.reference}`;
  return `${edge.tested} earns ${amount} (Diebold-Mariano/HLN ${write(edge.hln, 3)}, one-sided p = ${formatPValue(p)} that ${winner} earns more: ${verdict})`;
}

/**
 * The headline of a backtest: the tested policy against the strongest simple baseline, saying plainly
 * when it loses (`verdict`), and the test of the daily difference (`test`); null when no baseline was
 * run beside it.
 */
export function baselineHeadline(metrics: BacktestMetrics, currency: string, write: NumberWriter): { readonly verdict: string; readonly test: string } | null {
  const b = metrics.baseline;
  if (b === null || metrics.tested === null) return null;
  const profit = (p: string) => write(metrics.policies[p]?.profit ?? 0, 0);
  // Not behind and equal as written (e.g. auto that kept price-taking's bids every day) is a tie, not a win.
  const outcome = b.testedLoses ? 'LOSES' : profit(metrics.tested) === profit(b.policy) ? 'ties with it' : 'beats it';
  return {
    verdict: `against the strongest simple baseline, ${b.policy} (${STRONGEST_BASELINE_RULE}): ${metrics.tested} ${outcome}, ${profit(metrics.tested)} against ${profit(b.policy)} ${currency} over the run`,
    test: edgeSentence(b.edge, currency, write),
  };
}
