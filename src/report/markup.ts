/**
 * Escaped markup for HTML and inline SVG, and the one tag that builds it.
 *
 * Every piece of text that reaches a report goes through `markup`: strings are escaped, numbers are
 * rounded as SVG coordinates, nested `Markup` is kept as it is. Only this file can make a `Markup`
 * from raw text, so a string that was not escaped cannot reach a page by accident.
 */

/** A fragment of HTML/SVG whose text is known to be escaped. */
export class Markup {
  private constructor(readonly text: string) {}

  /** Internal: wraps text that is markup by construction (the page's doctype and style sheet). */
  static trusted(text: string): Markup {
    return new Markup(text);
  }

  toString(): string {
    return this.text;
  }
}

/** What may stand in a `markup` template: escaped text, a coordinate, markup, a list, or nothing. */
export type MarkupValue = Markup | string | number | false | null | undefined | readonly MarkupValue[];

/**
 * Tagged template: `markup\`<text x="${x}">${label}</text>\`` escapes `label`, rounds `x`
 * (see `coord`) and keeps nested Markup. `false`, `null` and `undefined` render as nothing, so
 * `${show && markup\`...\`}` works.
 */
export function markup(strings: TemplateStringsArray, ...values: readonly MarkupValue[]): Markup {
  let out = strings[0] ?? '';
  values.forEach((value, i) => {
    out += render(value) + (strings[i + 1] ?? '');
  });
  return Markup.trusted(out);
}

/** Joins fragments with a separator (default: newline). */
export function joinMarkup(parts: readonly MarkupValue[], separator = '\n'): Markup {
  return Markup.trusted(parts.map(render).filter((p) => p !== '').join(separator));
}

function render(value: MarkupValue): string {
  if (value instanceof Markup) return value.text;
  if (typeof value === 'string') return escapeText(value);
  if (typeof value === 'number') return coord(value);
  if (value === false || value === null || value === undefined) return '';
  return value.map(render).join('');
}

const ESCAPES: Readonly<Record<string, string>> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/**
 * Escapes text for HTML and XML (SVG) element content and quoted attribute values: `& < > " '`
 * become entities, and characters XML 1.0 forbids (C0 controls other than tab, line feed and
 * carriage return, lone surrogates, U+FFFE, U+FFFF) become U+FFFD, so the result is well-formed in
 * both languages (W3C XML 1.0, 5th edition, section 2.2 "Characters").
 */
export function escapeText(text: string): string {
  return text
    .replace(/[&<>"']/g, (c) => ESCAPES[c] as string)
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '\uFFFD');
}

/**
 * An SVG coordinate as text: rounded to 2 decimals (1/100 px, below what a screen or printer
 * shows), shortest form, never `-0`. Throws on NaN and infinities, which are always a bug upstream.
 */
export function coord(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`not a finite coordinate: ${value}`);
  const rounded = Math.round(value * 100) / 100;
  return Object.is(rounded, -0) ? '0' : String(rounded);
}
