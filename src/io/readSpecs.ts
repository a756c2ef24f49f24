import { z } from 'zod';
import type { BatterySpec, MarketSpec } from '../types.js';
import { BATTERY_FIELD_FIXES, parseBatterySpec } from '../battery/batterySpec.js';
import { MARKET_FIELD_FIXES, parseMarketSpec } from '../market/marketSpec.js';
import { InputError } from '../errors/inputError.js';
import { parseJsonText, zodProblems } from './jsonProblems.js';
import { readInputFile } from './readInputFile.js';
import { MAX_SPEC_BYTES, oldFieldNote } from './specFile.js';

export { MAX_SPEC_BYTES } from './specFile.js';

/**
 * Parses JSON text with a zod-checked parser; every problem (with line and field) goes into one
 * InputError.
 */
export function parseJsonSpec<T>(
  text: string,
  file: string,
  parse: (value: unknown) => z.ZodSafeParseResult<T>,
  fixes: Readonly<Record<string, string>>,
): T {
  const json = parseJsonText(text, file);
  if ('problems' in json) throw new InputError(json.problems);
  const result = parse(json.value);
  if (!result.success) {
    throw new InputError(zodProblems(result.error, file, text, (field) => fixes[field] ?? 'see the file formats in the README', json.value));
  }
  return result.data;
}

/**
 * Reads `market.json`. The rule under its old name `fallback` is read as `imbalance`, and `note` (when
 * given) hears one line saying so and asking to rename the field.
 */
export function readMarketSpec(path: string, note?: (text: string) => void): MarketSpec {
  const text = readInputFile(path, { maxBytes: MAX_SPEC_BYTES });
  const spec = parseJsonSpec(text, path, parseMarketSpec, MARKET_FIELD_FIXES);
  const said = note === undefined ? undefined : oldFieldNote(path, text);
  if (said !== undefined) note?.(said);
  return spec;
}

export function readBatterySpec(path: string): BatterySpec {
  return parseJsonSpec(readInputFile(path, { maxBytes: MAX_SPEC_BYTES }), path, parseBatterySpec, BATTERY_FIELD_FIXES);
}
