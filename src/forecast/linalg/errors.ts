/**
 * Typed errors of the linear-algebra solvers. Each names the problem and what to do about it; `reason`
 * is for programs.
 */
export class SolverError extends Error {
  constructor(
    readonly reason: 'singular-design' | 'iteration-limit' | 'unbounded',
    message: string,
  ) {
    super(message);
    this.name = 'SolverError';
  }
}
