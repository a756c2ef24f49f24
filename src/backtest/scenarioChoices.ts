import type { BacktestResult } from './runBacktest.js';

/** What a scenario policy (curve, auto) submitted over a backtest. */
export interface ScenarioChoices {
  readonly policy: string;
  /** Days on which each candidate was submitted, in the order the candidates were first submitted. */
  readonly submittedDays: Readonly<Record<string, number>>;
  /** Days on which the best candidate on the fresh paths was not price-taking but its advantage was not significant. */
  readonly keptPriceTakingDays: number;
}

/** The days each candidate of the curve and auto policies was submitted (their scenario reports). */
export function scenarioChoices(result: BacktestResult): ScenarioChoices[] {
  return result.policies.flatMap((policy, i) => {
    if (policy !== 'curve' && policy !== 'auto') return [];
    const submittedDays: Record<string, number> = {};
    let keptPriceTakingDays = 0;
    for (const day of result.days) {
      const report = day.runs[i]?.scenarioReport ?? null;
      if (report === null) continue;
      const { choice } = report;
      const name = (choice.scores[choice.chosen] as (typeof choice.scores)[number]).candidate.name;
      submittedDays[name] = (submittedDays[name] ?? 0) + 1;
      if (choice.best !== choice.chosen) keptPriceTakingDays++;
    }
    return [{ policy, submittedDays, keptPriceTakingDays }];
  });
}
