/** A key that an object of a JSON text holds twice. */
export interface DuplicateKey {
  /** The key's path, e.g. `energyMwh` or `fallback.penaltyPerMwh`. */
  readonly path: string;
  /** 1-based lines of its first and its repeated appearance. */
  readonly firstLine: number;
  readonly line: number;
}

/**
 * The keys that appear twice in one object of a JSON text, in text order. JSON.parse keeps the last of
 * them without a word ("the names within an object SHOULD be unique", RFC 8259, section 4), so a spec
 * that says `"energyMwh": 10` and, further down, `"energyMwh": 2000` would silently mean 2000.
 *
 * `text` must be valid JSON (JSON.parse accepted it): the scan only tracks strings, objects and
 * arrays, and takes a string followed by a colon as a key.
 */
export function jsonDuplicateKeys(text: string): DuplicateKey[] {
  type Frame = { readonly kind: 'object'; readonly path: string; readonly keys: Map<string, number>; pending: string | null } | { readonly kind: 'array'; readonly path: string };
  const stack: Frame[] = [];
  const found: DuplicateKey[] = [];
  let line = 1;
  let lastString: { value: string; line: number } | null = null;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) line++;
    else if (c === 0x22) {
      const start = i;
      i++;
      while (i < text.length && text.charCodeAt(i) !== 0x22) i += text.charCodeAt(i) === 0x5c ? 2 : 1;
      lastString = { value: JSON.parse(text.slice(start, i + 1)) as string, line };
    } else if (c === 0x3a) {
      const frame = stack[stack.length - 1];
      if (frame?.kind === 'object' && lastString !== null) {
        const path = frame.path === '' ? lastString.value : `${frame.path}.${lastString.value}`;
        const first = frame.keys.get(lastString.value);
        if (first !== undefined) found.push({ path, firstLine: first, line: lastString.line });
        else frame.keys.set(lastString.value, lastString.line);
        frame.pending = path;
      }
    } else if (c === 0x7b || c === 0x5b) {
      const parent = stack[stack.length - 1];
      const path = parent === undefined ? '' : parent.kind === 'object' ? (parent.pending ?? parent.path) : parent.path;
      stack.push(c === 0x7b ? { kind: 'object', path, keys: new Map(), pending: null } : { kind: 'array', path });
    } else if (c === 0x7d || c === 0x5d) {
      stack.pop();
    }
  }
  return found;
}
