/**
 * What the branch and bound allows a period to do: anything (free), only charge or only discharge.
 * Both day solvers branch on it (solveDay.ts on the LP, warehouse/arbitrageBranching.ts on the
 * warehouse problem) and keep one mode per period in an Int8Array, indexed by period.
 */
export const PERIOD_MODE = Object.freeze({ free: 0, chargeOnly: 1, dischargeOnly: 2 } as const);

export type PeriodMode = (typeof PERIOD_MODE)[keyof typeof PERIOD_MODE];

/** Modes of a day with every period free. */
export function freeModes(periods: number): Int8Array {
  return new Int8Array(periods);
}
