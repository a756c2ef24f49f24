/**
 * Typed errors of the forecasting layer. The message names the input, the field and what to do;
 * `field` is for programs (the CLI maps these errors to exit code 2).
 */
export class ForecastInputError extends RangeError {
  constructor(
    /** The offending input, e.g. `history.days[12].periods` or `options.windowsDays`. */
    readonly field: string,
    problem: string,
    fix: string,
  ) {
    super(`${field}: ${problem}; ${fix}`);
    this.name = 'ForecastInputError';
  }
}

/** The history before the delivery day is too short for the method asked for. */
export class InsufficientHistoryError extends ForecastInputError {
  constructor(
    readonly day: string,
    what: string,
    readonly needed: number,
    readonly available: number,
  ) {
    super(
      `history before ${day}`,
      `${what} needs at least ${needed} days, found ${available}`,
      'start the forecasts later, give a longer history, or lower the window lengths in the options',
    );
    this.name = 'InsufficientHistoryError';
  }
}
