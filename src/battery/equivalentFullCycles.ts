import type { BatteryModel } from './batterySpec.js';

/**
 * Equivalent full cycles of energy discharged at the grid [-]: the energy that left the store
 * (dischargedMwh / eta_d, before the discharge losses) over the usable window socMax - socMin, so a full
 * swing of the window is exactly one cycle (common practice). The daily cycle cap bounds the same count
 * (batteryModel's maxFromStoreMwhPerDay), so a day at the cap shows exactly maxCyclesPerDay.
 *
 * @example
 * // usable 9 MWh, eta_d = 0.938: two full swings deliver 2 x 9 x 0.938 = 16.884 MWh at the grid
 * equivalentFullCycles(16.884, battery); // 2
 */
export function equivalentFullCycles(dischargedMwh: number, battery: BatteryModel): number {
  return dischargedMwh / battery.dischargeEfficiency / (battery.socMaxMwh - battery.socMinMwh);
}
