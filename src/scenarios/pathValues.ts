import type { PathOutcomes } from './evaluateBids.js';
import { CVAR_SHARE } from './profitDistribution.js';
import type { ScenarioSet } from './scenarioSet.js';

/** Mean clearing price of each path over the day [currency/MWh]. */
export function pathMeanPrices(set: ScenarioSet): Float64Array {
  const out = new Float64Array(set.pathCount);
  for (let t = 0; t < set.periodCount; t++) for (let w = 0; w < set.pathCount; w++) out[w] = (out[w] as number) + (set.clearingPricePerMwh[t * set.pathCount + w] as number);
  return out.map((v) => v / set.periodCount);
}

/**
 * Each path's profit less the cost of any shortfall of the state of charge below the end-of-day floor,
 * bought back at the path's mean clearing price / eta_c (a plan that ends low has spent tomorrow's
 * energy); no credit for ending higher. Also the mean shortfall [MWh].
 */
export function valuesLessShortfall(outcomes: PathOutcomes, meanPrice: Float64Array, floorMwh: number, etaC: number): { values: Float64Array; shortfallMwh: number } {
  const n = outcomes.profit.length;
  const values = new Float64Array(n);
  let shortfall = 0;
  for (let w = 0; w < n; w++) {
    const short = Math.max(0, floorMwh - (outcomes.socEndMwh[w] as number));
    shortfall += short;
    values[w] = (outcomes.profit[w] as number) - (short * Math.max(0, meanPrice[w] as number)) / etaC;
  }
  return { values, shortfallMwh: shortfall / n };
}

/**
 * Per-path terms g_w = x_w + lambda (v - max(0, v - x_w) / beta), v the beta-quantile x_(ceil(beta n)),
 * whose mean is exactly mean + lambda CVaR (Rockafellar and Uryasev 2000, Theorem 1, at its optimal
 * eta = v); with lambda = 0 they are the values themselves. Paired differences of these terms compare
 * two bids by the criterion on the same paths.
 */
export function criterionTerms(x: Float64Array, riskWeight: number): Float64Array {
  if (riskWeight === 0) return x;
  const n = x.length;
  const sorted = Float64Array.from(x).sort();
  const v = sorted[Math.max(0, Math.ceil(CVAR_SHARE * n) - 1)] as number;
  return x.map((xw) => xw + riskWeight * (v - Math.max(0, v - xw) / CVAR_SHARE));
}
