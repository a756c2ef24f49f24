import { worstTailMean } from '../stats/worstTailMean.js';
import type { PathOutcomes } from './evaluateBids.js';

/** The tail share of CVaR the tool reports: the worst 5 % of paths [-]. */
export const CVAR_SHARE = 0.05;

/** What a day's bids earn across equally likely paths. */
export interface ProfitDistribution {
  /** Paths n [-]. */
  readonly paths: number;
  /** Mean profit over the paths [currency]. */
  readonly mean: number;
  /** Sample standard deviation of the profit (divisor n - 1; 0 for one path) [currency]. */
  readonly sd: number;
  /** Standard error of the mean, sd / sqrt(n) [currency]. */
  readonly standardError: number;
  /** CVaR at 5 %: the mean of the worst 5 % of profits, fractional tail (stats/worstTailMean.ts) [currency]. */
  readonly cvar5: number;
  /** Share of paths with a profit below 0 [-]. */
  readonly lossProbability: number;
  /** Mean energy bought plus sold at the imbalance price [MWh]. */
  readonly imbalanceMwh: number;
}

/** The distribution of a day's profit over the paths it was settled on (evaluateBids). */
export function profitDistribution(outcomes: PathOutcomes): ProfitDistribution {
  const { profit, imbalanceMwh } = outcomes;
  const n = profit.length;
  let sum = 0;
  let losses = 0;
  let imbalance = 0;
  for (let w = 0; w < n; w++) {
    const p = profit[w] as number;
    sum += p;
    if (p < 0) losses++;
    imbalance += imbalanceMwh[w] as number;
  }
  const mean = sum / n;
  let squares = 0;
  for (let w = 0; w < n; w++) squares += ((profit[w] as number) - mean) ** 2;
  const sd = n > 1 ? Math.sqrt(squares / (n - 1)) : 0;
  return { paths: n, mean, sd, standardError: sd / Math.sqrt(n), cvar5: worstTailMean(profit, CVAR_SHARE), lossProbability: losses / n, imbalanceMwh: imbalance / n };
}
