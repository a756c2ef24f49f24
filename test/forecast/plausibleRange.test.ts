import { describe, expect, it } from 'vitest';
import { plausibleRanges, withinRange } from '../../src/forecast/plausibleRange.js';
import type { PriceHistory } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

/** A history of the given daily prices (one period a day is enough for the ranges). */
function pricesOnly(days: number[][]): PriceHistory {
  const base = syntheticHistory({ days: days.length, periodMinutes: 60, seed: 3 });
  return { ...base, days: base.days.map((day, d) => ({ ...day, pricePerMwh: days[d] as number[] })) };
}

describe('plausible range of a forecast (auto passes over runaway extrapolations)', () => {
  it('is the range of the days before, widened by its own span on both sides (worked by hand)', () => {
    const ranges = plausibleRanges(pricesOnly([[10, 30], [5, 50], [-20, 40]]));
    expect(ranges[0]).toBeNull();
    // Day 1: prices before 10..30, span 20 -> [-10, 50]. Day 2: 5..50, span 45 -> [-40, 95].
    expect(ranges[1]).toEqual({ low: -10, high: 50 });
    expect(ranges[2]).toEqual({ low: -40, high: 95 });
  });

  it('reads only the days before: changing a day and every day after it leaves its range as it was', () => {
    const history = syntheticHistory({ days: 40, periodMinutes: 60, seed: 11 });
    const ranges = plausibleRanges(history);
    const changed = { ...history, days: history.days.map((day, d) => (d < 25 ? day : { ...day, pricePerMwh: day.pricePerMwh.map((p) => 1000 * p - 5000) })) };
    expect(plausibleRanges(changed).slice(0, 26)).toEqual(ranges.slice(0, 26));
  });

  it('accepts a forecast inside the range, bounds included, and rejects one with any quantile outside', () => {
    const range = { low: -10, high: 50 };
    expect(withinRange([[-10, 0, 50], [1, 2, 3]], range)).toBe(true);
    expect(withinRange([[-10, 0, 50], [1, 2, 1e6]], range)).toBe(false);
    expect(withinRange([[-10.5, 0, 5]], range)).toBe(false);
    expect(withinRange([[-1e9, 1e9]], null)).toBe(true);
  });
});
