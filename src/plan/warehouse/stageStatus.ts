/**
 * The one status vocabulary of the warehouse solver's stages: the sweep (lineSweep.ts), the dynamic
 * program (valueProgram.ts), the cycle-cap multiplier search (cycleCapMultiplier.ts) and the branching
 * (arbitrageBranching.ts) each answer one of these; solveWarehouseDay.ts turns them into the
 * public DayOutcome.
 *
 *   ok                    the stage has its answer
 *   start-unreachable     the first period cannot bring a start outside the window inside it
 *   end-unreachable       no schedule reaches the end-of-day floor
 *   cap-unreachable       even the least discharge the window allows exceeds the cycle cap
 *   too-many-breakpoints  the dynamic program gave up: a value function outgrew its budget
 *   node-budget-spent     the branching gave up: it spent its node budget
 */
export type StageStatus = 'ok' | InfeasibleStatus | GaveUpStatus;

/** The statuses that prove the day has no feasible schedule. */
export type InfeasibleStatus = 'start-unreachable' | 'end-unreachable' | 'cap-unreachable';

/** The statuses of a stage that stopped within its budget without an answer. */
export type GaveUpStatus = 'too-many-breakpoints' | 'node-budget-spent';

export function isInfeasible(status: StageStatus): status is InfeasibleStatus {
  return status === 'start-unreachable' || status === 'end-unreachable' || status === 'cap-unreachable';
}
