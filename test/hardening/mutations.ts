import fc from 'fast-check';
import { InputError } from '../../src/errors/inputError.js';

/**
 * Structured mutations of valid input text for property tests: whole lines dropped, doubled or
 * swapped, a cell or a value replaced by junk, an offset changed, characters inserted or the text cut.
 * Each mutation is a plain record (so fast-check can shrink and print it) applied by `applyMutation`.
 */
export interface Mutation {
  readonly kind: 'drop' | 'duplicate' | 'swap' | 'cell' | 'offset' | 'insert' | 'truncate' | 'char';
  /** Positions, taken modulo the number of lines, cells or characters. */
  readonly at: number;
  readonly other: number;
  readonly junk: string;
}

/** Strings that tend to break readers: numbers in odd forms, separators, quotes, offsets, controls. */
export const JUNK = [
  '', ' ', 'NaN', 'Infinity', '-inf', '1e999', '-0', '0x10', '4,5', '"', '""', ',', ';', '\t', '\r', '\n', '\u0000', '\ufeff',
  'null', 'true', '[]', '{}', '{', '}', ':', '//', '+02:00', '+01:00', 'Z', '+0200', '2027-02-30', '2027-06-15T24:00:00+02:00',
  '99999999999999999999', '-500.000001', '4000.1', '0.5', 'q0.5', 'period_start', 'level', 'price', '\u00e9', '\ud800', '\u2028',
];

export const junkArbitrary: fc.Arbitrary<string> = fc.oneof(fc.constantFrom(...JUNK), fc.string({ maxLength: 12 }), fc.string({ unit: 'binary', maxLength: 6 }));

export const mutationArbitrary: fc.Arbitrary<Mutation> = fc.record({
  kind: fc.constantFrom('drop', 'duplicate', 'swap', 'cell', 'offset', 'insert', 'truncate', 'char'),
  at: fc.nat(),
  other: fc.nat(),
  junk: junkArbitrary,
});

/** Several mutations, applied in order. */
export const mutationsArbitrary: fc.Arbitrary<Mutation[]> = fc.array(mutationArbitrary, { minLength: 1, maxLength: 4 });

export function applyMutation(text: string, m: Mutation): string {
  const lines = text.split('\n');
  const i = m.at % lines.length;
  const j = m.other % lines.length;
  switch (m.kind) {
    case 'drop':
      return lines.filter((_, k) => k !== i).join('\n');
    case 'duplicate':
      return [...lines.slice(0, j), lines[i] as string, ...lines.slice(j)].join('\n');
    case 'swap': {
      const out = [...lines];
      [out[i], out[j]] = [out[j] as string, out[i] as string];
      return out.join('\n');
    }
    case 'cell': {
      // A CSV cell, or in JSON the text after a colon on the line.
      const line = lines[i] as string;
      const replaced = line.includes(':') && line.trimStart().startsWith('"')
        ? line.replace(/:\s*[^,]*/, `: ${m.junk}`)
        : line.split(',').map((cell, k, all) => (k === m.other % all.length ? m.junk : cell)).join(',');
      return lines.map((l, k) => (k === i ? replaced : l)).join('\n');
    }
    case 'offset': {
      const offsets = ['+01:00', '+02:00', '+00:00', 'Z', '-05:00', '+0200', ''];
      return lines.map((l, k) => (k === i ? l.replace(/(Z|[+-]\d{2}:?\d{2})(?=,|$)/, offsets[m.other % offsets.length] as string) : l)).join('\n');
    }
    case 'insert': {
      const at = m.other % (text.length + 1);
      return `${text.slice(0, at)}${m.junk}${text.slice(at)}`;
    }
    case 'truncate':
      return text.slice(0, m.other % (text.length + 1));
    case 'char': {
      const at = m.other % Math.max(1, text.length);
      return `${text.slice(0, at)}${m.junk.slice(0, 1)}${text.slice(at + 1)}`;
    }
  }
}

export function applyMutations(text: string, mutations: readonly Mutation[]): string {
  return mutations.reduce(applyMutation, text);
}

/** A seed derived from a property's name, so each property has its own fixed sequence of inputs. */
export function seedOf(name: string): number {
  let h = 2166136261;
  for (let k = 0; k < name.length; k++) h = Math.imul(h ^ name.charCodeAt(k), 16777619);
  return h >>> 0;
}

/**
 * Runs a reader on one input: its value, or the InputError it threw after checking that every problem
 * names the file and says what is wrong and what to do. Any other exception fails the property.
 */
export function readOrProblems<T>(file: string, read: () => T): { value: T } | { error: InputError } {
  try {
    return { value: read() };
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    for (const p of err.problems) {
      if (p.file !== file || p.message.trim() === '' || p.fix.trim() === '') throw new Error(`a problem without file, message or fix: ${JSON.stringify(p)}`);
    }
    if (err.problems.length === 0) throw new Error('an InputError with no problems');
    return { error: err };
  }
}
