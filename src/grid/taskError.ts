import { InputError, type InputProblem } from '../errors/inputError.js';

/** An error as it crosses from a worker thread: plain data (a class does not survive the crossing). */
export interface SerialisedError {
  readonly name: string;
  readonly message: string;
  readonly stack?: string;
  /** Set when the task threw an InputError (bad input for this setting): the CLI exits with code 2. */
  readonly problems?: readonly InputProblem[];
}

/** An InputError, also one from another copy of the class (a task module may bundle its own). */
function isInputError(err: unknown): err is InputError {
  return err instanceof Error && err.name === 'InputError' && Array.isArray((err as Partial<InputError>).problems);
}

export function serialiseError(err: unknown): SerialisedError {
  if (isInputError(err)) return { name: err.name, message: err.message, problems: err.problems };
  if (err instanceof Error) return err.stack === undefined ? { name: err.name, message: err.message } : { name: err.name, message: err.message, stack: err.stack };
  return { name: 'Error', message: String(err) };
}

/**
 * The error a grid reports for a failed setting: an InputError as it was (it already says what is
 * wrong and what to do), anything else as an Error naming the setting, with the original stack.
 */
export function settingError(err: SerialisedError, key: string): Error {
  if (err.problems !== undefined) return new InputError(err.problems);
  const error = new Error(`the sweep task failed for setting ${key}: ${err.name}: ${err.message}`);
  if (err.stack !== undefined) error.stack = `${error.message}\n  task stack: ${err.stack}`;
  return error;
}
