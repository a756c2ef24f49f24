import type { BatteryModel } from '../types.js';
import type { UnacceptedRule } from '../settle/unacceptedRule.js';
import { VALUE_TOLERANCE } from '../curves/planCurves.js';
import { riskAdjustedValue } from '../scenarios/criterion.js';
import { evaluateBids, type PathOutcomes } from '../scenarios/evaluateBids.js';
import { CVAR_SHARE, profitDistribution, type ProfitDistribution } from '../scenarios/profitDistribution.js';
import type { ScenarioSet } from '../scenarios/scenarioSet.js';
import { pairedDifference, type PairedDifference } from '../stats/pairedDifference.js';
import type { DayBid } from './dayBid.js';

/** One candidate of `auto`: a policy's bids for the day. */
export interface Candidate {
  /** e.g. `price-taking`, `point`, `quantile 0.1`, `median 0.2`, `curve`. */
  readonly name: string;
  readonly policy: 'price-taking' | 'point' | 'quantile' | 'median' | 'curve';
  readonly alpha: number | null;
  readonly bids: readonly DayBid[];
  /** A curve moves with what clears under either rule; a schedule follows the rule. */
  readonly kind: 'schedule' | 'curves';
  /** The curve's figures on the paths it was planned on (null for the others). */
  readonly planned: ProfitDistribution | null;
}

/** A candidate scored on the fresh paths. */
export interface CandidateScore {
  readonly candidate: Candidate;
  /** Profit on the fresh paths, as settlement counts it. */
  readonly fresh: ProfitDistribution;
  /** Mean shortfall of the state of charge below the end-of-day floor at the end of the day [MWh]. */
  readonly shortfallMwh: number;
  /** The criterion on profits less the shortfall's cost (see chooseAuto) [currency]. */
  readonly value: number;
  /** Paired difference of the criterion's per-path terms against price-taking on the same paths. */
  readonly advantage: PairedDifference;
}

export interface AutoChoice {
  readonly scores: readonly CandidateScore[];
  /** Index of the candidate submitted. */
  readonly chosen: number;
  /** Index of the candidate with the highest value (the chosen one unless its advantage was not significant). */
  readonly best: number;
}

export interface AutoRequest {
  /** Candidates; the first must be price-taking, the reference of every advantage. */
  readonly candidates: readonly Candidate[];
  readonly fresh: ScenarioSet;
  readonly battery: BatteryModel;
  readonly periodHours: number;
  readonly socStartMwh: number;
  /** The end-of-day floor [MWh]. */
  readonly socEndMinMwh: number;
  readonly unaccepted: UnacceptedRule;
  readonly riskWeight: number;
  /** z: the advantage must exceed z standard errors. */
  readonly switchStandardErrors: number;
}

/**
 * Chooses a day's bids on fresh paths (docs/design.md section 4.7). Each candidate is settled on every
 * fresh path (evaluateBids, exactly settleDay) under the rule for unaccepted orders (a curve by what
 * clears). Its value per path is the profit less the cost of any shortfall of the state of charge below
 * the end-of-day floor, bought back at the path's mean clearing price / eta_c (a plan that ends low has
 * spent tomorrow's energy); no credit is given for ending higher. The criterion is mean + lambda x CVaR
 * 5 % of these values (scenarios/criterion.ts).
 *
 * Winner's-curse control: the best candidate by the criterion is submitted only if its advantage over
 * price-taking on the same paths exceeds z standard errors of the paired difference; otherwise
 * price-taking is. The paired difference is taken of the per-path terms
 *   g_w = x_w + lambda (v - max(0, v - x_w) / beta),   v = the beta-quantile x_(ceil(beta n)),
 * whose mean is exactly mean + lambda CVaR (Rockafellar and Uryasev 2000, Theorem 1, at its optimal
 * eta = v); with lambda = 0 it is the plain paired difference of the values.
 */
export function chooseAuto(request: AutoRequest): AutoChoice {
  const { candidates, fresh, battery, periodHours, socStartMwh, riskWeight } = request;
  if (candidates[0]?.policy !== 'price-taking') throw new RangeError('chooseAuto: the first candidate must be price-taking');
  const meanPrice = pathMeanPrices(fresh);
  const terms: Float64Array[] = [];
  const partial = candidates.map((candidate) => {
    const outcomes = evaluateBids({
      bids: candidate.bids,
      scenarios: fresh,
      battery,
      periodHours,
      socStartMwh,
      unaccepted: candidate.kind === 'curves' ? 'follow-accepted' : request.unaccepted,
    });
    const { values, shortfallMwh } = valuesLessShortfall(outcomes, meanPrice, request.socEndMinMwh, battery.chargeEfficiency);
    const adjusted = profitDistribution({ ...outcomes, profit: values });
    terms.push(criterionTerms(values, riskWeight));
    return { candidate, fresh: profitDistribution(outcomes), shortfallMwh, value: riskAdjustedValue(adjusted, riskWeight) };
  });
  const reference = terms[0] as Float64Array;
  const scores: CandidateScore[] = partial.map((p, i) => ({ ...p, advantage: pairedDifference(terms[i] as Float64Array, reference) }));
  // Ties and differences of rounding go to the earlier candidate, price-taking first.
  const tolerance = (value: number): number => VALUE_TOLERANCE * Math.max(1, Math.abs(value));
  let best = 0;
  scores.forEach((s, i) => {
    const leader = (scores[best] as CandidateScore).value;
    if (s.value > leader + tolerance(leader)) best = i;
  });
  const winner = scores[best] as CandidateScore;
  const { mean, standardError } = winner.advantage;
  const significant = best !== 0 && mean > request.switchStandardErrors * standardError && mean > tolerance((scores[0] as CandidateScore).value);
  return { scores, chosen: significant ? best : 0, best };
}

/** Mean clearing price of each path over the day [currency/MWh]. */
function pathMeanPrices(set: ScenarioSet): Float64Array {
  const out = new Float64Array(set.pathCount);
  for (let t = 0; t < set.periodCount; t++) for (let w = 0; w < set.pathCount; w++) out[w] = (out[w] as number) + (set.clearingPricePerMwh[t * set.pathCount + w] as number);
  return out.map((v) => v / set.periodCount);
}

function valuesLessShortfall(outcomes: PathOutcomes, meanPrice: Float64Array, floorMwh: number, etaC: number): { values: Float64Array; shortfallMwh: number } {
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

/** g_w = x_w + lambda (v - max(0, v - x_w) / beta), v the beta-quantile of x (see chooseAuto). */
function criterionTerms(x: Float64Array, riskWeight: number): Float64Array {
  if (riskWeight === 0) return x;
  const n = x.length;
  const sorted = Float64Array.from(x).sort();
  const v = sorted[Math.max(0, Math.ceil(CVAR_SHARE * n) - 1)] as number;
  return x.map((xw) => xw + riskWeight * (v - Math.max(0, v - xw) / CVAR_SHARE));
}
