import { ForecastInputError } from '../models/errors.js';

/** Checks that quantile levels are strictly increasing numbers in (0, 1). */
export function requireLevels(levels: readonly number[]): void {
  if (levels.length === 0) throw new ForecastInputError('levels', 'no quantile levels', 'give at least one level in (0, 1), e.g. 0.05:0.95:0.05');
  levels.forEach((tau, k) => {
    if (!(tau > 0 && tau < 1)) throw new ForecastInputError(`levels[${k}]`, `${tau} is not in (0, 1)`, 'give levels strictly between 0 and 1');
    if (k > 0 && !(tau > (levels[k - 1] as number))) {
      throw new ForecastInputError(`levels[${k}]`, `${tau} does not exceed the level before it`, 'list the levels in increasing order without repeats');
    }
  });
}
