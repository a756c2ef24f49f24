import { z } from 'zod';
import type { BatterySpec, MarketSpec } from '../types.js';
import { BATTERY_FIELD_FIXES, parseBatterySpec } from '../battery/batterySpec.js';
import { MARKET_FIELD_FIXES, OLD_IMBALANCE_FIELD, parseMarketSpec } from '../market/marketSpec.js';
import { InputError } from '../errors/inputError.js';
import { lineOfJsonPath, parseJsonText, stripBom, zodProblems } from './jsonProblems.js';
import { readInputFile } from './readInputFile.js';

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

/** Largest spec file [bytes]: a spec holds a dozen numbers, so anything bigger is the wrong file. */
export const MAX_SPEC_BYTES = 1024 * 1024;

/**
 * Reads `market.json`. The rule under its old name `fallback` is read as `imbalance`, and `note` (when
 * given) hears one line saying so and asking to rename the field.
 */
export function readMarketSpec(path: string, note?: (text: string) => void): MarketSpec {
  const text = readInputFile(path, { maxBytes: MAX_SPEC_BYTES });
  const spec = parseJsonSpec(text, path, parseMarketSpec, MARKET_FIELD_FIXES);
  if (note !== undefined && Object.hasOwn(JSON.parse(stripBom(text)) as object, OLD_IMBALANCE_FIELD)) {
    const line = lineOfJsonPath(text, [OLD_IMBALANCE_FIELD]);
    note(`note: ${path}${line === undefined ? '' : `:${line}`}: the field "${OLD_IMBALANCE_FIELD}" is read as "imbalance"; rename it to "imbalance"\n`);
  }
  return spec;
}

export function readBatterySpec(path: string): BatterySpec {
  return parseJsonSpec(readInputFile(path, { maxBytes: MAX_SPEC_BYTES }), path, parseBatterySpec, BATTERY_FIELD_FIXES);
}
