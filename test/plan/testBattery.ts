import type { BatteryModel } from '../../src/types.js';

/** A 1 MWh / 1 MW lossless battery with a [0, 1] MWh window and no cap or wear, with the given changes (frozen). */
export function testBattery(overrides: Partial<BatteryModel> = {}): BatteryModel {
  return Object.freeze({
    energyMwh: 1,
    chargeMw: 1,
    dischargeMw: 1,
    chargeEfficiency: 1,
    dischargeEfficiency: 1,
    socMinMwh: 0,
    socMaxMwh: 1,
    socInitialMwh: 0,
    socFinalMinMwh: undefined,
    maxFromStoreMwhPerDay: undefined,
    degradationCostPerMwh: 0,
    ...overrides,
  });
}
