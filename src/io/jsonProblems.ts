import type { z } from 'zod';
import type { InputProblem } from '../errors/inputError.js';
import { jsonDuplicateKeys } from './jsonDuplicateKeys.js';
import { jsonSyntaxError } from './jsonSyntaxError.js';

/**
 * JSON text -> value, or the problems: the line and column of the first syntax error and the usual
 * mistake behind it, or every key that appears twice in one object (JSON.parse would keep the last
 * silently). A byte order mark is accepted; an empty file is named as such.
 */
export function parseJsonText(text: string, file: string): { value: unknown } | { problems: InputProblem[] } {
  const body = stripBom(text);
  if (body.trim() === '') {
    return { problems: [{ file, message: 'the file is empty', fix: 'give one JSON object such as {"energyMwh": 10, ...}; see the file formats in the README' }] };
  }
  let value: unknown;
  try {
    value = JSON.parse(body);
  } catch (err) {
    const found = jsonSyntaxError(body);
    if (found === null) {
      // The engine and the scanner disagree (they should not): report the engine's words, no line.
      const message = err instanceof Error ? err.message : String(err);
      return { problems: [{ file, message: `not valid JSON (${message})`, fix: 'check quotes, commas and brackets' }] };
    }
    const { line, column } = lineAndColumn(body, found.offset);
    return { problems: [{ file, line, message: `not valid JSON at column ${column}: ${found.message}`, fix: found.fix }] };
  }
  const twice = jsonDuplicateKeys(body);
  if (twice.length > 0) {
    return { problems: twice.map((d) => ({ file, line: d.line, field: d.path, message: `appears twice in one object (first on line ${d.firstLine}), and only one value can count`, fix: 'keep one of the two and delete the other' })) };
  }
  return { value };
}

export function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** 1-based line and column of an offset (a CR LF pair ends one line). */
function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

function lineOfOffset(text: string, offset: number): number {
  return lineAndColumn(text, offset).line;
}

/**
 * The line on which a key path appears in JSON text: finds each key in turn, as a quoted name followed
 * by a colon, after the previous one. Good enough for the flat specs we read; undefined when the first
 * key is absent (a missing field has no line), else the line of the last key found.
 */
export function lineOfJsonPath(text: string, path: readonly PropertyKey[]): number | undefined {
  let offset = 0;
  let found: number | undefined;
  for (const key of path) {
    if (typeof key !== 'string') continue;
    const name = new RegExp(`${escapeRegExp(JSON.stringify(key))}\\s*:`, 'g');
    name.lastIndex = offset;
    const at = name.exec(text)?.index;
    if (at === undefined) break;
    offset = at;
    found = at;
  }
  return found === undefined ? undefined : lineOfOffset(text, found);
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/**
 * Zod issues -> problems with file, line and field. `fixFor` gives the advice for a field. Each unknown
 * field is its own problem on its own line; a file that is not a JSON object says what it holds.
 */
export function zodProblems(
  error: z.ZodError,
  file: string,
  text: string,
  fixFor: (field: string) => string,
  value?: unknown,
): InputProblem[] {
  return error.issues.flatMap((issue): InputProblem[] => {
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((key) => problemAt(file, text, [...issue.path, key], 'unknown field', 'remove it or check its spelling against the README'));
    }
    if (issue.path.length === 0 && issue.code === 'invalid_type') {
      return [{ file, field: '(top level)', message: `the file holds ${jsonKind(value)}, not a JSON object`, fix: 'a spec is one JSON object such as {"energyMwh": 10, ...}; see the file formats in the README' }];
    }
    const field = issue.path.map(String).join('.') || '(top level)';
    return [problemAt(file, text, issue.path, issue.message, fixFor(field))];
  });
}

function problemAt(file: string, text: string, keys: readonly PropertyKey[], message: string, fix: string): InputProblem {
  const line = lineOfJsonPath(text, keys);
  return { file, ...(line === undefined ? {} : { line }), field: keys.map(String).join('.') || '(top level)', message, fix };
}

function jsonKind(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'an array';
  return typeof value === 'string' ? 'a text' : typeof value === 'number' ? 'a number' : `a ${typeof value} value`;
}
