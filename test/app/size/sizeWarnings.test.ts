import { describe, expect, it } from 'vitest';
import { sizeWarnings } from '../../../src/app/size/sizeSummary.js';

// The warnings are rules about the grid, not values to check against a source: a size with the
// highest NPV on the grid's edge, and a policy whose every NPV is negative.
const axes = [
  { name: 'energy_mwh', values: [5, 10, 15] },
  { name: 'power_mw', values: [2.5, 5, 7.5] },
];
const pick = (policy: string, energyMwh: number, powerMw: number, npv: number) =>
  ({ policy, highestNpv: { energyMwh, powerMw, roundTripEfficiency: 0.88, row: { npv }, neighbours: [] }, highestIrr: null }) as never;

describe('sizeWarnings', () => {
  it('says nothing for an interior best size with a positive NPV', () => {
    expect(sizeWarnings([pick('quantile', 10, 5, 1000)], axes)).toEqual([]);
  });

  it('names the axes whose edge the best size lies on, and a negative best NPV', () => {
    const warnings = sizeWarnings([pick('quantile', 5, 5, -10)], axes);
    expect(warnings).toHaveLength(2);
    expect(warnings[0]).toMatch(/quantile: every size has a negative NPV/);
    expect(warnings[1]).toMatch(/edge of the grid in --energy-mwh \(5 MWh\); extend/);
  });

  it('says when a policy\'s best NPV is below the price-taking baseline\'s', () => {
    const warnings = sizeWarnings([pick('quantile', 10, 5, 500), pick('price-taking', 10, 5, 900), pick('perfect-foresight', 10, 5, 5000)], axes);
    expect(warnings).toEqual(["quantile: its highest NPV (500) is below price-taking's (900): at these costs the simplest baseline pays better"]);
    expect(sizeWarnings([pick('quantile', 10, 5, 950), pick('price-taking', 10, 5, 900)], axes)).toEqual([]);
  });

  it('leaves perfect foresight alone and ignores an axis with a single value', () => {
    expect(sizeWarnings([pick('perfect-foresight', 5, 2.5, -10)], axes)).toEqual([]);
    expect(sizeWarnings([pick('quantile', 10, 5, 1)], [{ name: 'energy_mwh', values: [10] }, { name: 'power_mw', values: [5] }])).toEqual([]);
  });
});
