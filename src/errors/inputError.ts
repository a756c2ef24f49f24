import { shownText } from './shownText.js';

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

/**
 * One problem as one line of text. Every part is passed through shownText, so a message that quotes a
 * file's garbage can neither span lines nor print control characters.
 */
export function formatProblem(problem: InputProblem): string {
  const file = shownText(problem.file, 500);
  const where = problem.line === undefined ? file : `${file}:${problem.line}`;
  const field = problem.field === undefined ? '' : ` ${shownText(problem.field, 80)}:`;
  return `${where}:${field} ${shownText(problem.message, 1000)}; ${shownText(problem.fix, 500)}`;
}

/** Thrown at the edges (readers, argument parsers) when input is bad; carries all problems found. */
export class InputError extends Error {
  readonly problems: readonly InputProblem[];
  /**
   * What was kept, when the run stopped after writing something that a second run picks up (a grid's
   * journal on a full disk), one line; undefined when nothing was written (the CLI then says so).
   */
  readonly kept: string | undefined;

  constructor(problems: readonly InputProblem[], options: { readonly kept?: string } = {}) {
    super(problems.map(formatProblem).join('\n'));
    this.name = 'InputError';
    this.problems = problems;
    this.kept = options.kept;
  }
}

/** Throws an InputError when `problems` is not empty. */
export function throwIfProblems(problems: readonly InputProblem[]): void {
  if (problems.length > 0) throw new InputError(problems);
}

/**
 * Collects problems, then throws them together. After `limit` problems the rest are only counted, and
 * a last line says how many were left out, so a file of garbage never prints a million lines.
 */
export class ProblemList {
  readonly items: InputProblem[] = [];
  /** Problems found beyond `limit`, counted but not kept. */
  private dropped = 0;

  constructor(readonly limit = 200) {}

  add(problem: InputProblem): void {
    if (this.items.length < this.limit) this.items.push(problem);
    else this.dropped++;
  }

  get full(): boolean {
    return this.items.length >= this.limit;
  }

  throwIfAny(): void {
    const last = this.items[this.items.length - 1];
    if (last === undefined) return;
    if (this.dropped === 0 && !this.full) throw new InputError(this.items);
    const more = this.dropped > 0 ? `${this.dropped} more problems were found and not shown` : `the list stops at ${this.limit} problems; there may be more`;
    throw new InputError([...this.items, { file: last.file, message: more, fix: `fix the first ${this.limit} and run again; so many usually means a wrong file, column order or market spec` }]);
  }
}

/**
 * Runs a reader and keeps its problems instead of throwing them, so that several files can be checked
 * in one run and all their problems listed together. Returns undefined when the reader found problems.
 */
export function gatherProblems<T>(problems: InputProblem[], read: () => T): T | undefined {
  try {
    return read();
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    problems.push(...err.problems);
    return undefined;
  }
}
