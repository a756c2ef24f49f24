import { createRequire } from 'node:module';
import type solverModule from 'javascript-lp-solver';
import type { SolveResult } from 'javascript-lp-solver';

/**
 * javascript-lp-solver, loaded the first time an LP is solved (through its CommonJS build, which loads
 * synchronously): the day solver seldom needs it, and a plan should not pay its start-up.
 */
let loadedSolver: typeof solverModule | undefined;
function solver(): typeof solverModule {
  loadedSolver ??= createRequire(import.meta.url)('javascript-lp-solver') as typeof solverModule;
  return loadedSolver;
}

/**
 * A linear program in the row form javascript-lp-solver reads: each variable lists its coefficient
 * in the objective row and in each constraint row. Variables are >= 0.
 */
export interface LpModel {
  readonly objectiveRow: string;
  readonly direction: 'max' | 'min';
  readonly constraints: Readonly<Record<string, { readonly max?: number; readonly min?: number; readonly equal?: number }>>;
  readonly variables: Readonly<Record<string, Readonly<Record<string, number>>>>;
}

export type LpResult =
  | { readonly status: 'optimal'; readonly objective: number; readonly values: ReadonlyMap<string, number> }
  | { readonly status: 'infeasible' }
  | { readonly status: 'unbounded' };

/** Our small interface in front of any LP solver, so that a solver can be swapped and tested. */
export interface LpSolver {
  readonly name: string;
  solve(model: LpModel): LpResult;
}

/**
 * javascript-lp-solver (dense simplex, MIT). Used only for continuous LPs: its integer answers are
 * not trusted (its branch and bound can stop at its time limit and still report "feasible"), so
 * complementarity is handled by our own exact branch and bound in solveDay.
 */
export const javascriptLpSolver: LpSolver = {
  name: 'javascript-lp-solver',
  solve(model: LpModel): LpResult {
    const raw = solver().Solve({
      optimize: model.objectiveRow,
      opType: model.direction,
      constraints: model.constraints as Record<string, { max?: number; min?: number; equal?: number }>,
      variables: model.variables as Record<string, Record<string, number>>,
    }) as SolveResult;
    if (!raw.feasible) return { status: 'infeasible' };
    if (raw.bounded === false) return { status: 'unbounded' };
    const values = new Map<string, number>();
    for (const name of Object.keys(model.variables)) {
      const value = raw[name];
      values.set(name, typeof value === 'number' ? value : 0);
    }
    return { status: 'optimal', objective: raw.result, values };
  },
};
