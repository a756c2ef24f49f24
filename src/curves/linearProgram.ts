/**
 * The small interface through which the curve program (curveProgram.ts) uses a linear-programming
 * solver, so that the domain stays synchronous and free of packages: the app layer loads a solver
 * (HiGHS, app/highsSolver.ts) and hands it down. A session keeps its model between solves, so rows
 * can be added and the model solved again from the last basis (lazy constraints).
 */

/** Rows in compressed sparse row form: row i holds indices[starts[i] .. starts[i+1]) with values. */
export interface SparseRows {
  /** Row lower bounds; -Infinity for none. */
  readonly lower: Float64Array;
  /** Row upper bounds; +Infinity for none. */
  readonly upper: Float64Array;
  /** Length rows + 1, starts[0] = 0. */
  readonly starts: Int32Array;
  readonly indices: Int32Array;
  readonly values: Float64Array;
}

/** maximise cost . x subject to lower <= A x <= upper (rows) and columnLower <= x <= columnUpper. */
export interface LinearProgram {
  readonly columnCost: Float64Array;
  /** -Infinity for a free column. */
  readonly columnLower: Float64Array;
  readonly columnUpper: Float64Array;
  readonly rows: SparseRows;
}

export type LpOutcome =
  | { readonly status: 'optimal'; readonly objective: number; readonly columns: Float64Array }
  | { readonly status: 'infeasible' | 'unbounded' | 'failed'; readonly detail: string };

/** A model held by a solver between solves. */
export interface LpSession {
  /** Solves the model as it stands (maximisation). */
  solve(): LpOutcome;
  /** Adds rows over the existing columns. */
  addRows(rows: SparseRows): void;
  /** Sets the costs of the columns from..from + costs.length - 1 (the next solve starts from the last basis). */
  changeCosts(from: number, costs: Float64Array): void;
  /** Frees what the solver holds for this model. */
  close(): void;
}

/** A linear-programming solver as the domain sees it. */
export interface SparseLpSolver {
  /** For outputs, e.g. `highs 1.11.0 (dual simplex)`. */
  readonly name: string;
  open(program: LinearProgram): LpSession;
}

/** Builds SparseRows row by row. */
export class RowBuilder {
  private readonly lower: number[] = [];
  private readonly upper: number[] = [];
  private readonly starts: number[] = [0];
  private readonly indices: number[] = [];
  private readonly values: number[] = [];

  /** Adds lower <= sum_k values[k] x[indices[k]] <= upper; an index must not repeat within a row. */
  add(indices: ArrayLike<number>, values: ArrayLike<number>, lower: number, upper: number): void {
    for (let k = 0; k < indices.length; k++) {
      this.indices.push(indices[k] as number);
      this.values.push(values[k] as number);
    }
    this.starts.push(this.indices.length);
    this.lower.push(lower);
    this.upper.push(upper);
  }

  get count(): number {
    return this.lower.length;
  }

  build(): SparseRows {
    return {
      lower: Float64Array.from(this.lower),
      upper: Float64Array.from(this.upper),
      starts: Int32Array.from(this.starts),
      indices: Int32Array.from(this.indices),
      values: Float64Array.from(this.values),
    };
  }
}
