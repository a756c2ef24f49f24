import util from 'node:util';
import fc from 'fast-check';
import { expect } from 'vitest';
import type { z } from 'zod';

// The hand-written checks of the plan's success path (errors/plainChecks.ts) stand in for zod schemas:
// they must accept exactly what the schema accepts and return what it returns, key order included.
// The reference each is held to is its schema, run by zod (the validation library).

/** Every key path of a value in order, so that two equal values with fields in another order differ. */
function keyPaths(value: unknown, at = ''): string[] {
  if (typeof value !== 'object' || value === null) return [];
  return Object.keys(value).flatMap((key) => [`${at}.${key}`, ...keyPaths((value as Record<string, unknown>)[key], `${at}.${key}`)]);
}

export interface Tally {
  accepted: number;
  refused: number;
}

/**
 * Asserts that `check` and `schema` agree on `value`: both accept with the same output (values, keys and
 * their order), or both refuse. `onlyZod(value)` marks values the check leaves to zod on purpose (it
 * then refuses while zod may accept).
 */
export function expectAgreement(check: (value: unknown) => unknown, schema: z.ZodType, value: unknown, tally: Tally, onlyZod: (value: unknown) => boolean = () => false): void {
  const fast = check(value);
  const reference = schema.safeParse(value);
  if (fast !== undefined) {
    expect(reference.success, `the check accepted what zod refuses: ${show(value)}`).toBe(true);
    expect(fast).toStrictEqual(reference.data);
    expect(keyPaths(fast)).toEqual(keyPaths(reference.data));
    tally.accepted++;
  } else {
    if (!onlyZod(value)) expect(reference.success, `the check refused what zod accepts: ${show(value)}`).toBe(false);
    tally.refused++;
  }
}

function show(value: unknown): string {
  return util.inspect(value, { depth: 4 });
}

/** Values that sit on or beside the schemas' limits, and values of every JSON kind. */
export const oddValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(0, -0, 1, 2, 15, 30, 45, 60, 0.5, 0.05, 0.049, 0.001, 0.0009, 0.0001, 0.00009, 1.0000001, 100, 100.01, 1000, 1000.5, 1e6, -1e6, 1e6 + 1, -1e6 - 1, 2 ** 53, Infinity, -Infinity),
  fc.constantFrom('', ' ', 'steps', 'clearing-plus-penalty', '12:00', '24:00', 'Europe/Berlin', 'UTC', 'EUR', '2027-01-01', '2027-02-30', 'a.json', null, true, false, [], {}),
  fc.jsonValue({ maxDepth: 2 }),
  fc.double(),
);

/** A mutation of a plain object: a field removed, a field (known or not) set to an odd value, or a nested field changed. */
export type Mutation = { readonly kind: 'remove'; readonly pick: number } | { readonly kind: 'set'; readonly key: string; readonly value: unknown } | { readonly kind: 'nested'; readonly pick: number; readonly key: string; readonly value: unknown };

export function mutation(keys: readonly string[]): fc.Arbitrary<Mutation> {
  const key = fc.oneof(fc.constantFrom(...keys), fc.constantFrom('unknownField', '__proto__', 'constructor', 'kind', 'shape'));
  return fc.oneof(
    fc.record({ kind: fc.constant('remove' as const), pick: fc.nat() }),
    fc.record({ kind: fc.constant('set' as const), key, value: oddValue }),
    fc.record({ kind: fc.constant('nested' as const), pick: fc.nat(), key, value: oddValue }),
  );
}

/** `value` (a plain object) with the mutations applied, each field set as an own field (even `__proto__`). */
export function mutated(value: Record<string, unknown>, mutations: readonly Mutation[]): Record<string, unknown> {
  const copy = structuredClone(value);
  for (const m of mutations) {
    const keys = Object.keys(copy);
    if (m.kind === 'remove') {
      if (keys.length > 0) delete copy[keys[m.pick % keys.length] as string];
    } else if (m.kind === 'set') {
      Object.defineProperty(copy, m.key, { value: structuredClone(m.value), enumerable: true, writable: true, configurable: true });
    } else {
      const objects = keys.filter((k) => typeof copy[k] === 'object' && copy[k] !== null && !Array.isArray(copy[k]));
      if (objects.length > 0) {
        const inner = copy[objects[m.pick % objects.length] as string] as Record<string, unknown>;
        Object.defineProperty(inner, m.key, { value: structuredClone(m.value), enumerable: true, writable: true, configurable: true });
      }
    }
  }
  return copy;
}

/**
 * The agreement over generated values and mutations of them (up to `mutations` each), with at least
 * `least` answers of each kind so that neither side of it is empty.
 */
export function expectAgreementOnMutations(
  check: (value: unknown) => unknown,
  schema: z.ZodType,
  run: { readonly values: fc.Arbitrary<Record<string, unknown>>; readonly keys: readonly string[]; readonly seed: number; readonly numRuns: number; readonly mutations: number; readonly least: Tally; readonly onlyZod?: (value: unknown) => boolean },
): void {
  const tally: Tally = { accepted: 0, refused: 0 };
  fc.assert(
    fc.property(run.values, fc.array(mutation(run.keys), { maxLength: run.mutations }), (value, mutations) => {
      expectAgreement(check, schema, value, tally, run.onlyZod);
      expectAgreement(check, schema, mutated(value, mutations), tally, run.onlyZod);
    }),
    { seed: run.seed, numRuns: run.numRuns },
  );
  expect(tally.accepted).toBeGreaterThan(run.least.accepted);
  expect(tally.refused).toBeGreaterThan(run.least.refused);
}

/** The agreement over values of any kind; the tally of answers. */
export function agreementOnAnyValue(check: (value: unknown) => unknown, schema: z.ZodType, seed: number, numRuns: number): Tally {
  const tally: Tally = { accepted: 0, refused: 0 };
  fc.assert(fc.property(oddValue, (value) => expectAgreement(check, schema, value, tally)), { seed, numRuns });
  return tally;
}
