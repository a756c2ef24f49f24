import type { LinearProgram, LpOutcome, LpSession, SparseLpSolver, SparseRows } from '../../curves/linearProgram.js';

/**
 * The curve program's solver: HiGHS (Huangfu and Hall 2018, the dual revised simplex method) through
 * the npm package `highs`, a WebAssembly build. Loaded only when a curve or auto policy runs, so that
 * other commands never pay its start-up (README: the solver dependency and why).
 *
 * Options: dual simplex (rows are added between solves and the dual simplex restarts from the last
 * basis, which stays dual feasible), presolve off (it would throw the basis away), no output.
 *
 * Reference: Q. Huangfu and J. A. J. Hall (2018), Parallelizing the dual revised simplex method, Math.
 * Prog. Comp. 10, 119-142.
 */
export async function loadHighsSolver(): Promise<SparseLpSolver> {
  const { default: loadHighs } = await import('highs');
  const highs = await loadHighs();
  const inf = highs.infinity;
  const bound = (values: Float64Array): Float64Array => values.map((v) => (v === Infinity ? inf : v === -Infinity ? -inf : v));
  const { modelStatus } = highs.constants;
  return {
    name: `HiGHS ${highs.version.string} (dual simplex, npm highs)`,
    open(program: LinearProgram): LpSession {
      const n = program.columnCost.length;
      const rows = program.rows;
      const model = highs.createModel({
        numCols: n,
        numRows: rows.lower.length,
        sense: highs.constants.objectiveSense.maximize,
        colCost: program.columnCost,
        colLower: bound(program.columnLower),
        colUpper: bound(program.columnUpper),
        rowLower: bound(rows.lower),
        rowUpper: bound(rows.upper),
        matrix: { format: 'csr', numRows: rows.lower.length, numCols: n, starts: rows.starts, indices: rows.indices, values: rows.values },
      });
      model.options.set({ output_flag: false, presolve: 'off', solver: 'simplex', simplex_strategy: 1 });
      return {
        solve(): LpOutcome {
          const result = model.run();
          const status = result.modelStatus;
          if (status === modelStatus.optimal) return { status: 'optimal', objective: model.getObjectiveValue(), columns: model.getSolution().colValue };
          if (status === modelStatus.infeasible) return { status: 'infeasible', detail: 'HiGHS: the program is infeasible' };
          if (status === modelStatus.unbounded) return { status: 'unbounded', detail: 'HiGHS: the program is unbounded' };
          return { status: 'failed', detail: `HiGHS stopped with model status ${status}` };
        },
        addRows(more: SparseRows): void {
          model.addRows({
            lower: bound(more.lower),
            upper: bound(more.upper),
            matrix: { format: 'csr', numRows: more.lower.length, numCols: n, starts: more.starts, indices: more.indices, values: more.values },
          });
        },
        changeCosts(from: number, costs: Float64Array): void {
          if (costs.length > 0) model.changeColsCost({ kind: 'range', from, to: from + costs.length - 1 }, costs);
        },
        close(): void {
          model.dispose();
        },
      };
    },
  };
}
