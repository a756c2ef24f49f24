import { z } from 'zod';
import { BATTERY_DEFAULTS, BATTERY_LIMITS } from './batteryLimits.js';

export { BATTERY_DEFAULTS, BATTERY_LIMITS } from './batteryLimits.js';

/** A number of the spec in [lo, hi]; Infinity (JSON's 1e999) and NaN are out of that range too. */
const bounded = (field: string, [lo, hi]: readonly [number, number]) =>
  z
    .number({ error: (issue) => (issue.input === undefined ? `missing ${field}` : typeof issue.input === 'number' ? `${field} must be in [${lo}, ${hi}]` : `${field} must be a number`) })
    .min(lo, `${field} must be in [${lo}, ${hi}]`)
    .max(hi, `${field} must be in [${lo}, ${hi}]`);
const efficiency = (field: string) => bounded(field, BATTERY_LIMITS.efficiency);
const fraction = (field: string) => bounded(field, [0, 1]);

/** The fields of `battery.json` (docs/design.md section 8), each checked on its own. */
const batteryFields = z.strictObject({
  /** Nameplate energy capacity [MWh], in BATTERY_LIMITS.energyMwh. */
  energyMwh: bounded('energyMwh', BATTERY_LIMITS.energyMwh),
  /** Maximum charge power at the grid connection [MW], in BATTERY_LIMITS.powerMw. */
  chargeMw: bounded('chargeMw', BATTERY_LIMITS.powerMw),
  /** Maximum discharge power at the grid connection [MW], in BATTERY_LIMITS.powerMw. */
  dischargeMw: bounded('dischargeMw', BATTERY_LIMITS.powerMw),
  /** Round-trip efficiency [0.05, 1]; split as sqrt into charge and discharge. Either this or both of the next two. */
  roundTripEfficiency: efficiency('roundTripEfficiency').optional(),
  /** Charge efficiency [0.05, 1]: MWh stored per MWh bought. */
  chargeEfficiency: efficiency('chargeEfficiency').optional(),
  /** Discharge efficiency [0.05, 1]: MWh sold per MWh taken from store. */
  dischargeEfficiency: efficiency('dischargeEfficiency').optional(),
  /** Lowest allowed state of charge as a fraction of energyMwh [-], default 0. */
  socMinFraction: fraction('socMinFraction').default(BATTERY_DEFAULTS.socMinFraction),
  /** Highest allowed state of charge as a fraction of energyMwh [-], default 1. */
  socMaxFraction: fraction('socMaxFraction').default(BATTERY_DEFAULTS.socMaxFraction),
  /** State of charge at the start of the first planned day as a fraction of energyMwh [-], default 0.5. */
  socInitialFraction: fraction('socInitialFraction').default(BATTERY_DEFAULTS.socInitialFraction),
  /** Lowest state of charge at the end of each day as a fraction [-]. Default: the day's starting state. */
  socFinalMinFraction: fraction('socFinalMinFraction').optional(),
  /**
   * Cap on equivalent full cycles per day [1/day]: energy taken out of the store per day (before the
   * discharge losses) at most maxCyclesPerDay x the usable window, so one full swing of the window is one
   * cycle (docs/design.md section 4.1). Default: none.
   */
  maxCyclesPerDay: bounded('maxCyclesPerDay', BATTERY_LIMITS.maxCyclesPerDay).optional(),
  /** Wear cost per MWh discharged [currency/MWh], in BATTERY_LIMITS.degradationCostPerMwh, default 0. */
  degradationCostPerMwh: bounded('degradationCostPerMwh', BATTERY_LIMITS.degradationCostPerMwh).default(BATTERY_DEFAULTS.degradationCostPerMwh),
});

/** Schema of `battery.json`, with the physical sanity checks. */
export const batterySpecSchema = batteryFields
  .superRefine(batteryCrossChecks, {
    // Runs even when some fields are wrong, so that every problem is listed at once.
    when: (payload) => typeof payload.value === 'object' && payload.value !== null && !Array.isArray(payload.value),
  });

/**
 * Checks between fields. Each looks only at fields that are themselves valid (a wrong field is already
 * reported by its own check), with the documented default for a field left out.
 */
function batteryCrossChecks(spec: z.infer<typeof batteryFields>, ctx: z.RefinementCtx): void {
  const raw = spec as Partial<Record<keyof typeof spec, unknown>>;
  const fractionOr = (value: unknown, fallback: number): number | undefined =>
    value === undefined ? fallback : typeof value === 'number' && value >= 0 && value <= 1 ? value : undefined;
  const split = raw.chargeEfficiency !== undefined || raw.dischargeEfficiency !== undefined;
  if (raw.roundTripEfficiency !== undefined && split) {
    ctx.addIssue({ code: 'custom', path: ['roundTripEfficiency'], message: 'give either roundTripEfficiency or chargeEfficiency + dischargeEfficiency, not both' });
  } else if (raw.roundTripEfficiency === undefined && !split) {
    ctx.addIssue({ code: 'custom', path: ['roundTripEfficiency'], message: 'missing roundTripEfficiency' });
  } else if (split && (raw.chargeEfficiency === undefined || raw.dischargeEfficiency === undefined)) {
    const missing = raw.chargeEfficiency === undefined ? 'chargeEfficiency' : 'dischargeEfficiency';
    ctx.addIssue({ code: 'custom', path: [missing], message: `missing ${missing} (both split efficiencies are needed)` });
  }
  const min = fractionOr(raw.socMinFraction, BATTERY_DEFAULTS.socMinFraction);
  const max = fractionOr(raw.socMaxFraction, BATTERY_DEFAULTS.socMaxFraction);
  if (min === undefined || max === undefined) return;
  if (min >= max) {
    ctx.addIssue({ code: 'custom', path: ['socMaxFraction'], message: `socMaxFraction (${max}) must be above socMinFraction (${min})` });
  }
  // socFinalMinFraction has no default to check: left out, the floor is the day's starting state.
  const inWindow = [
    ['socInitialFraction', fractionOr(raw.socInitialFraction, BATTERY_DEFAULTS.socInitialFraction)],
    ['socFinalMinFraction', raw.socFinalMinFraction === undefined ? undefined : fractionOr(raw.socFinalMinFraction, min)],
  ] as const;
  for (const [field, value] of inWindow) {
    if (value !== undefined && (value < min || value > max)) {
      ctx.addIssue({ code: 'custom', path: [field], message: `${field} (${value}) is outside the window [${min}, ${max}]` });
    }
  }
}

export const BATTERY_FIELD_FIXES: Readonly<Record<string, string>> = {
  energyMwh: 'give the usable nameplate energy in MWh, e.g. 10',
  chargeMw: 'give the charge power limit at the grid connection in MW, e.g. 5',
  dischargeMw: 'give the discharge power limit at the grid connection in MW, e.g. 5',
  roundTripEfficiency: 'give roundTripEfficiency in [0.05, 1], e.g. 0.88, or both chargeEfficiency and dischargeEfficiency',
  chargeEfficiency: 'give chargeEfficiency in [0.05, 1] together with dischargeEfficiency',
  dischargeEfficiency: 'give dischargeEfficiency in [0.05, 1] together with chargeEfficiency',
  socMinFraction: 'give the lowest state of charge as a fraction of energyMwh, e.g. 0.05',
  socMaxFraction: 'give the highest state of charge as a fraction of energyMwh, above socMinFraction, e.g. 0.95',
  socInitialFraction: 'give a starting state of charge inside [socMinFraction, socMaxFraction]',
  socFinalMinFraction: 'give an end-of-day floor inside [socMinFraction, socMaxFraction], or leave it out',
  maxCyclesPerDay: 'give the equivalent full cycles per day, e.g. 1.5, or leave it out',
  degradationCostPerMwh: 'give a wear cost per MWh discharged in currency/MWh, e.g. 4',
};

/** Battery spec, as read from `battery.json`: the type of batterySpecSchema's output (defaults filled in). */
export type BatterySpec = Readonly<z.output<typeof batterySpecSchema>>;

export function parseBatterySpec(value: unknown): z.ZodSafeParseResult<BatterySpec> {
  return batterySpecSchema.safeParse(value);
}

export { batteryModel, roundTripEfficiency, type BatteryModel } from './batteryModel.js';
