import type { BatteryModel } from '../types.js';
import type { UnacceptedRule } from '../settle/unacceptedRule.js';
import { VALUE_TOLERANCE } from '../curves/planCurves.js';
import { riskAdjustedValue } from '../scenarios/criterion.js';
import { evaluateBids } from '../scenarios/evaluateBids.js';
import { criterionTerms, pathMeanPrices, valuesLessShortfall } from '../scenarios/pathValues.js';
import { profitDistribution, type ProfitDistribution } from '../scenarios/profitDistribution.js';
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
  /** The same advantage's mean on each of two independent halves of the fresh paths (even and odd paths). */
  readonly halfAdvantages: readonly [number, number];
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
 * price-taking on the same paths exceeds z standard errors of the paired difference, and is positive on
 * each of two independent halves of the fresh paths (even and odd paths); otherwise price-taking is.
 * The halves guard against heavy tails: where a few paths of extreme prices decide the mean, the
 * standard error of 1,000 paths understates the uncertainty (it is itself estimated from those few
 * paths), and an advantage that one half of the paths does not show is not taken. A replication
 * requirement of this kind asks nothing of the distribution; on light-tailed differences an advantage
 * of z = 2 standard errors is positive on both halves with high probability (each half's mean is
 * about z / sqrt(2) of its standard errors above 0), so it costs little there. The paired difference is taken of the per-path terms
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
  const scores: CandidateScore[] = partial.map((p, i) => ({ ...p, advantage: pairedDifference(terms[i] as Float64Array, reference), halfAdvantages: halfMeans(terms[i] as Float64Array, reference) }));
  // Ties and differences of rounding go to the earlier candidate, price-taking first.
  const tolerance = (value: number): number => VALUE_TOLERANCE * Math.max(1, Math.abs(value));
  let best = 0;
  scores.forEach((s, i) => {
    const leader = (scores[best] as CandidateScore).value;
    if (s.value > leader + tolerance(leader)) best = i;
  });
  const winner = scores[best] as CandidateScore;
  const { mean, standardError } = winner.advantage;
  const significant = best !== 0 && mean > request.switchStandardErrors * standardError && mean > tolerance((scores[0] as CandidateScore).value) && onBothHalves(winner);
  return { scores, chosen: significant ? best : 0, best };
}

/** Whether a candidate's advantage over price-taking is positive on each half of the fresh paths (see chooseAuto). */
export function onBothHalves(score: CandidateScore): boolean {
  return score.halfAdvantages[0] > 0 && score.halfAdvantages[1] > 0;
}

/** Mean of a - b over the even and over the odd indices. */
function halfMeans(a: Float64Array, b: Float64Array): [number, number] {
  const sums = [0, 0];
  const counts = [0, 0];
  for (let w = 0; w < a.length; w++) {
    sums[w % 2] = (sums[w % 2] as number) + (a[w] as number) - (b[w] as number);
    counts[w % 2] = (counts[w % 2] as number) + 1;
  }
  return [(sums[0] as number) / Math.max(1, counts[0] as number), (sums[1] as number) / Math.max(1, counts[1] as number)];
}
