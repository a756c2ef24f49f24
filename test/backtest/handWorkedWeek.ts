import type { BatteryModel, HistoryDay, MarketSpec, PriceHistory, QuantileDay } from '../../src/types.js';
import type { BacktestInput } from '../../src/backtest/runBacktest.js';
import { hourlyPeriods } from './randomMarket.js';

// A backtest worked by hand through the planner: days of 4 one-hour periods whose best plan is plain to
// see, a missing history day and a missing forecast day. Every number is worked out in the comments.
//
// Battery: 8 MWh nameplate with the window [0, 4] MWh, 4 MW both ways, efficiency 1, no wear, start 0.
// So in one period it can fill or empty the whole window (4 MWh). Forecast levels 0.1, 0.5, 0.9; with
// alpha 0.1 the quantile policy buys at q0.9 and sells at q0.1 (as prices and as limits).

export const market: MarketSpec = Object.freeze({ timeZone: 'UTC', periodMinutes: 60, priceFloor: -100, priceCap: 1000, currency: 'TST', gateClosure: '12:00' });
export const battery: BatteryModel = Object.freeze({
  energyMwh: 8, chargeMw: 4, dischargeMw: 4, chargeEfficiency: 1, dischargeEfficiency: 1, socMinMwh: 0, socMaxMwh: 4,
  socInitialMwh: 0, socFinalMinMwh: undefined, maxFromStoreMwhPerDay: undefined, degradationCostPerMwh: 0,
});

/** q0.1 = median - 2, q0.9 = median + 2. */
function forecastDay(day: string, medians: readonly number[]): QuantileDay {
  return Object.freeze({ day, levels: [0.1, 0.5, 0.9], periods: hourlyPeriods(day, 4), prices: medians.map((m) => [m - 2, m, m + 2]) });
}
function historyDay(day: string, prices: readonly number[], imbalance: readonly number[]): HistoryDay {
  return Object.freeze({ day, periods: hourlyPeriods(day, 4), pricePerMwh: prices, imbalancePricePerMwh: imbalance, exogenous: {} });
}

// Day A, 05-04: buy prices q0.9 = 22, 42, 92, 52, sell prices q0.1 = 18, 38, 88, 48: the plan buys 4 MW in
// hour 0 (limit 22) and sells 4 MW in hour 2 (limit 18): 4 x (88 - 22) = 264, the best single cycle.
// Realised 20, 45, 95, 50: both accepted: -80 + 380 = 300 under either rule. End 0.
// Day C, 05-05: buy 22 in hour 1, sell 98 in hour 3 (4 x 76 = 304). Realised 80, 20, 30, 90: the buy is
// accepted (20 <= 22), the sell is not (90 < 98).
//   follow-plan: -80, then 4 MWh sold at the imbalance 85: +340 -> 260, end 0.
//   follow-accepted: -80, the 4 MWh stay in store: end 4.
// 05-06: no history (listed incomplete). Skipped; the state of charge carries over unchanged.
// Day D, 05-07: buy prices 22, 62, 32, 72, sell prices 18, 58, 28, 68. Realised 25, 60, 30, 70, imbalance 26, 61, 29, 69.
//   follow-plan from 0: two cycles, buy h0 (22) sell h1 (58), buy h2 (32) sell h3 (68): 2 x 4 x 36 = 288.
//     h0 not accepted (25 > 22): bought at imbalance 26: -104; h1 +240; h2 accepted (30 <= 32) -120; h3 +280: 296.
//   follow-accepted from 4 (full, and must end at >= 4): sell h1 (58), buy back h2 (32): 4 x 26 = 104.
//     h1 accepted (60 >= 58): +240, h2 accepted: -120: 120, end 4.
// 05-08: no forecast. Skipped.
// Perfect foresight (realised prices, from 0, ends at 0): A buy h0 sell h2: 4 x 75 = 300; C buy h1 sell h3:
// 4 x 70 = 280; D buy h0 sell h1, buy h2 sell h3: 4 x 35 + 4 x 40 = 300. Total 880.

export const history: PriceHistory = Object.freeze({
  days: [
    historyDay('2026-05-04', [20, 45, 95, 50], [21, 44, 96, 49]),
    historyDay('2026-05-05', [80, 20, 30, 90], [81, 27, 31, 85]),
    historyDay('2026-05-07', [25, 60, 30, 70], [26, 61, 29, 69]),
    historyDay('2026-05-08', [25, 60, 30, 70], [26, 61, 29, 69]),
  ],
  exogenousNames: [],
  incompleteDays: [{ day: '2026-05-06', reason: '1 of 4 periods missing (2026-05-06T02:00:00Z)' }],
});
const forecast = Object.freeze({
  days: new Map([
    ['2026-05-04', forecastDay('2026-05-04', [20, 40, 90, 50])],
    ['2026-05-05', forecastDay('2026-05-05', [80, 20, 30, 100])],
    ['2026-05-06', forecastDay('2026-05-06', [20, 40, 90, 50])],
    ['2026-05-07', forecastDay('2026-05-07', [20, 60, 30, 70])],
  ]),
  incompleteDays: [],
});
export const input: BacktestInput = Object.freeze({ market, battery, history, forecast, from: '2026-05-04', to: '2026-05-08' });

