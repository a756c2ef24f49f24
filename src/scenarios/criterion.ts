import type { ProfitDistribution } from './profitDistribution.js';

/**
 * What the tool maximises when it chooses bids on scenarios: mean profit + lambda x CVaR at 5 % (the
 * mean of the worst 5 % of paths), lambda = `--risk-weight` >= 0. lambda = 0 is the mean profit; a
 * larger lambda gives up mean profit for a better worst 5 % (the mean-CVaR criterion of Rockafellar and
 * Uryasev 2000, written on profits).
 */
export function riskAdjustedValue(distribution: Pick<ProfitDistribution, 'mean' | 'cvar5'>, riskWeight: number): number {
  return distribution.mean + riskWeight * distribution.cvar5;
}
