import { describe, expect, it } from 'vitest';
import { quantilePathCount, quantileScenarioPaths, runScenarioPaths } from '../../../src/app/scenarios/quantilePaths.js';
import { scenarioSettingsSchema } from '../../../src/app/scenarios/scenarioSettings.js';
import { parsePriceHistory } from '../../../src/io/readPriceHistory.js';
import { parseQuantileForecast } from '../../../src/io/readQuantileForecast.js';
import { InputError } from '../../../src/errors/inputError.js';
import { daysBetween } from '../../../src/market/calendar.js';
import { marketSpecSchema } from '../../../src/market/marketSpec.js';

// Paths made from a quantile file and the history (no paths file), on an invented hourly market of
// 40 seeded days. The law checked is the gate-closure rule, common practice for a day-ahead auction: the
// paths of delivery day D may use the forecast of D and what was known the day before (earlier forecast
// days, history before D), nothing of D's prices nor of later forecasts.

const market = marketSpecSchema.parse({ timeZone: 'UTC', periodMinutes: 60, priceFloor: -500, priceCap: 3000, currency: 'TST', gateClosure: '12:00' });
const LEVELS = [0.1, 0.25, 0.5, 0.75, 0.9];
const DAYS = daysBetween('2026-03-01', '2026-04-09');
const DAY = '2026-04-02';

/** Lehmer generator, uniform in (0, 1). */
function lehmer(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

/** The forecast and history CSV texts; `changed(day)` true: that day's rows get other (seeded) numbers. */
function inputs(changed: (day: string) => { forecast: boolean; history: boolean } = () => ({ forecast: false, history: false })) {
  const random = lehmer(4711);
  const other = lehmer(90210);
  const forecast = [`period_start,${LEVELS.map((l) => `q${l}`).join(',')}`];
  const history = ['period_start,price'];
  for (const day of DAYS) {
    const level = 40 + 30 * random();
    const change = changed(day);
    for (let h = 0; h < 24; h++) {
      const start = `${day}T${String(h).padStart(2, '0')}:00:00+00:00`;
      const median = level + 30 * Math.sin((Math.PI * h) / 12) + (change.forecast ? 50 * other() : 0);
      const spread = 6 + 10 * random();
      forecast.push(`${start},${LEVELS.map((l) => (median + spread * 2.5 * (l - 0.5)).toFixed(2)).join(',')}`);
      const price = median + spread * (random() - 0.5) * 2 + (change.history ? 80 * other() - 40 : 0);
      history.push(`${start},${price.toFixed(2)}`);
    }
  }
  return { forecast: `${forecast.join('\n')}\n`, history: `${history.join('\n')}\n` };
}

function pathsOf(text: { forecast: string; history: string }, options: { days?: readonly string[]; seed?: number } = {}) {
  const forecast = parseQuantileForecast(text.forecast, 'quantiles.csv', market);
  const history = parsePriceHistory(text.history, 'history.csv', market);
  return quantileScenarioPaths({ forecastDays: forecast.days, history, market, days: options.days ?? [DAY], planningPaths: 15, seed: options.seed ?? 1 });
}

const bytes = (made: ReturnType<typeof pathsOf>, day = DAY): string => JSON.stringify(made.paths.days.get(day));

describe('paths made from the quantile file and the history', () => {
  it('gives each planned day three times the planning paths, over every period, with the source and seed named', () => {
    const made = pathsOf(inputs());
    const paths = made.paths.days.get(DAY) as readonly (readonly number[])[];
    expect(paths).toHaveLength(quantilePathCount(15));
    expect(paths.every((p) => p.length === 24 && p.every(Number.isFinite))).toBe(true);
    // 32 forecast days before 2026-04-02 with their prices: the PIT template (at least 28 of them).
    expect(made.source).toBe('quantile file + history, Schaake shuffle with the PIT template of 32 past days, 45 paths per day, seed 1');
  });

  it('are deterministic for a seed, and another seed gives other paths', () => {
    expect(bytes(pathsOf(inputs()))).toBe(bytes(pathsOf(inputs())));
    expect(bytes(pathsOf(inputs(), { seed: 2 }))).not.toBe(bytes(pathsOf(inputs())));
  });

  it('do not depend on later forecast days nor on the history of the delivery day or later', () => {
    const base = bytes(pathsOf(inputs()));
    expect(bytes(pathsOf(inputs((day) => ({ forecast: day > DAY, history: day >= DAY }))))).toBe(base);
    // The check can fail: the same change one day earlier moves the paths (a template day changed).
    expect(bytes(pathsOf(inputs((day) => ({ forecast: day > '2026-03-31', history: day >= '2026-03-31' }))))).not.toBe(base);
  });

  it('of a day do not depend on the span planned around it', () => {
    const alone = pathsOf(inputs());
    const inSpan = pathsOf(inputs(), { days: ['2026-03-30', '2026-03-31', DAY, '2026-04-03'] });
    expect(bytes(inSpan)).toBe(bytes(alone));
    expect([...inSpan.paths.days.keys()]).toEqual(['2026-03-30', '2026-03-31', DAY, '2026-04-03']);
  });

  it('fall back to the seasonal naive errors of the history with fewer than 28 past forecast days', () => {
    const made = pathsOf(inputs(), { days: ['2026-03-20'] });
    // 19 days before 2026-03-20, of which the 12 from 2026-03-08 have a day 7 days before them.
    expect(made.source).toBe('quantile file + history, Schaake shuffle with the seasonal naive errors template of 12 past days, 45 paths per day, seed 1');
  });

  it('are refused without a paths file and without a history, naming both ways out', () => {
    const forecast = parseQuantileForecast(inputs().forecast, 'quantiles.csv', market);
    const settings = scenarioSettingsSchema.parse({});
    const run = () => runScenarioPaths(settings, { market, history: null, forecastDays: forecast.days, days: [DAY], policies: ['auto'] });
    expect(run).toThrow(InputError);
    expect(run).toThrow(/--paths FILE.*--history FILE/);
  });

  it('are refused when no day before the first one planned gives a template', () => {
    expect(() => pathsOf(inputs(), { days: ['2026-03-03'] })).toThrow(/no past day to learn the dependence/);
  });
});
