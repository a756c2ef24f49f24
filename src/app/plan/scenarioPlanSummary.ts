import type { DeliveryPeriod, MarketSpec, Order } from '../../types.js';
import { onBothHalves, type AutoChoice, type CandidateScore } from '../../backtest/autoChoice.js';
import { formatNumber } from '../../io/formatNumber.js';
import type { ProfitDistribution } from '../../scenarios/profitDistribution.js';

/** What plan.json says about a plan of the curve or auto policy besides its orders. */
export interface ScenarioPlanContext {
  readonly day: string;
  readonly policy: 'curve' | 'auto';
  readonly market: MarketSpec;
  readonly inputs: Readonly<Record<string, string>>;
  readonly periods: readonly DeliveryPeriod[];
  readonly socStartMwh: number;
  readonly socEndMinMwh: number;
  readonly unaccepted: string;
  readonly riskWeight: number;
  readonly switchStandardErrors: number;
  readonly planningPaths: number;
  /** Paths the curves' penalty was chosen on (apart from the planning and the fresh ones). */
  readonly validationPaths: number;
  readonly freshPaths: number;
  /** Where the paths came from: the --paths file, or the quantile file and the history (quantilePaths.ts). */
  readonly scenarioPaths: string;
  readonly curveSteps: number;
  readonly imbalance: string;
  readonly solver: string;
}

const distribution = (d: ProfitDistribution) => ({
  meanProfit: d.mean,
  sd: d.sd,
  standardError: d.standardError,
  cvar5: d.cvar5,
  lossProbability: d.lossProbability,
  imbalanceMwh: d.imbalanceMwh,
});

/** One row of the candidate table, as plan.json carries it. */
function candidateRow(score: CandidateScore) {
  const { candidate } = score;
  return {
    name: candidate.name,
    policy: candidate.policy,
    alpha: candidate.alpha,
    bids: candidate.kind,
    fresh: distribution(score.fresh),
    endShortfallMwh: score.shortfallMwh,
    value: score.value,
    advantageOverPriceTaking: score.advantage.mean,
    advantageStandardError: score.advantage.standardError,
    planned: candidate.planned === null ? null : distribution(candidate.planned),
  };
}

/**
 * The content of plan.json for the curve and auto policies: the scenarios, every candidate scored on
 * the fresh paths (mean, sd, CVaR 5 %, loss probability, imbalance energy, end-of-day shortfall, the
 * criterion, the paired advantage over price-taking), which was best, which was submitted and why, and
 * the order totals.
 */
export function scenarioPlanSummary(choice: AutoChoice, orders: readonly Order[], context: ScenarioPlanContext) {
  const dt = context.market.periodMinutes / 60;
  const buys = orders.filter((o) => o.side === 'buy');
  const sells = orders.filter((o) => o.side === 'sell');
  const mwh = (list: readonly Order[]) => list.reduce((sum, o) => sum + o.quantityMw * dt, 0);
  const chosen = choice.scores[choice.chosen] as CandidateScore;
  const best = choice.scores[choice.best] as CandidateScore;
  return {
    day: context.day,
    policy: context.policy,
    currency: context.market.currency,
    inputs: { ...context.inputs },
    socStartMwh: context.socStartMwh,
    socEndMinMwh: context.socEndMinMwh,
    submitted: chosen.candidate.name,
    best: best.candidate.name,
    why: whyText(choice, context.switchStandardErrors),
    unaccepted: context.unaccepted,
    criterion: { riskWeight: context.riskWeight, cvarShare: 0.05, switchStandardErrors: context.switchStandardErrors },
    scenarios: { paths: context.scenarioPaths, planningPaths: context.planningPaths, validationPaths: context.validationPaths, freshPaths: context.freshPaths, curveSteps: context.curveSteps, imbalance: context.imbalance, solver: context.solver },
    candidates: choice.scores.map(candidateRow),
    orders: { rows: orders.length, buys: buys.length, sells: sells.length, boughtMwhIfAllAccepted: mwh(buys), soldMwhIfAllAccepted: mwh(sells) },
  };
}

/** Why the submitted candidate was submitted, in a sentence. */
export function whyText(choice: AutoChoice, z: number): string {
  const best = choice.scores[choice.best] as CandidateScore;
  const { mean, standardError } = best.advantage;
  if (choice.best === 0) return 'price-taking has the highest value on the fresh paths';
  const numbers = `${formatNumber(mean, 2)} over price-taking, standard error ${formatNumber(standardError, 2)}`;
  if (choice.chosen === choice.best) return `${best.candidate.name} has the highest value, ${numbers}: more than ${formatNumber(z, 2)} standard errors, and ahead on both halves of the fresh paths`;
  if (mean > z * standardError && !onBothHalves(best)) {
    const halves = best.halfAdvantages.map((h) => formatNumber(h, 2)).join(' and ');
    return `${best.candidate.name} has the highest value, ${numbers}: more than ${formatNumber(z, 2)} standard errors, but not ahead on both halves of the fresh paths (${halves}), so price-taking`;
  }
  return `${best.candidate.name} has the highest value, ${numbers}: not more than ${formatNumber(z, 2)} standard errors, so price-taking`;
}

/** The candidate table as console text, one line per candidate. */
export function candidateTableText(choice: AutoChoice, currency: string): string[] {
  const header = `  ${'candidate'.padEnd(16)}${'mean'.padStart(11)}${'sd'.padStart(11)}${'CVaR 5%'.padStart(11)}${'P(loss)'.padStart(9)}${'imb. MWh'.padStart(10)}${'vs price-taking (se)'.padStart(24)}`;
  const money = (x: number) => formatNumber(x, 2).padStart(11);
  const rows = choice.scores.map((s, i) => {
    const mark = i === choice.chosen ? '*' : ' ';
    const vs = i === 0 ? '' : `${formatNumber(s.advantage.mean, 2)} (${formatNumber(s.advantage.standardError, 2)})`;
    return `${mark} ${s.candidate.name.padEnd(16)}${money(s.fresh.mean)}${money(s.fresh.sd)}${money(s.fresh.cvar5)}${formatNumber(s.fresh.lossProbability, 3).padStart(9)}${formatNumber(s.fresh.imbalanceMwh, 3).padStart(10)}${vs.padStart(24)}`;
  });
  return [`  on the fresh paths [${currency}], * submitted:`, header, ...rows];
}
