import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { scenarioSchema } from '../../src/io/readScenario.js';
import { checkedScenarioFields } from '../../src/io/scenarioCheck.js';
import { agreementOnAnyValue, expectAgreementOnMutations } from './schemaAgreement.js';

// checkedScenarioFields against the reference it stands in for: the scenario file's schema run by zod.

const KEYS = ['name', 'description', 'market', 'battery', 'history', 'forecast', 'demoDay'];
const text = fc.constantFrom('a.json', 'halvorn/market.json', '', ' ', 'ä b.csv.gz');
const scenario = fc.record(
  { name: text, description: text, market: text, battery: text, history: text, forecast: text, demoDay: fc.constantFrom('2027-01-01', '2024-02-29', '2027-02-29', '2027-1-1', '', '9999-12-31') },
  { requiredKeys: [] },
);

describe('checkedScenarioFields: the same answer as the scenario schema', () => {
  it('on generated scenario files and mutations of them', () => {
    expectAgreementOnMutations(checkedScenarioFields, scenarioSchema, { values: scenario, keys: KEYS, seed: 1721, numRuns: 1500, mutations: 3, least: { accepted: 300, refused: 300 } });
  });

  it('on values of any kind', () => {
    const tally = agreementOnAnyValue(checkedScenarioFields, scenarioSchema, 1722, 500);
    expect(tally.accepted + tally.refused).toBe(500);
  });
});
