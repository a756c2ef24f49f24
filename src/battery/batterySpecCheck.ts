import { FAILED, numberIn, onlyKeys, plainRecord } from '../errors/plainChecks.js';
import type { BatterySpec } from './batterySpec.js';
import { BATTERY_DEFAULTS, BATTERY_LIMITS } from './batteryLimits.js';

type Range = readonly [number, number];

/** The fields of battery.json in the schema's order (batterySpec.ts), with their ranges and defaults. */
const BATTERY_FIELDS: readonly { readonly key: string; readonly range: Range; readonly need: 'required' | 'optional' | number }[] = [
  { key: 'energyMwh', range: BATTERY_LIMITS.energyMwh, need: 'required' },
  { key: 'chargeMw', range: BATTERY_LIMITS.powerMw, need: 'required' },
  { key: 'dischargeMw', range: BATTERY_LIMITS.powerMw, need: 'required' },
  { key: 'roundTripEfficiency', range: BATTERY_LIMITS.efficiency, need: 'optional' },
  { key: 'chargeEfficiency', range: BATTERY_LIMITS.efficiency, need: 'optional' },
  { key: 'dischargeEfficiency', range: BATTERY_LIMITS.efficiency, need: 'optional' },
  { key: 'socMinFraction', range: [0, 1], need: BATTERY_DEFAULTS.socMinFraction },
  { key: 'socMaxFraction', range: [0, 1], need: BATTERY_DEFAULTS.socMaxFraction },
  { key: 'socInitialFraction', range: [0, 1], need: BATTERY_DEFAULTS.socInitialFraction },
  { key: 'socFinalMinFraction', range: [0, 1], need: 'optional' },
  { key: 'maxCyclesPerDay', range: BATTERY_LIMITS.maxCyclesPerDay, need: 'optional' },
  { key: 'degradationCostPerMwh', range: BATTERY_LIMITS.degradationCostPerMwh, need: BATTERY_DEFAULTS.degradationCostPerMwh },
];
const BATTERY_KEYS = BATTERY_FIELDS.map((field) => field.key);

/**
 * battery.json's value as batterySpecSchema returns it (defaults filled in), checked by hand without
 * loading zod; undefined when the schema might refuse it (it then words the problems). Every rule is
 * the schema's, on the same shared limits (batteryLimits.ts); test/battery/batterySpecCheck.test.ts
 * holds the two to the same answer on generated and mutated specs.
 */
export function checkedBatterySpec(value: unknown): BatterySpec | undefined {
  const spec = plainRecord(value);
  if (spec === undefined || !onlyKeys(spec, BATTERY_KEYS)) return undefined;
  const parsed: Record<string, number | undefined> = {};
  for (const { key, range, need } of BATTERY_FIELDS) {
    const given = spec[key];
    const field = given === undefined ? (need === 'required' ? FAILED : need === 'optional' ? undefined : need) : numberIn(given, range[0], range[1]) ? given : FAILED;
    if (field === FAILED) return undefined;
    // An optional field left out stays out; given as undefined it stays, as zod keeps it.
    if (field !== undefined || Object.hasOwn(spec, key)) parsed[key] = field;
  }
  // The schema's checks between fields (batteryCrossChecks), on fields that are all valid here.
  const { roundTripEfficiency, chargeEfficiency, dischargeEfficiency, socMinFraction, socMaxFraction, socInitialFraction, socFinalMinFraction } = parsed;
  const split = chargeEfficiency !== undefined || dischargeEfficiency !== undefined;
  if (roundTripEfficiency !== undefined ? split : !split || chargeEfficiency === undefined || dischargeEfficiency === undefined) return undefined;
  const min = socMinFraction as number;
  const max = socMaxFraction as number;
  if (min >= max) return undefined;
  const initial = socInitialFraction as number;
  if (initial < min || initial > max) return undefined;
  if (socFinalMinFraction !== undefined && (socFinalMinFraction < min || socFinalMinFraction > max)) return undefined;
  return parsed as unknown as BatterySpec;
}
