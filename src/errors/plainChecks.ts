/**
 * The pieces of the hand-written checks that stand in for a zod schema on the success path of
 * `quantbid plan` (market/marketSpecCheck.ts and its siblings). Each check accepts a value only when
 * its schema accepts it and returns what the schema returns; anything else (a value the schema refuses,
 * or one the check is not sure of) is left to the schema, which words the problems. A check never
 * refuses for good: refusing only means "ask zod".
 */

/** A plain object's own fields (prototype Object's or none), or undefined for anything else. */
export function plainRecord(value: unknown): Readonly<Record<string, unknown>> | undefined {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return undefined;
  const prototype: unknown = Object.getPrototypeOf(value);
  return prototype === Object.prototype || prototype === null ? (value as Record<string, unknown>) : undefined;
}

/** Whether every own field of `record` is one of `keys` (a strict object's rule). */
export function onlyKeys(record: Readonly<Record<string, unknown>>, keys: readonly string[]): boolean {
  for (const key of Object.keys(record)) if (!keys.includes(key)) return false;
  return true;
}

/** Whether `value` is a number in [lo, hi] (NaN and the infinities are not: zod's numbers are finite). */
export function numberIn(value: unknown, lo: number, hi: number): value is number {
  return typeof value === 'number' && value >= lo && value <= hi && Number.isFinite(value);
}

/** What a field check returns when it refuses the value. */
export const FAILED: unique symbol = Symbol('refused: ask the schema');
