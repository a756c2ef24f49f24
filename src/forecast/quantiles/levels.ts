import { ForecastInputError } from '../models/errors.js';

/**
 * The levels a quantile forecast may have [-]: 0.001 to 0.999. Finer tails than the 0.1% quantile are
 * not estimated from the few thousand days a history holds, and a level such as 1e-320 is no
 * probability anyone means.
 */
export const LEVEL_RANGE = Object.freeze([0.001, 0.999] as const);

/** Whether `tau` is a level a forecast may have (LEVEL_RANGE). */
export function isLevel(tau: number): boolean {
  return tau >= LEVEL_RANGE[0] && tau <= LEVEL_RANGE[1];
}

/** The levels' interval for messages, e.g. `[0.001, 0.999]`. */
export const LEVEL_RANGE_TEXT = `[${LEVEL_RANGE[0]}, ${LEVEL_RANGE[1]}]`;

/** Checks that quantile levels are strictly increasing numbers in LEVEL_RANGE. */
export function requireLevels(levels: readonly number[]): void {
  if (levels.length === 0) throw new ForecastInputError('levels', 'no quantile levels', `give at least one level in ${LEVEL_RANGE_TEXT}, e.g. 0.05:0.95:0.05`);
  levels.forEach((tau, k) => {
    if (!isLevel(tau)) throw new ForecastInputError(`levels[${k}]`, `${tau} is not in ${LEVEL_RANGE_TEXT}`, `give levels in ${LEVEL_RANGE_TEXT}`);
    if (k > 0 && !(tau > (levels[k - 1] as number))) {
      throw new ForecastInputError(`levels[${k}]`, `${tau} does not exceed the level before it`, 'list the levels in increasing order without repeats');
    }
  });
}
