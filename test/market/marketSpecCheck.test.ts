import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { marketSpecSchema } from '../../src/market/marketSpec.js';
import { checkedMarketSpec } from '../../src/market/marketSpecCheck.js';
import { agreementOnAnyValue, expectAgreement, expectAgreementOnMutations, type Tally } from '../io/schemaAgreement.js';

// checkedMarketSpec against the reference it stands in for: marketSpecSchema run by zod. Specs are
// generated near every limit (zones with half-hour and midnight clock changes, ticks that floor and
// cap do or do not lie on, the old field name beside the new one), then mutated.

const KEYS = ['timeZone', 'periodMinutes', 'priceFloor', 'priceCap', 'currency', 'gateClosure', 'imbalance', 'bidCurves', 'fallback', 'quantityStepMw', 'minimumQuantityMw', 'priceTickPerMwh'];

const rule = fc.record({ kind: fc.constantFrom('clearing-plus-penalty', 'clearing-plus-penalty', 'penalty'), penaltyPerMwh: fc.constantFrom(0, 15, 2.5, -1, 1e6, 1e6 + 1) }, { requiredKeys: ['kind'] });
const market = fc.record(
  {
    timeZone: fc.constantFrom('Europe/Berlin', 'Australia/Adelaide', 'Australia/Lord_Howe', 'Asia/Kathmandu', 'America/Santiago', 'UTC', 'Etc/GMT+5', 'Mars/Olympus', 'europe/berlin', ''),
    periodMinutes: fc.constantFrom(15, 30, 60, 60, 45, '15'),
    priceFloor: fc.constantFrom(-500, -500.005, -1e6, -1e6 - 1, 0, 0.3, 4000),
    priceCap: fc.constantFrom(4000, 4000.01, 1e6, 1e6 + 1, -500, 0.3, 17500),
    currency: fc.constantFrom('EUR', 'HLV', '', ' EUR', 'EUR\u200b', 'E\u0007', 'SIXTEEN_CHARS_AB', 'SEVENTEEN_CHARS_A', '€'),
    gateClosure: fc.constantFrom('12:00', '00:00', '23:59', '24:00', '9:00', '12:60', '12:00 '),
    imbalance: rule,
    bidCurves: fc.record({ shape: fc.constantFrom('steps', 'steps', 'blocks'), maxOrdersPerPeriod: fc.constantFrom(2, 10, 1, 2.5, 2 ** 53, 2 ** 53 - 1) }, { requiredKeys: [] }),
    fallback: rule,
    quantityStepMw: fc.constantFrom(0.1, 1, 0.001, 0.0009, 1000, 1000.5),
    minimumQuantityMw: fc.constantFrom(0.1, 0.001, 0.0009, 1000, 1001),
    priceTickPerMwh: fc.constantFrom(0.01, 0.1, 0.0001, 0.00009, 1, 3, 5000, 1e7),
  },
  { requiredKeys: [] },
);
// Mostly the fields a valid spec needs, each optional field now and then.
const likelyValid = fc
  .tuple(market, fc.record({ timeZone: fc.constant('Europe/Berlin'), periodMinutes: fc.constantFrom(15, 30, 60), priceFloor: fc.constant(-500), priceCap: fc.constant(4000), currency: fc.constant('EUR'), gateClosure: fc.constant('12:00') }), fc.subarray(KEYS))
  .map(([some, base, keep]) => ({ ...base, ...Object.fromEntries(Object.entries(some).filter(([key]) => keep.includes(key) && (key !== 'fallback' || !keep.includes('imbalance')))) }));

describe('checkedMarketSpec: the same answer as marketSpecSchema', () => {
  it('on generated specs near every limit, and on mutations of them', () => {
    expectAgreementOnMutations(checkedMarketSpec, marketSpecSchema, { values: fc.oneof(market, likelyValid), keys: KEYS, seed: 1701, numRuns: 1500, mutations: 3, least: { accepted: 300, refused: 300 } });
  });

  it('on values of any kind', () => {
    const tally = agreementOnAnyValue(checkedMarketSpec, marketSpecSchema, 1702, 500);
    expect(tally.refused).toBe(500);
  });

  it('the demo market and the old field name read as the new one', () => {
    const tally: Tally = { accepted: 0, refused: 0 };
    const demo = { timeZone: 'Europe/Berlin', periodMinutes: 15, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00', imbalance: { kind: 'clearing-plus-penalty', penaltyPerMwh: 15 } };
    expectAgreement(checkedMarketSpec, marketSpecSchema, demo, tally);
    const { imbalance, ...rest } = demo;
    expectAgreement(checkedMarketSpec, marketSpecSchema, { ...rest, fallback: imbalance }, tally);
    expect(checkedMarketSpec({ ...rest, fallback: imbalance })).toStrictEqual(demo);
    expect(tally.accepted).toBe(2);
  });
});
