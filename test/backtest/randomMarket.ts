import fc from 'fast-check';
import type { BatteryModel, DeliveryPeriod, HistoryDay, MarketSpec, PriceHistory, QuantileDay } from '../../src/types.js';
import type { BacktestInput } from '../../src/backtest/runBacktest.js';
import { shiftDay } from '../../src/market/calendar.js';

/**
 * Small random markets for the laws of the backtest: a few short days of hourly periods, a three-level
 * quantile forecast (0.1, 0.5, 0.9) around a median, realised prices scattered around the median inside
 * [floor, cap], and a random battery. Inputs only: never check values.
 */

export const LEVELS = Object.freeze([0.1, 0.5, 0.9]);
export const FIRST_DAY = '2026-03-02';

export type RandomMarket = BacktestInput;

const periodArb = fc.record({
  median: fc.double({ min: -60, max: 250, noNaN: true }),
  below: fc.double({ min: 0, max: 60, noNaN: true }),
  above: fc.double({ min: 0, max: 80, noNaN: true }),
  surprise: fc.double({ min: -1.5, max: 1.5, noNaN: true }),
});

/** A random battery: split efficiencies, a window, a start inside it, maybe a cycle cap, a wear cost. */
export const batteryModelArb: fc.Arbitrary<BatteryModel> = fc
  .record({
    energyMwh: fc.double({ min: 1, max: 20, noNaN: true }),
    chargeMw: fc.double({ min: 0.5, max: 10, noNaN: true }),
    dischargeMw: fc.double({ min: 0.5, max: 10, noNaN: true }),
    etaC: fc.double({ min: 0.7, max: 1, noNaN: true }),
    etaD: fc.double({ min: 0.7, max: 1, noNaN: true }),
    window: fc.tuple(fc.double({ min: 0, max: 0.3, noNaN: true }), fc.double({ min: 0.6, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })),
    cycles: fc.option(fc.double({ min: 0.3, max: 3, noNaN: true }), { nil: undefined }),
    deg: fc.double({ min: 0, max: 10, noNaN: true }),
  })
  .map((b) => {
    const [minFrac, maxFrac, startFrac] = b.window;
    const socMinMwh = minFrac * b.energyMwh;
    const socMaxMwh = maxFrac * b.energyMwh;
    return Object.freeze({
      energyMwh: b.energyMwh, chargeMw: b.chargeMw, dischargeMw: b.dischargeMw, chargeEfficiency: b.etaC, dischargeEfficiency: b.etaD,
      socMinMwh, socMaxMwh, socInitialMwh: socMinMwh + startFrac * (socMaxMwh - socMinMwh), socFinalMinMwh: undefined,
      maxFromStoreMwhPerDay: b.cycles === undefined ? undefined : b.cycles * (socMaxMwh - socMinMwh), degradationCostPerMwh: b.deg,
    });
  });

/** A random market of `days` days with 4 to 8 hourly periods each and an imbalance penalty in [0, 40]. */
export function randomMarketArb(days: number): fc.Arbitrary<RandomMarket> {
  return fc
    .record({
      periods: fc.integer({ min: 4, max: 8 }),
      draws: fc.array(fc.array(periodArb, { minLength: 8, maxLength: 8 }), { minLength: days, maxLength: days }),
      battery: batteryModelArb,
      penalty: fc.double({ min: 0, max: 40, noNaN: true }),
    })
    .map(({ periods, draws, battery, penalty }) => {
      const market: MarketSpec = Object.freeze({
        timeZone: 'UTC', periodMinutes: 60, priceFloor: -100, priceCap: 1000, currency: 'TST', gateClosure: '12:00',
        imbalance: Object.freeze({ kind: 'clearing-plus-penalty' as const, penaltyPerMwh: penalty }),
      });
      const historyDays: HistoryDay[] = [];
      const forecastDays = new Map<string, QuantileDay>();
      draws.forEach((dayDraws, d) => {
        const day = shiftDay(FIRST_DAY, d);
        const ps = hourlyPeriods(day, periods);
        const cells = dayDraws.slice(0, periods);
        const clamp = (p: number) => Math.min(market.priceCap, Math.max(market.priceFloor, p));
        const prices = cells.map((c) => [clamp(c.median - c.below), clamp(c.median), clamp(c.median + c.above)]);
        const realised = cells.map((c) => clamp(c.median + c.surprise * (c.surprise < 0 ? c.below : c.above)));
        forecastDays.set(day, Object.freeze({ day, levels: LEVELS, periods: ps, prices: Object.freeze(prices.map((r) => Object.freeze(r))) }));
        historyDays.push(Object.freeze({ day, periods: ps, pricePerMwh: Object.freeze(realised), imbalancePricePerMwh: null, exogenous: {} }));
      });
      return {
        market,
        battery,
        history: Object.freeze({ days: Object.freeze(historyDays), exogenousNames: [], incompleteDays: [] }),
        forecast: Object.freeze({ days: forecastDays, incompleteDays: [] }),
        from: FIRST_DAY,
        to: shiftDay(FIRST_DAY, days - 1),
      };
    });
}

/** `count` hourly periods from midnight UTC (a short synthetic day). */
export function hourlyPeriods(day: string, count: number): DeliveryPeriod[] {
  const startMs = Date.parse(`${day}T00:00:00Z`);
  return Array.from({ length: count }, (_, t) => {
    const ms = startMs + t * 3_600_000;
    return Object.freeze({ start: new Date(ms).toISOString().replace('.000Z', 'Z'), end: new Date(ms + 3_600_000).toISOString().replace('.000Z', 'Z'), startMs: ms });
  });
}

/** The same market with every price (floor, cap, forecast, realised, penalty, wear) multiplied by k. */
/**
 * Whether scalePrices(m, k) scales every number exactly and keeps the solver's arithmetic away from
 * subnormal numbers: every price, the wear cost and the penalty is 0 or at least 1e-290 in size,
 * before and after scaling (fast-check's doubles include subnormals such as 5e-324, which lose bits
 * when scaled; IEEE 754-2019, section 3.4).
 */
export function scalesExactly(m: RandomMarket, k: number): boolean {
  const normal = (x: number): boolean => x === 0 || (Math.abs(x) >= 1e-290 && Math.abs(k * x) >= 1e-290 && Number.isFinite(k * x));
  const values = [
    m.market.priceFloor,
    m.market.priceCap,
    m.market.imbalance?.penaltyPerMwh ?? 0,
    m.battery.degradationCostPerMwh,
    ...m.history.days.flatMap((d) => d.pricePerMwh),
    ...[...m.forecast.days.values()].flatMap((q) => q.prices.flat()),
  ];
  return values.every(normal);
}

export function scalePrices(m: RandomMarket, k: number): RandomMarket {
  const penalty = m.market.imbalance?.penaltyPerMwh ?? 0;
  const market: MarketSpec = { ...m.market, priceFloor: k * m.market.priceFloor, priceCap: k * m.market.priceCap, imbalance: { kind: 'clearing-plus-penalty', penaltyPerMwh: k * penalty } };
  const forecastDays = new Map([...m.forecast.days].map(([day, q]) => [day, { ...q, prices: q.prices.map((row) => row.map((p) => k * p)) }]));
  return {
    ...m,
    market,
    battery: { ...m.battery, degradationCostPerMwh: k * m.battery.degradationCostPerMwh },
    history: { ...m.history, days: m.history.days.map((d) => ({ ...d, pricePerMwh: d.pricePerMwh.map((p) => k * p) })) },
    forecast: { days: forecastDays, incompleteDays: [] },
  };
}
