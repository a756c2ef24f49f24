/**
 * Typed error for an invalid argument of a pure function.
 *
 * The message follows one template that names the argument, says what it must be (which is also
 * what to do about it) and shows the value received:
 *
 *   invalid argument 'h': must be an integer in [1, n - 1] = [1, 9]; got 12
 *
 * It is a RangeError, so callers that only know the standard hierarchy still catch it; `argument`
 * holds the argument's name for programs (the CLI maps it to exit code 2).
 *
 * @example
 * try { mean([]); } catch (e) { if (e instanceof ArgumentError) console.log(e.argument); } // 'values'
 */
export class ArgumentError extends RangeError {
  /** Name of the offending argument, e.g. `cashFlows` or `options.step`. */
  readonly argument: string;

  constructor(argument: string, requirement: string, received: unknown) {
    super(`invalid argument '${argument}': must be ${requirement}; got ${describe(received)}`);
    this.name = 'ArgumentError';
    this.argument = argument;
  }
}

function describe(value: unknown): string {
  if (Array.isArray(value)) {
    return value.length <= 6 ? `[${value.map(String).join(', ')}]` : `an array of length ${value.length}`;
  }
  return typeof value === 'string' ? JSON.stringify(value) : String(value);
}
