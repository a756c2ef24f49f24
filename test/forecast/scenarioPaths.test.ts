import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { forecastFileScenarioPaths, naiveErrorTemplate, pitTemplate } from '../../src/forecast/paths/dependenceTemplate.js';
import { levelOf, quantileAt } from '../../src/forecast/paths/quantileFunction.js';
import { scenarioPaths } from '../../src/forecast/paths/scenarioPaths.js';
import { SeededStream, daySeed } from '../../src/forecast/paths/seededStream.js';
import { ForecastInputError } from '../../src/forecast/models/errors.js';
import { priceAtLevel } from '../../src/forecast/quantileSet.js';
import { deliveryPeriods } from '../../src/market/calendar.js';
import type { QuantileDay } from '../../src/types.js';
import { syntheticHistory } from './syntheticHistory.js';

const LEVELS = [0.1, 0.5, 0.9];

function flatDay(day: string, prices: readonly number[]): QuantileDay {
  const periods = deliveryPeriods(day, 'Europe/Berlin', 60);
  return { day, levels: LEVELS, periods, prices: periods.map(() => [...prices]) };
}

describe('quantile function of one period (linear inside, linear extrapolation outside, clamped)', () => {
  it('hand-worked: levels 0.1, 0.9 at 10, 30 (slope 25 per unit level) give 8.75 at 0.05 and 32.25 at 0.99, 32 under a cap of 32', () => {
    expect(quantileAt([0.1, 0.9], [10, 30], 0.05)).toBeCloseTo(8.75, 12);
    expect(quantileAt([0.1, 0.9], [10, 30], 0.99)).toBeCloseTo(32.25, 12);
    expect(quantileAt([0.1, 0.9], [10, 30], 0.99, -Infinity, 32)).toBe(32);
    expect(quantileAt([0.5], [7], 0.01)).toBe(7);
  });

  it('agrees with the planner\'s interpolation (quantileSet.ts priceAtLevel) between the levels, and levelOf inverts it', () => {
    const row = fc.array(fc.integer({ min: -50_000, max: 400_000 }), { minLength: 3, maxLength: 3 }).map((a) => a.sort((x, y) => x - y).map((cents) => cents / 100));
    fc.assert(
      fc.property(row, fc.double({ min: 0.1, max: 0.9, noNaN: true }), (prices, u) => {
        const q = quantileAt(LEVELS, prices, u);
        if (Math.abs(q - priceAtLevel(LEVELS, prices, u)) > 1e-9 * (1 + Math.abs(q))) return false;
        const strictly = prices[0]! < prices[1]! && prices[1]! < prices[2]!;
        return !strictly || Math.abs(levelOf(LEVELS, prices, q) - u) < 1e-9;
      }),
      { seed: 5 },
    );
    expect(levelOf(LEVELS, [10, 20, 30], 5)).toBe(0); // extrapolated: 0.1 + (5 - 10) / 10 * 0.4 = -0.1, kept at 0
    expect(levelOf(LEVELS, [10, 20, 30], 40)).toBe(1);
  });
});

describe('Schaake shuffle (Clark et al. 2004): scenarioPaths', () => {
  it('hand-worked: three template days reorder the samples Q(1/6), Q(1/2), Q(5/6) period by period', () => {
    // Quantiles 10, 20, 30 at 0.1, 0.5, 0.9 in every hour: Q(1/6) = 10 + (1/6 - 0.1)/0.4 * 10 = 11.667,
    // Q(1/2) = 20, Q(5/6) = 20 + (5/6 - 0.5)/0.4 * 10 = 28.333. Template days A, B, C: in slot 0 they
    // rank A < B < C, in slot 1 B < C < A; so path A = (11.667, 28.333), B = (20, 11.667), C = (28.333, 20).
    const template = [
      Float64Array.from({ length: 24 }, (_, s) => (s === 0 ? 1 : s === 1 ? 3 : s)),
      Float64Array.from({ length: 24 }, (_, s) => (s === 0 ? 2 : s === 1 ? 1 : s + 0.5)),
      Float64Array.from({ length: 24 }, (_, s) => (s === 0 ? 3 : s === 1 ? 2 : s + 0.25)),
    ];
    const paths = scenarioPaths({ quantileDay: flatDay('2031-03-04', [10, 20, 30]), template, n: 3, seed: 11 });
    const byFirst = [...paths].sort((p, q) => p[0]! - q[0]!);
    const low = 10 + ((1 / 6 - 0.1) / 0.4) * 10;
    const high = 20 + ((5 / 6 - 0.5) / 0.4) * 10;
    expect(byFirst.map((p) => p.slice(0, 2))).toEqual([
      [expect.closeTo(low, 12), expect.closeTo(high, 12)],
      [20, expect.closeTo(low, 12)],
      [expect.closeTo(high, 12), 20],
    ]);
  });

  it('laws: every period holds exactly the n equidistant quantiles, and the paths\' ranks are the template days\' ranks', () => {
    const history = syntheticHistory({ days: 30, periodMinutes: 60, seed: 7 });
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 0, max: 2 ** 31 }), (n, seed) => {
        const stream = new SeededStream(seed);
        const template = Array.from({ length: n }, () => Float64Array.from({ length: 24 }, () => stream.uint32()));
        const day = history.days[20]!;
        const quantileDay: QuantileDay = { day: day.day, levels: LEVELS, periods: day.periods, prices: day.pricePerMwh.map((p) => [p - 5, p, p + 8]) };
        const paths = scenarioPaths({ quantileDay, template, n, seed });
        const marginalsExact = quantileDay.prices.every((row, t) => {
          const sorted = paths.map((p) => p[t]!).sort((a, b) => a - b);
          return sorted.every((v, r) => Math.abs(v - quantileAt(LEVELS, row, (r + 0.5) / n)) <= 1e-9);
        });
        // With n = m every template day is used once, so the paths' rank vectors over the periods are
        // the template days' rank vectors over the slots (a synthetic day has one period per slot).
        const rankVectors = (rows: readonly ArrayLike<number>[]): string[] => {
          const ranks = rows.map(() => new Array<number>(24));
          for (let t = 0; t < 24; t++) {
            [...rows.keys()].sort((a, b) => (rows[a]![t] as number) - (rows[b]![t] as number)).forEach((j, r) => (ranks[j]![t] = r));
          }
          return ranks.map((r) => r.join(',')).sort();
        };
        return marginalsExact && JSON.stringify(rankVectors(paths)) === JSON.stringify(rankVectors(template));
      }),
      { seed: 21, numRuns: 40 },
    );
  });

  it('keeps the rank dependence of the template: the Spearman correlation of two periods across paths is the template\'s', () => {
    const stream = new SeededStream(3);
    const m = 40;
    // Slots 0 and 1 move together in the template (rank correlation 1), slot 2 against slot 0 (-1).
    const template = Array.from({ length: m }, () => {
      const v = stream.uint32();
      return Float64Array.from({ length: 24 }, (_, s) => (s === 2 ? -v : s < 2 ? v + s : stream.uint32()));
    });
    const paths = scenarioPaths({ quantileDay: flatDay('2031-03-04', [10, 20, 30]), template, n: m, seed: 9 });
    const ranks = (t: number): number[] => {
      const column = paths.map((p) => p[t]!);
      const order = column.map((_, j) => j).sort((a, b) => column[a]! - column[b]!);
      const rank = new Array<number>(m);
      order.forEach((j, r) => (rank[j] = r));
      return rank;
    };
    expect(ranks(1)).toEqual(ranks(0));
    expect(ranks(2)).toEqual(ranks(0).map((r) => m - 1 - r));
  });

  it('is deterministic in the seed, cycles the template when n exceeds it, and refuses bad requests', () => {
    const template = [Float64Array.from({ length: 24 }, (_, s) => s), Float64Array.from({ length: 24 }, (_, s) => -s)];
    const request = { quantileDay: flatDay('2031-03-04', [10, 20, 30]), template, n: 5, seed: 4 };
    expect(scenarioPaths(request)).toEqual(scenarioPaths(request));
    expect(scenarioPaths(request)).toHaveLength(5);
    expect(() => scenarioPaths({ ...request, n: 0 })).toThrow(ForecastInputError);
    expect(() => scenarioPaths({ ...request, template: [] })).toThrow(ForecastInputError);
    expect(() => scenarioPaths({ ...request, template: [new Float64Array(3)] })).toThrow(ForecastInputError);
    expect(daySeed(1, 100)).not.toBe(daySeed(1, 101));
  });
});

describe('dependence templates for a quantile file alone plus the history', () => {
  const history = syntheticHistory({ days: 60, periodMinutes: 60, seed: 12 });

  it('PIT template: the level at which each realised price sits in its day\'s forecast (hand-checked at 0.5 and 0.9)', () => {
    const day = history.days[40]!;
    const forecast: QuantileDay = { day: day.day, levels: LEVELS, periods: day.periods, prices: day.pricePerMwh.map((p, t) => (t === 0 ? [p - 10, p - 5, p] : [p - 5, p, p + 5])) };
    const [u] = pitTemplate([{ forecast, realised: day.pricePerMwh }]);
    expect(u![0]).toBeCloseTo(0.9, 12);
    expect(u![5]).toBeCloseTo(0.5, 12);
  });

  it('naive-error template: P(d, s) - P(d - 7, s) of the latest days before the delivery day', () => {
    const template = naiveErrorTemplate(history, history.days[50]!.day, 5);
    expect(template).toHaveLength(5);
    const d = history.days[49]!;
    const week = history.days[42]!;
    expect(template[4]![3]).toBeCloseTo(d.pricePerMwh[3]! - week.pricePerMwh[3]!, 9);
  });

  it('uses the file\'s own past days when it has enough of them, else the history\'s naive errors', () => {
    const vendor = history.days.map((d) => ({ day: d.day, levels: LEVELS, periods: d.periods, prices: d.pricePerMwh.map((p) => [p - 6, p + 1, p + 9]) }));
    const target = vendor[55]!;
    const withPast = forecastFileScenarioPaths({ quantileDay: target, pastForecasts: vendor, history, n: 20, seed: 2 });
    expect(withPast.template).toBe('pit');
    expect(withPast.templateDays).toBe(55);
    expect(withPast.paths).toHaveLength(20);
    const alone = forecastFileScenarioPaths({ quantileDay: target, pastForecasts: [target], history, n: 20, seed: 2 });
    expect(alone.template).toBe('naive-errors');
  });
});
