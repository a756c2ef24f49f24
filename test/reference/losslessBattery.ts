import type { BatteryModel } from '../../src/types.js';

/** A lossless 4 MWh battery of 2 MW each way, no wear, no cycle cap, starting at 2 MWh: hand-worked days use it. */
export const LOSSLESS_BATTERY: BatteryModel = Object.freeze({
  energyMwh: 4,
  chargeMw: 2,
  dischargeMw: 2,
  chargeEfficiency: 1,
  dischargeEfficiency: 1,
  socMinMwh: 0,
  socMaxMwh: 4,
  socInitialMwh: 2,
  socFinalMinMwh: undefined,
  maxFromStoreMwhPerDay: undefined,
  degradationCostPerMwh: 0,
});
