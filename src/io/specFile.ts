import { InputError } from '../errors/inputError.js';
import { OLD_IMBALANCE_FIELD } from '../market/marketLimits.js';
import { lineOfJsonPath, parseJsonText, stripBom } from './jsonProblems.js';
import { readInputFile } from './readInputFile.js';

/** Largest spec file [bytes]: a spec holds a dozen numbers, so anything bigger is the wrong file. */
export const MAX_SPEC_BYTES = 1024 * 1024;

/**
 * The note that market.json's text gives its imbalance rule under the old name, or undefined (text
 * that its schema accepted: one JSON object).
 */
export function oldFieldNote(path: string, text: string): string | undefined {
  if (!Object.hasOwn(JSON.parse(stripBom(text)) as object, OLD_IMBALANCE_FIELD)) return undefined;
  const line = lineOfJsonPath(text, [OLD_IMBALANCE_FIELD]);
  return `note: ${path}${line === undefined ? '' : `:${line}`}: the field "${OLD_IMBALANCE_FIELD}" is read as "imbalance"; rename it to "imbalance"\n`;
}

/**
 * A JSON spec file read as the schema readers read it (readSpecs.ts: the same file checks, the same
 * JSON parsing) and checked by a hand-written check (e.g. checkedMarketSpec); undefined when the file
 * cannot be read, is not JSON, or the check leaves it to the schema: the caller then reads it with the
 * schema reader, which words every problem.
 */
export function readCheckedSpec<T>(path: string, check: (value: unknown) => T | undefined): { readonly value: T; readonly text: string } | undefined {
  try {
    const text = readInputFile(path, { maxBytes: MAX_SPEC_BYTES });
    const json = parseJsonText(text, path);
    const value = 'problems' in json ? undefined : check(json.value);
    return value === undefined ? undefined : { value, text };
  } catch (err) {
    if (err instanceof InputError) return undefined;
    throw err;
  }
}
