import type { BatterySpec } from './batterySpec.js';

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
