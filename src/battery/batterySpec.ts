import { z } from 'zod';

/** Defaults of the optional battery fields (docs/design.md section 8). */
export const BATTERY_DEFAULTS = Object.freeze({
  socMinFraction: 0,
  socMaxFraction: 1,
  socInitialFraction: 0.5,
  degradationCostPerMwh: 0,
});

const num = (field: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? `missing ${field}` : `${field} must be a number`) }).finite();
const positive = (field: string) => num(field).gt(0, `${field} must be > 0`);
const efficiency = (field: string) => num(field).gt(0, `${field} must be in (0, 1]`).lte(1, `${field} must be in (0, 1]`);
const fraction = (field: string) => num(field).min(0, `${field} must be in [0, 1]`).max(1, `${field} must be in [0, 1]`);

/** The fields of `battery.json` (docs/design.md section 8), each checked on its own. */
const batteryFields = z.strictObject({
  /** Nameplate energy capacity [MWh], > 0. */
  energyMwh: positive('energyMwh'),
  /** Maximum charge power at the grid connection [MW], > 0. */
  chargeMw: positive('chargeMw'),
  /** Maximum discharge power at the grid connection [MW], > 0. */
  dischargeMw: positive('dischargeMw'),
  /** Round-trip efficiency (0, 1]; split as sqrt into charge and discharge. Either this or both of the next two. */
  roundTripEfficiency: efficiency('roundTripEfficiency').optional(),
  /** Charge efficiency (0, 1]: MWh stored per MWh bought. */
  chargeEfficiency: efficiency('chargeEfficiency').optional(),
  /** Discharge efficiency (0, 1]: MWh sold per MWh taken from store. */
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
  maxCyclesPerDay: positive('maxCyclesPerDay').optional(),
  /** Wear cost per MWh discharged [currency/MWh], >= 0, default 0. */
  degradationCostPerMwh: num('degradationCostPerMwh')
    .min(0, 'degradationCostPerMwh must be >= 0')
    .default(BATTERY_DEFAULTS.degradationCostPerMwh),
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
  roundTripEfficiency: 'give roundTripEfficiency in (0, 1], e.g. 0.88, or both chargeEfficiency and dischargeEfficiency',
  chargeEfficiency: 'give chargeEfficiency in (0, 1] together with dischargeEfficiency',
  dischargeEfficiency: 'give dischargeEfficiency in (0, 1] together with chargeEfficiency',
  socMinFraction: 'give the lowest state of charge as a fraction of energyMwh, e.g. 0.05',
  socMaxFraction: 'give the highest state of charge as a fraction of energyMwh, above socMinFraction, e.g. 0.95',
  socInitialFraction: 'give a starting state of charge inside [socMinFraction, socMaxFraction]',
  socFinalMinFraction: 'give an end-of-day floor inside [socMinFraction, socMaxFraction], or leave it out',
  maxCyclesPerDay: 'give a positive number of equivalent full cycles per day, or leave it out',
  degradationCostPerMwh: 'give a wear cost >= 0 per MWh discharged, e.g. 4',
};

/** Battery spec, as read from `battery.json`: the type of batterySpecSchema's output (defaults filled in). */
export type BatterySpec = Readonly<z.output<typeof batterySpecSchema>>;

export function parseBatterySpec(value: unknown): z.ZodSafeParseResult<BatterySpec> {
  return batterySpecSchema.safeParse(value);
}

/** Battery values the planner uses, derived once from a BatterySpec (all in physical units). */
export interface BatteryModel {
  /** Nameplate energy [MWh]. */
  readonly energyMwh: number;
  /** Charge power limit [MW]. */
  readonly chargeMw: number;
  /** Discharge power limit [MW]. */
  readonly dischargeMw: number;
  /** Charge efficiency eta_c (0, 1] [-]. */
  readonly chargeEfficiency: number;
  /** Discharge efficiency eta_d (0, 1] [-]. */
  readonly dischargeEfficiency: number;
  /** State-of-charge window [MWh]. */
  readonly socMinMwh: number;
  readonly socMaxMwh: number;
  /** State of charge at the start of the first day [MWh]. */
  readonly socInitialMwh: number;
  /** End-of-day floor [MWh]; undefined means "the day's starting state". */
  readonly socFinalMinMwh: number | undefined;
  /**
   * Cap on energy taken out of the store per day [MWh stored, before the discharge losses: discharged at
   * the grid / eta_d]: maxCyclesPerDay x usable window. undefined means no cap.
   */
  readonly maxFromStoreMwhPerDay: number | undefined;
  /** Wear cost per MWh discharged (at the grid) [currency/MWh]. */
  readonly degradationCostPerMwh: number;
}

/**
 * Physical values the planner uses.
 *
 * With only a round-trip efficiency, eta_c = eta_d = sqrt(roundTrip) (common practice: losses split
 * evenly between the two conversions). The cycle cap limits energy taken out of the store per day
 * (discharged at the grid / eta_d) to maxCyclesPerDay x usable energy, usable = (socMax - socMin) x
 * energyMwh: equivalent full cycles count a full swing of the window as one cycle (docs/design.md
 * section 4.1), the same count as equivalentFullCycles.
 */
export function batteryModel(spec: BatterySpec): BatteryModel {
  const roundTrip = spec.roundTripEfficiency;
  const chargeEfficiency = spec.chargeEfficiency ?? Math.sqrt(roundTrip ?? 1);
  const dischargeEfficiency = spec.dischargeEfficiency ?? Math.sqrt(roundTrip ?? 1);
  const socMinMwh = spec.socMinFraction * spec.energyMwh;
  const socMaxMwh = spec.socMaxFraction * spec.energyMwh;
  return {
    energyMwh: spec.energyMwh,
    chargeMw: spec.chargeMw,
    dischargeMw: spec.dischargeMw,
    chargeEfficiency,
    dischargeEfficiency,
    socMinMwh,
    socMaxMwh,
    socInitialMwh: spec.socInitialFraction * spec.energyMwh,
    socFinalMinMwh: spec.socFinalMinFraction === undefined ? undefined : spec.socFinalMinFraction * spec.energyMwh,
    maxFromStoreMwhPerDay: spec.maxCyclesPerDay === undefined ? undefined : spec.maxCyclesPerDay * (socMaxMwh - socMinMwh),
    degradationCostPerMwh: spec.degradationCostPerMwh,
  };
}

/** Round-trip efficiency of a model [-]: eta_c x eta_d. */
export function roundTripEfficiency(battery: BatteryModel): number {
  return battery.chargeEfficiency * battery.dischargeEfficiency;
}
