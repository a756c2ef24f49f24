/** Reading chart markup in unit tests: the attributes of elements picked by tag and class. */
export interface SvgElement {
  readonly tag: string;
  readonly attrs: Readonly<Record<string, string>>;
  /** Numeric attribute, or NaN. */
  num(name: string): number;
}

/** Elements `<tag ... class="... cls ...">` in document order (no nesting assumptions). */
export function elements(svg: string, tag: string, cls: string): SvgElement[] {
  const found: SvgElement[] = [];
  for (const m of svg.matchAll(new RegExp(`<${tag}\\b([^>]*)>`, 'g'))) {
    const attrs: Record<string, string> = {};
    for (const a of (m[1] ?? '').matchAll(/([\w:-]+)="([^"]*)"/g)) attrs[a[1] as string] = a[2] as string;
    if ((attrs.class ?? '').split(' ').includes(cls)) found.push({ tag, attrs, num: (name) => Number(attrs[name]) });
  }
  return found;
}

/** Texts of `<text ... class="cls">...</text>`. */
export function texts(svg: string, cls: string): string[] {
  return [...svg.matchAll(/<text\b([^>]*)>([^<]*)<\/text>/g)].filter((m) => (m[1] ?? '').includes(`class="${cls}"`)).map((m) => m[2] as string);
}

/** Recursively freezes a value, so a test proves that rendering does not mutate its input. */
export function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}
