/**
 * Public types of quantbid, in one place. Every field says its unit and default. The spec types
 * (MarketSpec, BatterySpec) are the outputs of their zod schemas (market/marketSpec.ts,
 * battery/batterySpec.ts), where their fields are documented; they are re-exported here.
 *
 * Conventions used everywhere:
 * - power in MW, energy in MWh, price in currency/MWh (the currency is a label in the market spec);
 * - charge power `chargeMw` >= 0 takes energy from the grid, discharge power `dischargeMw` >= 0 gives
 *   energy to the grid; both are held constant over a delivery period;
 * - timestamps are ISO 8601 strings with an offset, e.g. `2027-03-28T02:00:00+02:00`.
 */

export type { ImbalanceRule, MarketSpec } from './market/marketSpec.js';
export type { DeliveryPeriod } from './market/deliveryPeriod.js';
export type { BatterySpec } from './battery/batterySpec.js';
export type { BatteryModel } from './battery/batteryModel.js';
import type { BatteryModel } from './battery/batteryModel.js';
import type { DeliveryPeriod } from './market/deliveryPeriod.js';

/** One delivery day's quantile forecast: prices[t][k] at levels[k], non-decreasing in k. */
export interface QuantileDay {
  /** Delivery day, YYYY-MM-DD in the market zone. */
  readonly day: string;
  /** Levels tau in (0, 1), strictly increasing. */
  readonly levels: readonly number[];
  /** Period starts, one per delivery period of the day, in order. */
  readonly periods: readonly DeliveryPeriod[];
  /** prices[t][k]: price at levels[k] for period t [currency/MWh]. */
  readonly prices: readonly (readonly number[])[];
}

/**
 * The day problem the planner solves (docs/design.md section 4), in physical units.
 * Prices are the ones the objective uses; limits are set separately.
 */
export interface DayProblem {
  /** Period length dt [h]. */
  readonly periodHours: number;
  /** Price paid per MWh bought in each period [currency/MWh]; length T. */
  readonly buyPricePerMwh: readonly number[];
  /** Price received per MWh sold in each period [currency/MWh]; length T. */
  readonly sellPricePerMwh: readonly number[];
  readonly battery: BatteryModel;
  /** State of charge at the start of the day [MWh]. */
  readonly socStartMwh: number;
  /** Floor on the state of charge at the end of the day [MWh]. */
  readonly socEndMinMwh: number;
  /** Value per MWh left in store at the end of the day [currency/MWh], default 0. */
  readonly terminalValuePerMwh?: number;
}

/** A schedule: charge, discharge and state of charge per period. */
export interface Schedule {
  /** Charge power per period [MW], >= 0. */
  readonly chargeMw: readonly number[];
  /** Discharge power per period [MW], >= 0; never both > 0 in one period. */
  readonly dischargeMw: readonly number[];
  /** State of charge at the end of each period [MWh]. */
  readonly socMwh: readonly number[];
}

/** Outcome of solving a day problem: a status union, never an empty schedule. */
export type DayOutcome =
  | {
      readonly status: 'optimal';
      readonly schedule: Schedule;
      /** Objective value at the prices of the problem [currency]. */
      readonly objective: number;
      /** Which method produced it, and the branch-and-bound nodes spent on simultaneous flows. */
      readonly solver: string;
      readonly nodes: number;
    }
  | { readonly status: 'infeasible'; readonly reason: string }
  | { readonly status: 'unbounded'; readonly reason: string };

export type Side = 'buy' | 'sell';

/** One order: one period, one side, a quantity held over the period, a limit price. */
export interface Order {
  readonly periodStart: string;
  readonly periodEnd: string;
  readonly side: Side;
  /** Quantity [MW] held over the period. */
  readonly quantityMw: number;
  /** Limit price [currency/MWh], inside [priceFloor, priceCap]. */
  readonly limitPrice: number;
  /** Quantile level the limit was taken at, or null for a point limit / floor / cap. */
  readonly quantileLevel: number | null;
}

/** Planning policy names (docs/design.md section 4). */
export type PlanPolicy = 'quantile' | 'median' | 'point' | 'price-taking';

/**
 * One delivery day of price history: realised clearing prices, the imbalance (balancing) price where
 * the history has one, and exogenous columns known before gate closure (e.g. `load_forecast_mw`).
 * Arrays are indexed like `periods`.
 */
export interface HistoryDay {
  /** Delivery day, YYYY-MM-DD in the market zone. */
  readonly day: string;
  readonly periods: readonly DeliveryPeriod[];
  /** Realised clearing price per period [currency/MWh]. */
  readonly pricePerMwh: readonly number[];
  /** Realised imbalance price per period [currency/MWh], or null when the history has no such column. */
  readonly imbalancePricePerMwh: readonly number[] | null;
  /** Exogenous columns by CSV header name, e.g. `load_forecast_mw` [MW]. */
  readonly exogenous: Readonly<Record<string, readonly number[]>>;
}

/** A price history: complete delivery days in ascending order (days with gaps are listed apart). */
export interface PriceHistory {
  readonly days: readonly HistoryDay[];
  /** Names of the exogenous columns present, in CSV order. */
  readonly exogenousNames: readonly string[];
  /** Days that had missing or doubled periods and were left out, with the reason. */
  readonly incompleteDays: readonly { readonly day: string; readonly reason: string }[];
}
