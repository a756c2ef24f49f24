/**
 * Bad input: every problem found in one file (or in the command line), each naming where it is,
 * what is wrong and what to do. The CLI prints them one per line and exits with code 2.
 *
 * Line format: `FILE:LINE: FIELD: what is wrong; what to do` (LINE and FIELD omitted when unknown).
 */
export interface InputProblem {
  /** File the problem is in, as the user named it, or `command line`. */
  readonly file: string;
  /** 1-based line number, where one applies. */
  readonly line?: number;
  /** Field, column or option name, where one applies. */
  readonly field?: string;
  /** What is wrong. */
  readonly message: string;
  /** What to do about it. */
  readonly fix: string;
}

export function formatProblem(problem: InputProblem): string {
  const where = problem.line === undefined ? problem.file : `${problem.file}:${problem.line}`;
  const field = problem.field === undefined ? '' : ` ${problem.field}:`;
  return `${where}:${field} ${problem.message}; ${problem.fix}`;
}

/** Thrown at the edges (readers, argument parsers) when input is bad; carries all problems found. */
export class InputError extends Error {
  readonly problems: readonly InputProblem[];

  constructor(problems: readonly InputProblem[]) {
    super(problems.map(formatProblem).join('\n'));
    this.name = 'InputError';
    this.problems = problems;
  }
}

/** Throws an InputError when `problems` is not empty. */
export function throwIfProblems(problems: readonly InputProblem[]): void {
  if (problems.length > 0) throw new InputError(problems);
}

/** Collects problems, then throws them together. */
export class ProblemList {
  readonly items: InputProblem[] = [];
  /** Stop collecting after this many; a file of garbage should not print a million lines. */
  constructor(readonly limit = 200) {}

  add(problem: InputProblem): void {
    if (this.items.length < this.limit) this.items.push(problem);
  }

  get full(): boolean {
    return this.items.length >= this.limit;
  }

  throwIfAny(): void {
    throwIfProblems(this.items);
  }
}
