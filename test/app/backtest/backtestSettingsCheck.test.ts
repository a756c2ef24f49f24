import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { backtestSettingsSchema } from '../../../src/app/backtest/backtestUseCase.js';
import { checkedBacktestSettings } from '../../../src/app/backtest/backtestSettingsCheck.js';
import { expectAgreement, expectAgreementOnMutations, type Tally } from '../../io/schemaAgreement.js';

// checkedBacktestSettings against the reference it stands in for: backtestSettingsSchema run by zod.
// Settings are not JSON: NaN and fields given as undefined are generated too. Settings with `model` or
// `scenarios` are left to the schema on purpose (the backtest's fast path neither makes forecasts nor
// plans on scenarios).

const KEYS = ['inputs', 'model', 'from', 'to', 'alpha', 'unaccepted', 'policies', 'scenarios', 'out', 'force', 'report'];
const path = fc.constantFrom('scenarios/halvorn/scenario.json', 'm.json', '', ' ', undefined, 3);
const flag = fc.constantFrom(true, false, undefined, 'yes', 0);
// Days on and beside the span's limits: a `to` before `from`, and spans of 100 years (the most) and more.
const day = fc.constantFrom('2026-01-01', '2026-12-31', '2024-02-29', '2027-02-29', '2026-1-1', '1970-01-01', '2069-12-31', '2070-01-01', '2100-01-01', '', undefined, 20260101);
const policy = fc.constantFrom('quantile', 'median', 'point', 'price-taking', 'perfect-foresight', 'curve', 'auto', 'greedy', '', undefined);
const settings = fc.record(
  {
    inputs: fc.oneof(fc.record({ scenario: path, market: path, battery: path, forecast: path, history: path }, { requiredKeys: [] }), fc.constantFrom(undefined, null, 'a.json')),
    model: fc.constantFrom(undefined, { method: 'arx-hs' }, 'arx-hs'),
    from: day,
    to: day,
    alpha: fc.constantFrom(0.1, 0.2, 0.001, 0.0009, 0.4999, 0.5, Number.NaN, Infinity, '0.1', undefined),
    unaccepted: fc.constantFrom('follow-plan', 'follow-accepted', 'follow', undefined),
    policies: fc.oneof(fc.array(policy, { maxLength: 6 }), fc.constantFrom(undefined, 'quantile', null, {})),
    scenarios: fc.constantFrom(undefined, {}, { paths: 'p.csv' }),
    out: fc.constantFrom('runs/year', 'runs/2026', '', ' ', '/', undefined, 7),
    force: flag,
    report: flag,
  },
  { requiredKeys: ['inputs'] },
);
// Mostly the settings the CLI gives, a few fields from the generator above.
const CLI = { inputs: { scenario: 'scenarios/halvorn/scenario.json' }, from: '2026-01-01', to: '2026-12-31', alpha: 0.1, unaccepted: 'follow-plan', policies: ['quantile', 'median', 'point', 'price-taking', 'perfect-foresight'], out: 'runs/year', force: true, report: false };
const likelyValid = fc
  .tuple(settings, fc.subarray(KEYS.filter((key) => key !== 'inputs'), { maxLength: 2 }))
  .map(([some, keep]) => ({ ...CLI, ...Object.fromEntries(Object.entries(some).filter(([key]) => keep.includes(key))) }));
const onlyZod = (value: unknown): boolean => typeof value === 'object' && value !== null && (Object.hasOwn(value, 'model') || Object.hasOwn(value, 'scenarios'));

describe('checkedBacktestSettings: the same answer as backtestSettingsSchema', () => {
  it('on generated settings and mutations of them', () => {
    expectAgreementOnMutations(checkedBacktestSettings, backtestSettingsSchema, { values: fc.oneof(settings, likelyValid), keys: KEYS, seed: 1977, numRuns: 3000, mutations: 2, least: { accepted: 500, refused: 1000 }, onlyZod });
  });

  it('the settings the CLI gives for a year, and with defaults left out', () => {
    const tally: Tally = { accepted: 0, refused: 0 };
    expectAgreement(checkedBacktestSettings, backtestSettingsSchema, CLI, tally);
    expectAgreement(checkedBacktestSettings, backtestSettingsSchema, { inputs: { market: 'm.json', battery: 'b.json', forecast: 'q.csv', history: 'h.csv' }, from: '2026-03-01', to: '2026-03-01', out: 'runs/day' }, tally);
    expectAgreement(checkedBacktestSettings, backtestSettingsSchema, { ...CLI, policies: ['point', 'quantile'], report: true }, tally);
    expect(tally.accepted).toBe(3);
  });

  it('leaves --model and the scenario settings to the schema', () => {
    expect(checkedBacktestSettings({ ...CLI, model: { method: 'arx-hs' } })).toBeUndefined();
    expect(checkedBacktestSettings({ ...CLI, scenarios: {} })).toBeUndefined();
  });
});
