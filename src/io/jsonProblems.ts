import type { z } from 'zod';
import type { InputProblem } from './inputError.js';

/**
 * JSON text -> value, or a problem that names the line of the syntax error.
 */
export function parseJsonText(text: string, file: string): { value: unknown } | { problem: InputProblem } {
  try {
    return { value: JSON.parse(stripBom(text)) };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const position = /position (\d+)/.exec(message);
    const line = position ? lineOfOffset(text, Number(position[1])) : undefined;
    return {
      problem: {
        file,
        ...(line === undefined ? {} : { line }),
        message: `not valid JSON (${message})`,
        fix: 'check quotes, commas and brackets; a JSON file holds one object such as {"energyMwh": 10}',
      },
    };
  }
}

export function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

function lineOfOffset(text: string, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < text.length; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

/**
 * The line on which a key path appears in JSON text: finds each key in turn after the previous one.
 * Good enough for the flat specs we read; falls back to the last key found.
 */
export function lineOfJsonPath(text: string, path: readonly PropertyKey[]): number | undefined {
  let offset = 0;
  let found: number | undefined;
  for (const key of path) {
    if (typeof key !== 'string') continue;
    const at = text.indexOf(JSON.stringify(key), offset);
    if (at < 0) break;
    offset = at;
    found = at;
  }
  return found === undefined ? undefined : lineOfOffset(text, found);
}

/** Zod issues -> problems with file, line and field. `fixFor` gives the advice for a field. */
export function zodProblems(
  error: z.ZodError,
  file: string,
  text: string,
  fixFor: (field: string) => string,
): InputProblem[] {
  return error.issues.map((issue) => {
    const keys = issue.code === 'unrecognized_keys' ? [...issue.path, ...issue.keys.slice(0, 1)] : issue.path;
    const field = keys.map(String).join('.') || '(top level)';
    const line = lineOfJsonPath(text, keys);
    return {
      file,
      ...(line === undefined ? {} : { line }),
      field,
      message: issue.message,
      fix: issue.code === 'unrecognized_keys' ? 'remove it or check its spelling against the README' : fixFor(field),
    };
  });
}
