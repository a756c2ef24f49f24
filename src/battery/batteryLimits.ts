/**
 * The defaults and ranges of battery.json's fields shared by its zod schema (batterySpec.ts) and its
 * hand-written check (batterySpecCheck.ts), in a module without zod so that the check loads light.
 */

/** Defaults of the optional battery fields (docs/design.md section 8). */
export const BATTERY_DEFAULTS = Object.freeze({
  socMinFraction: 0,
  socMaxFraction: 1,
  socInitialFraction: 0.5,
  degradationCostPerMwh: 0,
});

/**
 * The ranges of the battery's numbers: physically and economically sane, so that no arithmetic on them
 * can overflow or lose all precision. Energy and power from 1 kWh / 1 kW to 100 GWh / 100 GW (the
 * largest batteries built hold a few GWh, common practice); efficiencies from 5% (below that a store
 * only burns energy) to 100%; cycle caps from 0.01 to 100 a day; a wear cost as large as a price can be.
 */
export const BATTERY_LIMITS = Object.freeze({
  energyMwh: [0.001, 100_000],
  powerMw: [0.001, 100_000],
  efficiency: [0.05, 1],
  maxCyclesPerDay: [0.01, 100],
  degradationCostPerMwh: [0, 1_000_000],
} as const satisfies Record<string, readonly [number, number]>);
