/**
 * The limits of market.json's numbers and names shared by its zod schema (marketSpec.ts) and its
 * hand-written check (marketSpecCheck.ts), in a module without zod so that the check loads light.
 */

/**
 * Largest size of a price a market spec or a price history may give [currency/MWh]: 1,000,000 is above
 * every day-ahead market's cap in its own currency (4000 EUR, 17,500 AUD, 251,000 JPY when converted
 * from JEPX's 251 JPY/kWh; common practice), and keeps sums over decades of periods far from overflow.
 */
export const PRICE_LIMIT_PER_MWH = 1_000_000;

/**
 * Largest quantity step and minimum quantity accepted [MW]: exchanges trade in steps of 0.1 MW or 1 MW,
 * so a step above this is a unit mistake (kW for MW), not a market.
 */
export const MAX_QUANTITY_STEP_MW = 1000;

/**
 * Smallest quantity step and minimum quantity accepted [MW]: 1 kW, far below any exchange's step, and
 * large enough that a day's energy divided by it stays a modest whole number (a step of 1e-320 MW
 * overflows the rounding arithmetic).
 */
export const MIN_QUANTITY_STEP_MW = 0.001;

/** Smallest price tick accepted [currency/MWh]: 0.0001, below any exchange's tick (0.01 is common practice). */
export const MIN_PRICE_TICK_PER_MWH = 0.0001;

/** Whether x is a whole multiple of step, up to floating-point dust (1e-9 of a step). */
export function isMultipleOf(x: number, step: number): boolean {
  const k = x / step;
  return Math.abs(k - Math.round(k)) <= 1e-9 * Math.max(1, Math.abs(k));
}

/** The old name of the field `imbalance`, still read (docs/design.md section 2). */
export const OLD_IMBALANCE_FIELD = 'fallback';

/** A gate closure: a local time of day HH:MM, 00:00 to 23:59. */
export const GATE_CLOSURE_PATTERN = /^([01]\d|2[0-3]):[0-5]\d$/;

/** Longest currency label [characters]. */
export const MAX_CURRENCY_LENGTH = 16;

/** The only imbalance price rule (docs/design.md section 8). */
export const IMBALANCE_RULE_KIND = 'clearing-plus-penalty';
