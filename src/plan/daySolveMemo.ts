import type { DayOutcome, DayProblem } from '../types.js';

/** The solver settings an outcome depends on (SolveDayOptions without the workspace, stopwatch and memo). */
export interface SolveSettingsKey {
  readonly lpSolver: unknown;
  readonly maxNodes: number;
  readonly relativeGap: number;
  readonly solver: string;
}

interface Entry {
  readonly problem: DayProblem;
  readonly settings: SolveSettingsKey;
  readonly outcome: DayOutcome;
}

/**
 * Outcomes of day problems solved before, handed out again for a problem equal to one of them in every
 * field (prices compared value by value, the battery and the solver settings by identity). The day
 * solver is deterministic, so the outcome of an equal problem is the outcome it would compute. In a
 * backtest the median, point and price-taking policies all schedule on the median forecast; while
 * their states of charge agree (under follow-plan every accepted or not order is executed as planned)
 * one solve serves all three. Outcomes are shared, never copied: nothing downstream writes into them.
 * Keep one memo per delivery day: it holds at most `capacity` entries, the newest first.
 */
export class DaySolveMemo {
  private readonly entries: Entry[] = [];

  constructor(private readonly capacity = 8) {}

  /** The outcome kept for a problem equal to `problem` under equal settings, or undefined. */
  find(problem: DayProblem, settings: SolveSettingsKey): DayOutcome | undefined {
    for (const entry of this.entries) if (sameSettings(entry.settings, settings) && sameProblem(entry.problem, problem)) return entry.outcome;
    return undefined;
  }

  keep(problem: DayProblem, settings: SolveSettingsKey, outcome: DayOutcome): void {
    this.entries.unshift({ problem, settings, outcome });
    if (this.entries.length > this.capacity) this.entries.pop();
  }
}

function sameSettings(a: SolveSettingsKey, b: SolveSettingsKey): boolean {
  return a.lpSolver === b.lpSolver && Object.is(a.maxNodes, b.maxNodes) && Object.is(a.relativeGap, b.relativeGap) && a.solver === b.solver;
}

function sameProblem(a: DayProblem, b: DayProblem): boolean {
  return (
    a.battery === b.battery &&
    Object.is(a.periodHours, b.periodHours) &&
    Object.is(a.socStartMwh, b.socStartMwh) &&
    Object.is(a.socEndMinMwh, b.socEndMinMwh) &&
    Object.is(a.terminalValuePerMwh, b.terminalValuePerMwh) &&
    samePrices(a.buyPricePerMwh, b.buyPricePerMwh) &&
    samePrices(a.sellPricePerMwh, b.sellPricePerMwh)
  );
}

function samePrices(a: readonly number[], b: readonly number[]): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let t = 0; t < a.length; t++) if (!Object.is(a[t], b[t])) return false;
  return true;
}
