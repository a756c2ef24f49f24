/**
 * Text from an input file made safe to quote in a message: control characters and other invisible
 * code points are written as escapes (`\x00`, `\u200b`), and text longer than `maxChars` is cut with
 * its full length named, so that a file of garbage never floods or garbles the terminal.
 *
 * Example: shownText('ab\u0000c') is 'ab\x00c'; shownText('x'.repeat(100), 10) is 'xxxxxxxxxx... (100 characters)'.
 *
 * @param text text taken from an input
 * @param maxChars most characters kept [-], default 60
 */
export function shownText(text: string, maxChars = 60): string {
  const cut = text.length > maxChars ? text.slice(0, maxChars) : text;
  // C0 and C1 controls, DEL, zero-width and direction marks, line and paragraph separators, BOM, lone surrogates.
  const escaped = cut.replace(/[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u2028-\u202e\ufeff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g, escapeChar);
  return text.length > maxChars ? `${escaped}... (${text.length} characters)` : escaped;
}

function escapeChar(char: string): string {
  const code = char.charCodeAt(0);
  return code < 0x100 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
}
