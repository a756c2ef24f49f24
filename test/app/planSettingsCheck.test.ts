import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planSettingsSchema } from '../../src/app/plan/planUseCase.js';
import { checkedPlanSettings } from '../../src/app/plan/planSettingsCheck.js';
import { RUN_LIMITS } from '../../src/app/settingRules.js';
import { expectAgreement, expectAgreementOnMutations, type Tally } from '../io/schemaAgreement.js';

// checkedPlanSettings against the reference it stands in for: planSettingsSchema run by zod. Settings
// are not JSON: NaN and fields given as undefined are generated too. Settings with `scenarios` are left
// to the schema on purpose (the plan's fast path does not plan on scenarios).

const KEYS = ['inputs', 'day', 'alpha', 'policy', 'scenarios', 'unaccepted', 'socStartMwh', 'out', 'force', 'report', 'listOrders'];
const [socLow, socHigh] = RUN_LIMITS.socStartMwh;
const path = fc.constantFrom('scenarios/halvorn/scenario.json', 'm.json', '', ' ', undefined, 3);
const flag = fc.constantFrom(true, false, undefined, 'yes', 0);
const settings = fc.record(
  {
    inputs: fc.oneof(fc.record({ scenario: path, market: path, battery: path, forecast: path, history: path }, { requiredKeys: [] }), fc.constantFrom(undefined, null, 'a.json')),
    day: fc.constantFrom('2027-01-01', '2024-02-29', '2027-02-29', '2027-1-1', '', undefined, 20270101),
    alpha: fc.constantFrom(0.1, 0.2, 0.001, 0.0009, 0.4999, 0.5, Number.NaN, Infinity, '0.1', undefined),
    policy: fc.constantFrom('quantile', 'median', 'point', 'price-taking', 'curve', 'auto', 'greedy', '', undefined),
    scenarios: fc.constantFrom(undefined, {}, { paths: 'p.csv' }),
    unaccepted: fc.constantFrom('follow-plan', 'follow-accepted', 'follow', undefined),
    socStartMwh: fc.constantFrom(5, 0, socLow, socHigh, socHigh * 2, socLow - 1, Number.NaN, -Infinity, '5', undefined),
    out: fc.constantFrom('runs/plan', 'plans/2027-01-01', '', ' ', '/', undefined, 7),
    force: flag,
    report: flag,
    listOrders: flag,
  },
  { requiredKeys: ['inputs'] },
);
// Mostly the settings the CLI gives, a few fields from the generator above.
const likelyValid = fc
  .tuple(settings, fc.subarray(KEYS.filter((key) => key !== 'inputs'), { maxLength: 2 }))
  .map(([some, keep]) => ({ inputs: { scenario: 'scenarios/halvorn/scenario.json' }, alpha: 0.1, policy: 'quantile', unaccepted: 'follow-plan', ...Object.fromEntries(Object.entries(some).filter(([key]) => keep.includes(key))) }));
const onlyZod = (value: unknown): boolean => typeof value === 'object' && value !== null && (value as { scenarios?: unknown }).scenarios !== undefined;

describe('checkedPlanSettings: the same answer as planSettingsSchema', () => {
  it('on generated settings and mutations of them', () => {
    expectAgreementOnMutations(checkedPlanSettings, planSettingsSchema, { values: fc.oneof(settings, likelyValid), keys: KEYS, seed: 1731, numRuns: 3000, mutations: 2, least: { accepted: 500, refused: 1000 }, onlyZod });
  });

  it('the settings the CLI gives for the demo day', () => {
    const tally: Tally = { accepted: 0, refused: 0 };
    const cli = { inputs: { scenario: 'scenarios/halvorn/scenario.json' }, alpha: 0.1, policy: 'quantile', unaccepted: 'follow-plan', out: 'runs/plan', force: true, report: false };
    expectAgreement(checkedPlanSettings, planSettingsSchema, cli, tally);
    expectAgreement(checkedPlanSettings, planSettingsSchema, { ...cli, day: '2027-01-01', socStartMwh: 5 }, tally);
    expect(tally.accepted).toBe(2);
  });
});
