import type { BatterySpec } from '../types.js';

/** One battery size of a sizing grid. */
export interface BatterySize {
  /** Nameplate energy [MWh], > 0. */
  readonly energyMwh: number;
  /** Charge and discharge power limit [MW], > 0. */
  readonly powerMw: number;
  /** Round-trip efficiency (0, 1]; undefined keeps the spec's efficiencies. */
  readonly roundTripEfficiency?: number;
}

/**
 * The scenario's battery at another size: energyMwh = size.energyMwh and chargeMw = dischargeMw =
 * size.powerMw; the state-of-charge fractions (window, start, end floor), the cycle cap per day (in
 * equivalent full cycles of the usable window, so in MWh it grows with the energy) and the wear cost
 * per MWh are kept. A round-trip efficiency, when given, replaces the spec's efficiencies (split as
 * sqrt into charge and discharge, batterySpec.ts).
 *
 * @example
 * scaledBatterySpec({ energyMwh: 10, chargeMw: 5, dischargeMw: 4, roundTripEfficiency: 0.88, ... }, { energyMwh: 20, powerMw: 8 })
 * // { energyMwh: 20, chargeMw: 8, dischargeMw: 8, roundTripEfficiency: 0.88, ... }
 */
export function scaledBatterySpec(spec: BatterySpec, size: BatterySize): BatterySpec {
  const scaled: BatterySpec = { ...spec, energyMwh: size.energyMwh, chargeMw: size.powerMw, dischargeMw: size.powerMw };
  if (size.roundTripEfficiency === undefined) return scaled;
  const { chargeEfficiency: _charge, dischargeEfficiency: _discharge, ...rest } = scaled;
  return { ...rest, roundTripEfficiency: size.roundTripEfficiency };
}

/** The spec's round-trip efficiency [-]: roundTripEfficiency, or chargeEfficiency x dischargeEfficiency. */
export function specRoundTripEfficiency(spec: BatterySpec): number {
  return spec.roundTripEfficiency ?? (spec.chargeEfficiency ?? 1) * (spec.dischargeEfficiency ?? 1);
}
