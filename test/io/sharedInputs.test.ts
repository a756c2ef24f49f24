import { describe, expect, it } from 'vitest';
import { inputDataSpan } from '../../src/app/inputDataSpan.js';
import { parsePriceHistory } from '../../src/io/readPriceHistory.js';
import { readBacktestInputs } from '../../src/io/readBacktestInputs.js';
import { parseQuantileForecast } from '../../src/io/readQuantileForecast.js';
import { shareInputs, sharedInputData } from '../../src/io/sharedInputs.js';

// A worker thread gets the inputs as SharedInputs through a structured clone (postMessage's algorithm,
// which hands over the SharedArrayBuffers themselves) and rebuilds them; it must get the very data the
// parent read, Map order, -0 and every bit of every price included.
const demo = {
  market: 'scenarios/halvorn/market.json',
  battery: 'scenarios/halvorn/battery.json',
  history: 'scenarios/halvorn/history.csv.gz',
  forecast: 'scenarios/halvorn/quantiles.csv.gz',
};

describe('shareInputs / sharedInputData', () => {
  it('rebuilds the demo inputs in another thread exactly: two months over a clock change, imbalance and exogenous columns', () => {
    const data = inputDataSpan(readBacktestInputs(demo), '2026-03-01', '2026-04-30');
    const shared = shareInputs(data);
    expect(shared.history.pricePerMwh.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(sharedInputData(shared)).toBe(data); // the thread that shared them keeps its own
    const elsewhere = sharedInputData(structuredClone(shared));
    expect(elsewhere).not.toBe(data);
    expect(elsewhere).toEqual(data);
    expect([...elsewhere.forecast.days.keys()]).toEqual([...data.forecast.days.keys()]);
    expect(elsewhere.history.days.map((d) => d.periods.length)).toContain(92);
  });

  it('keeps a history without imbalance prices, empty inputs and negative zero', () => {
    const market = { timeZone: 'Europe/Berlin', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV' } as const;
    const rows = Array.from({ length: 24 }, (_, h) => `2026-06-01T${String(h).padStart(2, '0')}:00:00+02:00,${h === 0 ? '-0' : h - 3.25},${h * 10}`);
    const history = parsePriceHistory(`period_start,price,wind_mw\n${rows.join('\n')}\n`, 'h.csv', market as never);
    const forecastRows = Array.from({ length: 24 }, (_, h) => `2026-06-01T${String(h).padStart(2, '0')}:00:00+02:00,${h - 10},${h},${h === 5 ? '-0' : h + 10}`);
    const forecast = parseQuantileForecast(`period_start,q0.1,q0.5,q0.9\n${forecastRows.join('\n')}\n`, 'f.csv', market as never);
    const data = { market: market as never, batterySpec: { energyMwh: 1 } as never, history, forecast };
    const elsewhere = sharedInputData(structuredClone(shareInputs(data)));
    expect(elsewhere).toEqual(data);
    expect(Object.is(elsewhere.history.days[0]?.pricePerMwh[0], -0)).toBe(true);
    expect(elsewhere.history.days[0]?.imbalancePricePerMwh).toBeNull();
    const empty = { ...data, history: { ...history, days: [] }, forecast: { ...forecast, days: new Map() } };
    expect(sharedInputData(structuredClone(shareInputs(empty)))).toEqual(empty);
  });
});
