import { InvalidArgumentError } from 'commander';
import { parseDecimalRange } from '../backtest/sweep/decimalRange.js';
import { parseDecimal } from '../io/csvText.js';
import { shownText } from '../errors/shownText.js';

/** Most quantile levels one forecast may have [-] (0.01:0.99:0.01 is 99). */
export const MAX_LEVELS = 99;

/**
 * `--levels`: a range `start:end:step` (exact decimals, end included when on the grid, e.g.
 * `0.05:0.95:0.05`) or a comma-separated list (`0.1,0.5,0.9`); every level in (0, 1), strictly
 * increasing, at most MAX_LEVELS of them. Throws commander's typed error (exit code 2).
 */
export function parseLevelsArg(value: string): number[] {
  const bad = (why: string): never => {
    throw new InvalidArgumentError(`"${shownText(value)}": ${why}; give levels in (0, 1) as a range start:end:step (e.g. 0.05:0.95:0.05) or a list (e.g. 0.1,0.5,0.9)`);
  };
  let levels: number[];
  if (value.includes(':')) {
    const range = parseDecimalRange(value);
    if (range.status === 'bad') return bad(range.message);
    if (range.count > BigInt(MAX_LEVELS)) return bad(`${range.count} levels, more than ${MAX_LEVELS}`);
    levels = Array.from({ length: Number(range.count) }, (_, i) => Number(range.valueText(i)));
  } else {
    levels = value.split(',').map((cell) => {
      const parsed = parseDecimal(cell.trim());
      return 'value' in parsed ? parsed.value : bad(`"${shownText(cell.trim())}" is not a number`);
    });
    if (levels.length > MAX_LEVELS) return bad(`${levels.length} levels, more than ${MAX_LEVELS}`);
  }
  const outside = levels.filter((tau) => !(tau > 0 && tau < 1));
  if (outside.length > 0) return bad(`level${outside.length > 1 ? 's' : ''} ${outside.join(', ')} outside (0, 1)`);
  if (levels.some((tau, k) => k > 0 && !(tau > (levels[k - 1] as number)))) return bad('the levels do not increase strictly');
  return levels;
}
