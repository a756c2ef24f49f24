import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { batterySpecSchema } from '../../src/battery/batterySpec.js';
import { checkedBatterySpec } from '../../src/battery/batterySpecCheck.js';
import { agreementOnAnyValue, expectAgreementOnMutations } from '../io/schemaAgreement.js';

// checkedBatterySpec against the reference it stands in for: batterySpecSchema run by zod. Specs are
// generated on and beside every range limit, with one or two efficiencies, windows that hold or do not
// hold the start and end states, then mutated.

const KEYS = ['energyMwh', 'chargeMw', 'dischargeMw', 'roundTripEfficiency', 'chargeEfficiency', 'dischargeEfficiency', 'socMinFraction', 'socMaxFraction', 'socInitialFraction', 'socFinalMinFraction', 'maxCyclesPerDay', 'degradationCostPerMwh'];
const fraction = fc.constantFrom(0, 0.05, 0.1, 0.5, 0.9, 0.95, 1, -0.01, 1.01);
const efficiency = fc.constantFrom(0.88, 0.95, 1, 0.05, 0.049, 1.01, 0);
const battery = fc.record(
  {
    energyMwh: fc.constantFrom(10, 0.001, 0.0009, 100_000, 100_001, 2.5),
    chargeMw: fc.constantFrom(5, 0.001, 0.0009, 100_000, 100_001),
    dischargeMw: fc.constantFrom(5, 0.001, 100_000, 100_001, -5),
    roundTripEfficiency: efficiency,
    chargeEfficiency: efficiency,
    dischargeEfficiency: efficiency,
    socMinFraction: fraction,
    socMaxFraction: fraction,
    socInitialFraction: fraction,
    socFinalMinFraction: fraction,
    maxCyclesPerDay: fc.constantFrom(1, 1.5, 0.01, 0.009, 100, 100.5),
    degradationCostPerMwh: fc.constantFrom(0, 4, 1e6, 1e6 + 1, -1),
  },
  { requiredKeys: [] },
);
const likelyValid = fc
  .tuple(battery, fc.subarray(KEYS.slice(3)), fc.boolean())
  .map(([some, keep, split]) => ({
    energyMwh: 10,
    chargeMw: 5,
    dischargeMw: 5,
    ...(split ? { chargeEfficiency: 0.95, dischargeEfficiency: 0.94 } : { roundTripEfficiency: 0.88 }),
    ...Object.fromEntries(Object.entries(some).filter(([key]) => keep.includes(key) && !key.endsWith('Efficiency'))),
  }));

describe('checkedBatterySpec: the same answer as batterySpecSchema', () => {
  it('on generated specs near every limit, and on mutations of them', () => {
    expectAgreementOnMutations(checkedBatterySpec, batterySpecSchema, { values: fc.oneof(battery, likelyValid), keys: KEYS, seed: 1711, numRuns: 2000, mutations: 3, least: { accepted: 400, refused: 400 } });
  });

  it('on values of any kind', () => {
    const tally = agreementOnAnyValue(checkedBatterySpec, batterySpecSchema, 1712, 500);
    expect(tally.refused).toBe(500);
  });
});
